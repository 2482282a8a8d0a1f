import 'server-only';
import type { Client, InValue, Transaction } from '@libsql/client';
import { and, count, desc, eq, isNull } from 'drizzle-orm';
import { createDb, db, getClient, type Executor } from '@/db/client';
import { apiToken, calculation, importBatch, material, measurement, method, source, user, type ImportBatch } from '@/db/schema';
import { listAudit, writeAudit } from '@/db/queries/audit';
import { AppError } from '@/lib/errors';
import { atomsPerReducedFormulaUnit, elementCountsOrUndefined } from '@/lib/science/formula';
import type { ImportableKind } from '@/lib/import/columns';
import type { ImportWarning } from '@/lib/import/mode-set-warnings';
import type { DuplicateRow, PendingRow } from '@/lib/import/row-validator';
import type { DosReferences } from '@/lib/import/dos-compute';
import type { ImportReferences } from '@/lib/import/validate-row';

/** Who commits an import: a member through the wizard, or a pipeline through an API token. */
export interface ImportActor {
  userId: string | null;
  tokenId: string | null;
}

export interface ImportFileFacts {
  kind: ImportBatch['kind'];
  fileName: string | null;
  sha256: string;
  byteCount: number;
  via: 'wizard' | 'api' | 'form';
}

export interface ImportOutcome {
  importId: string;
  rowCount: number;
  insertedCount: number;
  duplicateCount: number;
  /** Rows skipped because an identical row exists (first MAX_REPORTED_ERRORS). */
  duplicates: DuplicateRow[];
  /** Incomplete mode sets, sets without acoustic marks and Born-charge sets not quite neutral or not checkable; imported all the same. */
  warnings?: ImportWarning[];
  warningCount?: number;
  /** Calculation imports with createMissing: the materials and methods they created. */
  createdMaterials?: number;
  createdMethods?: number;
}

/**
 * Atoms per reduced formula unit of a stored material. A formula that no longer parses (written before the parser
 * knew its notation, or by hand) falls back to the count stored with it, so one odd material does not stop every
 * import of the workspace.
 */
function storedAtomsPerFormulaUnit(m: { reducedFormula: string; atomsPerFormulaUnit: number }): number {
  try {
    return atomsPerReducedFormulaUnit(m.reducedFormula);
  } catch {
    return m.atomsPerFormulaUnit;
  }
}

/** The handles an import (CSV, JSON rows or DOS) may use, for validation on the server and in the browser. */
export async function loadImportReferences(workspaceId: string): Promise<ImportReferences & DosReferences> {
  const [materials, sources, methods] = await Promise.all([
    db
      .select({
        id: material.id,
        name: material.name,
        reducedFormula: material.reducedFormula,
        atomsPerFormulaUnit: material.atomsPerFormulaUnit,
        atomsInCell: material.atomsInCell,
      })
      .from(material)
      .where(and(eq(material.workspaceId, workspaceId), isNull(material.retractedAt))),
    db.select({ id: source.id, key: source.citeKey }).from(source).where(and(eq(source.workspaceId, workspaceId), isNull(source.retractedAt))),
    db.select({ id: method.id, label: method.label }).from(method).where(and(eq(method.workspaceId, workspaceId), isNull(method.retractedAt))),
  ]);
  return {
    // Values per formula unit are per the reduced formula's unit (GaN, not Ga2N2).
    materials: new Map(
      materials.map((m) => [m.name, { id: m.id, atomsPerFormulaUnit: storedAtomsPerFormulaUnit(m), atomsInCell: m.atomsInCell, elements: elementCountsOrUndefined(m.reducedFormula) }]),
    ),
    sources: new Map(sources.map((s) => [s.key, s.id])),
    methods: new Map(methods.map((m) => [m.label, m.id])),
  };
}

export async function findImportBySha(workspaceId: string, sha256: string) {
  const rows = await db
    .select({ id: importBatch.id, createdAt: importBatch.createdAt, fileName: importBatch.fileName, status: importBatch.status })
    .from(importBatch)
    .where(and(eq(importBatch.workspaceId, workspaceId), eq(importBatch.sha256, sha256)))
    .limit(1);
  return rows[0] ?? null;
}

