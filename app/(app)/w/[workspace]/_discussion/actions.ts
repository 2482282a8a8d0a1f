'use server';
import { revalidatePath } from 'next/cache';
import { z } from 'zod';
import { workspaceAction } from '@/lib/action';
import { AppError } from '@/lib/errors';
import { env } from '@/lib/env';
import { THREAD_SUBJECTS } from '@/db/schema';
import { getThread, parsePairKey, setThreadResolved } from '@/db/queries/comments';
import { COMMENT_MAX_CHARS } from '@/lib/discussion/mentions';
import { postComment } from '@/lib/services/discussion/post-comment';
import { getRevision } from '@/db/queries/revisions';
import { decide, pin } from '@/lib/services/benchmarks/decisions';
import { threadPath } from '@/lib/discussion/thread-url';

const blank = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);
const optionalId = z.preprocess(blank, z.string().min(1).max(400).optional());

const postCommentSchema = z
  .object({
    workspaceId: z.string().min(1),
    threadId: optionalId,
    subjectKind: z.preprocess(blank, z.enum(THREAD_SUBJECTS).optional()),
    subjectId: optionalId,
    benchmarkId: optionalId,
    body: z.string().trim().min(1, 'Write something first.').max(COMMENT_MAX_CHARS, `At most ${COMMENT_MAX_CHARS} characters.`),
  })
  .refine((v) => v.threadId || (v.subjectKind && v.subjectId), { path: ['body'], message: 'Say which thread or subject the comment is about.' });

function refresh(slug: string, benchmarkId: string | null | undefined) {
  if (benchmarkId) revalidatePath(`/w/${slug}/benchmarks/${benchmarkId}`);
  revalidatePath(`/w/${slug}/decks`, 'layout');
}

export const postCommentAction = workspaceAction('comments:create', postCommentSchema, async (input, ctx) => {
  let where: { subjectKind: string; subjectId: string; benchmarkId: string | null };
  if (input.threadId) {
    const thread = await getThread(ctx.workspace.id, input.threadId);
    if (!thread) throw new AppError('not-found', 'No such thread in this workspace.');
    where = thread;
  } else {
    where = { subjectKind: input.subjectKind!, subjectId: input.subjectId!, benchmarkId: input.benchmarkId ?? null };
  }
  const url = `${env().BETTER_AUTH_URL.replace(/\/$/, '')}${threadPath(ctx.workspace.slug, where)}`;
  const posted = await postComment(
    ctx.workspace.id,
    { userId: ctx.user.id, name: ctx.user.name },
    {
      threadId: input.threadId ?? null,
      subject: input.threadId ? null : { kind: input.subjectKind!, id: input.subjectId!, benchmarkId: input.benchmarkId ?? null },
      body: input.body,
      url,
    },
  );
  refresh(ctx.workspace.slug, where.benchmarkId);
  const n = posted.mentioned.length;
  return { ok: true, message: n ? `Comment posted; ${n} member${n === 1 ? '' : 's'} notified.` : 'Comment posted.', data: posted };
});

const resolveSchema = z.object({ workspaceId: z.string().min(1), threadId: z.string().min(1), resolved: z.enum(['true', 'false']).default('true') });

export const resolveThreadAction = workspaceAction('comments:resolve', resolveSchema, async (input, ctx) => {
  const done = await setThreadResolved(ctx.workspace.id, { userId: ctx.user.id }, input.threadId, input.resolved === 'true');
  refresh(ctx.workspace.slug, done.benchmarkId);
  return { ok: true, message: input.resolved === 'true' ? 'Thread resolved.' : 'Thread reopened.' };
});

const decideSchema = z.object({
  workspaceId: z.string().min(1),
  threadId: z.string().min(1),
  kind: z.enum(['exclude-pair', 'exclude-measurement', 'keep'], 'Choose what to decide.'),
  reason: z.string().trim().min(3, 'Give a reason (at least 3 characters).').max(1000),
});

