import 'server-only';
import { and, asc, count, desc, eq, inArray, isNull, or, sql, type SQL } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import { calculation, material, materialTag, measurement, type Material } from '@/db/schema';
import { AppError } from '@/lib/errors';
import { likePattern, type ListParams } from '@/lib/catalog/list-params';
import { deriveMaterial, type MaterialInput } from '@/lib/catalog/material-schema';
import { writeAudit, type Actor } from './audit';

const SORTABLE = {
  name: material.name,
  reducedFormula: material.reducedFormula,
  spaceGroup: material.spaceGroup,
  crystalSystem: material.crystalSystem,
  atomsInCell: material.atomsInCell,
  createdAt: material.createdAt,
} as const;

function listFilter(workspaceId: string, params: ListParams): SQL | undefined {
  const conditions: Array<SQL | undefined> = [eq(material.workspaceId, workspaceId)];
  if (!params.retracted) conditions.push(isNull(material.retractedAt));
  if (params.q) {
    const pattern = likePattern(params.q);
    conditions.push(
      or(
        sql`${material.name} like ${pattern} escape '\\'`,
        sql`${material.displayName} like ${pattern} escape '\\'`,
        sql`${material.formula} like ${pattern} escape '\\'`,
        sql`${material.reducedFormula} like ${pattern} escape '\\'`,
        sql`${material.externalId} like ${pattern} escape '\\'`,
      ),
    );
  }
  if (params.tag) {
    conditions.push(sql`exists (select 1 from ${materialTag} where ${materialTag.materialId} = ${material.id} and ${materialTag.tag} = ${params.tag.toLowerCase()})`);
  }
  if (params.system) conditions.push(eq(material.crystalSystem, params.system));
  return and(...conditions);
}

export type MaterialListRow = Awaited<ReturnType<typeof listMaterials>>['rows'][number];

/** One page of materials (LIMIT/OFFSET), sorted by a whitelisted column, with the total count of the filter. */
export async function listMaterials(workspaceId: string, params: ListParams) {
  const where = listFilter(workspaceId, params);
  const sortKey = params.sort && Object.hasOwn(SORTABLE, params.sort) ? (params.sort as keyof typeof SORTABLE) : 'name';
  const order = params.dir === 'desc' ? desc(SORTABLE[sortKey]) : asc(SORTABLE[sortKey]);
  const [rows, [{ total }]] = await Promise.all([
    db
      .select({
        id: material.id,
        name: material.name,
        displayName: material.displayName,
        formula: material.formula,
        reducedFormula: material.reducedFormula,
        atomsPerFormulaUnit: material.atomsPerFormulaUnit,
        spaceGroup: material.spaceGroup,
        crystalSystem: material.crystalSystem,
        atomsInCell: material.atomsInCell,
        retractedAt: material.retractedAt,
      })
      .from(material)
      .where(where)
      .orderBy(order, asc(material.id))
      .limit(params.size)
      .offset((params.page - 1) * params.size),
    db.select({ total: count() }).from(material).where(where),
  ]);
  const ids = rows.map((r) => r.id);
  const [measured, computed, tags] = await Promise.all([valueCounts(measurement, workspaceId, ids), valueCounts(calculation, workspaceId, ids), tagsOfMaterials(workspaceId, ids)]);
  return {
    rows: rows.map((r) => ({ ...r, tags: tags.get(r.id) ?? [], measurementCount: measured.get(r.id) ?? 0, calculationCount: computed.get(r.id) ?? 0 })),
    total,
    sort: sortKey,
  };
}

/**
 * Unretracted values per material of one page, in a single grouped pass (the calculation
 * index leads with the method, so a per-row subquery would scan the workspace once per row).
 */
