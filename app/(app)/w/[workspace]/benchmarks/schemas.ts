import { z } from 'zod';
import { BENCHMARK_QUANTITIES, ENTROPY_BASES, HEAT_CAPACITY_CORRECTIONS, OUTLIER_RULE_KINDS, OUTLIER_SCALES, REPEATED_MEASUREMENT_MODES, SCOPE_TECHNIQUES, type BenchmarkDefinitionInput } from '@/lib/benchmark/schemas';

const blank = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);
const optionalNumber = (label: string) =>
  z.preprocess(blank, z.coerce.number({ message: `${label} must be a number.` }).refine(Number.isFinite, `${label} must be a number.`).optional());
const list = <T extends z.ZodType>(item: T) =>
  z.preprocess((v) => (v === undefined ? [] : Array.isArray(v) ? v : [v]), z.array(item)).default([]);
const splitCommas = (v: unknown) =>
  (Array.isArray(v) ? v : typeof v === 'string' ? [v] : [])
    .flatMap((s: string) => s.split(','))
    .map((s: string) => s.trim())
    .filter(Boolean);
const commaList = z.preprocess(splitCommas, z.array(z.string()));

/** The benchmark form, flat as FormData delivers it. */
export const benchmarkFormSchema = z.object({
  workspaceId: z.string().min(1),
  name: z.string().trim().min(1, 'Give the benchmark a name.').max(120, 'At most 120 characters.'),
  purpose: z.preprocess(blank, z.string().trim().max(2000).optional()),
  quantity: z.enum(BENCHMARK_QUANTITIES, 'Choose a quantity.'),
  techniques: list(z.enum(SCOPE_TECHNIQUES, 'Unknown technique.')),
  temperatureMinK: optionalNumber('The lower temperature'),
  temperatureMaxK: optionalNumber('The upper temperature'),
  materialTags: commaList,
  materialIds: list(z.string().min(1)),
  methodIds: list(z.string().min(1)),
  /** Empty: compare with experiment; a method id: compare with that method's calculations. */
  referenceMethodId: z.preprocess(blank, z.string().min(1).optional()),
  referenceTolerance: optionalNumber('The reference tolerance'),
  convergenceSharePercent: optionalNumber('The share of materials within tolerance'),
  entropyTemperatureK: optionalNumber('The comparison temperature'),
  /** "each": compare a measured series at every measured temperature (entropyTemperatureK is then ignored). */
  thermalTemperatures: z.preprocess(blank, z.enum(['one', 'each'], 'Choose one temperature or every measured one.').optional()),
  entropyToleranceK: optionalNumber('The temperature tolerance'),
  maxRelativeDeviationPercent: optionalNumber('The pairing window'),
  labelledMaxRelativeDeviationPercent: optionalNumber('The labelled pairing window'),
  ambiguityCm1: optionalNumber('The ambiguity window'),
  outlierKind: z.enum(OUTLIER_RULE_KINDS, 'Choose an outlier rule.'),
  outlierThreshold: optionalNumber('The outlier threshold'),
  /** Empty: follow the quantity (relative for frequencies and dielectric constants). */
  outlierScale: z.preprocess(blank, z.enum(OUTLIER_SCALES, 'Choose a scale.').optional()),
  outlierMinN: optionalNumber('The outlier minimum N'),
  rankMinN: optionalNumber('The ranking minimum N'),
  rankMinCoveragePercent: optionalNumber('The ranking minimum coverage'),
  entropyBasis: z.preprocess(blank, z.enum(ENTROPY_BASES, 'Choose a basis.').optional()),
  heatCapacityCorrection: z.preprocess(blank, z.enum(HEAT_CAPACITY_CORRECTIONS, 'Choose whether to correct Cv to Cp.').optional()),
  repeatedMeasurements: z.enum(REPEATED_MEASUREMENT_MODES, 'Choose how repeated measurements count.'),
  bandEdgesCm1: z.preprocess(splitCommas, z.array(z.coerce.number('Band edges must be numbers.').positive('Band edges must be positive numbers.'))),
  alertMaeAbsolute: optionalNumber('The MAE alert threshold'),
  /** Older name of alertMaeAbsolute. */
  alertMaeCm1: optionalNumber('The MAE alert threshold'),
  alertMaeRelativePercent: optionalNumber('The relative MAE alert threshold'),
  alertNRelativePercent: optionalNumber('The N alert threshold'),
});
export type BenchmarkForm = z.infer<typeof benchmarkFormSchema>;

export const editBenchmarkFormSchema = benchmarkFormSchema.extend({ benchmarkId: z.string().min(1) });

