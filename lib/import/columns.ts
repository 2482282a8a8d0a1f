import { ACTIVITY_VALUES as ACTIVITIES, BRANCH_VALUES as BRANCHES, SAMPLE_FORM_VALUES as SAMPLE_FORMS, TECHNIQUE_VALUES as TECHNIQUES } from './vocabulary';
import { catalogColumnsOf, isCatalogKind, type CatalogKind } from './catalog-columns';
import { ENTROPY_UNITS, FREQUENCY_UNITS } from '@/lib/science/units';

/** What an import file holds; each kind has its own template. */
export const IMPORTABLE_KINDS = ['measurements', 'calculations'] as const;
export type ImportableKind = (typeof IMPORTABLE_KINDS)[number];

/** Every kind read as a table of rows: values, and the catalogue kinds (materials, methods, sources). */
export type TableKind = ImportableKind | CatalogKind;

/** Quantities an import may carry for now (the others arrive with their own checks). */
export const IMPORT_QUANTITIES = ['frequency', 'entropy', 'heat-capacity', 'eps-inf', 'eps-static', 'born-charge'] as const;
export type ImportQuantity = (typeof IMPORT_QUANTITIES)[number];

export type { ColumnDef } from './column-def';
import type { ColumnDef } from './column-def';

const col = (key: string, required: boolean, description: string, aliases: string[] = []): ColumnDef => ({ key, required, aliases, description });

const list = (values: readonly string[]) => values.join(' | ');

const shared = {
  material: col('material', true, 'Material name (the unique handle of a material in this workspace, e.g. "GaN-wz").', ['material_name', 'compound', 'crystal']),
  quantity: col('quantity', true, `What the value is: ${list(IMPORT_QUANTITIES)}.`, ['property']),
  value: col('value', true, 'The number as written ("1.50" is kept as "1.50"). Frequencies > 0 for measurements; calculations may be ≤ 0 (imaginary modes are written as negative numbers). Entropies and heat capacities ≥ 0; a measured heat capacity is Cp (calorimetry), a harmonic one Cv. Dielectric constants (eps-inf = ε∞, eps-static = ε₀) ≥ 1, dimensionless, the orientational average for a non-cubic crystal. A Born effective charge (born-charge) in e, may be negative: the mean of the diagonal of its tensor. With a tensor the cell may be left empty.', ['frequency', 'entropy', 'val']),
  unit: col('unit', false, `Unit of value (and uncertainty). Frequency: ${list(FREQUENCY_UNITS)}; entropy and heat capacity: ${list(ENTROPY_UNITS)}; dielectric constants: none (or 1); Born charges: e (or none). May be left out when a unit is chosen for the whole file.`, ['units']),
  temperature: col('temperature_K', false, 'Temperature in kelvin, ≥ 0. Required for entropies and heat capacities.', ['temperature', 'temp', 't_k', 'temperature_k', 't']),
  irrep: col('irrep', false, 'Irreducible-representation label, e.g. A1g, E2(high), T2g; normalised on import.', ['label', 'symmetry', 'mode_label']),
  branch: col('branch', false, `${list(BRANCHES)}; left empty when not split. Read from the irrep label when that carries it, e.g. "A1(LO)".`),
  degeneracy: col('degeneracy', false, 'Whole number ≥ 1.', ['deg']),
  activity: col('activity', false, `${list(ACTIVITIES)}.`),
  source: col('source', true, 'Cite key of a source in this workspace, e.g. "azuhata1995".', ['source_key', 'cite_key', 'citekey', 'citation', 'reference']),
  site: col('site', false, 'Born charges: the atom, its element symbol with an optional number, e.g. "Ga", "O2". Required for born-charge rows.', ['atom', 'atom_site', 'site_label']),
  tensor: col(
    'tensor',
    false,
    'Born charge: its 3 × 3 tensor in e, nine numbers row-major (xx xy xz yx yy yz zx zy zz) separated by spaces or semicolons. Dielectric constant of a non-cubic crystal: its three principal values. The value column, if filled, must equal the mean of the diagonal.',
    ['components', 'principal_values'],
  ),
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
  shared.site,
  shared.tensor,
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
  shared.site,
  shared.tensor,
  shared.temperature,
  shared.source,
  shared.notes,
];

/**
 * Optional catalogue columns of a calculation import: with createMissing, a row whose
 * material or method is not in the workspace creates it from these (lib/import/create-missing.ts).
 */
export const CALCULATION_CATALOG_COLUMNS: readonly ColumnDef[] = [
  col('material_formula', false, 'With createMissing: formula of a new material, e.g. "GaN".'),
  col('material_space_group', false, 'With createMissing: space-group number 1–230 of a new material.'),
  col('material_atoms_in_cell', false, 'With createMissing: atoms in the primitive cell of a new material (a whole multiple of the atoms per formula unit).'),
  col('material_display_name', false, 'With createMissing: display name of a new material.'),
  col('material_external_id', false, 'With createMissing: external structure identifier of a new material.'),
  col('material_tags', false, 'With createMissing: tags of a new material, separated by commas.'),
  col('method_functional', false, 'With createMissing: functional of a new method, e.g. "PBEsol".'),
  col('method_dispersion', false, 'With createMissing: dispersion correction of a new method.'),
  col('method_pseudopotential', false, 'With createMissing: pseudopotential family of a new method.'),
  col('method_cutoff_eV', false, 'With createMissing: plane-wave cutoff of a new method in eV, > 0.'),
  col('method_k_grid', false, 'With createMissing: k-point grid of a new method, e.g. "8x8x8".'),
  col('method_q_grid', false, 'With createMissing: q-point grid of a new method, e.g. "4x4x4".'),
  col('method_smearing', false, 'With createMissing: smearing of a new method.'),
  col('method_approach', false, 'With createMissing: perturbation | finite-displacement.'),
  col('method_lo_to', false, 'With createMissing: LO–TO (non-analytic) correction of a new method, yes | no.'),
];

export function columnsOf(kind: TableKind): readonly ColumnDef[] {
  if (isCatalogKind(kind)) return catalogColumnsOf(kind);
  return kind === 'measurements' ? MEASUREMENT_COLUMNS : [...CALCULATION_COLUMNS, ...CALCULATION_CATALOG_COLUMNS];
}

/** Columns of the downloadable template (the calculation template leaves out the createMissing columns). */
export function templateColumnsOf(kind: TableKind): readonly ColumnDef[] {
  return kind === 'calculations' ? CALCULATION_COLUMNS : columnsOf(kind);
}

export function isImportableKind(value: unknown): value is ImportableKind {
  return typeof value === 'string' && (IMPORTABLE_KINDS as readonly string[]).includes(value);
}
