import 'server-only';
import type { z } from 'zod';
import { AppError } from '@/lib/errors';
import type { Permission } from '@/lib/permissions';
import { limitCaller } from '@/lib/api-limits';
import { authenticateToken, type TokenContext } from './auth';
import { toProblem } from '@/lib/errors';
import { withIdempotency } from '@/lib/services/idempotency';

type RouteContext = { params: Promise<unknown> };

/**
 * A public REST handler under /api/v1: bearer token → permission → the token's rate limit (429 with
 * Retry-After) → path params → act. Every refusal is application/problem+json; the workspace always comes
 * from the token, so another workspace's ids are simply not found (404).
 * Every POST honours an `Idempotency-Key` header (lib/services/idempotency.ts): a retry gets the stored answer,
 * refusals included, and never runs the request twice.
 */
export function apiRoute<P>(permission: Permission, params: z.ZodType<P>, act: (request: Request, ctx: TokenContext, params: P) => Promise<Response>) {
  return async (request: Request, context: RouteContext): Promise<Response> => {
    try {
      const ctx = await authenticateToken(request, permission);
      limitCaller(`token:${ctx.tokenId}`);
      const parsed = params.safeParse((await context.params) ?? {});
      if (!parsed.success) throw new AppError('bad-request', 'Invalid path parameters.', parsed.error.issues);
      if (request.method !== 'POST') return await act(request, ctx, parsed.data);
      return await withIdempotency(request, ctx, async (body) => {
        try {
          return await act(body, ctx, parsed.data);
        } catch (e) {
          return toProblem(e, { bearer: true });
        }
      });
    } catch (e) {
      return toProblem(e, { bearer: true });
    }
  };
}
