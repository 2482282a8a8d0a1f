'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { AppError } from '@/lib/errors';
import { requireBenchmark } from '@/db/queries/benchmarks';
import { createBenchmark, requestRecompute, updateBenchmark } from '@/lib/services/benchmarks/definitions';
import { decide, pin, revertDecision, revokePin } from '@/lib/services/benchmarks/decisions';
import {
  benchmarkFormSchema,
  benchmarkIdSchema,
  decisionFormSchema,
  definitionFromForm,
  editBenchmarkFormSchema,
  pinFormSchema,
  revertDecisionFormSchema,
  revokePinFormSchema,
} from './schemas';

function fieldErrorsOf(e: AppError): Record<string, string[]> | undefined {
  if (!Array.isArray(e.details)) return undefined;
  const out: Record<string, string[]> = {};
  for (const issue of e.details as Array<{ path?: unknown; message?: string }>) {
    const path = Array.isArray(issue.path) ? issue.path.join('.') : String(issue.path ?? '_form');
    (out[path] ??= []).push(issue.message ?? e.message);
  }
  return out;
}

export const createBenchmarkAction = workspaceAction('benchmarks:create', benchmarkFormSchema, async (input, ctx) => {
  try {
    const { id } = await createBenchmark(ctx.workspace.id, { userId: ctx.user.id }, definitionFromForm(input));
    revalidatePath(`/w/${ctx.workspace.slug}/benchmarks`);
    return { ok: true, message: 'Benchmark created; its first revision is being computed.', data: { id, href: `/w/${ctx.workspace.slug}/benchmarks/${id}` } };
  } catch (e) {
    if (e instanceof AppError && e.code === 'bad-request') return { ok: false, code: e.code, message: e.message, fieldErrors: fieldErrorsOf(e) };
    throw e;
  }
});

export const updateBenchmarkAction = workspaceAction('benchmarks:update', editBenchmarkFormSchema, async (input, ctx) => {
  try {
    await updateBenchmark(ctx.workspace.id, { userId: ctx.user.id }, input.benchmarkId, definitionFromForm(input));
  } catch (e) {
    if (e instanceof AppError && e.code === 'bad-request') return { ok: false, code: e.code, message: e.message, fieldErrors: fieldErrorsOf(e) };
    throw e;
  }
  revalidatePath(`/w/${ctx.workspace.slug}/benchmarks/${input.benchmarkId}`);
  return { ok: true, message: 'Saved; a new revision is being computed.', data: { href: `/w/${ctx.workspace.slug}/benchmarks/${input.benchmarkId}` } };
});

export const recomputeBenchmarkAction = workspaceAction('benchmarks:update', benchmarkIdSchema, async (input, ctx) => {
  await requestRecompute(ctx.workspace.id, { userId: ctx.user.id }, input.benchmarkId);
  return { ok: true, message: 'Recomputation queued; a revision is stored only if something changed.' };
});

export const decideAction = workspaceAction('decisions:create', decisionFormSchema, async (input, ctx) => {
  const { id } = await decide(ctx.workspace.id, { userId: ctx.user.id }, input);
  revalidatePath(`/w/${ctx.workspace.slug}/benchmarks/${input.benchmarkId}`);
  const what = input.kind === 'keep' ? 'Kept' : input.kind === 'exclude-pair' ? 'Pair excluded' : 'Measurement excluded';
  return { ok: true, message: `${what}; the next revision is being computed.`, data: { id } };
});

export const revertDecisionAction = workspaceAction('decisions:revert', revertDecisionFormSchema, async (input, ctx) => {
  await requireBenchmark(ctx.workspace.id, input.benchmarkId);
  await revertDecision(ctx.workspace.id, { userId: ctx.user.id }, input.decisionId, input.reason);
  revalidatePath(`/w/${ctx.workspace.slug}/benchmarks/${input.benchmarkId}`);
  return { ok: true, message: 'Decision reverted; the next revision is being computed.' };
});

export const pinAction = workspaceAction('decisions:create', pinFormSchema, async (input, ctx) => {
  const { id } = await pin(ctx.workspace.id, { userId: ctx.user.id }, { ...input, calculationId: input.calculationId ?? null }, input.benchmarkId);
  revalidatePath(`/w/${ctx.workspace.slug}/benchmarks/${input.benchmarkId}`);
  return { ok: true, message: input.calculationId ? 'Pairing pinned.' : 'Marked as having no counterpart.', data: { id } };
});

export const revokePinAction = workspaceAction('decisions:revert', revokePinFormSchema, async (input, ctx) => {
  await requireBenchmark(ctx.workspace.id, input.benchmarkId);
  await revokePin(ctx.workspace.id, { userId: ctx.user.id }, input.pinId, input.reason);
  revalidatePath(`/w/${ctx.workspace.slug}/benchmarks/${input.benchmarkId}`);
  return { ok: true, message: 'Pin removed.' };
});
