/**
 * The wizard's method table: one line per method label a calculation file names but the
 * workspace lacks, with the recipe the import creates that method with (createMissing).
 * For the labels it lists, the table replaces the rows' method_ cells (create-missing.ts takes
 * the records from here and reads no method_ cell of those rows). A line is checked with the
 * rules of a methods catalogue row (validateCatalogRow), and its errors name the line and field.
 * Used by the browser (checking the table as it is edited) and by the server alike.
 */
import { z } from 'zod';
import { validateCatalogRow, type MethodRecord } from './catalog-rows';
import type { CellReader } from './column-def';
import { excerpt, importRefusal, MAX_REPORTED_ERRORS, type ImportRefusalError, type RowError } from './errors';

/** The recipe fields of a line, as the methods catalogue names its columns. */
export const METHOD_TABLE_FIELDS = ['functional', 'dispersion', 'pseudopotential', 'cutoff_eV', 'k_grid', 'q_grid', 'smearing', 'approach', 'lo_to_correction'] as const;
export type MethodTableField = (typeof METHOD_TABLE_FIELDS)[number];

/** A line as the wizard sends it: text cells, empty ones left out. */
export type MethodTableLine = { label: string } & Partial<Record<MethodTableField, string>>;

/** Recipe field → the calculation file's column that createMissing reads it from. */
export const METHOD_CELLS: Record<MethodTableField, string> = {
  functional: 'method_functional',
  dispersion: 'method_dispersion',
  pseudopotential: 'method_pseudopotential',
  cutoff_eV: 'method_cutoff_eV',
  k_grid: 'method_k_grid',
  q_grid: 'method_q_grid',
  smearing: 'method_smearing',
  approach: 'method_approach',
  lo_to_correction: 'method_lo_to',
};

/** How errors and the table's header name each field. */
export const METHOD_TABLE_FIELD_NAMES: Record<'label' | MethodTableField, string> = {
  label: 'label',
  functional: 'functional',
  dispersion: 'dispersion',
  pseudopotential: 'pseudopotential',
  cutoff_eV: 'cutoff (eV)',
  k_grid: 'k-grid',
  q_grid: 'q-grid',
  smearing: 'smearing',
  approach: 'approach',
  lo_to_correction: 'LO–TO',
};

/**
 * Lines one import may carry: the table travels in the upload's query string beside the file
 * bytes, and 60 full lines stay well inside a server's usual 16 KB request-header limit.
 */
export const MAX_METHOD_LINES = 60;

// The wire shape only; what a cell may say is validateCatalogRow's business.
const cell = z.string().max(200, 'At most 200 characters.').optional();
export const methodTableLineSchema = z.strictObject({
  label: z.string().trim().min(1, 'A method line needs its label.').max(100, 'A label has at most 100 characters.'),
  ...(Object.fromEntries(METHOD_TABLE_FIELDS.map((f) => [f, cell])) as Record<MethodTableField, typeof cell>),
});
export const methodTableSchema = z
  .array(methodTableLineSchema)
  .min(1, 'The method table has no lines.')
  .max(MAX_METHOD_LINES, `The method table takes at most ${MAX_METHOD_LINES} lines in one import.`);

/** A checked line: the method it creates. */
export interface TableMethod {
  /** 1-based, as the wizard numbers the lines. */
  line: number;
  record: MethodRecord;
}

export interface MethodTableCheck {
  /** Label → the line's method; null for a line with errors (the first line of a label counts). */
  methods: Map<string, TableMethod | null>;
  errors: RowError[];
}

const isField = (key: string): key is MethodTableField => (METHOD_TABLE_FIELDS as readonly string[]).includes(key);

const lineError = (line: number, field: 'label' | MethodTableField, reason: string, value?: string): RowError => ({
  row: 0,
  methodLine: line,
  column: METHOD_TABLE_FIELD_NAMES[field],
  reason,
  ...(value !== undefined ? { value: excerpt(value) } : {}),
});

/**
 * Checks every line: the catalogue rules of a method row, a label given once, and one the
 * workspace neither has (`stored`) nor keeps reserved for a retracted method (`reserved`).
 */
export function checkMethodTable(lines: readonly MethodTableLine[], known: { stored: (label: string) => boolean; reserved?: ReadonlySet<string> }): MethodTableCheck {
  const methods = new Map<string, TableMethod | null>();
  const errors: RowError[] = [];
  const firstLine = new Map<string, number>();
  const nameOf = (key: string) => METHOD_TABLE_FIELD_NAMES[key as MethodTableField] ?? key;
  lines.forEach((entry, i) => {
    const line = i + 1;
    const label = entry.label.trim();
    // The table has no notes field: a method made from a line starts without notes.
    const read: CellReader = (key) => (key === 'label' ? entry.label : isField(key) ? entry[key] : undefined);
    const before = errors.length;
    const seen = firstLine.get(label);
    if (seen !== undefined) errors.push(lineError(line, 'label', `Line ${seen} already defines method "${excerpt(label)}".`, label));
    else if (label !== '') firstLine.set(label, line);
    if (known.reserved?.has(label)) errors.push(lineError(line, 'label', `"${excerpt(label)}" is a retracted method of this workspace: restore it first (its label stays reserved).`, label));
    else if (label !== '' && known.stored(label)) errors.push(lineError(line, 'label', `The workspace already has method "${excerpt(label)}": its rows use the stored method, so remove this line.`, label));
    const rowErrors: RowError[] = [];
    const checked = validateCatalogRow('methods', line, read, nameOf, rowErrors);
    for (const e of rowErrors) errors.push({ ...e, row: 0, methodLine: line });
    if (seen === undefined && label !== '') methods.set(label, checked && errors.length === before ? { line, record: checked.record as MethodRecord } : null);
  });
  return { methods, errors };
}