async function valueCounts(table: typeof measurement | typeof calculation, workspaceId: string, materialIds: string[]): Promise<Map<string, number>> {
  if (materialIds.length === 0) return new Map();
  const rows = await db
    .select({ materialId: table.materialId, n: count() })
    .from(table)
    .where(and(eq(table.workspaceId, workspaceId), inArray(table.materialId, materialIds), isNull(table.retractedAt)))
    .groupBy(table.materialId);
  return new Map(rows.map((r) => [r.materialId, r.n]));
}

async function tagsOfMaterials(workspaceId: string, materialIds: string[]): Promise<Map<string, string[]>> {
  const out = new Map<string, string[]>();
  if (materialIds.length === 0) return out;
  const rows = await db
    .select({ materialId: materialTag.materialId, tag: materialTag.tag })
    .from(materialTag)
    .where(and(eq(materialTag.workspaceId, workspaceId), inArray(materialTag.materialId, materialIds)))
    .orderBy(asc(materialTag.tag));
  for (const r of rows) out.set(r.materialId, [...(out.get(r.materialId) ?? []), r.tag]);
  return out;
}

/** Tags in use in the workspace, for the filter. */
export async function listMaterialTags(workspaceId: string): Promise<string[]> {
  const rows = await db.selectDistinct({ tag: materialTag.tag }).from(materialTag).where(eq(materialTag.workspaceId, workspaceId)).orderBy(asc(materialTag.tag));
  return rows.map((r) => r.tag);
}

export type MaterialWithTags = Material & { tags: string[] };

async function loadMaterial(executor: Executor, workspaceId: string, id: string): Promise<MaterialWithTags | null> {
  const rows = await executor.select().from(material).where(and(eq(material.workspaceId, workspaceId), eq(material.id, id))).limit(1);
  if (!rows[0]) return null;
  const tags = await executor.select({ tag: materialTag.tag }).from(materialTag).where(eq(materialTag.materialId, id)).orderBy(asc(materialTag.tag));
  return { ...rows[0], tags: tags.map((t) => t.tag) };
}

export async function getMaterial(workspaceId: string, id: string): Promise<MaterialWithTags | null> {
  return loadMaterial(db, workspaceId, id);
}

async function requireMaterial(executor: Executor, workspaceId: string, id: string): Promise<MaterialWithTags> {
  const found = await loadMaterial(executor, workspaceId, id);
  if (!found) throw new AppError('not-found', 'No such material in this workspace.');
  return found;
}

async function assertNameFree(executor: Executor, workspaceId: string, name: string, exceptId?: string) {
  const clash = await executor
    .select({ id: material.id })
    .from(material)
    .where(and(eq(material.workspaceId, workspaceId), eq(material.name, name), isNull(material.retractedAt)))
    .limit(1);
  if (clash[0] && clash[0].id !== exceptId) {
    throw new AppError('conflict', `A material named "${name}" already exists in this workspace.`, { field: 'name' });
  }
}

/** What the audit trail keeps of a material (dates as ISO strings). */
function snapshot(m: MaterialWithTags) {
  return {
    name: m.name,
    displayName: m.displayName,
    formula: m.formula,
    reducedFormula: m.reducedFormula,
    atomsPerFormulaUnit: m.atomsPerFormulaUnit,
    spaceGroup: m.spaceGroup,
    crystalSystem: m.crystalSystem,
    atomsInCell: m.atomsInCell,
    externalId: m.externalId,
    thermalExpansionPerK: m.thermalExpansionPerK,
    bulkModulusGpa: m.bulkModulusGpa,
    molarVolumeCm3: m.molarVolumeCm3,
    tags: m.tags,
    retractedAt: m.retractedAt?.toISOString() ?? null,
    retractionReason: m.retractionReason,
  };
}

