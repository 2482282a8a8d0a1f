import { ACTIVITY_VALUES as ACTIVITIES, BRANCH_VALUES as BRANCHES, SAMPLE_FORM_VALUES as SAMPLE_FORMS, TECHNIQUE_VALUES as TECHNIQUES } from './vocabulary';
import { ENTROPY_UNITS, FREQUENCY_UNITS } from '@/lib/science/units';

/** What an import file holds; each kind has its own template. */
export const IMPORTABLE_KINDS = ['measurements', 'calculations'] as const;
export type ImportableKind = (typeof IMPORTABLE_KINDS)[number];

/** Quantities an import may carry for now (the others arrive with their own checks). */
export const IMPORT_QUANTITIES = ['frequency', 'entropy'] as const;
export type ImportQuantity = (typeof IMPORT_QUANTITIES)[number];

export interface ColumnDef {
  /** Our column name, exactly as in the template header. */
  key: string;
  required: boolean;
  /** Other header spellings the auto-mapping recognises (compared after normalisation). */
  aliases: readonly string[];
  description: string;
}

const col = (key: string, required: boolean, description: string, aliases: string[] = []): ColumnDef => ({ key, required, aliases, description });

const list = (values: readonly string[]) => values.join(' | ');

const shared = {
  material: col('material', true, 'Material name (the unique handle of a material in this workspace, e.g. "GaN-wz").', ['material_name', 'compound', 'crystal']),
  quantity: col('quantity', true, `What the value is: ${list(IMPORT_QUANTITIES)}.`, ['property']),
  value: col('value', true, 'The number as written ("1.50" is kept as "1.50"). Frequencies > 0 for measurements; calculations may be ≤ 0 (imaginary modes are written as negative numbers).', ['frequency', 'entropy', 'val']),
  unit: col('unit', false, `Unit of value (and uncertainty). Frequency: ${list(FREQUENCY_UNITS)}; entropy: ${list(ENTROPY_UNITS)}. May be left out when a unit is chosen for the whole file.`, ['units']),
  temperature: col('temperature_K', false, 'Temperature in kelvin, ≥ 0. Required for entropies.', ['temperature', 'temp', 't_k', 'temperature_k', 't']),
  irrep: col('irrep', false, 'Irreducible-representation label, e.g. A1g, E2(high), T2g; normalised on import.', ['label', 'symmetry', 'mode_label']),
  branch: col('branch', false, `${list(BRANCHES)}; left empty when not split. Read from the irrep label when that carries it, e.g. "A1(LO)".`),
  degeneracy: col('degeneracy', false, 'Whole number ≥ 1.', ['deg']),
  activity: col('activity', false, `${list(ACTIVITIES)}.`),
  source: col('source', true, 'Cite key of a source in this workspace, e.g. "azuhata1995".', ['source_key', 'cite_key', 'citekey', 'citation', 'reference']),
  notes: col('notes', false, 'Free text.', ['note', 'comment', 'comments']),
};

export const MEASUREMENT_COLUMNS: readonly ColumnDef[] = [
  shared.material,
  shared.quantity,
  shared.value,
  shared.unit,
  col('uncertainty', false, 'Uncertainty of value, ≥ 0, in the same unit.', ['error', 'sigma', 'err', 'uncertainty_value']),
  shared.temperature,
  shared.irrep,
  shared.branch,
  shared.degeneracy,
  shared.activity,
  col('technique', false, `${list(TECHNIQUES)}.`),
  col('laser_nm', false, 'Excitation laser wavelength in nm, > 0 (Raman).', ['laser', 'laser_wavelength', 'laser_wavelength_nm', 'wavelength_nm']),
  col('sample_form', false, `${list(SAMPLE_FORMS)}.`, ['sample']),
  shared.source,
  shared.notes,
];

export const CALCULATION_COLUMNS: readonly ColumnDef[] = [
  shared.material,
  col('method', true, 'Label of a method in this workspace, e.g. "PBEsol-PAW-600".', ['method_label', 'recipe']),
  shared.quantity,
  shared.value,
  shared.unit,
  col('mode_index', false, 'Index of the mode in the computed list, whole number ≥ 1.', ['mode', 'index', 'band', 'band_index']),
  shared.irrep,
  shared.branch,
  shared.degeneracy,
  shared.activity,
  shared.temperature,
  shared.source,
  shared.notes,
];

export function columnsOf(kind: ImportableKind): readonly ColumnDef[] {
  return kind === 'measurements' ? MEASUREMENT_COLUMNS : CALCULATION_COLUMNS;
}

export function isImportableKind(value: unknown): value is ImportableKind {
  return typeof value === 'string' && (IMPORTABLE_KINDS as readonly string[]).includes(value);
}
