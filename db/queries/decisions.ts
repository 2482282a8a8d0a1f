import 'server-only';
import { and, desc, eq, inArray, isNull, or } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import { calculation, decision, measurement, method, pairPin, user } from '@/db/schema';
import { AppError } from '@/lib/errors';
import { writeAudit, type Actor } from './audit';
import { requireBenchmark } from './benchmarks';

async function requireMeasurement(tx: Executor, workspaceId: string, measurementId: string) {
  const rows = await tx
    .select({ id: measurement.id, materialId: measurement.materialId })
    .from(measurement)
    .where(and(eq(measurement.workspaceId, workspaceId), eq(measurement.id, measurementId)))
    .limit(1);
  if (!rows[0]) throw new AppError('not-found', 'No such measurement in this workspace.');
  return rows[0];
}

async function requireMethod(tx: Executor, workspaceId: string, methodId: string) {
  const rows = await tx.select({ id: method.id }).from(method).where(and(eq(method.workspaceId, workspaceId), eq(method.id, methodId))).limit(1);
  if (!rows[0]) throw new AppError('not-found', 'No such method in this workspace.');
}

export interface DecisionInput {
  benchmarkId: string;
  kind: 'exclude-pair' | 'exclude-measurement' | 'keep';
  measurementId: string;
  /** Required for 'exclude-pair' and 'keep'; ignored for 'exclude-measurement' (every method). */
  methodId?: string | null;
  reason: string;
  threadId?: string | null;
}

/** Records a curator's decision with its audit row, in one transaction. */
export async function createDecision(workspaceId: string, actor: Actor, input: DecisionInput): Promise<{ id: string }> {
  const reason = input.reason.trim();
  if (!reason) throw new AppError('bad-request', 'A decision needs a reason.', [{ path: 'reason' }]);
  const methodId = input.kind === 'exclude-measurement' ? null : (input.methodId ?? null);
  if (input.kind !== 'exclude-measurement' && !methodId) throw new AppError('bad-request', 'Excluding or keeping a pair needs its method.', [{ path: 'methodId' }]);
  return db.transaction(async (tx) => {
    await requireBenchmark(workspaceId, input.benchmarkId, tx);
    await requireMeasurement(tx, workspaceId, input.measurementId);
    if (methodId) await requireMethod(tx, workspaceId, methodId);
    const active = await tx
      .select({ id: decision.id })
      .from(decision)
      .where(
        and(
          eq(decision.workspaceId, workspaceId),
          eq(decision.benchmarkId, input.benchmarkId),
          eq(decision.measurementId, input.measurementId),
          eq(decision.kind, input.kind),
          methodId ? eq(decision.methodId, methodId) : isNull(decision.methodId),
          isNull(decision.revertedAt),
        ),
      )
      .limit(1);
    if (active[0]) throw new AppError('conflict', 'The same decision is already in force; revert it first to change its reason.');
    const [row] = await tx
      .insert(decision)
      .values({
        workspaceId,
        benchmarkId: input.benchmarkId,
        kind: input.kind,
        measurementId: input.measurementId,
        methodId,
        reason,
        threadId: input.threadId ?? null,
        createdBy: actor.userId,
      })
      .returning();
    await writeAudit({ workspaceId, actor, action: 'decide', entityType: 'decision', entityId: row.id, after: row, reason }, tx);
    return { id: row.id };
  });
}

/** Reverts a decision (it stays on record with who reverted it, when and why). */
export async function revertDecision(workspaceId: string, actor: Actor, decisionId: string, reason: string): Promise<{ benchmarkId: string | null }> {
  const why = reason.trim();
  if (!why) throw new AppError('bad-request', 'Reverting a decision needs a reason.', [{ path: 'reason' }]);
  return db.transaction(async (tx) => {
    const rows = await tx.select().from(decision).where(and(eq(decision.workspaceId, workspaceId), eq(decision.id, decisionId))).limit(1);
    const before = rows[0];
    if (!before) throw new AppError('not-found', 'No such decision in this workspace.');
    if (before.revertedAt) throw new AppError('conflict', 'This decision was already reverted.');
    const revertedAt = new Date();
    await tx
      .update(decision)
      .set({ revertedAt, revertedBy: actor.userId, revertReason: why })
      .where(and(eq(decision.workspaceId, workspaceId), eq(decision.id, decisionId)));
    await writeAudit({
      workspaceId,
      actor,
      action: 'revert',
      entityType: 'decision',
      entityId: decisionId,
      before,
      after: { ...before, revertedAt, revertedBy: actor.userId, revertReason: why },
      reason: why,
    }, tx);
    return { benchmarkId: before.benchmarkId };
  });
}

export interface PinInput {
  methodId: string;
  measurementId: string;
  /** null: the measurement has no counterpart under this method. */
  calculationId: string | null;
  reason: string;
}

