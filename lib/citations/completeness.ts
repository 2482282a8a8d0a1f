/**
 * A source is incomplete when a reader could not find or credit it: no authors,
 * no year, or neither a DOI nor a notebook reference. For in-house work the
 * operator stands for the authors and the recording date for the year.
 */
import type { SourceRecord } from './record';

export const GAP_CODES = ['authors', 'authors-review', 'year', 'identifier'] as const;
export type SourceGap = (typeof GAP_CODES)[number];

export const GAP_LABELS: Record<SourceGap, string> = {
  authors: 'no authors',
  'authors-review': 'an author name to review',
  year: 'no year',
  identifier: 'no DOI or notebook reference',
};

type CompletenessFields = Pick<SourceRecord, 'kind' | 'authorList' | 'year' | 'doi' | 'notebookRef' | 'operator' | 'recordedOn'>;

export function sourceGaps(s: CompletenessFields): SourceGap[] {
  const inHouse = s.kind === 'in-house-notebook';
  const gaps: SourceGap[] = [];
  const names = s.authorList ?? [];
  if (names.length === 0 && !(inHouse && s.operator)) gaps.push('authors');
  if (names.some((n) => n.review)) gaps.push('authors-review');
  if (s.year === null && !(inHouse && s.recordedOn)) gaps.push('year');
  if (!s.doi && !s.notebookRef) gaps.push('identifier');
  return gaps;
}

/** "Incomplete: no authors, no DOI or notebook reference." */
export function describeGaps(gaps: readonly string[]): string {
  const known = gaps.filter((g): g is SourceGap => (GAP_CODES as readonly string[]).includes(g));
  return known.length ? `Incomplete source: ${known.map((g) => GAP_LABELS[g]).join(', ')}.` : '';
}

/** How many pairs cite at least one incomplete source (a pair cites the sources of its measured and computed values). */
export function countPairsOnIncompleteSources(
  pairs: ReadonlyArray<{ sourceIds: readonly string[] }>,
  sources: ReadonlyMap<string, { gaps: readonly string[] }>,
): number {
  let n = 0;
  for (const p of pairs) if (p.sourceIds.some((id) => (sources.get(id)?.gaps.length ?? 0) > 0)) n++;
  return n;
}
