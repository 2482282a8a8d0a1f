import { z } from 'zod';

export const benchmarkRouteParams = z.object({ workspaceId: z.string().min(1), benchmarkId: z.string().min(1) });

const revisionNumber = z.coerce.number().int().positive();

/** ?revision=N (absent: the latest). */
export function revisionParam(request: Request): { ok: true; value: number | undefined } | { ok: false; message: string } {
  const raw = new URL(request.url).searchParams.get('revision');
  if (raw === null || raw === '' || raw === 'latest') return { ok: true, value: undefined };
  const parsed = revisionNumber.safeParse(raw);
  return parsed.success ? { ok: true, value: parsed.data } : { ok: false, message: `Query parameter "revision" must be a positive integer, got "${raw}".` };
}
