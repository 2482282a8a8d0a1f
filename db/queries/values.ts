import 'server-only';
import { and, asc, count, type AnyColumn, desc, eq, inArray, isNull, sql, type SQL } from 'drizzle-orm';
import { db } from '@/db/client';
import { alias } from 'drizzle-orm/sqlite-core';
import { calculation, importBatch, material, measurement, method, source, user } from '@/db/schema';
import { likePattern } from '@/lib/catalog/list-params';
import type { ValueListParams, ValueSortKey } from '@/lib/catalog/value-list-params';

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

/*
 * The measurement and calculation tables of the web pages. Filters on related records
 * (material name, source cite key) are `IN (subquery)` conditions on the value table, so
 * the COUNT never joins; a page is chosen by LIMIT/OFFSET over ids first (sorting by a
 * related name through a correlated lookup), and only that page's ids are joined.
 */

type ValueTable = typeof measurement | typeof calculation;

function tableFilter(t: ValueTable, workspaceId: string, p: ValueListParams): Array<SQL | undefined> {
  const c: Array<SQL | undefined> = [eq(t.workspaceId, workspaceId)];
  if (!p.retracted) c.push(isNull(t.retractedAt));
  if (p.quantity) c.push(eq(t.quantity, p.quantity));
  if (p.import) c.push(eq(t.importId, p.import));
  if (p.q) {
    const pattern = likePattern(p.q);
    c.push(
      inArray(
        t.materialId,
        db
          .select({ id: material.id })
          .from(material)
          .where(and(eq(material.workspaceId, workspaceId), sql`(${material.name} like ${pattern} escape '\\' or ${material.displayName} like ${pattern} escape '\\')`)),
      ),
    );
  }
  if (p.source) {
    const pattern = likePattern(p.source);
    c.push(
      inArray(
        t.sourceId,
        db
          .select({ id: source.id })
          .from(source)
          .where(and(eq(source.workspaceId, workspaceId), sql`${source.citeKey} like ${pattern} escape '\\'`)),
      ),
    );
  }
  return c;
}

function sortKeyOf(p: ValueListParams, allowed: readonly ValueSortKey[]): ValueSortKey {
  return p.sort && (allowed as readonly string[]).includes(p.sort) ? (p.sort as ValueSortKey) : 'created';
}

function sortExpression(t: ValueTable, key: ValueSortKey): SQL | AnyColumn {
  switch (key) {
    case 'value':
      return t.value;
    case 'temperature':
      return t.temperatureK;
    case 'material':
      return sql`(select ${material.name} from ${material} where ${material.id} = ${t.materialId})`;
    case 'method':
      return sql`(select ${method.label} from ${method} where ${method.id} = ${calculation.methodId})`;
    default:
      return t.createdAt;
  }
}

async function pageOfIds(t: ValueTable, where: SQL | undefined, key: ValueSortKey, p: ValueListParams) {
  const expr = sortExpression(t, key);
  const order = p.dir === 'desc' ? desc(expr) : asc(expr);
  const [ids, [{ total }]] = await Promise.all([
    db
      .select({ id: t.id })
      .from(t)
      .where(where)
      .orderBy(order, p.dir === 'desc' ? desc(t.id) : asc(t.id))
      .limit(p.size)
      .offset((p.page - 1) * p.size),
    db.select({ total: count() }).from(t).where(where),
  ]);
  return { ids: ids.map((r) => r.id), total };
}

function inPageOrder<R extends { id: string }>(ids: string[], rows: R[]): R[] {
  const byId = new Map(rows.map((r) => [r.id, r]));
  return ids.map((id) => byId.get(id)).filter((r): r is R => r !== undefined);
}

const MEASUREMENT_SORTS: readonly ValueSortKey[] = ['value', 'material', 'temperature', 'created'];
const CALCULATION_SORTS: readonly ValueSortKey[] = ['value', 'material', 'method', 'temperature', 'created'];

function commonColumns(t: ValueTable) {
  return {
    id: t.id,
    materialId: t.materialId,
    materialName: material.name,
    quantity: t.quantity,
    value: t.value,
    valueText: t.valueText,
    unit: t.unit,
    uncertainty: t.uncertainty,
    uncertaintyText: t.uncertaintyText,
    temperatureK: t.temperatureK,
    temperatureText: t.temperatureText,
    irrep: t.irrep,
    branch: t.branch,
    activity: t.activity,
    sourceId: t.sourceId,
    citeKey: source.citeKey,
    sourceGaps: source.gaps,
    importId: t.importId,
    contributorName: user.name,
    createdAt: t.createdAt,
    retractedAt: t.retractedAt,
  };
}

