/** The pairs of a revision as CSV rows and as the JSON the plots read. */
import { toCsv } from '@/lib/csv';
import type { BenchmarkSnapshot, PairRecord } from './types';

export interface PairLookups {
  materials: Map<string, { name: string; formula: string }>;
  sources: Map<string, { citeKey: string; citation: string; doi: string | null }>;
}

export const PAIRS_CSV_HEADER = [
  'pair',
  'method',
  'material',
  'formula',
  'label',
  'technique',
  'temperature_K',
  'measured',
  'measured_uncertainty',
  'calculated',
  'error',
  'relative_error',
  'unit',
  'basis',
  'ambiguous',
  'outlier',
  'excluded_reason',
  'sources',
  'measurement_ids',
  'calculation_ids',
];

export function pairsCsv(snapshot: BenchmarkSnapshot, lookups: PairLookups): string {
  const methodLabel = new Map(snapshot.methods.map((m) => [m.methodId, m.label]));
  return toCsv(
    PAIRS_CSV_HEADER,
    snapshot.pairs.map((p) => [
      p.key,
      methodLabel.get(p.methodId) ?? p.methodId,
      lookups.materials.get(p.materialId)?.name ?? p.materialId,
      lookups.materials.get(p.materialId)?.formula ?? '',
      p.label,
      p.technique,
      p.temperatureK,
      p.measured,
      p.measuredUncertainty,
      p.calculated,
      p.error,
      p.relativeError,
      snapshot.unit,
      p.basis,
      p.ambiguous ? 'yes' : 'no',
      p.outlier,
      p.excluded,
      p.sourceIds.map((id) => lookups.sources.get(id)?.citeKey ?? id).join('; '),
      p.measurementIds.join(' '),
      p.calculationIds.join(' '),
    ]),
  );
}

/** A pair as a plot point: flat, with the names the tooltips show. */
export interface PlotPoint {
  key: string;
  methodId: string;
  method: string;
  material: string;
  label: string;
  measured: number;
  calculated: number;
  error: number;
  mean: number;
  uMeasured: number | null;
  excluded: boolean;
  outlier: boolean;
  citation: string;
}

export function plotPoints(snapshot: BenchmarkSnapshot, lookups: PairLookups): PlotPoint[] {
  const methodLabel = new Map(snapshot.methods.map((m) => [m.methodId, m.label]));
  return snapshot.pairs.map((p: PairRecord) => ({
    key: p.key,
    methodId: p.methodId,
    method: methodLabel.get(p.methodId) ?? p.methodId,
    material: lookups.materials.get(p.materialId)?.name ?? p.materialId,
    label: p.label ?? '—',
    measured: p.measured,
    calculated: p.calculated,
    error: p.error,
    mean: (p.measured + p.calculated) / 2,
    uMeasured: p.measuredUncertainty,
    excluded: p.excluded !== null,
    outlier: p.outlier !== null,
    citation: p.sourceIds.map((id) => lookups.sources.get(id)?.citation ?? id).join('; '),
  }));
}
