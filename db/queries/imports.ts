import 'server-only';
import { createHash } from 'node:crypto';
import type { Client, InValue, Transaction } from '@libsql/client';
import { and, count, desc, eq, isNull } from 'drizzle-orm';
import { createDb, db, getClient } from '@/db/client';
import { apiToken, calculation, importBatch, material, measurement, method, source, user, type ImportBatch } from '@/db/schema';
import { listAudit, writeAudit } from '@/db/queries/audit';
import { AppError } from '@/lib/errors';
import { atomsPerReducedFormulaUnit } from '@/lib/science/formula';
import type { ImportableKind } from '@/lib/import/columns';
import { ImportRefusal, MAX_REPORTED_ERRORS, type RowError } from '@/lib/import/errors';
import { ModeSetTally, type ImportWarning } from '@/lib/import/mode-set-warnings';
import type { ImportTable } from '@/lib/import/table';
import type { DefaultUnits } from '@/lib/import/units';
import { modeSetFacts, validateRow, type ImportReferences, type ValidRow } from '@/lib/import/validate-row';

/** Who commits an import: a member through the wizard, or a pipeline through an API token. */
export interface ImportActor {
  userId: string | null;
  tokenId: string | null;
}

export interface ImportFileFacts {
  kind: ImportableKind;
  fileName: string | null;
  sha256: string;
  byteCount: number;
  via: 'wizard' | 'api' | 'form';
}

export interface DuplicateRow {
  row: number;
  reason: string;
}

export interface ImportOutcome {
  importId: string;
  rowCount: number;
  insertedCount: number;
  duplicateCount: number;
  /** Rows skipped because an identical row exists (first MAX_REPORTED_ERRORS). */
  duplicates: DuplicateRow[];
  /** Calculation imports: incomplete mode sets and sets without acoustic marks; imported all the same. */
  warnings?: ImportWarning[];
  warningCount?: number;
}

/** Rows per multi-row INSERT (26 columns × 500 stays far below SQLite's variable limit). */
export const INSERT_CHUNK_ROWS = 500;

