/**
 * The columns of the catalogue imports (materials, methods, sources): one template
 * each, the same names in CSV headers and JSON rows. Kept apart from columns.ts so
 * the value columns stay as they were.
 */
import { SOURCE_KINDS } from '@/lib/record-kinds';
import type { ColumnDef } from './column-def';

export const CATALOG_KINDS = ['materials', 'methods', 'sources'] as const;
export type CatalogKind = (typeof CATALOG_KINDS)[number];

export function isCatalogKind(value: unknown): value is CatalogKind {
  return typeof value === 'string' && (CATALOG_KINDS as readonly string[]).includes(value);
}

const col = (key: string, required: boolean, description: string, aliases: string[] = []): ColumnDef => ({ key, required, aliases, description });

export const MATERIAL_IMPORT_COLUMNS: readonly ColumnDef[] = [
  col('name', true, 'Unique handle of the material in this workspace, e.g. "GaN-wz" (letters, digits and . _ + - ( )).', ['material', 'handle', 'material_name']),
  col('formula', true, 'Chemical formula, e.g. "GaN", "Al2O3", "CuSO4·5H2O"; reduced formula and atoms per formula unit are derived.', ['chemical_formula', 'composition']),
  col('display_name', false, 'Name shown in lists, e.g. "GaN (wurtzite)".', ['displayname', 'title', 'label']),
  col('space_group', false, 'International space-group number, whole number 1–230.', ['spacegroup', 'space_group_number', 'sg', 'spg']),
  col('atoms_in_cell', false, 'Atoms in the primitive cell: a whole multiple of the atoms per (reduced) formula unit.', ['atoms', 'natoms', 'n_atoms', 'atoms_in_primitive_cell', 'nsites']),
  col('external_id', false, 'Free external structure identifier (e.g. a database entry id); matches a stored material first.', ['externalid', 'structure_id', 'ext_id']),
  col('tags', false, 'Material classes separated by commas, e.g. "nitride, semiconductor".', ['tag', 'classes', 'class']),
  col('thermal_expansion_per_K', false, 'Volumetric thermal expansion α_V in K⁻¹ (3 × the linear coefficient of a cubic crystal), e.g. 3.12e-5; |α| ≤ 1e-3. Used only for the Cp − Cv correction of heat-capacity benchmarks, with B_T and V_m (all three needed).', ['thermal_expansion', 'volumetric_thermal_expansion', 'alpha_v', 'alpha_v_per_k', 'thermal_expansion_1_k']),
  col('bulk_modulus_GPa', false, 'Isothermal bulk modulus B_T in GPa, > 0 and < 2000. For the Cp − Cv correction only.', ['bulk_modulus', 'b_t', 'b_t_gpa', 'k_t']),
  col('molar_volume_cm3', false, 'Molar volume V_m in cm³ per mole of formula units (molar mass ÷ density), > 0 and < 1000. For the Cp − Cv correction only.', ['molar_volume', 'molar_volume_cm3_mol', 'molar_volume_cm3_per_mol', 'v_m', 'vm']),
  col('structure', false, 'POSCAR/CONTCAR or CIF text (quoted, line breaks kept): formula, atoms in the primitive cell and space group are derived from it and fill empty cells.', ['poscar', 'cif']),
  col('prefer', false, 'Where the structure disagrees with a typed cell: typed | structure (else the file-wide choice; without one the row is refused with both values).'),
];

export const METHOD_IMPORT_COLUMNS: readonly ColumnDef[] = [
  col('label', true, 'Unique label of the method in this workspace, e.g. "PBEsol-PAW-600".', ['method', 'method_label', 'name']),
  col('functional', true, 'Exchange–correlation functional: LDA, PBE, PBEsol, r2SCAN, HSE06, …', ['xc', 'xc_functional']),
  col('dispersion', false, 'Dispersion correction, e.g. "D3(BJ)".', ['vdw']),
  col('pseudopotential', false, 'Pseudopotential family, e.g. "PAW PBE 54".', ['pseudopotentials', 'pp']),
  col('cutoff_eV', false, 'Plane-wave cutoff in eV, a number > 0.', ['cutoff', 'encut', 'cutoff_ev', 'ecut']),
  col('k_grid', false, 'k-point grid, three whole numbers like "8x8x8".', ['kpoints', 'k_points', 'kgrid']),
  col('q_grid', false, 'q-point grid, three whole numbers like "4x4x4".', ['qpoints', 'q_points', 'qgrid']),
  col('smearing', false, 'Smearing, e.g. "Gaussian 0.01 eV".'),
  col('approach', false, 'perturbation | finite-displacement.'),
  col('lo_to_correction', false, 'LO–TO (non-analytic) correction: yes | no.', ['nac', 'non_analytic_correction', 'lo_to']),
  col('notes', false, 'Free text.', ['note', 'comment', 'comments']),
];

export const SOURCE_IMPORT_COLUMNS: readonly ColumnDef[] = [
  col('cite_key', true, 'Unique cite key, e.g. "azuhata1995" (letters, digits and _ : . + - /).', ['citekey', 'key', 'source', 'id']),
  col('kind', false, `${SOURCE_KINDS.join(' | ')}; journal-article when empty.`, ['type']),
  col('doi', false, 'DOI, bare or as a https://doi.org/ address; stored bare and lower-case. One source per DOI.'),
  col('title', false, 'Title; required except for an in-house notebook.'),
  col('authors', false, 'Authors separated by ";" ("Azuhata, T.; Sota, T.").', ['author']),
  col('year', false, 'Year, whole number.'),
  col('venue', false, 'Journal or container title.', ['journal', 'container']),
  col('volume', false, 'Volume.'),
  col('pages', false, 'Pages, e.g. "L129–L133".'),
  col('url', false, 'Web address (http or https).'),
  col('notebook_ref', false, 'In-house notebook reference (required for kind in-house-notebook).', ['notebook']),
  col('note', false, 'Free text.', ['notes']),
];

export function catalogColumnsOf(kind: CatalogKind): readonly ColumnDef[] {
  return kind === 'materials' ? MATERIAL_IMPORT_COLUMNS : kind === 'methods' ? METHOD_IMPORT_COLUMNS : SOURCE_IMPORT_COLUMNS;
}
