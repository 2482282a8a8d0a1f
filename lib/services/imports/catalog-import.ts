import 'server-only';
/**
 * Catalogue imports: materials, methods and sources in bulk, from the wizard and the
 * API (CSV or JSON rows; sources also as BibTeX, RIS or CSL-JSON).
 *
 * Every row is checked first (the forms' zod schemas, plus: atoms in the primitive
 * cell a whole multiple of the atoms per formula unit, no unknown columns, no identity
 * twice in one file), then matched against the stored records (lib/import/catalog-rows.ts
 * for the identity rules). Any error refuses the whole file with row, column and reason.
 *
 * Changed rows: a row whose record exists with other values in the columns it fills is
 * refused by default, one error per column with the stored and the new value. With
 * onChange=update (curator or owner: the roles that may retract records) those records
 * are updated, each with an audit row holding before and after; undo restores them
 * unless they were changed again since.
 *
 * After an undo: a materials row matches live materials only, so it creates the material
 * again. A method's label and a source's cite key stay reserved by the retracted record,
 * so a row naming one that was retracted *by an undo* restores it with the row's values
 * (audit action "import-restore"; counted as created; the new import owns it and its undo
 * retracts it again). A record retracted for any other reason is refused: restore it first.
 *
 * Rows identical to stored records are counted and listed as unchanged. A file whose
 * rows are all unchanged writes nothing, not even an import (importId null), so
 * re-importing a catalogue is idempotent. The same bytes imported before and having
 * something to write are refused as a duplicate file (409), as for value imports.
 */
import { createHash } from 'node:crypto';
import { commitCatalogImport, loadStoredCatalog } from '@/db/queries/catalog-import';
import { duplicateFile, findImportBySha, type ImportActor } from '@/db/queries/imports';
import { AppError } from '@/lib/errors';
import type { CatalogKind } from '@/lib/import/catalog-columns';
import { changedRowErrors, planCatalogImport, sourceFromInput, validateCatalogRow, type CatalogRow } from '@/lib/import/catalog-rows';
import { excerpt, importRefusal, MAX_REPORTED_ERRORS, type RowError } from '@/lib/import/errors';
import type { ImportTable } from '@/lib/import/table';
import { resolveStructureColumn, type Prefer } from '@/lib/import/structure-column';
import { describeReferenceError, detectFormat, parseReferences } from '@/lib/citations/import';
import { roleCan, type WorkspaceRole } from '@/lib/permissions';
import { dataChanged } from '@/lib/services/data-changed';

export const ON_CHANGE = ['refuse', 'update'] as const;
export type OnChange = (typeof ON_CHANGE)[number];

export interface CatalogImportOutcome {
  /** null when every row was unchanged: nothing was written. */
  importId: string | null;
  kind: CatalogKind;
  rowCount: number;
  createdCount: number;
  updatedCount: number;
  unchangedCount: number;
  /** Rows identical to a stored record (first MAX_REPORTED_ERRORS), with its handle. */
  unchanged: Array<{ row: number; handle: string }>;
  /** The same counts in the value-import shape: inserted = created + updated, duplicates = unchanged. */
  insertedCount: number;
  duplicateCount: number;
  duplicates: Array<{ row: number; reason: string }>;
}

export interface CatalogImportInput {
  workspaceId: string;
  actor: ImportActor;
  role: WorkspaceRole;
  via: 'wizard' | 'api';
  kind: CatalogKind;
  fileName: string | null;
  sha256: string;
  byteCount: number;
  onChange?: OnChange;
  /** Materials with a structure column: which value wins where structure and typed cells disagree (else the row is refused). */
  prefer?: Prefer;
}

/** The permissions a catalogue import needs beyond imports:create: create records of its kind, and for updates retract them (curator or owner). */
export function assertCatalogPermissions(role: WorkspaceRole, kind: CatalogKind, onChange: OnChange = 'refuse'): void {
  if (!roleCan(role, `${kind}:create`)) throw new AppError('forbidden', `Importing ${kind} needs a role that may create ${kind}.`);
  if (onChange === 'update' && !roleCan(role, `${kind}:retract`)) {
    throw new AppError('forbidden', `Updating stored ${kind} by import (onChange=update) needs the curator or owner role.`);
  }
}

const singular = (kind: CatalogKind) => kind.slice(0, -1);

