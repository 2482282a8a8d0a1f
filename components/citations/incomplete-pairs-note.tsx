/** "12 of 240 pairs rest on incomplete sources." — beside a benchmark's citation list. */
export function IncompletePairsNote({ count, total }: { count: number; total: number }) {
  if (total === 0) return null;
  return (
    <p className={`text-xs ${count ? 'text-warn' : 'text-ink-muted'}`} data-testid="pairs-on-incomplete-sources" data-count={count}>
      {count === 0
        ? 'Every pair rests on complete sources.'
        : `${count.toLocaleString('en')} of ${total.toLocaleString('en')} pair${total === 1 ? '' : 's'} ${count === 1 ? 'rests' : 'rest'} on incomplete sources (no authors, year, or DOI or notebook reference).`}
    </p>
  );
}
