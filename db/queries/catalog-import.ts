import 'server-only';
/**
 * Reads and writes of catalogue imports (materials, methods, sources) and of the
 * catalogue records a calculation import creates with createMissing. Records an
 * import creates carry its id (`import_id`); records it updates get one audit row
 * each (action "import-update", before/after, the import id in `after`), so undo
 * can retract the first and restore the second.
 */
import type { Client, InValue, Transaction } from '@libsql/client';
import { and, eq, inArray, isNull, sql } from 'drizzle-orm';
import { createDb, db, getClient, type Executor } from '@/db/client';
import { auditLog, importBatch, material, materialTag, method, source } from '@/db/schema';
import { AppError } from '@/lib/errors';
import type { CatalogKind } from '@/lib/import/catalog-columns';
import type { CatalogRecord, MaterialRecord, MethodRecord, SourceRow, Stored } from '@/lib/import/catalog-rows';
import { writeAudit } from './audit';
import { insertImportBatch, multiRowInsertSql, writeImportAudit, type ImportActor, type ImportFileFacts } from './imports';

const yieldToEventLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

/** Every material of the workspace (live and retracted) as the import compares it. */
async function storedMaterials(workspaceId: string, executor: Executor = db): Promise<Array<Stored<'materials'>>> {
  const rows = await executor
    .select({
      id: material.id,
      name: material.name,
      displayName: material.displayName,
      formula: material.formula,
      reducedFormula: material.reducedFormula,
      atomsPerFormulaUnit: material.atomsPerFormulaUnit,
      elementCounts: material.elementCounts,
      spaceGroup: material.spaceGroup,
      crystalSystem: material.crystalSystem,
      atomsInCell: material.atomsInCell,
      externalId: material.externalId,
      thermalExpansionPerK: material.thermalExpansionPerK,
      bulkModulusGpa: material.bulkModulusGpa,
      molarVolumeCm3: material.molarVolumeCm3,
      retractedAt: material.retractedAt,
      tags: sql<string | null>`(select json_group_array(tag) from (select ${materialTag.tag} as tag from ${materialTag} where ${materialTag.materialId} = ${material.id} order by ${materialTag.tag}))`,
    })
    .from(material)
    .where(eq(material.workspaceId, workspaceId));
  return rows.map(({ retractedAt, tags, ...m }) => ({ ...m, tags: tags ? (JSON.parse(tags) as string[]) : [], retracted: retractedAt !== null }));
}

async function storedMethods(workspaceId: string, executor: Executor = db): Promise<Array<Stored<'methods'>>> {
  const rows = await executor.select().from(method).where(eq(method.workspaceId, workspaceId));
  return rows.map((m) => ({ ...methodRecordOf(m), id: m.id, retracted: m.retractedAt !== null, revivable: revivable(m) }));
}

/** The reason undoCatalogChanges writes; a record retracted for any other reason is not revived by an import. */
const UNDO_REASON_PREFIX = 'Import undone: ';

function revivable(r: { retractedAt: Date | null; retractionReason: string | null; importId: string | null }): boolean {
  return r.retractedAt !== null && r.importId !== null && (r.retractionReason ?? '').startsWith(UNDO_REASON_PREFIX);
}

function methodRecordOf(m: typeof method.$inferSelect): MethodRecord {
  return {
    label: m.label,
    functional: m.functional,
    dispersion: m.dispersion,
    pseudopotential: m.pseudopotential,
    cutoffEv: m.cutoffEv,
    kGrid: m.kGrid,
    qGrid: m.qGrid,
    smearing: m.smearing,
    approach: m.approach,
    nonAnalyticCorrection: m.nonAnalyticCorrection,
    notes: m.notes,
  };
}

async function storedSources(workspaceId: string, executor: Executor = db): Promise<Array<Stored<'sources'>>> {
  const rows = await executor.select().from(source).where(eq(source.workspaceId, workspaceId));
  return rows.map((s) => ({ ...sourceRecordOf(s), id: s.id, retracted: s.retractedAt !== null, revivable: revivable(s) }));
}

