import 'server-only';
import { z } from 'zod';
import { AppError } from '@/lib/errors';
import type { Permission } from '@/lib/permissions';
import type { Actor } from '@/db/queries/audit';
import { apiRoute } from '@/lib/api/handler';
import { toApi } from '@/lib/api/serialize';
import { readLimitedBody } from '@/lib/stream-limit';

/**
 * POST /api/v1/{materials|methods|sources} and PATCH …/{id}: one record, validated by the same zod schema as the
 * web form (lib/catalog/*-schema.ts) and written by the same queries and services. A PATCH sends only the fields
 * it changes (null clears one): they are laid over the stored record and the whole is validated again.
 * 422 lists every field issue with its path; a taken name, label, cite key or DOI is 409 naming the field.
 */

const MAX_BODY_BYTES = 1024 * 1024;
const idParams = z.object({ id: z.string().min(1).max(100) });

async function readObject(request: Request): Promise<Record<string, unknown>> {
  const type = (request.headers.get('content-type') ?? '').split(';')[0].trim().toLowerCase();
  if (type !== 'application/json') throw new AppError('bad-request', 'Send Content-Type: application/json with a JSON object.');
  const text = new TextDecoder().decode(await readLimitedBody(request, MAX_BODY_BYTES));
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new AppError('bad-request', 'The body is not valid JSON.');
  }
  if (!body || typeof body !== 'object' || Array.isArray(body)) throw new AppError('bad-request', 'The body must be a JSON object of fields.');
  return body as Record<string, unknown>;
}

function validate<S extends z.ZodType>(schema: S, fields: readonly string[], body: Record<string, unknown>, what: string): z.infer<S> {
  const unknown = Object.keys(body).filter((k) => !fields.includes(k));
  const parsed = schema.safeParse(body);
  const issues = [
    ...unknown.map((k) => ({ path: k, message: `Unknown field (the ${what} fields are ${fields.join(', ')}).` })),
    ...(parsed.success ? [] : parsed.error.issues.map((i) => ({ path: i.path.map(String).join('.'), message: i.message }))),
  ];
  if (issues.length > 0) {
    throw new AppError('unprocessable', `The ${what} was not saved: ${issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join(' ')}`, { fields: issues });
  }
  return (parsed as { data: z.infer<S> }).data;
}

interface WriteSpec<S extends z.ZodType, R> {
  what: string;
  plural: string;
  input: S;
  fields: readonly string[];
  output: z.ZodType;
  read: (workspaceId: string, id: string) => Promise<R | null>;
  serialize: (row: R) => object;
}

const actorOf = (ctx: { createdBy: string; tokenId: string }): Actor => ({ userId: ctx.createdBy, tokenId: ctx.tokenId });

export function createRoute<S extends z.ZodType, R>(
  permission: Permission,
  spec: WriteSpec<S, R>,
  create: (workspaceId: string, actor: Actor, input: z.infer<S>) => Promise<string>,
) {
  return apiRoute(permission, z.object({}), async (request, ctx) => {
    const input = validate(spec.input, spec.fields, await readObject(request), spec.what);
    const id = await create(ctx.workspaceId, actorOf(ctx), input);
    const row = await spec.read(ctx.workspaceId, id);
    return Response.json(toApi(spec.output, spec.serialize(row!)), { status: 201, headers: { location: `/api/v1/${spec.plural}/${id}` } });
  });
}

export function patchRoute<S extends z.ZodType, R>(
  permission: Permission,
  spec: WriteSpec<S, R> & { toInput: (row: R) => Record<string, unknown> },
  update: (workspaceId: string, actor: Actor, id: string, input: z.infer<S>) => Promise<void>,
) {
  return apiRoute(permission, idParams, async (request, ctx, params) => {
    const body = await readObject(request);
    const stored = await spec.read(ctx.workspaceId, params.id);
    if (!stored) throw new AppError('not-found', `No such ${spec.what} in this workspace.`);
    const input = validate(spec.input, spec.fields, { ...spec.toInput(stored), ...body }, spec.what);
    await update(ctx.workspaceId, actorOf(ctx), params.id, input);
    const row = await spec.read(ctx.workspaceId, params.id);
    return Response.json(toApi(spec.output, spec.serialize(row!)));
  });
}
