import 'server-only';
import { and, asc, count, eq, isNull, type SQL } from 'drizzle-orm';
import { db } from '@/db/client';
import { calculation, measurement } from '@/db/schema';

export interface ValueListFilter {
  page: number;
  size: number;
  materialId?: string;
  sourceId?: string;
  importId?: string;
  methodId?: string;
  /** Include retracted rows (default: live rows only). */
  retracted?: boolean;
}

function filterOf<T extends typeof measurement | typeof calculation>(t: T, workspaceId: string, f: ValueListFilter): SQL | undefined {
  const c: Array<SQL | undefined> = [eq(t.workspaceId, workspaceId)];
  if (!f.retracted) c.push(isNull(t.retractedAt));
  if (f.materialId) c.push(eq(t.materialId, f.materialId));
  if (f.sourceId) c.push(eq(t.sourceId, f.sourceId));
  if (f.importId) c.push(eq(t.importId, f.importId));
  return and(...c);
}

/** One page of measurements (stable order: creation time, then id). */
export async function listMeasurements(workspaceId: string, f: ValueListFilter) {
  const where = filterOf(measurement, workspaceId, f);
  const [rows, [{ total }]] = await Promise.all([
    db
      .select()
      .from(measurement)
      .where(where)
      .orderBy(asc(measurement.createdAt), asc(measurement.id))
      .limit(f.size)
      .offset((f.page - 1) * f.size),
    db.select({ total: count() }).from(measurement).where(where),
  ]);
  return { rows, total };
}

export async function getMeasurement(workspaceId: string, id: string) {
  const rows = await db
    .select()
    .from(measurement)
    .where(and(eq(measurement.workspaceId, workspaceId), eq(measurement.id, id)))
    .limit(1);
  return rows[0] ?? null;
}

/** One page of calculations, optionally of one method. */
export async function listCalculations(workspaceId: string, f: ValueListFilter) {
  const base = filterOf(calculation, workspaceId, f);
  const where = f.methodId ? and(base, eq(calculation.methodId, f.methodId)) : base;
  const [rows, [{ total }]] = await Promise.all([
    db
      .select()
      .from(calculation)
      .where(where)
      .orderBy(asc(calculation.createdAt), asc(calculation.id))
      .limit(f.size)
      .offset((f.page - 1) * f.size),
    db.select({ total: count() }).from(calculation).where(where),
  ]);
  return { rows, total };
}

export async function getCalculation(workspaceId: string, id: string) {
  const rows = await db
    .select()
    .from(calculation)
    .where(and(eq(calculation.workspaceId, workspaceId), eq(calculation.id, id)))
    .limit(1);
  return rows[0] ?? null;
}