function sourceRecordOf(s: typeof source.$inferSelect): SourceRow {
  return {
    kind: s.kind,
    citeKey: s.citeKey,
    doi: s.doi,
    title: s.title,
    authorList: s.authorList ?? [],
    editorList: s.editorList,
    year: s.year,
    venue: s.venue,
    volume: s.volume,
    issue: s.issue,
    pages: s.pages,
    articleNumber: s.articleNumber,
    publisher: s.publisher,
    url: s.url,
    accessedOn: s.accessedOn,
    notebookRef: s.notebookRef,
    instrument: s.instrument,
    operator: s.operator,
    recordedOn: s.recordedOn,
    note: s.note,
    authors: s.authors,
    gaps: s.gaps,
  };
}

/** The stored records an import of `kind` is matched against. */
export async function loadStoredCatalog<K extends CatalogKind>(workspaceId: string, kind: K): Promise<Array<Stored<K>>> {
  if (kind === 'materials') return (await storedMaterials(workspaceId)) as unknown as Array<Stored<K>>;
  if (kind === 'methods') return (await storedMethods(workspaceId)) as unknown as Array<Stored<K>>;
  return (await storedSources(workspaceId)) as unknown as Array<Stored<K>>;
}

const MATERIAL_COLUMNS = ['id', 'workspace_id', 'name', 'display_name', 'formula', 'reduced_formula', 'atoms_per_formula_unit', 'element_counts', 'space_group', 'crystal_system', 'atoms_in_cell', 'external_id', 'thermal_expansion_per_k', 'bulk_modulus_gpa', 'molar_volume_cm3', 'import_id', 'created_by'] as const;
const TAG_COLUMNS = ['material_id', 'workspace_id', 'tag'] as const;
const MATERIAL_CHUNK = 500;
const TAG_CHUNK = 900;

/** Inserts new materials (with their tags) in the open transaction, 500 to a statement. */
export async function insertMaterialRows(raw: Transaction, workspaceId: string, importId: string, userId: string | null, rows: ReadonlyArray<MaterialRecord & { id: string }>): Promise<void> {
  const tags: InValue[] = [];
  let tagCount = 0;
  for (let start = 0; start < rows.length; start += MATERIAL_CHUNK) {
    const chunk = rows.slice(start, start + MATERIAL_CHUNK);
    const args: InValue[] = [];
    for (const m of chunk) {
      args.push(m.id, workspaceId, m.name, m.displayName, m.formula, m.reducedFormula, m.atomsPerFormulaUnit, JSON.stringify(m.elementCounts), m.spaceGroup, m.crystalSystem, m.atomsInCell, m.externalId, m.thermalExpansionPerK, m.bulkModulusGpa, m.molarVolumeCm3, importId, userId);
      for (const tag of m.tags) {
        tags.push(m.id, workspaceId, tag);
        tagCount++;
      }
    }
    await raw.execute({ sql: multiRowInsertSql('material', MATERIAL_COLUMNS, chunk.length), args });
    await yieldToEventLoop();
  }
  const width = TAG_COLUMNS.length;
  for (let start = 0; start < tagCount; start += TAG_CHUNK) {
    const n = Math.min(TAG_CHUNK, tagCount - start);
    await raw.execute({ sql: multiRowInsertSql('material_tag', TAG_COLUMNS, n), args: tags.slice(start * width, (start + n) * width) });
    await yieldToEventLoop();
  }
}

/** Inserts new methods in the open transaction. */
export async function insertMethodRows(tx: Executor, workspaceId: string, importId: string, userId: string | null, rows: ReadonlyArray<MethodRecord & { id: string }>): Promise<void> {
  for (let start = 0; start < rows.length; start += 200) {
    await tx.insert(method).values(rows.slice(start, start + 200).map((m) => ({ ...m, workspaceId, importId, createdBy: userId })));
  }
}

async function insertSourceRows(tx: Executor, workspaceId: string, importId: string, userId: string | null, rows: ReadonlyArray<SourceRow>): Promise<void> {
  for (let start = 0; start < rows.length; start += 100) {
    await tx.insert(source).values(rows.slice(start, start + 100).map((s) => ({ ...s, workspaceId, importId, createdBy: userId })));
  }
}

