/**
 * Rows a benchmark reads (already restricted to its scope) and the snapshot it
 * computes from them. The snapshot is what a Revision stores, so every field is
 * plain JSON.
 */
import type { BenchmarkQuantity, BenchmarkRules } from './schemas';
import type { ErrorStatistics, QualityThresholds, WilcoxonResult } from '@/lib/science';

export interface ScopeMeasurement {
  id: string;
  /** The row's stable sequence number (what a revision's row set lists); absent in hand-built inputs. */
  seq?: number;
  materialId: string;
  sourceId: string;
  importId: string | null;
  value: number;
  uncertainty: number | null;
  temperatureK: number | null;
  irrep: string | null;
  branch: 'TO' | 'LO' | null;
  technique: string | null;
  /** Born charges: the atom ("Ga", "O2"); absent or null for other quantities. */
  site?: string | null;
  /** Born charges: the nine tensor components; dielectric constants: three principal values. */
  components?: number[] | null;
}

export interface ScopeCalculation {
  id: string;
  seq?: number;
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
  /** Position of the mode in the computed list (1-based), when the import gave it. */
  modeIndex?: number | null;
  site?: string | null;
  components?: number[] | null;
}

export interface ScopeMaterial {
  id: string;
  name: string;
  formula: string;
  atomsInCell: number | null;
  tags: string[];
  /** International Tables number, for the LST check (non-cubic crystals skip it). */
  spaceGroup?: number | null;
  /** For the Cp − Cv correction (rules.heatCapacityCorrection): α_V in K⁻¹, B_T in GPa, V_m in cm³ mol⁻¹. */
  thermalExpansionPerK?: number | null;
  bulkModulusGpa?: number | null;
  molarVolumeCm3?: number | null;
}

export interface ScopeMethod {
  id: string;
  label: string;
  kGrid: [number, number, number] | null;
  qGrid: [number, number, number] | null;
  /** Whether the method applies the LO–TO (non-analytic) correction; null: not recorded. */
  nonAnalyticCorrection?: boolean | null;
}

/**
 * Dielectric constants and Born charges stored as calculation rows of one material ×
 * method ('eps-inf', 'eps-static', 'born-charge'): the quality checks of frequency benchmarks use
 * them (Lyddane–Sachs–Teller; neutrality when there is one Born charge per atom of the cell).
 */
export interface ScopeDielectric {
  materialId: string;
  methodId: string;
  epsInf: number | null;
  eps0: number | null;
  /** One per site, by site: the nine tensor components where stored, else the scalar (Z·I). */
  bornCharges: Array<number | number[]>;
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
  /** temperatureK null: every measured temperature, each within toleranceK of a computed one. */
  entropyWindow?: { temperatureK: number | null; toleranceK: number };
  /** Dielectric constants and Born charges where stored (see ScopeDielectric). */
  dielectric?: ScopeDielectric[];
  /**
   * Against a reference method (scope.referenceMethodId): its calculations are the reference side, in
   * place of measurements; `methods` lists the candidates only.
   */
  referenceMethod?: { id: string; label: string };
  /**
   * How many source merges the workspace has seen: a merge re-points rows to the
   * kept source (the one edit of a stored row), which changes the pairs' sources
   * without changing the row set, so the fingerprint covers this count.
   */
  sourceMerges?: number;
}

/**
 * Statistics of a group of pairs as a revision stores them: errorStatistics with
 * the worst pair's key in place of its index. meanAbsoluteRelativeError is
 * optional because revisions computed before it existed lack it.
 */
export type StoredStatistics = Omit<ErrorStatistics, 'n' | 'maxAbsoluteErrorIndex' | 'meanAbsoluteRelativeError'> & {
  maxAbsoluteErrorPair: string;
  meanAbsoluteRelativeError?: number;
};

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
  /** Symmetry species of the label ("E2g" for "E¹₂g"); absent on older revisions. */
  species?: string | null;
  /** TO / LO of the measured peak (given, or written in its label). */
  branch?: 'TO' | 'LO' | null;
  technique: string | null;
  temperatureK: number | null;
  basis: 'label' | 'frequency' | 'pinned' | 'temperature' | 'material' | 'index';
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
  /** Rank on the common pairs (ranking rule); null when the method is not ranked. */
  rank: number | null;
  /** Measured values in scope that this method paired (excluded pairs included). */
  paired?: number;
  /** paired / measured values in scope; null when nothing is in scope. */
  coverage?: number | null;
  /** Why the method is listed but not ranked; null when it is ranked. */
  unranked?: string | null;
  /** The method's statistics on the common pairs (ranked methods only). */
  common?: { n: number; meanAbsoluteError: number; rootMeanSquareError: number; meanSignedError: number } | null;
}