/** One page of measurements for the table (material, source and contributor joined on the page only). */
export async function listMeasurementRows(workspaceId: string, p: ValueListParams) {
  const where = and(...tableFilter(measurement, workspaceId, p), p.technique ? eq(measurement.technique, p.technique) : undefined);
  const sort = sortKeyOf(p, MEASUREMENT_SORTS);
  const { ids, total } = await pageOfIds(measurement, where, sort, p);
  const rows = ids.length
    ? await db
        .select({ ...commonColumns(measurement), technique: measurement.technique, sampleForm: measurement.sampleForm })
        .from(measurement)
        .innerJoin(material, eq(material.id, measurement.materialId))
        .innerJoin(source, eq(source.id, measurement.sourceId))
        .leftJoin(user, eq(user.id, measurement.contributorId))
        .where(and(eq(measurement.workspaceId, workspaceId), inArray(measurement.id, ids)))
    : [];
  return { rows: inPageOrder(ids, rows), total, sort };
}

/** One page of calculations for the table, optionally of one method. */
export async function listCalculationRows(workspaceId: string, p: ValueListParams) {
  const where = and(...tableFilter(calculation, workspaceId, p), p.method ? eq(calculation.methodId, p.method) : undefined);
  const sort = sortKeyOf(p, CALCULATION_SORTS);
  const { ids, total } = await pageOfIds(calculation, where, sort, p);
  const rows = ids.length
    ? await db
        .select({ ...commonColumns(calculation), methodId: calculation.methodId, methodLabel: method.label, modeIndex: calculation.modeIndex })
        .from(calculation)
        .innerJoin(material, eq(material.id, calculation.materialId))
        .innerJoin(source, eq(source.id, calculation.sourceId))
        .innerJoin(method, eq(method.id, calculation.methodId))
        .leftJoin(user, eq(user.id, calculation.contributorId))
        .where(and(eq(calculation.workspaceId, workspaceId), inArray(calculation.id, ids)))
    : [];
  return { rows: inPageOrder(ids, rows), total, sort };
}

export type MeasurementTableRow = Awaited<ReturnType<typeof listMeasurementRows>>['rows'][number];
export type CalculationTableRow = Awaited<ReturnType<typeof listCalculationRows>>['rows'][number];

/** Methods of the workspace for the calculation table's filter. */
export async function listMethodChoices(workspaceId: string) {
  return db.select({ id: method.id, label: method.label }).from(method).where(eq(method.workspaceId, workspaceId)).orderBy(asc(method.label));
}

/**
 * One measurement or calculation as its history page shows it: what it is (for the
 * title), and how it came and went (its creation and retraction are stored on the
 * row and on its import, not as audit rows of its own).
 */
export async function getValueRecord(workspaceId: string, kind: 'measurement' | 'calculation', id: string) {
  const t = kind === 'measurement' ? measurement : calculation;
  const retractor = alias(user, 'retractor');
  const rows = await db
    .select({
      ...commonColumns(t),
      retractionReason: t.retractionReason,
      retractedByName: retractor.name,
      importFileName: importBatch.fileName,
      importVia: importBatch.via,
      importCreatedAt: importBatch.createdAt,
    })
    .from(t)
    .innerJoin(material, eq(material.id, t.materialId))
    .innerJoin(source, eq(source.id, t.sourceId))
    .leftJoin(user, eq(user.id, t.contributorId))
    .leftJoin(retractor, eq(retractor.id, t.retractedBy))
    .leftJoin(importBatch, eq(importBatch.id, t.importId))
    .where(and(eq(t.workspaceId, workspaceId), eq(t.id, id)))
    .limit(1);
  const row = rows[0];
  if (!row) return null;
  const methodLabel =
    kind === 'calculation'
      ? ((await db.select({ label: method.label }).from(method).innerJoin(calculation, eq(calculation.methodId, method.id)).where(eq(calculation.id, id)).limit(1))[0]?.label ?? null)
      : null;
  return { ...row, methodLabel };
}
export type ValueRecord = NonNullable<Awaited<ReturnType<typeof getValueRecord>>>;
