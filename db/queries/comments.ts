import 'server-only';
import { and, asc, desc, eq, gte, inArray, isNotNull, isNull, lt } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import { benchmark, comment, commentThread, decision, material, measurement, method, organization, revision, user } from '@/db/schema';
import { AppError } from '@/lib/errors';
import { COMMENT_MAX_CHARS, normaliseCommentBody } from '@/lib/discussion/mentions';
import type { NewMail } from '@/db/schema/mail';
import type { CommentView, ThreadSubjectKind, ThreadView } from '@/lib/discussion/thread-view';

export type { CommentView, ThreadSubjectKind, ThreadView };
import { writeAudit, type Actor } from './audit';
import { enqueueMail } from './mail';


export interface ThreadSubject {
  kind: ThreadSubjectKind;
  id: string;
  /** Pairs and revisions belong to a benchmark; the others may name the benchmark they were discussed on. */
  benchmarkId?: string | null;
}

/** A pair key is `${methodId}|${measurementId}+${measurementId}…` (lib/benchmark/pair-rows). */
export function parsePairKey(key: string): { methodId: string; measurementIds: string[] } | null {
  const cut = key.indexOf('|');
  if (cut <= 0) return null;
  const measurementIds = key.slice(cut + 1).split('+').filter(Boolean);
  return measurementIds.length ? { methodId: key.slice(0, cut), measurementIds } : null;
}

async function liveBenchmark(tx: Executor, workspaceId: string, benchmarkId: string) {
  const rows = await tx
    .select({ id: benchmark.id, name: benchmark.name })
    .from(benchmark)
    .where(and(eq(benchmark.workspaceId, workspaceId), eq(benchmark.id, benchmarkId), isNull(benchmark.retractedAt)))
    .limit(1);
  return rows[0] ?? null;
}

async function measurementLabel(tx: Executor, workspaceId: string, measurementId: string) {
  const rows = await tx
    .select({ id: measurement.id, irrep: measurement.irrep, value: measurement.value, unit: measurement.unit, materialName: material.name })
    .from(measurement)
    .innerJoin(material, eq(measurement.materialId, material.id))
    .where(and(eq(measurement.workspaceId, workspaceId), eq(measurement.id, measurementId)))
    .limit(1);
  const m = rows[0];
  return m ? `${m.materialName} ${m.irrep ?? ''} ${m.value} ${m.unit}`.replace(/\s+/g, ' ') : null;
}

async function methodLabel(tx: Executor, workspaceId: string, methodId: string) {
  const rows = await tx.select({ label: method.label }).from(method).where(and(eq(method.workspaceId, workspaceId), eq(method.id, methodId))).limit(1);
  return rows[0]?.label ?? null;
}

async function materialName(tx: Executor, workspaceId: string, materialId: string) {
  const rows = await tx.select({ name: material.name }).from(material).where(and(eq(material.workspaceId, workspaceId), eq(material.id, materialId))).limit(1);
  return rows[0]?.name ?? null;
}

/**
 * Checks that a subject is a row of this workspace (404 otherwise) and names it
 * for people: "GaN A1(TO) 531 cm-1 · PBEsol-D3".
 */
