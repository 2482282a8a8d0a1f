import { templateColumnsOf, type TableKind } from './columns';
import { toCsv } from '@/lib/csv';

/**
 * Example rows of the downloadable templates. The measured values are published
 * (sources named in the notes cell, see ../shared/reference/check-values.md);
 * the computed values are invented to show the format and say so.
 */
const EXAMPLES: Record<TableKind, Array<Record<string, string>>> = {
  measurements: [
    {
      material: 'GaN-wz',
      quantity: 'frequency',
      value: '569',
      unit: 'cm-1',
      temperature_K: '295',
      irrep: 'E2(high)',
      activity: 'raman',
      technique: 'raman',
      sample_form: 'single-crystal',
      source: 'azuhata1995',
      notes: 'Azuhata et al., J. Phys.: Condens. Matter 7, L129 (1995)',
    },
    {
      material: 'Si',
      quantity: 'frequency',
      value: '520.2',
      unit: 'cm-1',
      uncertainty: '0.5',
      temperature_K: '300',
      irrep: 'F2g',
      degeneracy: '3',
      activity: 'raman',
      technique: 'raman',
      source: 'parker1967',
      notes: 'Parker, Feldman & Ashkin, Phys. Rev. 155, 712 (1967)',
    },
    {
      material: 'Al2O3-corundum',
      quantity: 'entropy',
      value: '50.92',
      unit: 'J/mol/K',
      uncertainty: '0.10',
      temperature_K: '298.15',
      technique: 'calorimetry',
      source: 'codata1989',
      notes: 'Standard molar entropy, CODATA Key Values for Thermodynamics (1989)',
    },
    {
      material: 'Al2O3-corundum',
      quantity: 'heat-capacity',
      value: '79.01',
      unit: 'J/mol/K',
      temperature_K: '298.15',
      technique: 'calorimetry',
      source: 'janaf1998',
      notes: 'Cp at 298.15 K, NIST-JANAF Thermochemical Tables (1998); value recalled from memory, check it against the tables',
    },
    {
      material: 'NaCl-rs',
      quantity: 'eps-inf',
      value: '2.34',
      temperature_K: '295',
      source: 'inhouse-notebook-2026',
      notes: 'example row: a textbook ε∞ recalled from memory; dielectric constants have no unit (leave it empty)',
    },
    {
      material: 'NaCl-rs',
      quantity: 'born-charge',
      value: '1.1',
      unit: 'e',
      site: 'Na',
      source: 'inhouse-notebook-2026',
      notes: 'example row: a magnitude recalled from memory; a bare element site stands for every atom of that element',
    },
  ],
  calculations: [
    {
      material: 'GaN-wz',
      method: 'PBEsol-PAW-600',
      quantity: 'frequency',
      value: '563.1',
      unit: 'cm-1',
      mode_index: '10',
      irrep: 'E2(high)',
      degeneracy: '2',
      activity: 'raman',
      source: 'inhouse-pbesol-2026',
      notes: 'example row: invented value',
    },
    {
      material: 'GaN-wz',
      method: 'PBEsol-PAW-600',
      quantity: 'frequency',
      value: '-0.02',
      unit: 'cm-1',
      mode_index: '1',
      irrep: 'A1',
      activity: 'acoustic',
      source: 'inhouse-pbesol-2026',
      notes: 'example row: invented acoustic mode; calculations may be zero or negative (imaginary)',
    },
    {
      material: 'Si',
      method: 'PBEsol-PAW-600',
      quantity: 'entropy',
      value: '2.21',
      unit: 'kB/atom',
      temperature_K: '300',
      source: 'inhouse-pbesol-2026',
      notes: 'example row: invented value',
    },
    {
      material: 'Si',
      method: 'PBEsol-PAW-600',
      quantity: 'heat-capacity',
      value: '19.6',
      unit: 'J/mol/K',
      temperature_K: '298.15',
      source: 'inhouse-pbesol-2026',
      notes: 'example row: invented harmonic Cv',
    },
    {
      material: 'Si',
      method: 'PBEsol-PAW-600',
      quantity: 'eps-inf',
      value: '12.9',
      source: 'inhouse-pbesol-2026',
      notes: 'example row: invented ε∞ (DFPT); the orientational average for a non-cubic crystal',
    },
    {
      material: 'GaN-wz',
      method: 'PBEsol-PAW-600',
      quantity: 'eps-inf',
      tensor: '5.35 5.35 5.60',
      source: 'inhouse-pbesol-2026',
      notes: 'example row: invented principal values of ε∞ (x, y, z); the value is left empty and taken as their mean',
    },
    {
      material: 'GaN-wz',
      method: 'PBEsol-PAW-600',
      quantity: 'born-charge',
      site: 'Ga1',
      tensor: '2.60 0 0; 0 2.60 0; 0 0 2.74',
      source: 'inhouse-pbesol-2026',
      notes: 'example row: invented Born-charge tensor of one Ga atom, in e, row-major; give every atom of the cell so neutrality can be checked',
    },
  ],
  // Catalogue examples: well-known structures (space groups and atoms per primitive cell
  // as commonly tabulated); the external identifiers are invented and say so. NaCl's α_V, B_T
  // and V_m are handbook values recalled from memory (data/templates/README.md says so).
  materials: [
    { name: 'GaN-wz', formula: 'GaN', display_name: 'GaN (wurtzite)', space_group: '186', atoms_in_cell: '4', external_id: 'example-0001 (invented)', tags: 'nitride, semiconductor' },
    { name: 'NaCl-rs', formula: 'NaCl', display_name: 'NaCl (rocksalt)', space_group: '225', atoms_in_cell: '2', external_id: '', tags: 'halide', thermal_expansion_per_K: '1.2e-4', bulk_modulus_GPa: '24.0', molar_volume_cm3: '27.0' },
    { name: 'SrTiO3-cub', formula: 'SrTiO3', display_name: 'SrTiO3 (cubic perovskite)', space_group: '221', atoms_in_cell: '5', external_id: '', tags: 'oxide, perovskite' },
  ],
  methods: [
    { label: 'PBEsol-PAW-600', functional: 'PBEsol', dispersion: '', pseudopotential: 'PAW (example family)', cutoff_eV: '600', k_grid: '8x8x8', q_grid: '4x4x4', smearing: 'Gaussian 0.01 eV', approach: 'perturbation', lo_to_correction: 'yes', notes: 'example row: invented recipe' },
    { label: 'LDA-NC-finite', functional: 'LDA', pseudopotential: 'norm-conserving (example)', cutoff_eV: '1000', k_grid: '6x6x6', q_grid: '2x2x2', approach: 'finite-displacement', lo_to_correction: 'no', notes: 'example row: invented recipe' },
  ],
  sources: [
    { cite_key: 'azuhata1995', kind: 'journal-article', title: 'Polarized Raman spectra in GaN', authors: 'Azuhata, T.; Sota, T.; Suzuki, K.; Nakamura, S.', year: '1995', venue: 'Journal of Physics: Condensed Matter', volume: '7', pages: 'L129–L133' },
    { cite_key: 'inhouse-pbesol-2026', kind: 'in-house-notebook', notebook_ref: 'NB-2026-014 (invented)', note: 'example row: invented notebook' },
  ],
};

/** The CSV template of a kind: our header and a few example rows. */
export function templateCsv(kind: TableKind): string {
  const keys = templateColumnsOf(kind).map((c) => c.key);
  return toCsv(
    keys,
    EXAMPLES[kind].map((row) => keys.map((k) => row[k] ?? '')),
  );
}

export function templateFileName(kind: TableKind): string {
  return `${kind}-template.csv`;
}
