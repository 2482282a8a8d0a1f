import 'server-only';
import { z } from 'zod';
import { AppError } from '@/lib/errors';
import type { Permission } from '@/lib/permissions';
import { apiRoute } from './handler';
import { pageQuerySchema } from './schemas';
import { toApi } from './serialize';

const noParams = z.object({});
const idParams = z.object({ id: z.string().min(1).max(100) });

export function parsePageQuery(request: Request): { page: number; size: number } {
  const url = new URL(request.url);
  const parsed = pageQuerySchema.safeParse({ page: url.searchParams.get('page') ?? undefined, size: url.searchParams.get('size') ?? undefined });
  if (!parsed.success) throw new AppError('bad-request', 'page must be ≥ 1 and size between 1 and 1000.', parsed.error.issues);
  return parsed.data;
}

/** GET a page of a workspace's records: `{ items, page, size, total }`. */
export function listRoute<S extends z.ZodType>(
  permission: Permission,
  item: S,
  fetchPage: (workspaceId: string, page: { page: number; size: number }, request: Request) => Promise<{ rows: object[]; total: number }>,
) {
  return apiRoute(permission, noParams, async (request, ctx) => {
    const page = parsePageQuery(request);
    const { rows, total } = await fetchPage(ctx.workspaceId, page, request);
    return Response.json({ items: rows.map((r) => toApi(item, r)), page: page.page, size: page.size, total });
  });
}

/** GET one record by id within the token's workspace; any other id is 404. */
export function getRoute<S extends z.ZodType>(permission: Permission, item: S, what: string, fetchOne: (workspaceId: string, id: string) => Promise<object | null>) {
  return apiRoute(permission, idParams, async (_request, ctx, params) => {
    const row = await fetchOne(ctx.workspaceId, params.id);
    if (!row) throw new AppError('not-found', `No such ${what} in this workspace.`);
    return Response.json(toApi(item, row));
  });
}
