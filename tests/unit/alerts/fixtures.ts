/** Minimal invented snapshots for the alert tests (only the fields the comparison reads). */
import type { MethodResult, PairRecord } from '@/lib/benchmark/types';
import type { SnapshotForShift } from '@/lib/alerts/shift-summary';

export function method(methodId: string, label: string, n: number, mae: number | null): MethodResult {
  return {
    methodId,
    label,
    n,
    excluded: 0,
    excludedReasons: [],
    outliers: 0,
    qualityFlags: 0,
    unpairedMeasurements: 0,
    statistics: mae === null ? null : ({ meanAbsoluteError: mae } as MethodResult['statistics']),
    rank: null,
  };
}

export function pair(methodId: string, key: string, error: number, outlier: string | null = null): PairRecord {
  return {
    key,
    methodId,
    materialId: 'mat-1',
    measurementIds: ['m1'],
    calculationIds: ['c1'],
    measured: 500,
    calculated: 500 + error,
    error,
    relativeError: error / 500,
    measuredUncertainty: null,
    calculatedUncertainty: null,
    label: 'A1g',
    technique: 'raman',
    temperatureK: 295,
    basis: 'label',
    ambiguous: false,
    sourceIds: [],
    excluded: null,
    excludedBy: null,
    outlier,
  };
}

export function snapshot(methods: MethodResult[], pairs: PairRecord[] = []): SnapshotForShift {
  return { methods, pairs, unit: 'cm⁻¹' };
}
