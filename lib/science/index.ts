/**
 * Lattice Ledger science core: pure, typed computation with no I/O.
 * Every invalid input throws a ScienceInputError naming the argument and the reason.
 */
export * from './constants';
export { ScienceInputError } from './errors';
export { convertFrequency, convertEntropy, frequencyCm1ToKelvin, FREQUENCY_UNITS, ENTROPY_UNITS } from './units';
export type { FrequencyUnit, EntropyUnit } from './units';
export { parseFormula, atomsPerReducedFormulaUnit, formulaUnitsInCell, elementCountsOrUndefined } from './formula';
export type { ParsedFormula } from './formula';
export { ELEMENT_SYMBOLS, isElementSymbol } from './elements';
export { crystalSystem, normalizeIrrep, irrepSpecies, irrepBranch } from './symmetry';
export type { CrystalSystem } from './symmetry';
export {
  acousticModeIds,
  collapseDegenerateModes,
  isCompleteModeList,
  isStatedOptical,
  modeCount,
  DEFAULT_ACOUSTIC_THRESHOLD_CM1,
  DEGENERACY_TOLERANCE_CM1,
} from './modes';
export type { MeasuredPeak, ComputedMode, ModeLine, Technique, AcousticOptions } from './modes';
export { pairModes, DEFAULT_MAX_RELATIVE_DEVIATION, DEFAULT_LABELLED_MAX_RELATIVE_DEVIATION, DEFAULT_AMBIGUITY_CM1, DEFAULT_AMBIGUITY_RELATIVE } from './pairing';
export type { PairingOptions, Pair, PairingResult } from './pairing';
export {
  mean,
  median,
  quantile,
  sampleVariance,
  sampleStandardDeviation,
  lag1Autocorrelation,
  pearsonCorrelation,
  concordanceCorrelation,
  scaleFactor,
} from './descriptive';
export { compensatedSum } from './summation';
export { errorStatistics, scaleFactorStandardError, combinedUncertainty, DEFAULT_BOOTSTRAP_SAMPLES, DEFAULT_BOOTSTRAP_SEED, BLAND_ALTMAN_Z } from './statistics';
export type { PairValue, ErrorStatistics, ErrorStatisticsOptions } from './statistics';
export type { BootstrapIntervals } from './bootstrap';
export { createRandom } from './random';
export type { RandomSource } from './random';
export { normalCdf, erfc } from './normal';
export { modifiedZScores, tukeyFences, flagOutliers, isSampleRule, outlierScaleValues, MODIFIED_Z_CONSTANT, MODIFIED_Z_THRESHOLD, TUKEY_K } from './outliers';
export type { OutlierRule } from './outliers';
export { compareMethods, wilcoxonSignedRank, WILCOXON_EXACT_MAX_N } from './wilcoxon';
export type { MethodComparison, WilcoxonResult } from './wilcoxon';
export { harmonicMode, harmonicFromDos, debyeHeatCapacity, cpMinusCv, cpMinusCvOf } from './thermodynamics';
export type { HarmonicModeQuantities, HarmonicDosQuantities, CpMinusCvInput, ThermalProperties } from './thermodynamics';
export { qualityChecks, qualityReport, DEFAULT_QUALITY_THRESHOLDS } from './quality';
export type { QualityInput, QualityFlag, QualityThresholds, QualityNotApplied, QualityReport } from './quality';
export { detectShift, DEFAULT_SHIFT_THRESHOLDS } from './shift';
export type { MethodSummary, ShiftReason, ShiftThresholds } from './shift';
export { convergencePoint, recommendedParameter, deviationDistribution } from './convergence';
export type { ConvergenceDirection, ConvergencePoint, Recommendation, DistributionRow } from './convergence';
export { fullTensor, diagonalMean, frobeniusDistance, chargeSum, largestComponent, siteNeutrality, siteElement, isBareSite, TENSOR_COMPONENTS, PRINCIPAL_COMPONENTS } from './tensors';
export type { SiteNeutrality } from './tensors';
export { loToCouples } from './lo-to';
export type { BranchLine, LoToCouple } from './lo-to';