/** The refusal of a file whose bytes were imported before (the sha256 is unique per workspace). */
export function duplicateFile(first: { id: string; fileName: string | null; status: string }): AppError {
  return new AppError(
    'conflict',
    `This file was already imported${first.fileName ? ` as "${first.fileName}"` : ''} (import ${first.id}${first.status === 'undone' ? ', since undone' : ''}).`,
    { firstImportId: first.id },
  );
}

/**
 * Writes the import's own row first in its transaction. A concurrent import of
 * the same bytes loses on the unique sha256 and is refused as a duplicate file.
 */
export async function insertImportBatch(
  tx: Executor,
  batch: { id: string; workspaceId: string; kind: ImportBatch['kind']; fileName: string | null; sha256: string; byteCount: number; rowCount: number; via: ImportBatch['via'] },
  actor: ImportActor,
): Promise<void> {
  try {
    await tx.insert(importBatch).values({ ...batch, insertedCount: 0, duplicateCount: 0, createdBy: actor.userId, createdByToken: actor.tokenId });
  } catch (e) {
    const again = await findImportBySha(batch.workspaceId, batch.sha256);
    if (again) throw duplicateFile(again);
    throw e;
  }
}

const COMMON_COLUMNS = [
  'id',
  'workspace_id',
  'material_id',
  'source_id',
  'import_id',
  'quantity',
  'value',
  'value_text',
  'unit',
  'uncertainty',
  'uncertainty_text',
  'temperature_k',
  'temperature_text',
  'irrep',
  'irrep_normalized',
  'branch',
  'degeneracy',
  'activity',
  'site',
  'components',
  'notes',
  'row_hash',
  'contributor_id',
  'seq',
] as const;
const MEASUREMENT_EXTRA = ['technique', 'laser_wavelength_nm', 'sample_form'] as const;
const CALCULATION_EXTRA = ['method_id', 'mode_index'] as const;

export function valueTableOf(kind: ImportableKind): { table: string; columns: readonly string[] } {
  return kind === 'measurements'
    ? { table: 'measurement', columns: [...COMMON_COLUMNS, ...MEASUREMENT_EXTRA] }
    : { table: 'calculation', columns: [...COMMON_COLUMNS, ...CALCULATION_EXTRA] };
}

const statementCache = new Map<string, string>();
/** `INSERT INTO t (…) VALUES (?,…),(?,…)…` for n rows, built once per shape. */
export function multiRowInsertSql(table: string, columns: readonly string[], n: number): string {
  const key = `${table}:${n}`;
  let sql = statementCache.get(key);
  if (!sql) {
    const tuple = `(${columns.map(() => '?').join(',')})`;
    sql = `INSERT INTO ${table} (${columns.join(',')}) VALUES ${Array.from({ length: n }, () => tuple).join(',')}`;
    statementCache.set(key, sql);
  }
  return sql;
}

function rowArgs(kind: ImportableKind, workspaceId: string, importId: string, contributorId: string | null, seq: number, p: PendingRow, out: InValue[]): void {
  const v = p.valid;
  out.push(
    crypto.randomUUID(),
    workspaceId,
    v.materialId,
    v.sourceId,
    importId,
    v.quantity,
    v.value,
    v.valueText,
    v.unit,
    v.uncertainty,
    v.uncertaintyText,
    v.temperatureK,
    v.temperatureText,
    v.irrep,
    v.irrepNormalized,
    v.branch,
    v.degeneracy,
    v.activity,
    v.site,
    v.components ? JSON.stringify(v.components) : null,
    v.notes,
    p.hash,
    contributorId,
    seq,
  );
  if (kind === 'measurements') out.push(v.technique, v.laserWavelengthNm, v.sampleForm);
  else out.push(v.methodId, v.modeIndex);
}

const yieldToEventLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

/** The audit row of an import: what the file was and what it did (counts, channel, and any kind-specific facts). */
export async function writeImportAudit(workspaceId: string, actor: ImportActor, importId: string, after: Record<string, unknown>, tx: Executor): Promise<void> {
  await writeAudit({ workspaceId, actor, action: 'import', entityType: 'import', entityId: importId, after }, tx);
}

