import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { getDeck } from '@/db/queries/decks';
import { DeckSlide } from '@/components/decks/deck-slide';
import { PrintButton } from '@/components/decks/print-button';
import { when } from '../../../benchmarks/_components/format';

export const metadata: Metadata = { title: 'Print deck' };

// Printing shows only the deck: the workspace shell and every button are hidden, one slide per page.
const PRINT_CSS = `
@page { size: A4 landscape; margin: 12mm; }
@media print {
  html, body { background: #fff !important; }
  body * { visibility: hidden; }
  [data-print-root], [data-print-root] * { visibility: visible; }
  [data-print-root] { position: absolute; inset: 0 auto auto 0; width: 100%; padding: 0 !important; }
  [data-print-root] button, [data-print-hide] { display: none !important; }
  .print-slide { break-after: page; page-break-after: always; border: none !important; box-shadow: none !important; }
  .print-slide:last-child { break-after: auto; page-break-after: auto; }
  a { color: inherit; text-decoration: none; }
}
`;

export default async function PrintPage({ params }: { params: Promise<{ workspace: string; id: string }> }) {
  const { workspace, id } = await params;
  const ctx = await requirePageMember(workspace, 'decks:read');
  const deck = await getDeck(ctx.workspace.id, id);
  if (!deck) notFound();
  const total = deck.views.length;
  return (
    <div data-print-root className="space-y-6" data-testid="print-deck">
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
          {ctx.workspace.name} · {total} slide{total === 1 ? '' : 's'} · printed {when(new Date())}
        </p>
        <ol className="mt-4 list-decimal pl-6 text-sm">
          {deck.views.map((v) => (
            <li key={v.id}>{v.title ?? `${v.viewKind}${v.benchmark ? ` · ${v.benchmark.name}` : v.material ? ` · ${v.material.name}` : ''}`}</li>
          ))}
        </ol>
      </header>
      {deck.views.map((v, i) => (
        <section key={v.id} className="print-slide rounded-lg border border-rule bg-panel p-6" aria-label={`Slide ${i + 1} of ${total}`}>
          <DeckSlide workspace={ctx.workspace} entry={v} mode="print" />
          <p className="mt-3 text-right text-xs text-ink-faint num">
            {i + 1} / {total}
          </p>
        </section>
      ))}
    </div>
  );
}
