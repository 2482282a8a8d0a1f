import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { getDeck } from '@/db/queries/decks';
import { DeckSlide } from '@/app/(app)/w/[workspace]/decks/_components/deck-slide';
import { deckSlides } from '@/app/(app)/w/[workspace]/decks/_components/slide-parts';
import { Presenter } from '@/app/(app)/w/[workspace]/decks/_components/presenter';

export const metadata: Metadata = { title: 'Present' };

export default async function PresentPage({ params, searchParams }: { params: Promise<{ workspace: string; id: string }>; searchParams: Promise<{ slide?: string }> }) {
  const { workspace, id } = await params;
  const ctx = await requirePageMember(workspace, 'decks:read');
  const deck = await getDeck(ctx.workspace.id, id);
  if (!deck) notFound();
  const start = Number((await searchParams).slide);
  const slides = (await deckSlides(ctx.workspace.id, deck.views, 'present')).map((s) => <DeckSlide key={s.key} workspace={ctx.workspace} entry={s.entry} mode="present" part={s.part} parts={s.parts} />);
  return <Presenter title={deck.title} slides={slides} exitHref={`/w/${ctx.workspace.slug}/decks/${deck.id}`} initial={Number.isInteger(start) && start > 0 ? start - 1 : 0} />;
}