/** A value import in progress: one write transaction from its import row to its audit row. */
export interface ValueImportWriter {
  importId: string;
  /** Stores the rows not identical to a live row of the workspace (earlier chunks of this file included); returns the skipped ones. */
  insertValueRows(rows: readonly PendingRow[]): Promise<{ inserted: number; identical: Array<{ row: number; sameFile: boolean }> }>;
  /** Runs more writes inside the import's transaction (the catalogue records a createMissing import creates). */
  within<T>(fn: (raw: Transaction, tx: Executor) => Promise<T>): Promise<T>;
  /** Records the counts and the audit row (with `auditExtra`), and commits. */
  commit(counts: { rowCount: number; insertedCount: number; duplicateCount: number }, auditExtra?: Record<string, unknown>): Promise<void>;
  /** Rolls everything back (nothing of the import stays). */
  abort(): Promise<void>;
}

/**
 * Opens the write transaction of a measurements or calculations import and
 * writes its import row (a concurrent import of the same bytes is refused as a
 * duplicate file). The import service validates the rows and hands them over in
 * chunks; any failure before commit() rolls everything back.
 */
export async function openValueImport(workspaceId: string, actor: ImportActor, file: ImportFileFacts): Promise<ValueImportWriter> {
  const { table: tableName, columns } = valueTableOf(file.kind as ImportableKind);
  const raw: Transaction = await getClient().transaction('write');
  const tx = createDb(raw as unknown as Client);
  const importId = crypto.randomUUID();
  let nextSeq = 0;
  let closed = false;
  const close = () => {
    if (!closed) raw.close();
    closed = true;
  };
  try {
    await insertImportBatch(tx, { id: importId, workspaceId, kind: file.kind, fileName: file.fileName, sha256: file.sha256, byteCount: file.byteCount, rowCount: 0, via: file.via }, actor);
    // The import's rows take the next run of sequence numbers (one run: a revision's row set stays a few bytes).
    const top = await raw.execute(`SELECT coalesce(max(seq), 0) FROM ${tableName}`);
    nextSeq = Number(top.rows[0][0]);
  } catch (e) {
    await raw.rollback().catch(() => undefined);
    close();
    throw e;
  }
  return {
    importId,
    async insertValueRows(rows) {
      if (rows.length === 0) return { inserted: 0, identical: [] };
      const existing = await raw.execute({
        sql: `SELECT row_hash, import_id FROM ${tableName} WHERE workspace_id = ? AND retracted_at IS NULL AND row_hash IN (${rows.map(() => '?').join(',')})`,
        args: [workspaceId, ...rows.map((p) => p.hash)],
      });
      const known = new Map<string, string | null>();
      for (const r of existing.rows) known.set(r[0] as string, (r[1] as string | null) ?? null);
      const identical: Array<{ row: number; sameFile: boolean }> = [];
      const fresh: PendingRow[] = [];
      for (const p of rows) {
        if (known.has(p.hash)) identical.push({ row: p.row, sameFile: known.get(p.hash) === importId });
        else fresh.push(p);
      }
      if (fresh.length) {
        const values: InValue[] = [];
        for (const p of fresh) rowArgs(file.kind as ImportableKind, workspaceId, importId, actor.userId, ++nextSeq, p, values);
        await raw.execute({ sql: multiRowInsertSql(tableName, columns, fresh.length), args: values });
      }
      await yieldToEventLoop();
      return { inserted: fresh.length, identical };
    },
    within(fn) {
      return fn(raw, tx);
    },
    async commit(counts, auditExtra) {
      try {
        await tx.update(importBatch).set(counts).where(eq(importBatch.id, importId));
        await writeImportAudit(workspaceId, actor, importId, { kind: file.kind, fileName: file.fileName, sha256: file.sha256, byteCount: file.byteCount, ...counts, via: file.via, ...auditExtra }, tx);
        await raw.commit();
      } catch (e) {
        await raw.rollback().catch(() => undefined);
        throw e;
      } finally {
        close();
      }
    },
    async abort() {
      await raw.rollback().catch(() => undefined);
      close();
    },
  };
}