/** Checks and commits the rows of a CSV file or JSON body. */
export async function importCatalogTable(input: CatalogImportInput, table: ImportTable): Promise<CatalogImportOutcome> {
  assertCatalogPermissions(input.role, input.kind, input.onChange);
  const errors: RowError[] = [];
  let errorCount = 0;
  const add = (e: RowError) => {
    errorCount++;
    if (errors.length < MAX_REPORTED_ERRORS) errors.push(e);
  };
  for (const header of table.ignored) add({ row: 1, column: excerpt(header), reason: `"${excerpt(header)}" is not a column of ${input.kind}: remove it or rename it to one of the template's columns.` });
  const rows: CatalogRow[] = [];
  let rowCount = 0;
  for await (const batch of table.batches()) {
    for (const r of batch) {
      rowCount++;
      if (r.error) {
        add(r.error);
        continue;
      }
      const rowErrors: RowError[] = [];
      let read = r.read;
      if (input.kind === 'materials' && (r.read('structure') ?? '').trim() !== '') {
        const resolved = await resolveStructureColumn(r.row, r.read, input.prefer, (key) => table.columnName(key), rowErrors);
        if (!resolved) {
          rowErrors.forEach(add);
          continue;
        }
        read = resolved;
      }
      const valid = validateCatalogRow(input.kind, r.row, read, (key) => table.columnName(key), rowErrors);
      if (valid) rows.push(valid);
      else rowErrors.forEach(add);
    }
  }
  if (errorCount > 0) {
    // Duplicate identities within the file are reported beside the cell errors.
    const duplicates = planCatalogImport(input.kind, rows, [], (key) => table.columnName(key)).errors;
    duplicates.forEach(add);
    errors.sort((a, b) => a.row - b.row);
    throw refusal(table.format, errors, errorCount);
  }
  return commitRows(input, rows, rowCount, table.format, (key) => table.columnName(key));
}

/** Sources given as a BibTeX, RIS or CSL-JSON text; null when the text is none of these (then it is read as CSV). */
export async function importReferenceText(input: CatalogImportInput, text: string): Promise<CatalogImportOutcome | null> {
  const format = detectFormat(text);
  if (!format) return null;
  assertCatalogPermissions(input.role, input.kind, input.onChange);
  const parsed = parseReferences(text, format);
  if (parsed.errors.length) {
    const errors = parsed.errors.slice(0, MAX_REPORTED_ERRORS).map((e) => ({ row: e.entry, column: e.citeKey ? 'cite_key' : null, reason: describeReferenceError(e) }));
    throw importRefusal(`Nothing was imported: ${parsed.errors.length} ${parsed.errors.length === 1 ? 'problem' : 'problems'} in the ${format} text (row = entry number).`, errors, parsed.errors.length);
  }
  const rows = parsed.sources.map((s, i) => sourceFromInput(i + 1, s));
  return commitRows(input, rows, rows.length, 'csv', (key) => key);
}

function refusal(format: 'csv' | 'json', errors: RowError[], errorCount: number) {
  const plural = errorCount === 1 ? 'error' : 'errors';
  return importRefusal(`Nothing was imported: ${errorCount} ${plural} in ${format === 'csv' ? 'the file' : 'the rows'}.`, errors, errorCount);
}

async function commitRows(input: CatalogImportInput, rows: CatalogRow[], rowCount: number, format: 'csv' | 'json', columnName: (key: string) => string): Promise<CatalogImportOutcome> {
  const { kind } = input;
  if (rowCount === 0) throw importRefusal('The file has no rows.', [{ row: 0, column: null, reason: 'The file has no rows.' }]);
  const stored = await loadStoredCatalog(input.workspaceId, kind);
  const plan = planCatalogImport(kind, rows, stored, columnName);
  const errors = [...plan.errors];
  const update = input.onChange === 'update';
  if (!update) errors.push(...changedRowErrors(kind, plan.changed));
  if (errors.length) {
    errors.sort((a, b) => a.row - b.row);
    throw refusal(format, errors.slice(0, MAX_REPORTED_ERRORS), errors.length);
  }
  const unchanged = plan.unchanged.slice(0, MAX_REPORTED_ERRORS).map(({ row, handle }) => ({ row, handle }));
  const base = {
    kind,
    rowCount,
    unchangedCount: plan.unchanged.length,
    unchanged,
    duplicateCount: plan.unchanged.length,
    duplicates: unchanged.map((u) => ({ row: u.row, reason: `Identical to the stored ${singular(kind)} "${excerpt(u.handle)}"; nothing written.` })),
  };
  const updates = update ? plan.changed.map((c) => ({ id: c.id, before: c.before, after: c.after })) : [];
  if (plan.creates.length === 0 && plan.revives.length === 0 && updates.length === 0) return { ...base, importId: null, createdCount: 0, updatedCount: 0, insertedCount: 0 };

  const first = await findImportBySha(input.workspaceId, input.sha256);
  if (first) throw duplicateFile(first);
  const { importId } = await commitCatalogImport(
    input.workspaceId,
    input.actor,
    { kind, fileName: input.fileName, sha256: input.sha256, byteCount: input.byteCount, via: input.via },
    kind,
    { creates: plan.creates.map((c) => c.record), updates, revives: plan.revives.map(({ id, before, record }) => ({ id, before, record })) },
    { rowCount, unchangedCount: plan.unchanged.length },
  );
  // New records change no benchmark (nothing refers to them yet); updated ones may.
  if (updates.length) await dataChanged(input.workspaceId, { cause: { trigger: 'import', importId, userId: input.actor.userId } });
  const createdCount = plan.creates.length + plan.revives.length;
  return { ...base, importId, createdCount, updatedCount: updates.length, insertedCount: createdCount + updates.length };
}

export const sha256Of = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');
