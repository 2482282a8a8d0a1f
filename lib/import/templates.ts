import { columnsOf, type ImportableKind } from './columns';
import { toCsv } from '@/lib/csv';

/**
 * Example rows of the downloadable templates. The measured values are published
 * (sources named in the notes cell, see ../shared/reference/check-values.md);
 * the computed values are invented to show the format and say so.
 */
const EXAMPLES: Record<ImportableKind, Array<Record<string, string>>> = {
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
  ],
};

/** The CSV template of a kind: our header and a few example rows. */
export function templateCsv(kind: ImportableKind): string {
  const keys = columnsOf(kind).map((c) => c.key);
  return toCsv(
    keys,
    EXAMPLES[kind].map((row) => keys.map((k) => row[k] ?? '')),
  );
}

export function templateFileName(kind: ImportableKind): string {
  return `${kind}-template.csv`;
}