/** Lines whose label no row of the file names: refused, since the import would create a method with no values. */
export function unusedLineErrors(lines: readonly TableMethod[]): RowError[] {
  return lines.map((m) => lineError(m.line, 'label', `No row of the file names method "${excerpt(m.record.label)}": remove the line or fix the file.`, m.record.label));
}

/** The refusal of an import whose method table has errors: those first, then the rows' own when the rows had errors too. */
export function tableRefusal(lineErrors: readonly RowError[], rows: ImportRefusalError | null): ImportRefusalError {
  const total = lineErrors.length + (rows?.errorCount ?? 0);
  const where = rows ? 'the file and the method table' : 'the method table';
  return importRefusal(`Nothing was imported: ${total} ${total === 1 ? 'error' : 'errors'} in ${where}.`, [...lineErrors, ...(rows?.errors ?? [])].slice(0, MAX_REPORTED_ERRORS), total);
}

/** A line without its empty cells (what the wizard sends). */
export function compactLine(line: MethodTableLine): MethodTableLine {
  const out: MethodTableLine = { label: line.label };
  for (const f of METHOD_TABLE_FIELDS) {
    const v = line[f]?.trim();
    if (v) out[f] = v;
  }
  return out;
}

/** Copies the recipe of `from` into line `to`, keeping its label (the wizard's "copy from the line above"). */
export function copyRecipe(lines: readonly MethodTableLine[], from: number, to: number): MethodTableLine[] {
  const source = lines[from];
  if (!source || !lines[to]) return [...lines];
  return lines.map((l, i) => (i === to ? { ...Object.fromEntries(METHOD_TABLE_FIELDS.map((f) => [f, source[f] ?? ''])), label: l.label } : l));
}

/** Sets one field of every line below the first to the first line's value (the wizard's "fill down"). */
export function fillDown(lines: readonly MethodTableLine[], field: MethodTableField): MethodTableLine[] {
  const value = lines[0]?.[field] ?? '';
  return lines.map((l, i) => (i === 0 ? l : { ...l, [field]: value }));
}

/** A label of the file the workspace lacks, with the method_ cells of the first row naming it (the line's prefill). */
export interface MissingMethodLabel {
  label: string;
  row: number;
  cells: Partial<Record<MethodTableField, string>>;
  /** Later rows whose method_ cells say otherwise (the first per field): the table's value replaces them all. */
  others: Array<{ field: MethodTableField; row: number; value: string }>;
}

/**
 * Collects, while a calculation file is read, the method labels the workspace lacks, in the
 * order the file first names them. Past `limit` labels only the count goes on.
 */
export class MissingMethodLabels {
  private readonly byLabel = new Map<string, MissingMethodLabel>();
  private extra = new Set<string>();

  constructor(
    private readonly known: ReadonlySet<string>,
    private readonly limit = MAX_METHOD_LINES,
  ) {}

  add(row: number, read: CellReader): void {
    const label = (read('method') ?? '').trim();
    if (label === '' || this.known.has(label)) return;
    const cellOf = (f: MethodTableField) => (read(METHOD_CELLS[f]) ?? '').trim();
    const seen = this.byLabel.get(label);
    if (seen) {
      for (const f of METHOD_TABLE_FIELDS) {
        const v = cellOf(f);
        if (v !== '' && v !== (seen.cells[f] ?? '') && !seen.others.some((o) => o.field === f)) seen.others.push({ field: f, row, value: excerpt(v) });
      }
      return;
    }
    if (this.byLabel.size >= this.limit) {
      this.extra.add(label);
      return;
    }
    const cells: MissingMethodLabel['cells'] = {};
    for (const f of METHOD_TABLE_FIELDS) {
      const v = cellOf(f);
      if (v !== '') cells[f] = v;
    }
    this.byLabel.set(label, { label, row, cells, others: [] });
  }

  get labels(): MissingMethodLabel[] {
    return [...this.byLabel.values()];
  }

  get count(): number {
    return this.byLabel.size + this.extra.size;
  }
}

/** The line a missing label starts as: the file's cells, LO–TO and approach spelt as the table's choices. */
export function prefillLine(missing: MissingMethodLabel): MethodTableLine {
  const line: MethodTableLine = { label: missing.label, ...missing.cells };
  const loTo = line.lo_to_correction?.toLowerCase();
  if (loTo && ['yes', 'true', '1', 'on'].includes(loTo)) line.lo_to_correction = 'yes';
  else if (loTo && ['no', 'false', '0', 'off'].includes(loTo)) line.lo_to_correction = 'no';
  const approach = line.approach?.toLowerCase().replace(/[\s_]+/g, '-');
  if (approach === 'perturbation' || approach === 'finite-displacement') line.approach = approach;
  return line;
}
