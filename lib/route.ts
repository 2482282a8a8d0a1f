import 'server-only';
import { z } from 'zod';
import { AppError, toProblem } from '@/lib/errors';
import { requireMember, requireUser, type MemberContext } from '@/lib/session';
import type { Permission } from '@/lib/permissions';

type RouteContext<P> = { params: Promise<P> };

const workspaceParam = z.object({ workspaceId: z.string().min(1) });

/**
 * A workspace-scoped route handler: session → membership and role → params parsed → act.
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
      await requireUser();
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