/** The handles an import may use, for validation on the server and in the browser. */
export async function loadImportReferences(workspaceId: string): Promise<ImportReferences> {
  const [materials, sources, methods] = await Promise.all([
    db
      .select({ id: material.id, name: material.name, reducedFormula: material.reducedFormula, atomsInCell: material.atomsInCell })
      .from(material)
      .where(and(eq(material.workspaceId, workspaceId), isNull(material.retractedAt))),
    db.select({ id: source.id, key: source.citeKey }).from(source).where(and(eq(source.workspaceId, workspaceId), isNull(source.retractedAt))),
    db.select({ id: method.id, label: method.label }).from(method).where(and(eq(method.workspaceId, workspaceId), isNull(method.retractedAt))),
  ]);
  return {
    // Values per formula unit are per the reduced formula's unit (GaN, not Ga2N2).
    materials: new Map(materials.map((m) => [m.name, { id: m.id, atomsPerFormulaUnit: atomsPerReducedFormulaUnit(m.reducedFormula), atomsInCell: m.atomsInCell }])),
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

function duplicateFile(first: { id: string; fileName: string | null; status: string }): AppError {
  return new AppError(
    'conflict',
    `This file was already imported${first.fileName ? ` as "${first.fileName}"` : ''} (import ${first.id}${first.status === 'undone' ? ', since undone' : ''}).`,
    { firstImportId: first.id },
  );
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
  'notes',
  'row_hash',
  'contributor_id',
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

interface PendingRow {
  row: number;
  hash: string;
  valid: ValidRow;
}

function rowArgs(kind: ImportableKind, workspaceId: string, importId: string, contributorId: string | null, p: PendingRow, out: InValue[]): void {
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
    v.notes,
    p.hash,
    contributorId,
  );
  if (kind === 'measurements') out.push(v.technique, v.laserWavelengthNm, v.sampleForm);
  else out.push(v.methodId, v.modeIndex);
}

const hashOf = (identity: string) => createHash('sha256').update(identity).digest('base64url');

const yieldToEventLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

/**
 * Validates every row of the table and stores them with their import record and
 * one audit row in ONE transaction: any row error, a duplicate file or any
 * failure rolls everything back. Valid rows are inserted in multi-row chunks as
 * they are read (yielding to the event loop between chunks); once an error is
 * seen, inserting stops but validation goes on so that every error is reported.
 * Rows identical to live rows of the workspace (or to earlier rows of the same
 * file) are skipped and reported.
 */
export async function commitImport(args: {
  workspaceId: string;
  actor: ImportActor;
  file: ImportFileFacts;
  table: ImportTable;
  units?: DefaultUnits;
}): Promise<ImportOutcome> {
  const { workspaceId, actor, file, table } = args;
  const first = await findImportBySha(workspaceId, file.sha256);
  if (first) throw duplicateFile(first);
  const references = await loadImportReferences(workspaceId);
  const ctx = { kind: file.kind, references, units: args.units, columnName: (key: string) => table.columnName(key) };
  const { table: tableName, columns } = valueTableOf(file.kind);
  const contributorId = actor.userId;

  const raw: Transaction = await getClient().transaction('write');
  const tx = createDb(raw as unknown as Client);
  const importId = crypto.randomUUID();
  const errors: RowError[] = [];
  let errorCount = 0;
  const duplicates: DuplicateRow[] = [];
  let duplicateCount = 0;
  let rowCount = 0;
  let insertedCount = 0;
  let pending: PendingRow[] = [];
  const tally = new ModeSetTally();

  const flush = async () => {
    if (pending.length === 0) return;
    const batch = pending;
    pending = [];
    // Identical rows already stored (including earlier chunks of this file, visible inside the transaction).
    const existing = await raw.execute({
      sql: `SELECT row_hash, import_id FROM ${tableName} WHERE workspace_id = ? AND retracted_at IS NULL AND row_hash IN (${batch.map(() => '?').join(',')})`,
      args: [workspaceId, ...batch.map((p) => p.hash)],
    });
    const known = new Map<string, string | null>();
    for (const r of existing.rows) known.set(r[0] as string, (r[1] as string | null) ?? null);
    const fresh: PendingRow[] = [];
    for (const p of batch) {
      if (known.has(p.hash)) {
        duplicateCount++;
        if (duplicates.length < MAX_REPORTED_ERRORS) {
          duplicates.push({
            row: p.row,
            reason: known.get(p.hash) === importId ? 'Identical to an earlier row of this file; skipped.' : 'Identical to a row already in the workspace; skipped.',
          });
        }
      } else fresh.push(p);
    }
    if (fresh.length) {
      const values: InValue[] = [];
      for (const p of fresh) rowArgs(file.kind, workspaceId, importId, contributorId, p, values);
      await raw.execute({ sql: multiRowInsertSql(tableName, columns, fresh.length), args: values });
      insertedCount += fresh.length;
    }
    await yieldToEventLoop();
  };

  try {
    try {
      await tx.insert(importBatch).values({
        id: importId,
        workspaceId,
        kind: file.kind,
        fileName: file.fileName,
        sha256: file.sha256,
        byteCount: file.byteCount,
        rowCount: 0,
        insertedCount: 0,
        duplicateCount: 0,
        via: file.via,
        createdBy: actor.userId,
        createdByToken: actor.tokenId,
      });
    } catch (e) {
      const again = await findImportBySha(workspaceId, file.sha256);
      if (again) throw duplicateFile(again);
      throw e;
    }

    const seenInChunk = new Set<string>();
    for await (const rows of table.batches()) {
      for (const r of rows) {
        rowCount++;
        if (r.error) {
          errorCount++;
          if (errors.length < MAX_REPORTED_ERRORS) errors.push(r.error);
          continue;
        }
        const before = errors.length;
        const valid = validateRow(r.row, r.read, ctx, errors);
        if (!valid) {
          errorCount += Math.max(1, errors.length - before);
          if (errors.length > MAX_REPORTED_ERRORS) errors.length = MAX_REPORTED_ERRORS;
          continue;
        }
        if (errorCount > 0) continue;
        tally.add(r.row, valid);
        const hash = hashOf(valid.identity);
        if (seenInChunk.has(hash)) {
          duplicateCount++;
          if (duplicates.length < MAX_REPORTED_ERRORS) duplicates.push({ row: r.row, reason: 'Identical to an earlier row of this file; skipped.' });
          continue;
        }
        seenInChunk.add(hash);
        pending.push({ row: r.row, hash, valid });
        if (pending.length >= INSERT_CHUNK_ROWS) {
          await flush();
          seenInChunk.clear();
        }
      }
    }
    if (errorCount > 0) {
      const plural = errorCount === 1 ? 'error' : 'errors';
      throw new ImportRefusal(`Nothing was imported: ${errorCount} ${plural} in ${table.format === 'csv' ? 'the file' : 'the rows'}.`, errors, errorCount);
    }
    await flush();

    await tx
      .update(importBatch)
      .set({ rowCount, insertedCount, duplicateCount })
      .where(eq(importBatch.id, importId));
    await writeAudit(tx, {
      workspaceId,
      actor,
      action: 'import',
      entityType: 'import',
      entityId: importId,
      after: { kind: file.kind, fileName: file.fileName, sha256: file.sha256, byteCount: file.byteCount, rowCount, insertedCount, duplicateCount, via: file.via },
    });
    await raw.commit();
  } catch (e) {
    await raw.rollback().catch(() => undefined);
    throw e;
  } finally {
    raw.close();
  }
  const { warnings, warningCount } = tally.warnings(modeSetFacts(references));
  return { importId, rowCount, insertedCount, duplicateCount, duplicates, warnings, warningCount };
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
): Promise<{ retracted: number }> {
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
    await tx
      .update(importBatch)
      .set({ status: 'undone', undoneAt: new Date(now), undoneBy: actorUserId, undoReason: reason })
      .where(eq(importBatch.id, importId));
    await writeAudit(tx, {
      workspaceId,
      actor: { userId: actorUserId },
      action: 'undo-import',
      entityType: 'import',
      entityId: importId,
      before: { status: 'committed' },
      after: { status: 'undone', retracted },
      reason,
    });
    return { retracted };
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
  return listAudit(db, workspaceId, 'import', importId);
}