export async function describeSubject(workspaceId: string, subject: ThreadSubject, tx: Executor = db): Promise<string> {
  const missing = () => new AppError('not-found', `No such ${subject.kind} in this workspace.`);
  if (subject.benchmarkId && !(await liveBenchmark(tx, workspaceId, subject.benchmarkId))) throw new AppError('not-found', 'No such benchmark in this workspace.');
  switch (subject.kind) {
    case 'pair': {
      const parsed = parsePairKey(subject.id);
      if (!parsed) throw new AppError('bad-request', 'Not a pair key.');
      const label = await methodLabel(tx, workspaceId, parsed.methodId);
      const first = await measurementLabel(tx, workspaceId, parsed.measurementIds[0]);
      if (!label || !first) throw missing();
      return `${first}${parsed.measurementIds.length > 1 ? ` (+${parsed.measurementIds.length - 1})` : ''} · ${label}`;
    }
    case 'measurement': {
      const label = await measurementLabel(tx, workspaceId, subject.id);
      if (!label) throw missing();
      return label;
    }
    case 'material': {
      const name = await materialName(tx, workspaceId, subject.id);
      if (!name) throw missing();
      return name;
    }
    case 'calculation-set': {
      const [materialId, methodId] = subject.id.split('|');
      const name = materialId ? await materialName(tx, workspaceId, materialId) : null;
      const label = methodId ? await methodLabel(tx, workspaceId, methodId) : null;
      if (!name || !label) throw missing();
      return `${name} · ${label} calculations`;
    }
    case 'revision': {
      const rows = await tx
        .select({ number: revision.number, benchmarkId: revision.benchmarkId, name: benchmark.name })
        .from(revision)
        .innerJoin(benchmark, eq(revision.benchmarkId, benchmark.id))
        .where(and(eq(revision.workspaceId, workspaceId), eq(revision.id, subject.id)))
        .limit(1);
      if (!rows[0] || (subject.benchmarkId && rows[0].benchmarkId !== subject.benchmarkId)) throw missing();
      return `revision ${rows[0].number} of ${rows[0].name}`;
    }
  }
}

async function hydrate(threads: Array<Omit<ThreadView, 'comments' | 'decisions'>>, workspaceId: string): Promise<ThreadView[]> {
  if (threads.length === 0) return [];
  const ids = threads.map((t) => t.id);
  const comments: Array<CommentView & { threadId: string }> = [];
  const decisions: Array<ThreadView['decisions'][number] & { threadId: string | null }> = [];
  for (let i = 0; i < ids.length; i += 500) {
    const chunk = ids.slice(i, i + 500);
    comments.push(
      ...(await db
        .select({ id: comment.id, threadId: comment.threadId, body: comment.body, authorName: user.name, createdAt: comment.createdAt })
        .from(comment)
        .leftJoin(user, eq(comment.authorId, user.id))
        .where(and(eq(comment.workspaceId, workspaceId), inArray(comment.threadId, chunk)))
        .orderBy(asc(comment.createdAt))),
    );
    decisions.push(
      ...(await db
        .select({ id: decision.id, threadId: decision.threadId, kind: decision.kind, reason: decision.reason, createdAt: decision.createdAt, revertedAt: decision.revertedAt, byName: user.name })
        .from(decision)
        .leftJoin(user, eq(decision.createdBy, user.id))
        .where(and(eq(decision.workspaceId, workspaceId), inArray(decision.threadId, chunk)))
        .orderBy(asc(decision.createdAt))),
    );
  }
  return threads.map((t) => ({
    ...t,
    comments: comments.filter((c) => c.threadId === t.id).map(({ threadId: _t, ...c }) => c),
    decisions: decisions.filter((d) => d.threadId === t.id).map(({ threadId: _t, ...d }) => d),
  }));
}

const threadColumns = {
  id: commentThread.id,
  subjectKind: commentThread.subjectKind,
  subjectId: commentThread.subjectId,
  benchmarkId: commentThread.benchmarkId,
  createdAt: commentThread.createdAt,
  resolvedAt: commentThread.resolvedAt,
  resolvedByName: user.name,
};

/** Every thread discussed on a benchmark (its pairs, its revisions, and anything else opened there), oldest first. */
export async function listBenchmarkThreads(workspaceId: string, benchmarkId: string): Promise<ThreadView[]> {
  const rows = await db
    .select(threadColumns)
    .from(commentThread)
    .leftJoin(user, eq(commentThread.resolvedBy, user.id))
    .where(and(eq(commentThread.workspaceId, workspaceId), eq(commentThread.benchmarkId, benchmarkId)))
    .orderBy(asc(commentThread.createdAt));
  return hydrate(rows, workspaceId);
}

/** Threads of one subject (any benchmark), oldest first. */
export async function listSubjectThreads(workspaceId: string, kind: ThreadSubjectKind, subjectId: string): Promise<ThreadView[]> {
  const rows = await db
    .select(threadColumns)
    .from(commentThread)
    .leftJoin(user, eq(commentThread.resolvedBy, user.id))
    .where(and(eq(commentThread.workspaceId, workspaceId), eq(commentThread.subjectKind, kind), eq(commentThread.subjectId, subjectId)))
    .orderBy(asc(commentThread.createdAt));
  return hydrate(rows, workspaceId);
}

