import type { CalculationTableRow, MeasurementTableRow } from '@/db/queries/values';

/** One row of the measurement or calculation table as the browser receives it. */
export interface ValueRow {
  id: string;
  materialId: string;
  materialName: string;
  quantity: string;
  value: number;
  valueText: string;
  unit: string;
  uncertainty: number | null;
  uncertaintyText: string | null;
  temperatureK: number | null;
  irrep: string | null;
  branch: string | null;
  activity: string | null;
  sourceId: string;
  citeKey: string;
  /** What the cited source lacks (empty when complete). */
  sourceGaps: string[];
  importId: string | null;
  contributorName: string | null;
  created: string;
  retracted: boolean;
  technique?: string | null;
  sampleForm?: string | null;
  methodId?: string;
  methodLabel?: string;
  modeIndex?: number | null;
}

const created = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });

/** Dates become text on the server (UTC), so the browser renders exactly what was sent. */
export function toValueRow(row: MeasurementTableRow | CalculationTableRow): ValueRow {
  const { createdAt, retractedAt, ...rest } = row;
  return { ...rest, created: `${created.format(createdAt)} UTC`, retracted: retractedAt !== null };
}
