/**
 * Benchmark definition: scope (which rows), rules (how to pair and flag) and
 * alert thresholds, each a zod schema whose defaults make `{}` a valid value.
 */
import { z } from 'zod';

/** Quantities a benchmark can compare. */
export const BENCHMARK_QUANTITIES = ['frequency', 'entropy', 'heat-capacity', 'eps-inf', 'eps-static', 'born-charge', 'lo-to-splitting'] as const;
export type BenchmarkQuantity = (typeof BENCHMARK_QUANTITIES)[number];
/** Compared one value per material at a temperature (quantities.ts, isThermal). */
export const THERMAL_QUANTITIES: readonly BenchmarkQuantity[] = ['entropy', 'heat-capacity'];

/** Measurement techniques as stored on measurement rows. */
export const SCOPE_TECHNIQUES = ['raman', 'ir-reflectance', 'ir-absorption', 'ins', 'hyper-raman', 'calorimetry'] as const;

export const OUTLIER_RULE_KINDS = ['modified-z', 'tukey', 'relative', 'sigma'] as const;
export const REPEATED_MEASUREMENT_MODES = ['separate', 'weighted-mean'] as const;

/** Default outlier thresholds per rule (modified z: Iglewicz–Hoaglin 3.5; Tukey: inner fence k = 1.5). */
export const DEFAULT_OUTLIER_THRESHOLDS: Record<(typeof OUTLIER_RULE_KINDS)[number], number> = {
  'modified-z': 3.5,
  tukey: 1.5,
  relative: 0.1,
  sigma: 3,
};

const id = z.string().min(1).max(100);

export const scopeSchema = z
  .object({
    quantity: z.enum(BENCHMARK_QUANTITIES).default('frequency'),
    /** Empty: every technique. */
    techniques: z.array(z.enum(SCOPE_TECHNIQUES)).max(SCOPE_TECHNIQUES.length).default([]),
    /** Temperature window of the measurements, K; null = open. A window excludes measurements without a temperature. */
    temperatureMinK: z.number().min(0).nullable().default(null),
    temperatureMaxK: z.number().positive().nullable().default(null),
    /** Material tags (material classes); a material in scope carries at least one. Empty: no tag filter. */
    materialTags: z.array(z.string().trim().toLowerCase().min(1).max(60)).max(50).default([]),
    /** An explicit material list; when given it replaces the tag filter. */
    materialIds: z.array(id).max(5000).default([]),
    /** Methods to compare; empty: every method of the workspace (the reference method excepted). */
    methodIds: z.array(id).max(100).default([]),
    /**
     * The reference side: absent = experiment (measurements); a method id = that method's calculations
     * (a convergence study against a dense-grid or higher-level reference). Optional rather than
     * nullable so that stored scopes, and with them every fingerprint, are unchanged.
     */
    referenceMethodId: id.optional(),
    /**
     * Entropy and heat-capacity benchmarks: the temperature at which measured and computed values are
     * compared; null compares a measured S(T) or Cp(T) series at every measured temperature.
     */
    entropyTemperatureK: z.number().positive().nullable().default(298.15),
    /** Entropy and heat-capacity benchmarks: largest |T − entropyTemperatureK| of a row still compared. */
    entropyToleranceK: z.number().min(0).default(1),
  })
  .refine((s) => s.temperatureMinK === null || s.temperatureMaxK === null || s.temperatureMinK <= s.temperatureMaxK, {
    message: 'The lower temperature must not exceed the upper one.',
    path: ['temperatureMaxK'],
  })
  .refine((s) => s.referenceMethodId === undefined || !s.methodIds.includes(s.referenceMethodId), {
    message: 'The reference method cannot also be a candidate: take it out of the compared methods.',
    path: ['referenceMethodId'],
  });

export const OUTLIER_SCALES = ['absolute', 'relative'] as const;
export const HEAT_CAPACITY_CORRECTIONS = ['none', 'cp-minus-cv'] as const;
export const ENTROPY_BASES = ['formula-unit', 'atom'] as const;
export type EntropyBasis = (typeof ENTROPY_BASES)[number];

/** Outlier rules flag nothing below this many included pairs of a method (modified z and Tukey). */
export const DEFAULT_OUTLIER_MIN_N = 10;
/** A method is ranked from this many included pairs… */
export const DEFAULT_RANKING_MIN_N = 10;
/** …and this coverage (paired / measured in scope). */
export const DEFAULT_RANKING_MIN_COVERAGE = 0.5;