/** How the leaderboard was ranked. */
export interface RankingRecord {
  /** Pairs (measured values) that every ranked method shares: the N the ranking rests on. */
  commonN: number;
  minN: number;
  minCoverage: number;
  rankedMethods: number;
  /** Why there is no ranking, when there is none. */
  note: string | null;
}

/** One material of one method: the per-material table. */
export interface MaterialRow {
  methodId: string;
  materialId: string;
  name: string;
  formula: string;
  n: number;
  meanAbsoluteError: number | null;
  meanSignedError: number | null;
  maxAbsoluteError: number | null;
  outliers: number;
  ambiguous: number;
  excluded: number;
  qualityFlags: number;
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
  /** The flag's number (the lowest imaginary mode, the acoustic |ω|, the k-point density); absent on older revisions. */
  value?: number;
}

/** One candidate method against the reference method (compute.ts, referenceSummary). */
export interface ReferenceMethodRecord {
  methodId: string;
  label: string;
  /** Materials with at least one included pair. */
  materials: number;
  /** Materials whose largest |Δ| is within the tolerance. */
  withinTolerance: number;
  shareWithin: number | null;
  n: number;
  meanAbsolute: number | null;
  maxAbsolute: number | null;
  /** |Δ|/|reference|, over pairs whose reference is not zero. */
  meanRelative: number | null;
  maxRelative: number | null;
}

/** A benchmark against a reference method instead of experiment. */
export interface ReferenceRecord {
  methodId: string;
  label: string;
  tolerance: number;
  share: number;
  /** How the pairs were matched: by mode index, or by the pairing rules with activities ignored. */
  matchedBy: { index: number; pairing: number };
  perMethod: ReferenceMethodRecord[];
}

/** The snapshot a Revision stores (version 2 adds the fields marked optional; older ones lack them). */
export interface BenchmarkSnapshot {
  version: 1 | 2;
  quantity: BenchmarkQuantity;
  unit: string;
  rules: BenchmarkRules;
  methods: MethodResult[];
  classes: BreakdownRow[];
  bands: BreakdownRow[];
  /** By irreducible-representation species, by TO/LO branch, by technique. */
  species?: BreakdownRow[];
  branches?: BreakdownRow[];
  techniques?: BreakdownRow[];
  materialRows?: MaterialRow[];
  ranking?: RankingRecord;
  /** Entropy benchmarks: what one value is per. */
  entropyBasis?: 'formula-unit' | 'atom';
  /** Entropy benchmarks: what a harmonic value leaves out. */
  caution?: string | null;
  /** The outlier scale in force. */
  outlierScale?: 'absolute' | 'relative';
  /** Quality checks that had their inputs but were not applied, and why. */
  qualityNotApplied?: Array<{ methodId: string; materialId: string; code: string; reason: string }>;
  comparisons: ComparisonRecord[];
  pairs: PairRecord[];
  quality: QualityRecord[];
  decisions: ScopeDecision[];
  pins: ScopePin[];
  counts: { measurements: number; calculations: number; materials: number; methods: number; measuredInScope?: number };
  /** Why a computation produced nothing, for the empty state. */
  empty: string | null;
  /** Present when the reference side is a method's calculations; `measured` values are then the reference's. */
  reference?: ReferenceRecord;
  /** Born-charge benchmarks where both sides hold full tensors: the Frobenius difference per method. */
  tensors?: TensorComparisonRecord[];
  /** Heat-capacity benchmarks under the Cp − Cv rule: materials corrected, and those left out for want of α, B or V_m (names). */
  cpCorrection?: { corrected: number; lacking: string[] };
}

/** ‖Z_method − Z_reference‖_F over a method's included pairs whose two sides both hold a full tensor, in e. */
export interface TensorComparisonRecord {
  methodId: string;
  label: string;
  /** Pairs with a full tensor on both sides (of the method's included pairs). */
  n: number;
  meanFrobenius: number | null;
  maxFrobenius: number | null;
}
