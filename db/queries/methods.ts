import 'server-only';
import { and, asc, count, desc, eq, inArray, isNull, or, sql, type SQL } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import { calculation, material, method, type Method } from '@/db/schema';
import { AppError } from '@/lib/errors';
import { likePattern, type ListParams } from '@/lib/catalog/list-params';
import type { MethodInput } from '@/lib/catalog/method-schema';
import { writeAudit, type Actor } from './audit';

const SORTABLE = {
  label: method.label,
  functional: method.functional,
  pseudopotential: method.pseudopotential,
  cutoffEv: method.cutoffEv,
  approach: method.approach,
  createdAt: method.createdAt,
} as const;

function listFilter(workspaceId: string, params: ListParams): SQL | undefined {
  const conditions: Array<SQL | undefined> = [eq(method.workspaceId, workspaceId)];
  if (!params.retracted) conditions.push(isNull(method.retractedAt));
  if (params.q) {
    const pattern = likePattern(params.q);
    conditions.push(or(...[method.label, method.functional, method.pseudopotential, method.dispersion, method.notes].map((c) => sql`${c} like ${pattern} escape '\\'`)));
  }
  return and(...conditions);
}

export type MethodListRow = Awaited<ReturnType<typeof listMethods>>['rows'][number];

export async function listMethods(workspaceId: string, params: ListParams) {
  const where = listFilter(workspaceId, params);
  const sortKey = params.sort && Object.hasOwn(SORTABLE, params.sort) ? (params.sort as keyof typeof SORTABLE) : 'label';
  const order = params.dir === 'desc' ? desc(SORTABLE[sortKey]) : asc(SORTABLE[sortKey]);
  const [rows, [{ total }]] = await Promise.all([
    db
      .select({
        id: method.id,
        label: method.label,
        functional: method.functional,
        dispersion: method.dispersion,
        pseudopotential: method.pseudopotential,
        cutoffEv: method.cutoffEv,
        kGrid: method.kGrid,
        qGrid: method.qGrid,
        approach: method.approach,
        nonAnalyticCorrection: method.nonAnalyticCorrection,
        retractedAt: method.retractedAt,
      })
      .from(method)
      .where(where)
      .orderBy(order, asc(method.id))
      .limit(params.size)
      .offset((params.page - 1) * params.size),
    db.select({ total: count() }).from(method).where(where),
  ]);
  const counts = await calculationCounts(workspaceId, rows.map((r) => r.id));
  return { rows: rows.map((r) => ({ ...r, calculationCount: counts.get(r.id) ?? 0 })), total, sort: sortKey };
}

async function calculationCounts(workspaceId: string, methodIds: string[]): Promise<Map<string, number>> {
  if (methodIds.length === 0) return new Map();
  const rows = await db
    .select({ methodId: calculation.methodId, n: count() })
    .from(calculation)
    .where(and(eq(calculation.workspaceId, workspaceId), inArray(calculation.methodId, methodIds), isNull(calculation.retractedAt)))
    .groupBy(calculation.methodId);
  return new Map(rows.map((r) => [r.methodId, r.n]));
}

async function loadMethod(executor: Executor, workspaceId: string, id: string): Promise<Method | null> {
  const rows = await executor.select().from(method).where(and(eq(method.workspaceId, workspaceId), eq(method.id, id))).limit(1);
  return rows[0] ?? null;
}

export async function getMethod(workspaceId: string, id: string): Promise<Method | null> {
  return loadMethod(db, workspaceId, id);
}

async function requireMethod(executor: Executor, workspaceId: string, id: string): Promise<Method> {
  const found = await loadMethod(executor, workspaceId, id);
  if (!found) throw new AppError('not-found', 'No such method in this workspace.');
  return found;
}

/** Labels are unique for good (retracted methods included): calculations refer to them by label. */
async function assertLabelFree(executor: Executor, workspaceId: string, label: string, exceptId?: string) {
  const clash = await executor
    .select({ id: method.id, retractedAt: method.retractedAt })
    .from(method)
    .where(and(eq(method.workspaceId, workspaceId), eq(method.label, label)))
    .limit(1);
  if (clash[0] && clash[0].id !== exceptId) {
    const retracted = clash[0].retractedAt ? ' (retracted)' : '';
    throw new AppError('conflict', `A method labelled "${label}" already exists${retracted} in this workspace.`, { field: 'label' });
  }
}

