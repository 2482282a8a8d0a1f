import 'server-only';
import { z } from 'zod';
import { env } from '@/lib/env';
import { AppError, toProblem } from '@/lib/errors';
import { assertSameOrigin } from '@/lib/same-origin';
import { limitCaller } from '@/lib/api-limits';
import { requireMember, requireUser, type MemberContext } from '@/lib/session';
import type { Permission } from '@/lib/permissions';

type RouteContext<P> = { params: Promise<P> };

const workspaceParam = z.object({ workspaceId: z.string().min(1) });

/**
 * A workspace-scoped route handler: same origin (for changes) → session → the caller's rate limit →
 * membership and role → params parsed → act.
 * These handlers authenticate by cookie, which a browser attaches to another site's forms too, so a POST, PUT, PATCH
 * or DELETE must come from the app's own origin (403 otherwise). Bearer-token routes (lib/api/handler.ts) need no such check.
 * Session and membership come first, so a caller outside the workspace learns nothing, not even which params are valid.
 * Every refusal is an RFC 9457 problem document.
 */
export function workspaceRoute<P extends { workspaceId: string }>(
  permission: Permission,
  params: z.ZodType<P>,
  act: (request: Request, ctx: MemberContext, params: P) => Promise<Response>,
) {
  return async (request: Request, context: RouteContext<unknown>): Promise<Response> => {
    try {
      assertSameOrigin(request, env().BETTER_AUTH_URL);
      const user = await requireUser();
      limitCaller(`user:${user.id}`);
      const raw = await context.params;
      // Membership before the other params: another workspace's request is refused whatever else it carries.
      const scoped = workspaceParam.safeParse(raw);
      if (!scoped.success) throw new AppError('bad-request', 'Invalid workspace id.');
      const ctx = await requireMember(scoped.data.workspaceId, permission);
      const parsed = params.safeParse(raw);
      if (!parsed.success) throw new AppError('bad-request', 'Invalid path parameters.', parsed.error.issues);
      return await act(request, ctx, parsed.data);
    } catch (e) {
      return toProblem(e);
    }
  };
}
