/**
 * One-step pipeline pushes (createMissing): a calculation row naming a material or a
 * method the workspace lacks creates it, from the row's catalogue columns
 * (material_formula, material_space_group, material_atoms_in_cell, …; method_functional,
 * method_k_grid, …), checked exactly like a catalogue import row. The first row naming a
 * new record creates it; every later row naming it must carry the same catalogue values
 * in the columns it fills, else that row is an error naming the conflicting column and
 * the first row. Rows naming stored records are not compared with them.
 * A method the wizard's method table defines (method-table.ts) is created from its line
 * instead, and the method_ cells of the rows naming it are not read.
 * Used by the server's validation and by the wizard's preview alike.
 */
import type { RowError } from './errors';
import { validateCatalogRow, type MaterialRecord, type MethodRecord } from './catalog-rows';
import type { CellReader } from './column-def';
import { excerpt } from './errors';
import { METHOD_CELLS, type TableMethod } from './method-table';

/** The handles a calculation import resolves (validate-row's ImportReferences, of which this is a part). */
interface ImportReferences {
  materials: Map<string, { id: string; atomsPerFormulaUnit: number; atomsInCell?: number | null }>;
  methods: Map<string, string>;
}

type Fail = (key: string, reason: string, value?: string) => void;

const MATERIAL_CELLS: Record<string, string> = {
  formula: 'material_formula',
  space_group: 'material_space_group',
  atoms_in_cell: 'material_atoms_in_cell',
  display_name: 'material_display_name',
  external_id: 'material_external_id',
  tags: 'material_tags',
};
interface Pending<R> {
  id: string;
  row: number;
  record: R;
  given: ReadonlySet<string>;
}

/**
 * Methods defined by the wizard's method table: the checked lines by label (the server; null for
 * a line with errors, which refuse the import on their own, so its rows add none), or 'deferred'
 * (the browser's preview, which checks the table apart so that editing a line does not read the
 * file again): there any label the workspace lacks is accepted.
 */
export type MethodTableSource = ReadonlyMap<string, TableMethod | null> | 'deferred';

export class MissingCatalog {
  private readonly materials = new Map<string, Pending<MaterialRecord>>();
  private readonly methods = new Map<string, Pending<MethodRecord>>();
  private readonly deferredMethods = new Map<string, string>();
  private newMaterials: Array<MaterialRecord & { id: string }> = [];
  private newMethods: Array<MethodRecord & { id: string }> = [];

  constructor(
    private readonly references: ImportReferences,
    private readonly columnName: (key: string) => string,
    /** Labels of retracted methods: reserved for good, so they cannot be created again. */
    private readonly reservedMethodLabels: ReadonlySet<string> = new Set(),
    private readonly newId: () => string = () => crypto.randomUUID(),
    private readonly methodTable?: MethodTableSource,
  ) {}

  handlesMaterial(name: string): boolean {
    return this.materials.has(name) || !this.references.materials.has(name);
  }

  handlesMethod(label: string): boolean {
    return this.methods.has(label) || !this.references.methods.has(label);
  }

  get createdMaterialCount(): number {
    return this.materials.size;
  }

  get createdMethodCount(): number {
    return this.methods.size + this.deferredMethods.size;
  }

  /** Table lines no row named (nothing to create them for). */
  unusedTableLines(): TableMethod[] {
    if (this.methodTable === undefined || this.methodTable === 'deferred') return [];
    return [...this.methodTable.values()].filter((m): m is TableMethod => m !== null && !this.methods.has(m.record.label));
  }

  /** The records first seen since the last call, to insert before the rows that refer to them. */
  takeNew(): { materials: Array<MaterialRecord & { id: string }>; methods: Array<MethodRecord & { id: string }> } {
    const out = { materials: this.newMaterials, methods: this.newMethods };
    this.newMaterials = [];
    this.newMethods = [];
    return out;
  }

  material(row: number, name: string, read: CellReader, fail: Fail): { id: string; atomsPerFormulaUnit: number; atomsInCell: number | null } | null {
    if ((read('material_formula') ?? '').trim() === '' && !this.materials.has(name)) {
      fail('material', `Unknown material "${excerpt(name)}". To create it in this import, fill material_formula (and material_space_group, material_atoms_in_cell).`, name);
      return null;
    }
    const known = this.materials.get(name);
    const cells = cellsOf(MATERIAL_CELLS, read);
    // A later row naming a new material need not repeat its formula; the cells it does fill must agree.
    const inherited = known !== undefined && (cells.formula ?? '').trim() === '';
    if (inherited) cells.formula = known.record.formula;
    const checked = this.check(row, 'materials', { name, ...cells }, MATERIAL_CELLS, fail);
    if (!checked) return null;
    if (inherited) (checked.given as Set<string>).delete('formula');
    const record = checked.record as MaterialRecord;
    if (known) {
      if (!this.consistent(known, checked.given, record, MATERIAL_CELLS, 'material', name, fail)) return null;
      return { id: known.id, atomsPerFormulaUnit: known.record.atomsPerFormulaUnit, atomsInCell: known.record.atomsInCell };
    }
    const id = this.newId();
    this.materials.set(name, { id, row, record, given: checked.given });
    this.newMaterials.push({ ...record, id });
    this.references.materials.set(name, { id, atomsPerFormulaUnit: record.atomsPerFormulaUnit, atomsInCell: record.atomsInCell });
    return { id, atomsPerFormulaUnit: record.atomsPerFormulaUnit, atomsInCell: record.atomsInCell };
  }