/** Pins a pairing (replacing an earlier active pin of the same measurement and method), audited. */
export async function createPin(workspaceId: string, actor: Actor, input: PinInput): Promise<{ id: string }> {
  const reason = input.reason.trim();
  if (!reason) throw new AppError('bad-request', 'A pin needs a reason.', [{ path: 'reason' }]);
  return db.transaction(async (tx) => {
    const m = await requireMeasurement(tx, workspaceId, input.measurementId);
    await requireMethod(tx, workspaceId, input.methodId);
    if (input.calculationId) {
      const calc = await tx
        .select({ id: calculation.id, methodId: calculation.methodId, materialId: calculation.materialId })
        .from(calculation)
        .where(and(eq(calculation.workspaceId, workspaceId), eq(calculation.id, input.calculationId)))
        .limit(1);
      if (!calc[0]) throw new AppError('not-found', 'No such calculation in this workspace.');
      if (calc[0].methodId !== input.methodId || calc[0].materialId !== m.materialId) {
        throw new AppError('bad-request', 'The calculation must be of the same method and material as the measurement.', [{ path: 'calculationId' }]);
      }
    }
    const previous = await tx
      .select()
      .from(pairPin)
      .where(
        and(eq(pairPin.workspaceId, workspaceId), eq(pairPin.methodId, input.methodId), eq(pairPin.measurementId, input.measurementId), isNull(pairPin.revokedAt)),
      );
    const now = new Date();
    for (const old of previous) {
      await tx.update(pairPin).set({ revokedAt: now, revokedBy: actor.userId }).where(eq(pairPin.id, old.id));
      await writeAudit({ workspaceId, actor, action: 'revert', entityType: 'pair-pin', entityId: old.id, before: old, reason: `replaced: ${reason}` }, tx);
    }
    const [row] = await tx
      .insert(pairPin)
      .values({ workspaceId, methodId: input.methodId, measurementId: input.measurementId, calculationId: input.calculationId, reason, createdBy: actor.userId })
      .returning();
    await writeAudit({ workspaceId, actor, action: 'decide', entityType: 'pair-pin', entityId: row.id, after: row, reason }, tx);
    return { id: row.id };
  });
}

export async function revokePin(workspaceId: string, actor: Actor, pinId: string, reason: string): Promise<void> {
  const why = reason.trim();
  if (!why) throw new AppError('bad-request', 'Removing a pin needs a reason.', [{ path: 'reason' }]);
  await db.transaction(async (tx) => {
    const rows = await tx.select().from(pairPin).where(and(eq(pairPin.workspaceId, workspaceId), eq(pairPin.id, pinId))).limit(1);
    const before = rows[0];
    if (!before) throw new AppError('not-found', 'No such pin in this workspace.');
    if (before.revokedAt) throw new AppError('conflict', 'This pin was already removed.');
    const revokedAt = new Date();
    await tx.update(pairPin).set({ revokedAt, revokedBy: actor.userId }).where(eq(pairPin.id, pinId));
    await writeAudit({ workspaceId, actor, action: 'revert', entityType: 'pair-pin', entityId: pinId, before, after: { ...before, revokedAt }, reason: why }, tx);
  });
}

/** Decisions of a benchmark (and workspace-wide ones), newest first, with names. */
export async function listDecisions(workspaceId: string, benchmarkId: string) {
  return db
    .select({
      id: decision.id,
      kind: decision.kind,
      measurementId: decision.measurementId,
      methodId: decision.methodId,
      methodLabel: method.label,
      reason: decision.reason,
      createdAt: decision.createdAt,
      createdBy: user.name,
      revertedAt: decision.revertedAt,
      revertReason: decision.revertReason,
    })
    .from(decision)
    .leftJoin(user, eq(decision.createdBy, user.id))
    .leftJoin(method, eq(decision.methodId, method.id))
    .where(and(eq(decision.workspaceId, workspaceId), or(eq(decision.benchmarkId, benchmarkId), isNull(decision.benchmarkId))))
    .orderBy(desc(decision.createdAt));
}

/** Active pins of the workspace for some methods, with names. */
export async function listPins(workspaceId: string) {
  return db
    .select({
      id: pairPin.id,
      methodId: pairPin.methodId,
      methodLabel: method.label,
      measurementId: pairPin.measurementId,
      calculationId: pairPin.calculationId,
      reason: pairPin.reason,
      createdAt: pairPin.createdAt,
      createdBy: user.name,
    })
    .from(pairPin)
    .leftJoin(user, eq(pairPin.createdBy, user.id))
    .leftJoin(method, eq(pairPin.methodId, method.id))
    .where(and(eq(pairPin.workspaceId, workspaceId), isNull(pairPin.revokedAt)))
    .orderBy(desc(pairPin.createdAt));
}

/** Who decided what, by id (for the revision history). */
export async function decisionNames(workspaceId: string, ids: string[]) {
  if (ids.length === 0) return new Map<string, { kind: string; reason: string; by: string | null }>();
  const rows = await db
    .select({ id: decision.id, kind: decision.kind, reason: decision.reason, by: user.name })
    .from(decision)
    .leftJoin(user, eq(decision.createdBy, user.id))
    .where(and(eq(decision.workspaceId, workspaceId), inArray(decision.id, ids)));
  return new Map(rows.map((r) => [r.id, r]));
}