/** A curator's decision on the pair or measurement a thread discusses; the decision links back to the thread. */
export const decideFromThreadAction = workspaceAction('decisions:create', decideSchema, async (input, ctx) => {
  const thread = await getThread(ctx.workspace.id, input.threadId);
  if (!thread) throw new AppError('not-found', 'No such thread in this workspace.');
  if (!thread.benchmarkId) throw new AppError('bad-request', 'Decisions are recorded on a benchmark; this thread is not on one.');
  let measurementId: string;
  let methodId: string | null = null;
  if (thread.subjectKind === 'pair') {
    const parsed = parsePairKey(thread.subjectId);
    if (!parsed) throw new AppError('bad-request', 'This thread does not name a pair.');
    if (parsed.measurementIds.length > 1) {
      throw new AppError('bad-request', 'This pair averages several measurements; decide on them from the benchmark page one by one.', [{ path: 'kind' }]);
    }
    measurementId = parsed.measurementIds[0];
    methodId = parsed.methodId;
  } else if (thread.subjectKind === 'measurement') {
    if (input.kind !== 'exclude-measurement') throw new AppError('bad-request', 'On a measurement thread the decision is to exclude the measurement.', [{ path: 'kind' }]);
    measurementId = thread.subjectId;
  } else {
    throw new AppError('bad-request', 'Decisions are recorded on pairs and measurements.');
  }
  const { id } = await decide(ctx.workspace.id, { userId: ctx.user.id }, { benchmarkId: thread.benchmarkId, kind: input.kind, measurementId, methodId, reason: input.reason, threadId: thread.id });
  refresh(ctx.workspace.slug, thread.benchmarkId);
  return { ok: true, message: 'Decision recorded; the next revision is being computed.', data: { id } };
});

const pinSchema = z.object({
  workspaceId: z.string().min(1),
  threadId: z.string().min(1),
  kind: z.enum(['pin-pairing', 'no-counterpart'], 'Choose what to pin.'),
  reason: z.string().trim().min(3, 'Give a reason (at least 3 characters).').max(900),
});

/**
 * Pins the pairing a pair thread discusses (or marks its measurement as having no
 * counterpart under the method). The calculation is read from the benchmark's latest
 * revision, not from the form; pins have no thread column, so the reason names the thread.
 */
export const pinFromThreadAction = workspaceAction('decisions:create', pinSchema, async (input, ctx) => {
  const thread = await getThread(ctx.workspace.id, input.threadId);
  if (!thread) throw new AppError('not-found', 'No such thread in this workspace.');
  const parsed = thread.subjectKind === 'pair' ? parsePairKey(thread.subjectId) : null;
  if (!parsed || !thread.benchmarkId) throw new AppError('bad-request', 'Pairings are pinned from a pair thread on a benchmark.', [{ path: 'kind' }]);
  if (parsed.measurementIds.length > 1) {
    throw new AppError('bad-request', 'This pair averages several measurements; pin them from the benchmark page one by one.', [{ path: 'kind' }]);
  }
  const rev = await getRevision(ctx.workspace.id, thread.benchmarkId);
  const pair = rev?.statistics.pairs.find((p) => p.key === thread.subjectId);
  const calculationId = pair?.calculationIds[0] ?? null;
  if (!calculationId) throw new AppError('conflict', 'This pair has no calculation in the latest revision; pin it from the benchmark page.', [{ path: 'kind' }]);
  const { id } = await pin(
    ctx.workspace.id,
    { userId: ctx.user.id },
    {
      methodId: parsed.methodId,
      measurementId: parsed.measurementIds[0],
      calculationId: input.kind === 'pin-pairing' ? calculationId : null,
      reason: `${input.reason} (from discussion ${thread.id})`,
    },
  );
  refresh(ctx.workspace.slug, thread.benchmarkId);
  return { ok: true, message: input.kind === 'pin-pairing' ? 'Pairing pinned; the next revision is being computed.' : 'Marked as having no counterpart; the next revision is being computed.', data: { id } };
});