export const outlierRuleSchema = z.object({
  kind: z.enum(OUTLIER_RULE_KINDS).default('modified-z'),
  threshold: z.number().positive().default(DEFAULT_OUTLIER_THRESHOLDS['modified-z']),
  /** Scale of the modified z and Tukey rules; unset: relative for frequencies and dielectric constants, absolute for entropies and heat capacities. */
  scale: z.enum(OUTLIER_SCALES).optional(),
  /** Below this many included pairs of a method the modified z and Tukey rules flag nothing. */
  minN: z.number().int().min(1).max(10000).default(DEFAULT_OUTLIER_MIN_N),
});

/** The outlier scale a benchmark uses: the rule's, else relative for frequencies and absolute otherwise. */
export function outlierScaleOf(rule: { scale?: (typeof OUTLIER_SCALES)[number] }, quantity: BenchmarkQuantity): (typeof OUTLIER_SCALES)[number] {
  // ε spans 2–16 across ordinary crystals: an absolute error of 0.5 means little at Si and much at NaCl
  // Born charges cross zero between cations and anions, and LO–TO splittings can be a few cm⁻¹: relative errors mislead there
  return rule.scale ?? (THERMAL_QUANTITIES.includes(quantity) || quantity === 'born-charge' || quantity === 'lo-to-splitting' ? 'absolute' : 'relative');
}

export const rankingRuleSchema = z.object({
  /** Fewer included pairs than this: listed, not ranked. 0 switches the rule off. */
  minN: z.number().int().min(0).max(100000).default(DEFAULT_RANKING_MIN_N),
  /** Coverage (paired / measured in scope) below this: listed, not ranked. 0 switches the rule off. */
  minCoverage: z.number().min(0).max(1).default(DEFAULT_RANKING_MIN_COVERAGE),
});

export const rulesSchema = z.object({
  /** Largest |ω − ν|/ν that may pair (pairModes default 0.25). */
  maxRelativeDeviation: z.number().positive().max(1).default(0.25),
  /** The same when both sides carry a label of the same species (pairModes default 0.5). */
  labelledMaxRelativeDeviation: z.number().positive().max(1).default(0.5),
  /** Ambiguity window, cm⁻¹ and relative (pairModes defaults 2 and 0.01). */
  ambiguityCm1: z.number().min(0).default(2),
  ambiguityRelative: z.number().min(0).max(1).default(0.01),
  outlierRule: outlierRuleSchema.prefault({}),
  /** Several measurements of one mode: a pair each, or one pair with their uncertainty-weighted mean. */
  repeatedMeasurements: z.enum(REPEATED_MEASUREMENT_MODES).default('separate'),
  bootstrapSamples: z.number().int().min(0).max(10000).default(1000),
  /** Upper edges of the frequency bands of the breakdown, cm⁻¹, ascending. */
  bandEdgesCm1: z
    .array(z.number().positive())
    .max(10)
    .default([200, 500, 1000])
    .refine((edges) => edges.every((e, i) => i === 0 || e > edges[i - 1]), 'Band edges must increase.'),
  /** Which methods are ranked (on the pairs every ranked method shares). */
  ranking: rankingRuleSchema.prefault({}),
  /** Entropy and heat-capacity benchmarks: compare per mole of formula units (the reduced formula) or per mole of atoms. */
  entropyBasis: z.enum(ENTROPY_BASES).default('formula-unit'),
  /**
   * Heat-capacity benchmarks against experiment: 'cp-minus-cv' adds α_V² B_T V_m T to each computed Cv of a material
   * whose α, B and V_m are recorded, and leaves the materials without them out. Optional (unset = none), so stored
   * rules and their fingerprints are unchanged.
   */
  heatCapacityCorrection: z.enum(HEAT_CAPACITY_CORRECTIONS).optional(),
  /** Against a reference method: a material is within tolerance when its largest |Δ| is at most this, in the benchmark's unit (unset: DEFAULT_REFERENCE_TOLERANCE). */
  referenceTolerance: z.number().positive().optional(),
  /** Against a reference method: the share of a class's materials that must be within tolerance for a recipe to be recommended (unset: 0.95). Optional, like referenceTolerance, so stored rules and their fingerprints are unchanged. */
  convergenceShare: z.number().gt(0).max(1).optional(),
});

/**
 * Default convergence tolerance per quantity, in its unit: 1 cm⁻¹ for a Γ frequency (the resolution
 * of a routine Raman spectrum, so a recipe converged to it is indistinguishable in experiment),
 * 0.1 J mol⁻¹ K⁻¹ for an entropy or heat capacity (the calorimetric uncertainty near 298 K), and
 * 0.05 for a dielectric constant, 0.05 e for a Born charge (the spread between converged
 * calculations of one crystal) and 1 cm⁻¹ for an LO–TO splitting (a difference of two
 * frequencies) — common practice, no single source, from memory.
 */
