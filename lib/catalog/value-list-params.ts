import { z } from 'zod';
import { QUANTITIES, TECHNIQUES } from '@/lib/record-kinds';
import { listParamsSchema } from './list-params';

/** Sort keys of the measurement and calculation tables ("method" applies to calculations only). */
export const VALUE_SORT_KEYS = ['value', 'material', 'method', 'temperature', 'created'] as const;
export type ValueSortKey = (typeof VALUE_SORT_KEYS)[number];

const optionalText = (max: number) => z.string().trim().max(max).optional().catch(undefined);

/**
 * List state of the measurement and calculation tables as it travels in the URL:
 * the common ?page=&size=&sort=&dir=&q=&retracted= (q filters the material name)
 * plus &quantity=&technique=&method=&source=&import=. Unknown values fall back to "no filter".
 */
export const valueListParamsSchema = listParamsSchema.extend({
  quantity: z.enum(QUANTITIES).optional().catch(undefined),
  technique: z.enum(TECHNIQUES).optional().catch(undefined),
  method: optionalText(64),
  /** Source cite key, matched as a substring. */
  source: optionalText(120),
  /** Import id, matched exactly. */
  import: optionalText(64),
});

export type ValueListParams = z.infer<typeof valueListParamsSchema>;

/** Reads Next's searchParams (a repeated parameter: the first value wins). */
export function parseValueListParams(searchParams: Record<string, string | string[] | undefined>): ValueListParams {
  const flat: Record<string, string | undefined> = {};
  for (const [k, v] of Object.entries(searchParams)) flat[k] = Array.isArray(v) ? v[0] : v;
  return valueListParamsSchema.parse(flat);
}
