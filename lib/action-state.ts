import { isAppError } from '@/lib/errors';

/** What every server action returns to its form. */
export type ActionState = {
  ok: boolean;
  message?: string;
  code?: string;
  fieldErrors?: Record<string, string[]>;
  data?: unknown;
};

/**
 * Query functions report a taken name as AppError('conflict', …, { field }) so the
 * form can show it beside the field; other refusals pass through unchanged.
 */
export function conflictAsFieldError(e: unknown): ActionState {
  if (isAppError(e) && e.code === 'conflict') {
    const field = (e.details as { field?: string } | undefined)?.field;
    return { ok: false, code: 'conflict', message: e.message, fieldErrors: field ? { [field]: [e.message] } : undefined };
  }
  throw e;
}
