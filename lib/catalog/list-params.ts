import { z } from 'zod';

export const PAGE_SIZES = [50, 200, 1000] as const;

/** List state as it travels in the URL: ?page=&size=&sort=&dir=&q=&tag=&system=&retracted= */
export const listParamsSchema = z.object({
  page: z.coerce.number().int().min(1).catch(1),
  size: z.coerce
    .number()
    .int()
    .refine((n) => (PAGE_SIZES as readonly number[]).includes(n))
    .catch(PAGE_SIZES[0]),
  sort: z.string().max(40).optional().catch(undefined),
  dir: z.enum(['asc', 'desc']).catch('asc'),
  q: z.string().trim().max(200).optional().catch(undefined),
  tag: z.string().trim().max(40).optional().catch(undefined),
  system: z.string().trim().max(20).optional().catch(undefined),
  retracted: z
    .enum(['1', '0'])
    .optional()
    .catch(undefined)
    .transform((v) => v === '1'),
});

export type ListParams = z.infer<typeof listParamsSchema>;

/** Reads Next's searchParams (a value may be an array when repeated: the first one wins). */
export function parseListParams(searchParams: Record<string, string | string[] | undefined>): ListParams {
  const flat: Record<string, string | undefined> = {};
  for (const [k, v] of Object.entries(searchParams)) flat[k] = Array.isArray(v) ? v[0] : v;
  return listParamsSchema.parse(flat);
}

/** Escapes % and _ for a LIKE pattern (used with ESCAPE '\'). */
export function likePattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}
