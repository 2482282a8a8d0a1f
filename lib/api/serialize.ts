import type { z } from 'zod';
import { formatAuthors } from '@/lib/citations/authors';
import type { PersonName } from '@/lib/citations/names';

/** Dates become ISO strings, everything else is kept; then the API schema picks and checks the fields. */
function jsonDates(row: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(row)) out[k] = v instanceof Date ? v.toISOString() : v;
  return out;
}

export function toApi<S extends z.ZodType>(schema: S, row: object): z.infer<S> {
  return schema.parse(jsonDates(row as Record<string, unknown>));
}

/** A source row for the API: `authors` in the one display format, the name lists never null. */
export function sourceForApi<R extends { authorList: PersonName[] | null; editorList?: PersonName[] | null }>(row: R) {
  return { ...row, authors: formatAuthors(row.authorList), authorList: row.authorList ?? [], editorList: row.editorList ?? [] };
}