/** Form fields → a definition for createBenchmark/updateBenchmark (its schema fills the defaults). */
export function definitionFromForm(f: BenchmarkForm): BenchmarkDefinitionInput {
  const pct = (v: number | undefined) => (v === undefined ? undefined : v / 100);
  return {
    name: f.name,
    purpose: f.purpose,
    scope: {
      quantity: f.quantity,
      techniques: f.techniques,
      temperatureMinK: f.temperatureMinK ?? null,
      temperatureMaxK: f.temperatureMaxK ?? null,
      materialTags: f.materialTags,
      materialIds: f.materialIds,
      methodIds: f.methodIds,
      ...(f.referenceMethodId ? { referenceMethodId: f.referenceMethodId } : {}),
      entropyTemperatureK: f.thermalTemperatures === 'each' ? null : f.entropyTemperatureK,
      entropyToleranceK: f.entropyToleranceK,
    },
    rules: {
      maxRelativeDeviation: pct(f.maxRelativeDeviationPercent),
      labelledMaxRelativeDeviation: pct(f.labelledMaxRelativeDeviationPercent),
      ambiguityCm1: f.ambiguityCm1,
      outlierRule: { kind: f.outlierKind, threshold: f.outlierThreshold, scale: f.outlierScale, minN: f.outlierMinN },
      repeatedMeasurements: f.repeatedMeasurements,
      bandEdgesCm1: f.bandEdgesCm1.length ? f.bandEdgesCm1 : undefined,
      ranking: { minN: f.rankMinN, minCoverage: pct(f.rankMinCoveragePercent) },
      entropyBasis: f.entropyBasis,
      // stored only when on, so other benchmarks' rules (and fingerprints) are unchanged
      ...(f.quantity === 'heat-capacity' && !f.referenceMethodId && f.heatCapacityCorrection === 'cp-minus-cv' ? { heatCapacityCorrection: 'cp-minus-cv' as const } : {}),
      ...(f.referenceMethodId && f.referenceTolerance !== undefined ? { referenceTolerance: f.referenceTolerance } : {}),
      ...(f.referenceMethodId && f.convergenceSharePercent !== undefined ? { convergenceShare: f.convergenceSharePercent / 100 } : {}),
    },
    alertThresholds: { maeAbsolute: f.alertMaeAbsolute ?? f.alertMaeCm1, maeRelative: pct(f.alertMaeRelativePercent), nRelative: pct(f.alertNRelativePercent) },
  };
}

export const benchmarkIdSchema = z.object({ workspaceId: z.string().min(1), benchmarkId: z.string().min(1) });

export const decisionFormSchema = z.object({
  workspaceId: z.string().min(1),
  benchmarkId: z.string().min(1),
  kind: z.enum(['exclude-pair', 'exclude-measurement', 'keep'], 'Choose what to exclude.'),
  measurementId: z.string().min(1),
  methodId: z.preprocess(blank, z.string().min(1).optional()),
  reason: z.string().trim().min(3, 'Give a reason (at least 3 characters).').max(1000),
});

export const revertDecisionFormSchema = z.object({
  workspaceId: z.string().min(1),
  benchmarkId: z.string().min(1),
  decisionId: z.string().min(1),
  reason: z.string().trim().min(3, 'Give a reason (at least 3 characters).').max(1000),
});

export const pinFormSchema = z.object({
  workspaceId: z.string().min(1),
  benchmarkId: z.string().min(1),
  methodId: z.string().min(1),
  measurementId: z.string().min(1),
  /** Empty: "no counterpart". */
  calculationId: z.preprocess(blank, z.string().min(1).optional()),
  reason: z.string().trim().min(3, 'Give a reason (at least 3 characters).').max(1000),
});

export const revokePinFormSchema = z.object({
  workspaceId: z.string().min(1),
  benchmarkId: z.string().min(1),
  pinId: z.string().min(1),
  reason: z.string().trim().min(3, 'Give a reason (at least 3 characters).').max(1000),
});

/** The method comparison's pair, as kept in the page address (?methodA=…&methodB=…). */
export const comparisonPairSchema = z
  .object({
    methodA: z.string().trim().min(1, 'Choose method A.'),
    methodB: z.string().trim().min(1, 'Choose method B.'),
  })
  .refine((p) => p.methodA !== p.methodB, {
    message: 'A method cannot be compared with itself: choose two different methods.',
    path: ['methodB'],
  });
export type ComparisonPair = z.infer<typeof comparisonPairSchema>;

/**
 * The pair asked for in the address, checked against the methods of the revision:
 * `pair` when both are known and different, else the first two methods and the reason.
 */
export function comparisonFromSearch(
  search: { methodA?: string | string[]; methodB?: string | string[] },
  methodIds: readonly string[],
): { pair: ComparisonPair | null; error: string | null } {
  const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);
  const fallback = methodIds.length >= 2 ? { methodA: methodIds[0], methodB: methodIds[1] } : null;
  const asked = { methodA: first(search.methodA), methodB: first(search.methodB) };
  if (asked.methodA === undefined && asked.methodB === undefined) return { pair: fallback, error: null };
  const unknown = [asked.methodA, asked.methodB].some((id) => id === undefined || !methodIds.includes(id));
  if (unknown) return { pair: fallback, error: 'The address names a method that is not in this revision; showing the first two methods instead.' };
  const parsed = comparisonPairSchema.safeParse(asked);
  // a self-comparison stays on screen with the refusal, so the reader sees what was asked
  if (!parsed.success) return { pair: { methodA: asked.methodA!, methodB: asked.methodB! }, error: parsed.error.issues[0].message };
  return { pair: parsed.data, error: null };
}
