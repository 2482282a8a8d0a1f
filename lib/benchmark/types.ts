/**
 * Rows a benchmark reads (already restricted to its scope) and the snapshot it
 * computes from them. The snapshot is what a Revision stores, so every field is
 * plain JSON.
 */
import type { BenchmarkQuantity, BenchmarkRules } from './schemas';
import type { QualityThresholds, WilcoxonResult } from '@/lib/science';

export interface ScopeMeasurement {
  id: string;
  materialId: string;
  sourceId: string;
  importId: string | null;
  value: number;
  uncertainty: number | null;
  temperatureK: number | null;
  irrep: string | null;
  branch: 'TO' | 'LO' | null;
  technique: string | null;
}

export interface ScopeCalculation {
  id: string;
  materialId: string;
  methodId: string;
  sourceId: string;
  importId: string | null;
  value: number;
  uncertainty: number | null;
  temperatureK: number | null;
  irrep: string | null;
  branch: 'TO' | 'LO' | null;
  activity: string | null;
  degeneracy: number | null;
}

export interface ScopeMaterial {
  id: string;
  name: string;
  formula: string;
  atomsInCell: number | null;
  tags: string[];
}

export interface ScopeMethod {
  id: string;
  label: string;
  kGrid: [number, number, number] | null;
  qGrid: [number, number, number] | null;
}

export interface ScopePin {
  id: string;
  methodId: string;
  measurementId: string;
  calculationId: string | null;
  reason: string;
}

export interface ScopeDecision {
  id: string;
  kind: 'exclude-pair' | 'exclude-measurement' | 'keep';
  measurementId: string;
  methodId: string | null;
  reason: string;
  createdBy: string | null;
  createdAt: number;
}

/** Everything one computation needs; ids of other workspaces never reach it. */
export interface BenchmarkInput {
  quantity: BenchmarkQuantity;
  rules: BenchmarkRules;
  measurements: ScopeMeasurement[];
  calculations: ScopeCalculation[];
  materials: ScopeMaterial[];
  methods: ScopeMethod[];
  pins: ScopePin[];
  decisions: ScopeDecision[];
  qualityThresholds?: QualityThresholds;
  /** Entropy benchmarks: the comparison temperature and its tolerance, K. */
  entropyWindow?: { temperatureK: number; toleranceK: number };
}

/** Statistics of a group of pairs, as stored (errorStatistics without the index). */
export interface StoredStatistics {
  meanSignedError: number;
  meanAbsoluteError: number;
  rootMeanSquareError: number;
  standardDeviation: number;
  medianAbsoluteError: number;
  p95AbsoluteError: number;
  maxAbsoluteError: number;
  maxAbsoluteErrorPair: string;
  meanAbsolutePercentageError: number;
  scaleFactor: number;
  rmseAfterScaling: number;
  pearsonR: number;
  concordance: number;
  blandAltman: { bias: number; lower: number; upper: number };
  bootstrap?: { confidence: number; meanAbsoluteError: [number, number]; meanSignedError: [number, number] };
  withinOneSigma?: number;
  withinTwoSigma?: number;
}

/** One pair (or, for an entropy benchmark, one measured/computed entropy couple). */
export interface PairRecord {
  key: string;
  methodId: string;
  materialId: string;
  measurementIds: string[];
  calculationIds: string[];
  measured: number;
  calculated: number;
  error: number;
  relativeError: number;
  measuredUncertainty: number | null;
  calculatedUncertainty: number | null;
  label: string | null;
  technique: string | null;
  temperatureK: number | null;
  basis: 'label' | 'frequency' | 'pinned' | 'temperature';
  ambiguous: boolean;
  sourceIds: string[];
  /** Reason of the decision that excludes it. */
  excluded: string | null;
  excludedBy: string | null;
  /** Why the outlier rule flagged it. */
  outlier: string | null;
}

export interface MethodResult {
  methodId: string;
  label: string;
  /** Included pairs. */
  n: number;
  excluded: number;
  excludedReasons: Array<{ reason: string; count: number }>;
  outliers: number;
  qualityFlags: number;
  unpairedMeasurements: number;
  /** Absent when n < 3: only N is shown. */
  statistics: StoredStatistics | null;
  rank: number | null;
}

export interface BreakdownRow {
  group: string;
  methodId: string;
  n: number;
  statistics: StoredStatistics | null;
}

export interface ComparisonRecord {
  a: string;
  b: string;
  n: number;
  meanDifference: number;
  wins: number;
  losses: number;
  ties: number;
  wilcoxon: WilcoxonResult;
}

export interface QualityRecord {
  methodId: string;
  materialId: string;
  code: string;
  severity: 'warning' | 'error';
  message: string;
}

/** The snapshot a Revision stores. */
export interface BenchmarkSnapshot {
  version: 1;
  quantity: BenchmarkQuantity;
  unit: string;
  rules: BenchmarkRules;
  methods: MethodResult[];
  classes: BreakdownRow[];
  bands: BreakdownRow[];
  comparisons: ComparisonRecord[];
  pairs: PairRecord[];
  quality: QualityRecord[];
  decisions: ScopeDecision[];
  pins: ScopePin[];
  counts: { measurements: number; calculations: number; materials: number; methods: number };
  /** Why a computation produced nothing, for the empty state. */
  empty: string | null;
}
