import type { z } from 'zod';

/** Dates become ISO strings, everything else is kept; then the API schema picks and checks the fields. */
function jsonDates(row: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(row)) out[k] = v instanceof Date ? v.toISOString() : v;
  return out;
}

export function toApi<S extends z.ZodType>(schema: S, row: object): z.infer<S> {
  return schema.parse(jsonDates(row as Record<string, unknown>));
}
