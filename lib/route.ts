import 'server-only';
import { z } from 'zod';
import { AppError, isAppError, problemResponse } from '@/lib/errors';
import { requireMember, type MemberContext } from '@/lib/session';
import type { Permission } from '@/lib/permissions';

type RouteContext<P> = { params: Promise<P> };

/**
 * A workspace-scoped route handler: params parsed → session → membership and role → act.
 * Every refusal is an RFC 9457 problem document.
 */
export function workspaceRoute<P extends { workspaceId: string }>(
  permission: Permission,
  params: z.ZodType<P>,
  act: (request: Request, ctx: MemberContext, params: P) => Promise<Response>,
) {
  return async (request: Request, context: RouteContext<unknown>): Promise<Response> => {
    try {
      const parsed = params.safeParse(await context.params);
      if (!parsed.success) throw new AppError('bad-request', 'Invalid path parameters.', parsed.error.issues);
      const ctx = await requireMember(parsed.data.workspaceId, permission);
      return await act(request, ctx, parsed.data);
    } catch (e) {
      if (isAppError(e)) return problemResponse(e);
      console.error(e);
      return Response.json(
        { type: 'about:blank', title: 'internal', status: 500, detail: 'The server could not process the request.' },
        { status: 500, headers: { 'content-type': 'application/problem+json' } },
      );
    }
  };
}
