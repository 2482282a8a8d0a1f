import 'server-only';
import { z } from 'zod';
import { AppError, issuesText } from '@/lib/errors';
import type { RevisionView } from '@/db/queries/revisions';
import type { MethodResult } from '@/lib/benchmark/types';

/** Path parameters of /api/v1/benchmarks/{id}/… */
export const benchmarkIdParams = z.object({ id: z.string().min(1).max(100) });
export const benchmarkMethodParams = benchmarkIdParams.extend({ methodId: z.string().min(1).max(100) });
export const revisionNumberParams = benchmarkIdParams.extend({
  number: z.coerce.number({ message: 'The revision number must be a positive integer.' }).int().positive('The revision number must be a positive integer.'),
});

const revisionQuery = z.object({
  revision: z.coerce.number({ message: 'must be a positive integer' }).int('must be a positive integer').positive('must be a positive integer').optional(),
});

/** Parses the query string with a zod schema; 400 names the parameter. `latest` is the same as no ?revision. */
export function parseQuery<S extends z.ZodType>(request: Request, schema: S): z.infer<S> {
  const params = Object.fromEntries(new URL(request.url).searchParams);
  if (params.revision === 'latest' || params.revision === '') delete params.revision;
  const parsed = schema.safeParse(params);
  if (!parsed.success) {
    const names = parsed.error.issues.map((i) => `"${i.path.map(String).join('.')}"`);
    throw new AppError('bad-request', `Invalid query parameter ${[...new Set(names)].join(', ')}: ${issuesText(parsed.error.issues, '; ')}`, parsed.error.issues);
  }
  return parsed.data;
}

export function revisionQueryOf(request: Request): number | undefined {
  return parseQuery(request, revisionQuery.loose()).revision;
}

export function revisionHead(r: RevisionView) {
  return { number: r.number, fingerprint: r.fingerprint, createdAt: r.createdAt.toISOString(), isLatest: r.isLatest };
}

export function methodRow(m: MethodResult) {
  return { ...m, paired: m.paired, coverage: m.coverage ?? null, unranked: m.unranked ?? null, common: m.common ?? null };
}

export const NO_STORE = { 'cache-control': 'private, no-store' };