/** Threads grouped by `${kind}|${subjectId}`. */
export function threadsBySubject(threads: readonly ThreadView[]): Map<string, ThreadView[]> {
  const out = new Map<string, ThreadView[]>();
  for (const t of threads) {
    const key = `${t.subjectKind}|${t.subjectId}`;
    (out.get(key) ?? out.set(key, []).get(key)!).push(t);
  }
  return out;
}

/** Open pair threads of a benchmark, counted per pair key. */
export async function openPairThreadCounts(workspaceId: string, benchmarkId: string): Promise<Map<string, number>> {
  const rows = await db
    .select({ subjectId: commentThread.subjectId })
    .from(commentThread)
    .where(
      and(
        eq(commentThread.workspaceId, workspaceId),
        eq(commentThread.benchmarkId, benchmarkId),
        eq(commentThread.subjectKind, 'pair'),
        isNull(commentThread.resolvedAt),
      ),
    );
  const out = new Map<string, number>();
  for (const r of rows) out.set(r.subjectId, (out.get(r.subjectId) ?? 0) + 1);
  return out;
}

export async function getThread(workspaceId: string, threadId: string, tx: Executor = db) {
  const rows = await tx
    .select()
    .from(commentThread)
    .where(and(eq(commentThread.workspaceId, workspaceId), eq(commentThread.id, threadId)))
    .limit(1);
  return rows[0] ?? null;
}

export interface PostCommentInput {
  /** Reply to this thread; or open a new one on `subject`. */
  threadId?: string | null;
  subject?: ThreadSubject | null;
  body: string;
  /** Absolute link to where the thread is shown, put in the mention mails. */
  url: string;
}


/**
 * Adds a comment (opening its thread if needed) and, in the same transaction,
 * the mails `outbox` composes for it (the discussion service's mention mails),
 * so a comment is never stored without its notifications or the reverse.
 */
export async function insertComment(
  workspaceId: string,
  author: { userId: string },
  input: PostCommentInput,
  outbox: (posted: { commentId: string; body: string; subjectText: string }) => NewMail[] = () => [],
): Promise<{ threadId: string; commentId: string }> {
  const body = normaliseCommentBody(input.body);
  if (!body) throw new AppError('bad-request', 'Write something first.', [{ path: 'body' }]);
  if (body.length > COMMENT_MAX_CHARS) throw new AppError('bad-request', `A comment has at most ${COMMENT_MAX_CHARS} characters (this one has ${body.length}).`, [{ path: 'body' }]);
  return db.transaction(async (tx) => {
    let threadId: string;
    let subject: ThreadSubject;
    if (input.threadId) {
      const thread = await getThread(workspaceId, input.threadId, tx);
      if (!thread) throw new AppError('not-found', 'No such thread in this workspace.');
      if (thread.resolvedAt) throw new AppError('conflict', 'This thread is resolved; reopen it to reply.');
      threadId = thread.id;
      subject = { kind: thread.subjectKind, id: thread.subjectId, benchmarkId: thread.benchmarkId };
    } else if (input.subject) {
      subject = input.subject;
      if ((subject.kind === 'pair' || subject.kind === 'revision') && !subject.benchmarkId) throw new AppError('bad-request', `A ${subject.kind} is discussed on its benchmark.`);
      await describeSubject(workspaceId, subject, tx);
      const [row] = await tx
        .insert(commentThread)
        .values({ workspaceId, subjectKind: subject.kind, subjectId: subject.id, benchmarkId: subject.benchmarkId ?? null, createdBy: author.userId })
        .returning({ id: commentThread.id });
      threadId = row.id;
    } else {
      throw new AppError('bad-request', 'Say which thread or subject the comment is about.');
    }
    const subjectText = await describeSubject(workspaceId, { ...subject, benchmarkId: null }, tx).catch(() => subject.kind as string);
    const [row] = await tx.insert(comment).values({ workspaceId, threadId, authorId: author.userId, body }).returning({ id: comment.id });
    for (const mail of outbox({ commentId: row.id, body, subjectText })) await enqueueMail(mail, workspaceId, tx);
    return { threadId, commentId: row.id };
  });
}