function columnsOf(input: MaterialInput) {
  const derived = deriveMaterial(input);
  return {
    name: input.name,
    displayName: input.displayName ?? null,
    formula: input.formula,
    reducedFormula: derived.reducedFormula,
    atomsPerFormulaUnit: derived.atomsPerFormulaUnit,
    elementCounts: derived.elementCounts,
    spaceGroup: input.spaceGroup ?? null,
    crystalSystem: derived.crystalSystem,
    atomsInCell: input.atomsInCell ?? null,
    externalId: input.externalId ?? null,
    thermalExpansionPerK: input.thermalExpansionPerK ?? null,
    bulkModulusGpa: input.bulkModulusGpa ?? null,
    molarVolumeCm3: input.molarVolumeCm3 ?? null,
  };
}

async function writeTags(executor: Executor, workspaceId: string, materialId: string, tags: string[]) {
  await executor.delete(materialTag).where(eq(materialTag.materialId, materialId));
  if (tags.length) await executor.insert(materialTag).values(tags.map((tag) => ({ materialId, workspaceId, tag })));
}

export async function createMaterial(workspaceId: string, actor: Actor, input: MaterialInput): Promise<string> {
  return db.transaction(async (tx) => {
    await assertNameFree(tx, workspaceId, input.name);
    const [row] = await tx
      .insert(material)
      .values({ workspaceId, createdBy: actor.userId, ...columnsOf(input) })
      .returning({ id: material.id });
    await writeTags(tx, workspaceId, row.id, input.tags);
    const after = await requireMaterial(tx, workspaceId, row.id);
    await writeAudit({ workspaceId, actor, action: 'create', entityType: 'material', entityId: row.id, after: snapshot(after) }, tx);
    return row.id;
  });
}

export async function updateMaterial(workspaceId: string, actor: Actor, id: string, input: MaterialInput): Promise<void> {
  await db.transaction(async (tx) => {
    const before = await requireMaterial(tx, workspaceId, id);
    if (before.retractedAt) throw new AppError('conflict', 'This material is retracted: restore it before editing.');
    await assertNameFree(tx, workspaceId, input.name, id);
    await tx
      .update(material)
      .set({ ...columnsOf(input), updatedAt: new Date() })
      .where(and(eq(material.workspaceId, workspaceId), eq(material.id, id)));
    await writeTags(tx, workspaceId, id, input.tags);
    const after = await requireMaterial(tx, workspaceId, id);
    await writeAudit({ workspaceId, actor, action: 'update', entityType: 'material', entityId: id, before: snapshot(before), after: snapshot(after) }, tx);
  });
}

export async function retractMaterial(workspaceId: string, actor: Actor, id: string, reason: string): Promise<void> {
  await db.transaction(async (tx) => {
    const before = await requireMaterial(tx, workspaceId, id);
    if (before.retractedAt) throw new AppError('conflict', 'This material is already retracted.');
    await tx
      .update(material)
      .set({ retractedAt: new Date(), retractedBy: actor.userId, retractionReason: reason })
      .where(and(eq(material.workspaceId, workspaceId), eq(material.id, id)));
    const after = await requireMaterial(tx, workspaceId, id);
    await writeAudit({ workspaceId, actor, action: 'retract', entityType: 'material', entityId: id, before: snapshot(before), after: snapshot(after), reason }, tx);
  });
}

export async function restoreMaterial(workspaceId: string, actor: Actor, id: string, reason: string | null): Promise<void> {
  await db.transaction(async (tx) => {
    const before = await requireMaterial(tx, workspaceId, id);
    if (!before.retractedAt) throw new AppError('conflict', 'This material is not retracted.');
    await assertNameFree(tx, workspaceId, before.name, id);
    await tx
      .update(material)
      .set({ retractedAt: null, retractedBy: null, retractionReason: null, updatedAt: new Date() })
      .where(and(eq(material.workspaceId, workspaceId), eq(material.id, id)));
    const after = await requireMaterial(tx, workspaceId, id);
    await writeAudit({ workspaceId, actor, action: 'restore', entityType: 'material', entityId: id, before: snapshot(before), after: snapshot(after), reason }, tx);
  });
}
