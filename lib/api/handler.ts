import 'server-only';
import type { z } from 'zod';
import { AppError } from '@/lib/errors';
import type { Permission } from '@/lib/permissions';
import { limitCaller } from '@/lib/api-limits';
import { authenticateToken, type TokenContext } from './auth';
import { toProblem } from '@/lib/errors';

type RouteContext = { params: Promise<unknown> };

/**
 * A public REST handler under /api/v1: bearer token → permission → the token's rate limit (429 with
 * Retry-After) → path params → act. Every refusal is application/problem+json; the workspace always comes
 * from the token, so another workspace's ids are simply not found (404).
 */
export function apiRoute<P>(permission: Permission, params: z.ZodType<P>, act: (request: Request, ctx: TokenContext, params: P) => Promise<Response>) {
  return async (request: Request, context: RouteContext): Promise<Response> => {
    try {
      const ctx = await authenticateToken(request, permission);
      limitCaller(`token:${ctx.tokenId}`);
      const parsed = params.safeParse((await context.params) ?? {});
      if (!parsed.success) throw new AppError('bad-request', 'Invalid path parameters.', parsed.error.issues);
      return await act(request, ctx, parsed.data);
    } catch (e) {
      return toProblem(e, { bearer: true });
    }
  };
}