/** The workspace's display name, for mails. */
export async function workspaceName(workspaceId: string): Promise<string | null> {
  const rows = await db.select({ name: organization.name }).from(organization).where(eq(organization.id, workspaceId)).limit(1);
  return rows[0]?.name ?? null;
}

/** Resolves (or reopens) a thread; audited. */
export async function setThreadResolved(workspaceId: string, actor: Actor, threadId: string, resolved: boolean) {
  return db.transaction(async (tx) => {
    const before = await getThread(workspaceId, threadId, tx);
    if (!before) throw new AppError('not-found', 'No such thread in this workspace.');
    if (resolved === (before.resolvedAt !== null)) throw new AppError('conflict', resolved ? 'This thread is already resolved.' : 'This thread is open.');
    const patch = resolved ? { resolvedAt: new Date(), resolvedBy: actor.userId } : { resolvedAt: null, resolvedBy: null };
    await tx.update(commentThread).set(patch).where(and(eq(commentThread.workspaceId, workspaceId), eq(commentThread.id, threadId)));
    await writeAudit({ workspaceId, actor, action: resolved ? 'resolve' : 'reopen', entityType: 'comment-thread', entityId: threadId, before, after: { ...before, ...patch } }, tx);
    return { benchmarkId: before.benchmarkId, subjectKind: before.subjectKind, subjectId: before.subjectId };
  });
}

/** Decisions made and threads resolved in [from, to), with names, for the minutes. */
export async function minutesOf(workspaceId: string, from: Date, to: Date) {
  const decisions = await db
    .select({
      id: decision.id,
      kind: decision.kind,
      benchmarkId: decision.benchmarkId,
      benchmarkName: benchmark.name,
      methodLabel: method.label,
      measurementId: decision.measurementId,
      reason: decision.reason,
      by: user.name,
      at: decision.createdAt,
      revertedAt: decision.revertedAt,
      threadId: decision.threadId,
    })
    .from(decision)
    .leftJoin(user, eq(decision.createdBy, user.id))
    .leftJoin(method, eq(decision.methodId, method.id))
    .leftJoin(benchmark, eq(decision.benchmarkId, benchmark.id))
    .where(and(eq(decision.workspaceId, workspaceId), gte(decision.createdAt, from), lt(decision.createdAt, to)))
    .orderBy(asc(decision.createdAt));
  const withSubject = [];
  for (const d of decisions) withSubject.push({ ...d, subject: (await measurementLabel(db, workspaceId, d.measurementId)) ?? 'a measurement no longer present' });

  const threads = await db
    .select(threadColumns)
    .from(commentThread)
    .leftJoin(user, eq(commentThread.resolvedBy, user.id))
    .where(and(eq(commentThread.workspaceId, workspaceId), isNotNull(commentThread.resolvedAt), gte(commentThread.resolvedAt, from), lt(commentThread.resolvedAt, to)))
    .orderBy(desc(commentThread.resolvedAt));
  const hydrated = await hydrate(threads, workspaceId);
  const benchmarkIds = [...new Set(hydrated.map((t) => t.benchmarkId).filter((x): x is string => !!x))];
  const names = new Map(
    benchmarkIds.length
      ? (await db.select({ id: benchmark.id, name: benchmark.name }).from(benchmark).where(and(eq(benchmark.workspaceId, workspaceId), inArray(benchmark.id, benchmarkIds)))).map((b) => [b.id, b.name])
      : [],
  );
  const resolved = [];
  for (const t of hydrated) {
    const subject = await describeSubject(workspaceId, { kind: t.subjectKind, id: t.subjectId }).catch(() => `${t.subjectKind} (no longer present)`);
    resolved.push({ ...t, subject, benchmarkName: t.benchmarkId ? (names.get(t.benchmarkId) ?? null) : null });
  }
  return { decisions: withSubject, threads: resolved };
}