  method(row: number, label: string, read: CellReader, fail: Fail): string | null {
    if (this.reservedMethodLabels.has(label)) {
      fail('method', `"${excerpt(label)}" is a retracted method of this workspace: restore it first (its label stays reserved).`, label);
      return null;
    }
    const fromTable = this.tableMethod(row, label);
    if (fromTable !== undefined) return fromTable;
    if ((read('method_functional') ?? '').trim() === '' && !this.methods.has(label)) {
      fail('method', `Unknown method "${excerpt(label)}". To create it in this import, fill method_functional (and the other method_ columns of its recipe).`, label);
      return null;
    }
    const known = this.methods.get(label);
    const cells = cellsOf(METHOD_CELLS, read);
    const inherited = known !== undefined && (cells.functional ?? '').trim() === '';
    if (inherited) cells.functional = known.record.functional;
    const checked = this.check(row, 'methods', { label, ...cells }, METHOD_CELLS, fail);
    if (!checked) return null;
    if (inherited) (checked.given as Set<string>).delete('functional');
    if (known) return this.consistent(known, checked.given, checked.record as MethodRecord, METHOD_CELLS, 'method', label, fail) ? known.id : null;
    const id = this.newId();
    const record = checked.record as MethodRecord;
    this.methods.set(label, { id, row, record, given: checked.given });
    this.newMethods.push({ ...record, id });
    this.references.methods.set(label, id);
    return id;
  }

  /** The id of a method the table defines (created at its first row), else undefined. */
  private tableMethod(row: number, label: string): string | undefined {
    const table = this.methodTable;
    if (table === undefined) return undefined;
    const line = table === 'deferred' ? null : table.get(label);
    if (line === undefined) return undefined;
    if (line === null) {
      const id = this.deferredMethods.get(label) ?? this.newId();
      this.deferredMethods.set(label, id);
      // so that the preview's mode-set warnings name the method by its label
      this.references.methods.set(label, id);
      return id;
    }
    const known = this.methods.get(label);
    if (known) return known.id;
    const id = this.newId();
    this.methods.set(label, { id, row, record: line.record, given: new Set() });
    this.newMethods.push({ ...line.record, id });
    this.references.methods.set(label, id);
    return id;
  }

  private check(row: number, kind: 'materials' | 'methods', cells: Record<string, string | undefined>, columns: Record<string, string>, fail: Fail) {
    const errors: RowError[] = [];
    const handleKey = kind === 'materials' ? 'name' : 'label';
    const ownColumn = (key: string) => (key === handleKey ? (kind === 'materials' ? 'material' : 'method') : (columns[key] ?? key));
    const checked = validateCatalogRow(kind, row, (key) => cells[key], (key) => `\u0000${ownColumn(key)}`, errors);
    for (const e of errors) {
      const key = e.column?.startsWith('\u0000') ? e.column.slice(1) : (kind === 'materials' ? 'material' : 'method');
      fail(key, e.reason, e.value);
    }
    return checked;
  }

  private consistent<R extends object>(known: Pending<R>, given: ReadonlySet<string>, record: R, columns: Record<string, string>, what: string, handle: string, fail: Fail): boolean {
    let ok = true;
    const fieldToColumn = what === 'material' ? MATERIAL_FIELD_COLUMNS : METHOD_FIELD_COLUMNS;
    for (const field of given) {
      const column = fieldToColumn[field];
      if (!column) continue;
      const a = JSON.stringify((record as Record<string, unknown>)[field] ?? null);
      const b = JSON.stringify((known.record as Record<string, unknown>)[field] ?? null);
      if (a !== b) {
        ok = false;
        fail(columns[column] ?? column, `Conflicts with row ${known.row}, which creates ${what} "${excerpt(handle)}" with ${columns[column] ?? column} ${b === 'null' ? '(empty)' : excerpt(b.replace(/^"|"$/g, ''))}.`);
      }
    }
    return ok;
  }
}

const MATERIAL_FIELD_COLUMNS: Record<string, string> = { formula: 'formula', spaceGroup: 'space_group', atomsInCell: 'atoms_in_cell', displayName: 'display_name', externalId: 'external_id', tags: 'tags' };
const METHOD_FIELD_COLUMNS: Record<string, string> = {
  functional: 'functional',
  dispersion: 'dispersion',
  pseudopotential: 'pseudopotential',
  cutoffEv: 'cutoff_eV',
  kGrid: 'k_grid',
  qGrid: 'q_grid',
  smearing: 'smearing',
  approach: 'approach',
  nonAnalyticCorrection: 'lo_to_correction',
};

function cellsOf(columns: Record<string, string>, read: CellReader): Record<string, string | undefined> {
  const out: Record<string, string | undefined> = {};
  for (const [key, column] of Object.entries(columns)) out[key] = read(column);
  return out;
}
