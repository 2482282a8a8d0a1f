import 'server-only';
import { getRevision } from '@/db/queries/revisions';
import type { DeckViewEntry } from '@/db/queries/decks';
import type { PairRecord } from '@/lib/benchmark/types';

export type SlideMode = 'present' | 'print';

/**
 * Rows of a table slide that fit one screen (1280 × 720, text-base) or one A4
 * landscape page; a longer table continues on the next slide instead of being cut.
 */
export const ROWS_PER_SLIDE: Record<SlideMode, number> = { present: 7, print: 12 };

/** The flagged or excluded pairs an outlier slide lists, in the methods it shows. */
export function flaggedPairs(pairs: readonly PairRecord[], hiddenMethods: readonly string[] = []): PairRecord[] {
  const hidden = new Set(hiddenMethods);
  return pairs.filter((p) => !hidden.has(p.methodId) && (p.outlier !== null || p.excluded !== null));
}

/** How many slides a view takes: a long outlier table is split, everything else is one slide. */
export async function slidePartCount(workspaceId: string, entry: DeckViewEntry, mode: SlideMode): Promise<number> {
  if (entry.problem || entry.viewKind !== 'outliers' || !entry.benchmark || !entry.revision) return 1;
  const rev = await getRevision(workspaceId, entry.benchmark.id, entry.revision.number);
  if (!rev || rev.statistics.empty) return 1;
  return Math.max(1, Math.ceil(flaggedPairs(rev.statistics.pairs, entry.filters.hiddenMethods).length / ROWS_PER_SLIDE[mode]));
}

/** Every view of a deck as the slides it takes, in order. */
export async function deckSlides(workspaceId: string, views: readonly DeckViewEntry[], mode: SlideMode) {
  const counts = await Promise.all(views.map((v) => slidePartCount(workspaceId, v, mode)));
  return views.flatMap((entry, i) => Array.from({ length: counts[i] }, (_, part) => ({ entry, part, parts: counts[i], key: `${entry.id}:${part}` })));
}