export const DEFAULT_REFERENCE_TOLERANCE: Record<BenchmarkQuantity, number> = {
  frequency: 1,
  entropy: 0.1,
  'heat-capacity': 0.1,
  'eps-inf': 0.05,
  'eps-static': 0.05,
  'born-charge': 0.05,
  'lo-to-splitting': 1,
};

export const DEFAULT_CONVERGENCE_SHARE = 0.95;

export function referenceToleranceOf(rules: { referenceTolerance?: number }, quantity: BenchmarkQuantity): number {
  return rules.referenceTolerance ?? DEFAULT_REFERENCE_TOLERANCE[quantity];
}

/**
 * Defaults of a watch on this benchmark. `maeAbsolute` is in the benchmark's unit (cm⁻¹
 * or J mol⁻¹ K⁻¹); `maeCm1` is its older name, still accepted (maeAbsolute wins when both
 * are given). Unset, it takes the default of the benchmark's quantity
 * (DEFAULT_MAE_ABSOLUTE). The relative ones are fractions (0.05 = 5 %).
 */
export const alertThresholdsSchema = z.object({
  maeAbsolute: z.number().positive().optional(),
  maeCm1: z.number().positive().optional(),
  maeRelative: z.number().positive().default(0.05),
  nRelative: z.number().positive().default(0.1),
});

/**
 * Default absolute MAE change that alerts, per quantity, in its unit: 0.5 cm⁻¹ (below the
 * 1–2 cm⁻¹ resolution of a routine Raman spectrum) and 0.2 J mol⁻¹ K⁻¹ (about twice the
 * ±0.1 uncertainty of the CODATA key-value entropies; the same for heat capacities, whose
 * calorimetric uncertainty near 298 K is of the same order), and 0.1 for a dielectric constant
 * (about the spread between published ε∞ of one well-studied crystal), 0.05 e for a Born charge and
 * 0.5 cm⁻¹ for an LO–TO splitting (as for a frequency) — common practice, no single source, from memory.
 */
export const DEFAULT_MAE_ABSOLUTE: Record<BenchmarkQuantity, number> = {
  frequency: 0.5,
  entropy: 0.2,
  'heat-capacity': 0.2,
  'eps-inf': 0.1,
  'eps-static': 0.1,
  'born-charge': 0.05,
  'lo-to-splitting': 0.5,
};

/** The thresholds detectShift uses for a benchmark of this quantity (maeCm1 is the alias). */
export function resolveAlertThresholds(thresholds: AlertThresholds, quantity: BenchmarkQuantity): { maeAbsolute: number; maeRelative: number; nRelative: number } {
  return {
    maeAbsolute: thresholds.maeAbsolute ?? thresholds.maeCm1 ?? DEFAULT_MAE_ABSOLUTE[quantity],
    maeRelative: thresholds.maeRelative,
    nRelative: thresholds.nRelative,
  };
}

export type BenchmarkScope = z.infer<typeof scopeSchema>;
export type BenchmarkRules = z.infer<typeof rulesSchema>;
export type AlertThresholds = z.infer<typeof alertThresholdsSchema>;

/** A full definition as stored; `{}` parts take their defaults. */
export const benchmarkDefinitionSchema = z.object({
  name: z.string().trim().min(1, 'Give the benchmark a name.').max(120),
  purpose: z.string().trim().max(2000).optional(),
  scope: scopeSchema.prefault({}),
  rules: rulesSchema.prefault({}),
  alertThresholds: alertThresholdsSchema.prefault({}),
});
export type BenchmarkDefinition = z.infer<typeof benchmarkDefinitionSchema>;
export type BenchmarkDefinitionInput = z.input<typeof benchmarkDefinitionSchema>;

/** Reads stored JSON, filling defaults (rows written by an older version stay readable). */
export function readScope(value: unknown): BenchmarkScope {
  return scopeSchema.parse(value ?? {});
}
export function readRules(value: unknown): BenchmarkRules {
  return rulesSchema.parse(value ?? {});
}
/** Alert thresholds with the quantity's default filled in; `maeCm1` repeats maeAbsolute for older readers. */
export interface ResolvedAlertThresholds {
  maeAbsolute: number;
  maeCm1: number;
  maeRelative: number;
  nRelative: number;
}

export function readAlertThresholds(value: unknown, quantity: BenchmarkQuantity = 'frequency'): ResolvedAlertThresholds {
  const resolved = resolveAlertThresholds(alertThresholdsSchema.parse(value ?? {}), quantity);
  return { ...resolved, maeCm1: resolved.maeAbsolute };
}