async function updateRecord(tx: Executor, workspaceId: string, kind: CatalogKind, id: string, after: Record<string, unknown>): Promise<void> {
  const now = new Date();
  if (kind === 'materials') {
    const m = after as unknown as MaterialRecord;
    const { tags, ...columns } = m;
    await tx.update(material).set({ ...columns, updatedAt: now }).where(and(eq(material.workspaceId, workspaceId), eq(material.id, id)));
    await tx.delete(materialTag).where(eq(materialTag.materialId, id));
    if (tags.length) await tx.insert(materialTag).values(tags.map((tag) => ({ materialId: id, workspaceId, tag })));
  } else if (kind === 'methods') {
    await tx.update(method).set({ ...(after as unknown as MethodRecord), updatedAt: now }).where(and(eq(method.workspaceId, workspaceId), eq(method.id, id)));
  } else {
    await tx.update(source).set({ ...(after as unknown as SourceRow), updatedAt: now }).where(and(eq(source.workspaceId, workspaceId), eq(source.id, id)));
  }
}

const ENTITY: Record<CatalogKind, string> = { materials: 'material', methods: 'method', sources: 'source' };
const strip = <T extends object>(r: T) => {
  const { id: _i, retracted: _r, revivable: _v, ...rest } = r as T & { id?: unknown; retracted?: unknown; revivable?: unknown };
  return rest;
};

export interface CatalogWrite<K extends CatalogKind> {
  creates: Array<CatalogRecord<K>>;
  updates: Array<{ id: string; before: Stored<K>; after: CatalogRecord<K> }>;
  /** Records retracted by an import's undo, restored with the row's values and now owned by this import (its undo retracts them again). */
  revives?: Array<{ id: string; before: Stored<K>; record: CatalogRecord<K> }>;
}

/**
 * Commits a catalogue import in one write transaction: the import row (a concurrent
 * import of the same bytes loses on the unique sha256), the new records, the updated
 * records with one audit row each, and the import's audit row. All or nothing.
 */
export async function commitCatalogImport<K extends CatalogKind>(
  workspaceId: string,
  actor: ImportActor,
  file: ImportFileFacts,
  kind: K,
  write: CatalogWrite<K>,
  counts: { rowCount: number; unchangedCount: number },
): Promise<{ importId: string; createdIds: string[] }> {
  const raw: Transaction = await getClient().transaction('write');
  const tx = createDb(raw as unknown as Client);
  const importId = crypto.randomUUID();
  try {
    await insertImportBatch(tx, { id: importId, workspaceId, kind, fileName: file.fileName, sha256: file.sha256, byteCount: file.byteCount, rowCount: counts.rowCount, via: file.via }, actor);
    const created = write.creates.map((r) => ({ ...(r as object), id: crypto.randomUUID() }));
    if (kind === 'materials') await insertMaterialRows(raw, workspaceId, importId, actor.userId, created as unknown as Array<MaterialRecord & { id: string }>);
    else if (kind === 'methods') await insertMethodRows(tx, workspaceId, importId, actor.userId, created as unknown as Array<MethodRecord & { id: string }>);
    else await insertSourceRows(tx, workspaceId, importId, actor.userId, created as unknown as SourceRow[]);
    for (const u of write.updates) {
      await updateRecord(tx, workspaceId, kind, u.id, u.after as unknown as Record<string, unknown>);
      await writeAudit(
        { workspaceId, actor, action: 'import-update', entityType: ENTITY[kind], entityId: u.id, before: strip(u.before), after: { ...(u.after as object), importId }, reason: `Import ${file.fileName ?? importId}` },
        tx,
      );
    }
    for (const r of write.revives ?? []) {
      await updateRecord(tx, workspaceId, kind, r.id, r.record as unknown as Record<string, unknown>);
      const owner = { retractedAt: null, retractedBy: null, retractionReason: null, importId };
      if (kind === 'methods') await tx.update(method).set(owner).where(and(eq(method.workspaceId, workspaceId), eq(method.id, r.id)));
      else await tx.update(source).set(owner).where(and(eq(source.workspaceId, workspaceId), eq(source.id, r.id)));
      await writeAudit(
        { workspaceId, actor, action: 'import-restore', entityType: ENTITY[kind], entityId: r.id, before: strip(r.before), after: { ...(r.record as object), importId }, reason: `Import ${file.fileName ?? importId}` },
        tx,
      );
    }
    const revived = write.revives?.length ?? 0;
    const insertedCount = created.length + revived + write.updates.length;
    const summary = { rowCount: counts.rowCount, insertedCount, duplicateCount: counts.unchangedCount };
    await tx.update(importBatch).set(summary).where(eq(importBatch.id, importId));
    await writeImportAudit(
      workspaceId,
      actor,
      importId,
      { kind, fileName: file.fileName, sha256: file.sha256, byteCount: file.byteCount, via: file.via, rowCount: counts.rowCount, createdCount: created.length + revived, restoredCount: revived, updatedCount: write.updates.length, unchangedCount: counts.unchangedCount },
      tx,
    );
    await raw.commit();
    return { importId, createdIds: created.map((c) => c.id) };
  } catch (e) {
    await raw.rollback().catch(() => undefined);
    throw e;
  } finally {
    raw.close();
  }
}