/**
 * Undoes an import: its live rows are retracted with the reason, the import is
 * marked undone, and one audit row records it — all in one transaction.
 * `refusal` sees the import inside that transaction and may refuse (a reason) — the caller's rule of who may undo.
 */
export async function undoImport(
  workspaceId: string,
  importId: string,
  actorUserId: string,
  reason: string,
  refusal: (batch: ImportBatch) => string | null = () => null,
  /** More work in the same transaction after the values are retracted (the catalogue records the import created or updated). */
  alsoUndo?: (tx: Executor) => Promise<Record<string, number>>,
): Promise<{ retracted: number } & Record<string, number>> {
  return db.transaction(async (tx) => {
    const [batch] = await tx
      .select()
      .from(importBatch)
      .where(and(eq(importBatch.workspaceId, workspaceId), eq(importBatch.id, importId)))
      .limit(1);
    if (!batch) throw new AppError('not-found', 'No such import in this workspace.');
    if (batch.status === 'undone') throw new AppError('conflict', 'This import was already undone.');
    const refused = refusal(batch);
    if (refused) throw new AppError('forbidden', refused);
    const now = Date.now();
    const target = batch.kind === 'measurements' ? measurement : calculation;
    const result = await tx
      .update(target)
      .set({ retractedAt: new Date(now), retractedBy: actorUserId, retractionReason: `Import undone: ${reason}` })
      .where(and(eq(target.workspaceId, workspaceId), eq(target.importId, importId), isNull(target.retractedAt)));
    const retracted = result.rowsAffected;
    const more = alsoUndo ? await alsoUndo(tx) : {};
    await tx
      .update(importBatch)
      .set({ status: 'undone', undoneAt: new Date(now), undoneBy: actorUserId, undoReason: reason })
      .where(eq(importBatch.id, importId));
    await writeAudit({
      workspaceId,
      actor: { userId: actorUserId },
      action: 'undo-import',
      entityType: 'import',
      entityId: importId,
      before: { status: 'committed' },
      after: { status: 'undone', retracted, ...more },
      reason,
    }, tx);
    return { ...more, retracted };
  });
}

export async function listImports(workspaceId: string, { page, size }: { page: number; size: number }) {
  const where = eq(importBatch.workspaceId, workspaceId);
  const [items, total] = await Promise.all([
    db
      .select({
        id: importBatch.id,
        kind: importBatch.kind,
        fileName: importBatch.fileName,
        byteCount: importBatch.byteCount,
        rowCount: importBatch.rowCount,
        insertedCount: importBatch.insertedCount,
        duplicateCount: importBatch.duplicateCount,
        status: importBatch.status,
        via: importBatch.via,
        createdAt: importBatch.createdAt,
        creatorName: user.name,
        tokenName: apiToken.name,
      })
      .from(importBatch)
      .leftJoin(user, eq(importBatch.createdBy, user.id))
      .leftJoin(apiToken, eq(importBatch.createdByToken, apiToken.id))
      .where(where)
      .orderBy(desc(importBatch.createdAt))
      .limit(size)
      .offset((page - 1) * size),
    db.select({ n: count() }).from(importBatch).where(where),
  ]);
  return { items, total: total[0].n };
}

export async function getImport(workspaceId: string, importId: string) {
  const rows = await db
    .select({
      batch: importBatch,
      creatorName: user.name,
      tokenName: apiToken.name,
    })
    .from(importBatch)
    .leftJoin(user, eq(importBatch.createdBy, user.id))
    .leftJoin(apiToken, eq(importBatch.createdByToken, apiToken.id))
    .where(and(eq(importBatch.workspaceId, workspaceId), eq(importBatch.id, importId)))
    .limit(1);
  if (!rows[0]) return null;
  const undoneBy = rows[0].batch.undoneBy
    ? ((await db.select({ name: user.name }).from(user).where(eq(user.id, rows[0].batch.undoneBy)).limit(1))[0]?.name ?? null)
    : null;
  return { ...rows[0].batch, creatorName: rows[0].creatorName, tokenName: rows[0].tokenName, undoneByName: undoneBy };
}

/** The audit trail of one import (committed, undone), newest first. */
export async function listImportHistory(workspaceId: string, importId: string) {
  return listAudit(workspaceId, 'import', importId, db);
}
