import { z } from 'zod';
import { columnsOf, IMPORTABLE_KINDS, type ImportableKind } from './columns';
import type { RowError } from './errors';

/**
 * One measured peak or computed mode typed into a form. It is stored as a
 * one-row import: the same columns, the same row validation (validateRow), the
 * same commit, audit, undo, recomputation and alerts as a file.
 * The form's field names are the template's column keys, so a row error's
 * column names the field it belongs to.
 */
const cell = z.string().trim().max(500, 'At most 500 characters.').optional().default('');

export const singleEntrySchema = z.object({
  workspaceId: z.string().min(1),
  kind: z.enum(IMPORTABLE_KINDS),
  material: cell,
  method: cell,
  quantity: cell,
  value: cell,
  unit: cell,
  uncertainty: cell,
  temperature_K: cell,
  irrep: cell,
  branch: cell,
  degeneracy: cell,
  activity: cell,
  technique: cell,
  laser_nm: cell,
  sample_form: cell,
  mode_index: cell,
  site: cell,
  tensor: cell,
  source: cell,
  notes: z.string().trim().max(2000, 'At most 2,000 characters.').optional().default(''),
});
export type SingleEntryInput = z.infer<typeof singleEntrySchema>;

/** The entry as an import row: only the columns of its kind, empty cells left out. */
export function entryRow(input: SingleEntryInput): Record<string, string> {
  const row: Record<string, string> = {};
  const values = input as unknown as Record<string, string>;
  for (const c of columnsOf(input.kind)) {
    const v = values[c.key];
    if (v) row[c.key] = v;
  }
  return row;
}

/** A short name for the one-row import, shown in the import list. */
export function entryName(input: SingleEntryInput): string {
  const what = [input.material, input.irrep, input.quantity, [input.value, input.unit].filter(Boolean).join(' ')].filter(Boolean).join(' ');
  return `single entry: ${what}`.slice(0, 200);
}

/** Row errors as the form's field errors (by column key); errors of the row as a whole stay apart. */
export function entryFieldErrors(errors: readonly RowError[]): { fieldErrors: Record<string, string[]>; general: string[] } {
  const fieldErrors: Record<string, string[]> = {};
  const general: string[] = [];
  for (const e of errors) {
    if (e.column) (fieldErrors[e.column] ??= []).push(e.reason);
    else general.push(e.reason);
  }
  return { fieldErrors, general };
}

export const ENTRY_NOUN: Record<ImportableKind, string> = { measurements: 'measurement', calculations: 'calculation' };