function snapshot(m: Method) {
  const { workspaceId: _w, createdBy: _c, createdAt: _a, updatedAt: _u, retractedBy: _r, retractedAt, ...fields } = m;
  return { ...fields, retractedAt: retractedAt?.toISOString() ?? null };
}

function columnsOf(input: MethodInput) {
  return {
    label: input.label,
    functional: input.functional,
    dispersion: input.dispersion ?? null,
    pseudopotential: input.pseudopotential ?? null,
    cutoffEv: input.cutoffEv ?? null,
    kGrid: input.kGrid ?? null,
    qGrid: input.qGrid ?? null,
    smearing: input.smearing ?? null,
    approach: input.approach ?? null,
    nonAnalyticCorrection: input.nonAnalyticCorrection ?? null,
    notes: input.notes ?? null,
  };
}

export async function createMethod(workspaceId: string, actor: Actor, input: MethodInput): Promise<string> {
  return db.transaction(async (tx) => {
    await assertLabelFree(tx, workspaceId, input.label);
    const [row] = await tx.insert(method).values({ workspaceId, createdBy: actor.userId, ...columnsOf(input) }).returning();
    await writeAudit({ workspaceId, actor, action: 'create', entityType: 'method', entityId: row.id, after: snapshot(row) }, tx);
    return row.id;
  });
}

export async function updateMethod(workspaceId: string, actor: Actor, id: string, input: MethodInput): Promise<void> {
  await db.transaction(async (tx) => {
    const before = await requireMethod(tx, workspaceId, id);
    if (before.retractedAt) throw new AppError('conflict', 'This method is retracted: restore it before editing.');
    await assertLabelFree(tx, workspaceId, input.label, id);
    const [after] = await tx
      .update(method)
      .set({ ...columnsOf(input), updatedAt: new Date() })
      .where(and(eq(method.workspaceId, workspaceId), eq(method.id, id)))
      .returning();
    await writeAudit({ workspaceId, actor, action: 'update', entityType: 'method', entityId: id, before: snapshot(before), after: snapshot(after) }, tx);
  });
}

export async function retractMethod(workspaceId: string, actor: Actor, id: string, reason: string): Promise<void> {
  await db.transaction(async (tx) => {
    const before = await requireMethod(tx, workspaceId, id);
    if (before.retractedAt) throw new AppError('conflict', 'This method is already retracted.');
    const [after] = await tx
      .update(method)
      .set({ retractedAt: new Date(), retractedBy: actor.userId, retractionReason: reason })
      .where(and(eq(method.workspaceId, workspaceId), eq(method.id, id)))
      .returning();
    await writeAudit({ workspaceId, actor, action: 'retract', entityType: 'method', entityId: id, before: snapshot(before), after: snapshot(after), reason }, tx);
  });
}

export async function restoreMethod(workspaceId: string, actor: Actor, id: string, reason: string | null): Promise<void> {
  await db.transaction(async (tx) => {
    const before = await requireMethod(tx, workspaceId, id);
    if (!before.retractedAt) throw new AppError('conflict', 'This method is not retracted.');
    const [after] = await tx
      .update(method)
      .set({ retractedAt: null, retractedBy: null, retractionReason: null, updatedAt: new Date() })
      .where(and(eq(method.workspaceId, workspaceId), eq(method.id, id)))
      .returning();
    await writeAudit({ workspaceId, actor, action: 'restore', entityType: 'method', entityId: id, before: snapshot(before), after: snapshot(after), reason }, tx);
  });
}

/** Materials that have calculations of this method, with their atoms in the cell (for the k-point density). */
export async function listMaterialsOfMethod(workspaceId: string, methodId: string, limit = 200) {
  const rows = await db
    .select({
      id: material.id,
      name: material.name,
      reducedFormula: material.reducedFormula,
      atomsInCell: material.atomsInCell,
      calculationCount: count(calculation.id),
    })
    .from(calculation)
    .innerJoin(material, eq(calculation.materialId, material.id))
    .where(and(eq(calculation.workspaceId, workspaceId), eq(calculation.methodId, methodId), isNull(calculation.retractedAt)))
    .groupBy(material.id)
    .orderBy(asc(material.name))
    .limit(limit + 1);
  return { rows: rows.slice(0, limit), more: rows.length > limit };
}
