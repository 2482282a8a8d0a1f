import 'server-only';
import { z } from 'zod';
import { isAppError } from '@/lib/errors';
import { requireMember, requireUser, type MemberContext, type SessionUser } from '@/lib/session';
import type { Permission } from '@/lib/permissions';
import type { ActionState } from '@/lib/action-state';


type ActionFn = (prev: ActionState | undefined, formData: FormData) => Promise<ActionState>;

/** Which gate an action went through; the security test reads this so no action escapes it. */
const scopes = new WeakMap<ActionFn, 'workspace' | 'user'>();
export function actionScope(fn: unknown): 'workspace' | 'user' | undefined {
  return scopes.get(fn as ActionFn);
}

function formToObject(formData: FormData): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [key, value] of formData.entries()) {
    if (typeof value !== 'string') continue;
    if (key in out) {
      const prev = out[key];
      out[key] = Array.isArray(prev) ? [...prev, value] : [prev, value];
    } else out[key] = value;
  }
  return out;
}

function refusal(e: unknown): ActionState {
  if (isAppError(e)) return { ok: false, code: e.code, message: e.message };
  throw e;
}

function parse<S extends z.ZodType>(schema: S, formData: FormData): { data: z.infer<S> } | { state: ActionState } {
  const parsed = schema.safeParse(formToObject(formData));
  if (parsed.success) return { data: parsed.data };
  const fieldErrors: Record<string, string[]> = {};
  for (const issue of parsed.error.issues) {
    const key = issue.path.join('.') || '_form';
    (fieldErrors[key] ??= []).push(issue.message);
  }
  return { state: { ok: false, code: 'bad-request', message: 'Check the highlighted fields.', fieldErrors } };
}

const workspaceIdField = z.object({ workspaceId: z.string().min(1) });

/**
 * A workspace-scoped server action: session → workspace membership and role →
 * parse → act. Membership comes before the full parse so that a request for
 * another workspace is refused whatever else it carries.
 */
export function workspaceAction<S extends z.ZodType>(
  permission: Permission,
  schema: S,
  act: (input: z.infer<S>, ctx: MemberContext) => Promise<ActionState>,
): ActionFn {
  const fn: ActionFn = async (_prev, formData) => {
    let ctx: MemberContext;
    try {
      await requireUser();
      const scoped = workspaceIdField.safeParse(formToObject(formData));
      if (!scoped.success) return { ok: false, code: 'bad-request', message: 'Missing workspace.' };
      ctx = await requireMember(scoped.data.workspaceId, permission);
    } catch (e) {
      return refusal(e);
    }
    const parsed = parse(schema, formData);
    if ('state' in parsed) return parsed.state;
    try {
      return await act(parsed.data, ctx);
    } catch (e) {
      return refusal(e);
    }
  };
  scopes.set(fn, 'workspace');
  return fn;
}

/** A server action for any signed-in user (creating a workspace, accepting an invitation). */
export function userAction<S extends z.ZodType>(schema: S, act: (input: z.infer<S>, user: SessionUser) => Promise<ActionState>): ActionFn {
  const fn: ActionFn = async (_prev, formData) => {
    let user: SessionUser;
    try {
      user = await requireUser();
    } catch (e) {
      return refusal(e);
    }
    const parsed = parse(schema, formData);
    if ('state' in parsed) return parsed.state;
    try {
      return await act(parsed.data, user);
    } catch (e) {
      return refusal(e);
    }
  };
  scopes.set(fn, 'user');
  return fn;
}