// ---------------------------------------------------------------- undo

async function liveCount(tx: Executor, table: 'measurement' | 'calculation', column: 'material_id' | 'method_id' | 'source_id', ids: string[], importId: string): Promise<Map<string, number>> {
  const out = new Map<string, number>();
  for (let i = 0; i < ids.length; i += 500) {
    const chunk = ids.slice(i, i + 500);
    const rows = await tx.all<{ ref: string; n: number }>(
      sql`select ${sql.raw(column)} as ref, count(*) as n from ${sql.raw(table)} where ${sql.raw(column)} in (${sql.join(chunk.map((id) => sql`${id}`), sql`, `)}) and retracted_at is null and (import_id is null or import_id <> ${importId}) group by ${sql.raw(column)}`,
    );
    for (const r of rows) out.set(r.ref, (out.get(r.ref) ?? 0) + Number(r.n));
  }
  return out;
}

/**
 * Inside an undo's transaction (after the import's own values are retracted): retracts
 * the materials, methods and sources the import created, and restores the records it
 * updated from their audit rows. Refuses (conflict, nothing changed) when anything else
 * now refers to a created record, naming it and what refers to it, or when an updated
 * record was changed again after the import.
 */
export async function undoCatalogChanges(tx: Executor, workspaceId: string, importId: string, actorUserId: string, reason: string): Promise<{ retractedRecords: number; restoredRecords: number }> {
  const problems: string[] = [];
  const now = new Date();
  const retraction = { retractedAt: now, retractedBy: actorUserId, retractionReason: `${UNDO_REASON_PREFIX}${reason}` };
  let retractedRecords = 0;

  const createdMaterials = await tx.select({ id: material.id, name: material.name }).from(material).where(and(eq(material.workspaceId, workspaceId), eq(material.importId, importId), isNull(material.retractedAt)));
  const createdMethods = await tx.select({ id: method.id, name: method.label }).from(method).where(and(eq(method.workspaceId, workspaceId), eq(method.importId, importId), isNull(method.retractedAt)));
  const createdSources = await tx.select({ id: source.id, name: source.citeKey }).from(source).where(and(eq(source.workspaceId, workspaceId), eq(source.importId, importId), isNull(source.retractedAt)));

  const check = async (what: string, records: Array<{ id: string; name: string }>, column: 'material_id' | 'method_id' | 'source_id') => {
    if (records.length === 0) return;
    const ids = records.map((r) => r.id);
    const m = column === 'method_id' ? new Map<string, number>() : await liveCount(tx, 'measurement', column, ids, importId);
    const c = await liveCount(tx, 'calculation', column, ids, importId);
    for (const r of records) {
      const parts = [m.get(r.id) ? `${m.get(r.id)} measurement(s)` : null, c.get(r.id) ? `${c.get(r.id)} calculation(s)` : null].filter(Boolean);
      if (parts.length) problems.push(`${what} "${r.name}" is used by ${parts.join(' and ')} of other imports or entries`);
    }
  };
  await check('Material', createdMaterials, 'material_id');
  await check('Method', createdMethods, 'method_id');
  await check('Source', createdSources, 'source_id');
  for (const m of createdMethods) {
    const inScope = await tx.all<{ name: string }>(sql`select name from benchmark where workspace_id = ${workspaceId} and retracted_at is null and scope like ${`%${m.id}%`} limit 1`);
    if (inScope[0]) problems.push(`Method "${m.name}" is in the scope of benchmark "${inScope[0].name}"`);
  }

  const updates = await tx
    .select({ id: auditLog.id, entityType: auditLog.entityType, entityId: auditLog.entityId, before: auditLog.before, after: auditLog.after })
    .from(auditLog)
    .where(and(eq(auditLog.workspaceId, workspaceId), eq(auditLog.action, 'import-update'), sql`json_extract(${auditLog.after}, '$.importId') = ${importId}`));
  const kindOf: Record<string, CatalogKind> = { material: 'materials', method: 'methods', source: 'sources' };
  const restores: Array<{ kind: CatalogKind; id: string; before: Record<string, unknown> }> = [];
  for (const u of updates) {
    const kind = kindOf[u.entityType];
    const current = (await loadCurrent(tx, workspaceId, kind, u.entityId)) as Record<string, unknown> | null;
    const { importId: _i, ...after } = u.after as Record<string, unknown>;
    const handle = String(after.name ?? after.label ?? after.citeKey ?? u.entityId);
    if (!current) {
      problems.push(`${u.entityType} "${handle}" no longer exists`);
      continue;
    }
    const changedSince = Object.keys(after).some((k) => JSON.stringify(after[k] ?? null) !== JSON.stringify(current[k] ?? null));
    if (changedSince) problems.push(`${u.entityType} "${handle}" was changed after this import; restore it by hand`);
    else restores.push({ kind, id: u.entityId, before: u.before as Record<string, unknown> });
  }
  if (problems.length) {
    const shown = problems.slice(0, 20).join('; ') + (problems.length > 20 ? `; and ${problems.length - 20} more` : '');
    throw new AppError('conflict', `This import cannot be undone: ${shown}.`);
  }

  for (const [table, records] of [
    [material, createdMaterials],
    [method, createdMethods],
    [source, createdSources],
  ] as const) {
    const ids = records.map((r) => r.id);
    for (let i = 0; i < ids.length; i += 500) {
      const result = await tx
        .update(table)
        .set(retraction)
        .where(and(eq(table.workspaceId, workspaceId), inArray(table.id, ids.slice(i, i + 500))));
      retractedRecords += result.rowsAffected;
    }
  }
  for (const r of restores) {
    await updateRecord(tx, workspaceId, r.kind, r.id, r.before);
    await writeAudit({ workspaceId, actor: { userId: actorUserId }, action: 'update', entityType: ENTITY[r.kind], entityId: r.id, before: null, after: r.before, reason: `Import ${importId} undone: ${reason}` }, tx);
  }
  return { retractedRecords, restoredRecords: restores.length };
}

