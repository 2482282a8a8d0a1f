import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { utcMinute } from '@/lib/format';
import { getDeck } from '@/db/queries/decks';
import { DeckSlide } from '@/app/(app)/w/[workspace]/decks/_components/deck-slide';
import { deckSlides } from '@/app/(app)/w/[workspace]/decks/_components/slide-parts';
import { PrintButton } from '@/app/(app)/w/[workspace]/decks/_components/print-button';
import { VIEW_KIND_LABELS } from '@/lib/decks/view-kinds';

export const metadata: Metadata = { title: 'Print deck' };

// Printing (or saving as PDF) shows only the deck: the workspace shell and every button are hidden, one slide per A4 landscape page.
const PRINT_CSS = `
@page { size: A4 landscape; margin: 12mm; }
@media print {
  html, body { background: #fff !important; }
  body * { visibility: hidden; }
  aside { display: none !important; }
  [data-print-root], [data-print-root] * { visibility: visible; }
  [data-print-root] { position: absolute; inset: 0 auto auto 0; width: 100%; padding: 0 !important; }
  [data-print-root] button, [data-print-hide] { display: none !important; }
  .print-slide { break-after: page; page-break-after: always; break-inside: avoid; border: none !important; box-shadow: none !important; padding: 0 !important; }
  .print-slide:last-child { break-after: auto; page-break-after: auto; }
  a { color: inherit; text-decoration: none; }
}
`;

export default async function PrintPage({ params }: { params: Promise<{ workspace: string; id: string }> }) {
  const { workspace, id } = await params;
  const ctx = await requirePageMember(workspace, 'decks:read');
  const deck = await getDeck(ctx.workspace.id, id);
  if (!deck) notFound();
  const slides = await deckSlides(ctx.workspace.id, deck.views, 'print');
  const pages = slides.length + 1;
  return (
    <div data-print-root className="space-y-6" data-testid="print-deck" data-slides={slides.length}>
      <style>{PRINT_CSS}</style>
      <div className="flex flex-wrap items-center justify-between gap-3" data-print-hide>
        <p className="text-sm">
          <Link href={`/w/${ctx.workspace.slug}/decks/${deck.id}`}>← {deck.title}</Link>
        </p>
        <PrintButton />
      </div>
      <header className="print-slide rounded-lg border border-rule bg-panel p-6">
        <h1 className="text-3xl">{deck.title}</h1>
        <p className="mt-2 text-sm text-ink-muted">
          {ctx.workspace.name} · {deck.views.length} view{deck.views.length === 1 ? '' : 's'} on {slides.length} page{slides.length === 1 ? '' : 's'} · printed {utcMinute(new Date())}
        </p>
        <ol className="mt-4 list-decimal pl-6 text-sm">
          {deck.views.map((v) => (
            <li key={v.id}>{v.title ?? `${VIEW_KIND_LABELS[v.viewKind] ?? v.viewKind}${v.benchmark ? ` · ${v.benchmark.name}` : v.material ? ` · ${v.material.name}` : ''}`}</li>
          ))}
        </ol>
        <p className="mt-6 text-xs text-ink-faint">
          The statistics depend on the quality and representativeness of the data behind them; they support, and do not replace, expert judgement and peer review.
        </p>
      </header>
      {slides.map((s, i) => (
        <section key={s.key} className="print-slide rounded-lg border border-rule bg-panel p-6" aria-label={`Page ${i + 2} of ${pages}`}>
          <DeckSlide workspace={ctx.workspace} entry={s.entry} mode="print" part={s.part} parts={s.parts} />
          <p className="num mt-3 text-right text-xs text-ink-faint">
            {i + 2} / {pages}
          </p>
        </section>
      ))}
    </div>
  );
}
