import type { SourceInput } from '@/lib/catalog/source-schema';
import { authorsSortText } from './authors';
import { sourceGaps } from './completeness';
import type { SourceRecord } from './record';

/** The stored fields of a checked source, with the derived ones (search text of the authors, gaps) computed from it. */
export function storedSource(input: SourceInput): SourceRecord & { authors: string | null; gaps: string[] } {
  const record: SourceRecord = {
    kind: input.kind,
    citeKey: input.citeKey,
    doi: input.doi ?? null,
    title: input.title ?? null,
    authorList: input.authors,
    editorList: input.editors.length ? input.editors : null,
    year: input.year ?? null,
    venue: input.venue ?? null,
    volume: input.volume ?? null,
    issue: input.issue ?? null,
    pages: input.pages ?? null,
    articleNumber: input.articleNumber ?? null,
    publisher: input.publisher ?? null,
    url: input.url ?? null,
    accessedOn: input.accessedOn ?? null,
    notebookRef: input.notebookRef ?? null,
    instrument: input.instrument ?? null,
    operator: input.operator ?? null,
    recordedOn: input.recordedOn ?? null,
    note: input.note ?? null,
  };
  return { ...record, authors: authorsSortText(record.authorList), gaps: sourceGaps(record) };
}

/** A stored source back as input (for re-checking a stored row, e.g. in the one-time backfill or an edit form). */
export function sourceAsInput(s: SourceRecord): Record<string, unknown> {
  return { ...s, authors: s.authorList ?? [], editors: s.editorList ?? [] };
}
