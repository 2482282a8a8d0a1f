import { csvLine } from '@/lib/csv';

/** Columns of the measurement and calculation CSV exports: the import templates' names, so a file can go back in. */
export const MEASUREMENT_EXPORT_HEADER = ['material', 'quantity', 'value', 'unit', 'uncertainty', 'temperature_K', 'irrep', 'branch', 'activity', 'technique', 'sample_form', 'source', 'import', 'id'] as const;
export const CALCULATION_EXPORT_HEADER = ['material', 'method', 'quantity', 'value', 'unit', 'mode_index', 'uncertainty', 'temperature_K', 'irrep', 'branch', 'activity', 'source', 'import', 'id'] as const;

interface CommonRow {
  id: string;
  materialName: string;
  quantity: string;
  valueText: string;
  unit: string;
  uncertaintyText: string | null;
  temperatureK: number | null;
  /** As entered; null on rows stored before it was kept (the number is written then). */
  temperatureText?: string | null;
  irrep: string | null;
  branch: string | null;
  activity: string | null;
  citeKey: string;
  importId: string | null;
}

/** A measurement as a CSV line; numbers are written as the text that was entered ("1.50" stays "1.50"). */
export function measurementCsvLine(r: CommonRow & { technique: string | null; sampleForm: string | null }): string {
  return csvLine([r.materialName, r.quantity, r.valueText, r.unit, r.uncertaintyText, r.temperatureText ?? r.temperatureK, r.irrep, r.branch, r.activity, r.technique, r.sampleForm, r.citeKey, r.importId, r.id]);
}

export function calculationCsvLine(r: CommonRow & { methodLabel: string; modeIndex: number | null }): string {
  return csvLine([r.materialName, r.methodLabel, r.quantity, r.valueText, r.unit, r.modeIndex, r.uncertaintyText, r.temperatureText ?? r.temperatureK, r.irrep, r.branch, r.activity, r.citeKey, r.importId, r.id]);
}
