import { z } from 'zod';
import { AppError } from '@/lib/errors';

const filterSchema = z.object({
  material: z.string().min(1).max(100).optional(),
  source: z.string().min(1).max(100).optional(),
  import: z.string().min(1).max(100).optional(),
  method: z.string().min(1).max(100).optional(),
});

/** Optional ?material=&source=&import=&method= ids that narrow a measurements or calculations page. */
export function valueFilters(request: Request) {
  const params = Object.fromEntries(new URL(request.url).searchParams);
  const parsed = filterSchema.safeParse({ material: params.material, source: params.source, import: params.import, method: params.method });
  if (!parsed.success) throw new AppError('bad-request', 'Invalid filter.', parsed.error.issues);
  const f = parsed.data;
  return { materialId: f.material, sourceId: f.source, importId: f.import, methodId: f.method };
}