async function loadCurrent(tx: Executor, workspaceId: string, kind: CatalogKind, id: string): Promise<CatalogRecord<CatalogKind> | null> {
  if (kind === 'materials') {
    const all = await storedMaterials(workspaceId, tx);
    const found = all.find((m) => m.id === id);
    return found ? strip(found) : null;
  }
  if (kind === 'methods') {
    const rows = await tx.select().from(method).where(and(eq(method.workspaceId, workspaceId), eq(method.id, id)));
    return rows[0] ? methodRecordOf(rows[0]) : null;
  }
  const rows = await tx.select().from(source).where(and(eq(source.workspaceId, workspaceId), eq(source.id, id)));
  return rows[0] ? sourceRecordOf(rows[0]) : null;
}

/** The records a catalogue (or createMissing) import created, for its page. */
export async function listCreatedRecords(workspaceId: string, importId: string, limit = 200) {
  const [materials, methods, sources] = await Promise.all([
    db.select({ id: material.id, handle: material.name, detail: material.reducedFormula, retractedAt: material.retractedAt }).from(material).where(and(eq(material.workspaceId, workspaceId), eq(material.importId, importId))).limit(limit),
    db.select({ id: method.id, handle: method.label, detail: method.functional, retractedAt: method.retractedAt }).from(method).where(and(eq(method.workspaceId, workspaceId), eq(method.importId, importId))).limit(limit),
    db.select({ id: source.id, handle: source.citeKey, detail: source.title, retractedAt: source.retractedAt }).from(source).where(and(eq(source.workspaceId, workspaceId), eq(source.importId, importId))).limit(limit),
  ]);
  return { materials, methods, sources };
}

/** Labels of the workspace's retracted methods (labels are reserved for good). */
export async function listRetractedMethodLabels(workspaceId: string): Promise<Set<string>> {
  const rows = await db
    .select({ label: method.label })
    .from(method)
    .where(and(eq(method.workspaceId, workspaceId), sql`${method.retractedAt} is not null`));
  return new Set(rows.map((r) => r.label));
}
