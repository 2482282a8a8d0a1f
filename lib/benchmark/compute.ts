/**
 * The benchmark computation: scope rows → pairs → decisions → statistics per
 * method, per material class, frequency band, species, branch and technique, and
 * per material → outlier flags → ranking on common ground → method comparisons →
 * quality checks. Pure and deterministic: pairs are sorted by key before any
 * statistic, so the order of the input rows never matters.
 *
 * Decisions: 'exclude-pair' (method + measurement) and 'exclude-measurement'
 * (every method) keep the pair in the list, marked excluded with the reason, and
 * out of every statistic; 'keep' records that a flag was reviewed. Methods with
 * fewer than MIN_PAIRS_FOR_STATISTICS included pairs show N only. Breakdowns skip
 * the bootstrap.
 *
 * Intervals: the modes of one material share its errors, so every statistic is
 * computed with the material as the cluster: the bootstrap resamples whole
 * materials, and the out-of-sample RMSE after scaling leaves one material out.
 *
 * Outliers: the rule runs on a method's included pairs, the modified z and Tukey
 * rules only from `outlierRule.minN` (default 10) pairs, on the scale of
 * outlierScaleOf (relative for frequency and dielectric benchmarks unless the rule says otherwise).
 *
 * Ranking: ranking.ts (coverage, the ranking rule, common pairs). The rank is the
 * rank on the pairs every ranked method shares.
 *
 * Entropy basis (`rules.entropyBasis`, entropy and heat capacity): values are stored per mole
 * of formula units of the reduced formula; 'atom' divides measured and computed values (and
 * their uncertainties) by the atoms of that unit, so Al2O3 no longer weighs five times Al.
 *
 * Heat capacity pairs like entropy: one measured and one computed value of a material within
 * the temperature tolerance. The measured value is Cp, the computed one Cv; the snapshot
 * carries HEAT_CAPACITY_CAUTION and nothing corrects Cp − Cv.
 *
 * Dielectric constants (ε∞, ε₀) pair one measured and one computed scalar per material
 * (pair-rows.ts, pairPerMaterial), dimensionless, whatever the temperatures; DIELECTRIC_CAUTION.
 *
 * Stages: pairing and quality checks run per material (material-stage.ts); finishBenchmark
 * does the rest over every pair, so a caller may keep the stages of unchanged materials.
 *
 * Against a reference method (scope.referenceMethodId, material-stage.ts and reference-pairs.ts): the
 * reference's values stand where measured ones would, so error = candidate − reference and every
 * statistic above reads as the distance from the reference. The snapshot's `reference` adds, per
 * candidate over its included pairs: mean and max |Δ|, mean and max |Δ|/|ref| (pairs with a zero
 * reference left out), and the share of its materials whose largest |Δ| is at most the tolerance
 * (rules.referenceTolerance, else DEFAULT_REFERENCE_TOLERANCE of the quantity).
 *
 * Quality: each material × method runs qualityReport with the material's atoms in
 * the cell and space group, the method's grids and, where stored, its dielectric
 * constants and Born charges (types.ts, ScopeDielectric).
 */
import {
  compareMethods,
  errorStatistics,
  flagOutliers,
  isSampleRule,
  modifiedZScores,
  outlierScaleValues,
  tukeyFences,
  type ErrorStatistics,
  type PairValue,
} from '@/lib/science';
import { groupBy, mergeRepeatedMeasurements } from './pair-rows';
import { pairMaterials, qualityOrder, type MaterialStage } from './material-stage';
import { rankOnCommonGround } from './ranking';
import { DEFAULT_CONVERGENCE_SHARE, outlierScaleOf, referenceToleranceOf, type BenchmarkRules } from './schemas';
import { isDielectric, isThermal, QUANTITY_PLURAL, QUANTITY_UNIT } from './quantities';
import { MIN_PAIRS_FOR_STATISTICS } from './statistics-minimum';
import { fixed, stat } from '@/lib/format';
import type {
  BenchmarkInput,
  BenchmarkSnapshot,
  BreakdownRow,
  ComparisonRecord,
  MaterialRow,
  MethodResult,
  PairRecord,
  QualityRecord,
  ReferenceMethodRecord,
  ReferenceRecord,
  StoredStatistics,
  TensorComparisonRecord,
} from './types';

export { MIN_PAIRS_FOR_STATISTICS };
export const UNTAGGED = 'untagged';
export const UNLABELLED = 'unlabelled';
export const NO_BRANCH = 'no branch given';

/** What a harmonic vibrational entropy leaves out, shown beside every entropy benchmark. */
export const ENTROPY_CAUTION =
  'A harmonic vibrational entropy leaves out the volume (quasi-harmonic) term from Cp − Cv, the electronic entropy of metals, and magnetic and configurational entropy; a calorimetric S° holds them all. Compare insulators without magnetic order or disorder, and expect the harmonic value to fall below S° at 298 K.';

/**
 * What a heat-capacity benchmark compares, shown beside it: calorimetry measures Cp, a harmonic
 * calculation gives Cv, and Cp − Cv = α² B V_m T (thermodynamics.ts, cpMinusCv) is not corrected.
 * The 1.4 % (MgO) and 5.5 % (NaCl) at 298 K are worked in tests/unit/science/heat-capacity.test.ts.
 */
export const HEAT_CAPACITY_CAUTION =
  'Calorimetry measures Cp, at constant pressure; a harmonic calculation gives Cv, at constant volume. Cp − Cv = α² B V_m T (α volumetric thermal expansion, B bulk modulus, V_m molar volume) is positive and grows with T: about 1.4 % of Cp for a stiff oxide such as MgO at 298 K and about 5.5 % for NaCl. This benchmark compares the values as stored, without that correction, so expect the harmonic Cv below the measured Cp; metals also carry an electronic term the harmonic value leaves out.';

/** The heat-capacity caution when the Cp − Cv rule is on (material-stage.ts). */
export const HEAT_CAPACITY_CORRECTED_CAUTION =
  'Calorimetry measures Cp; a harmonic calculation gives Cv. Here each computed Cv is raised by Cp − Cv = α² B V_m T from the material’s own volumetric thermal expansion α, bulk modulus B and molar volume V_m, taken as given at every temperature (they change with T, so the correction is best near the temperature they were measured at); materials without all three are left out, not compared uncorrected. Metals also carry an electronic term the harmonic value leaves out.';

/** What a dielectric benchmark compares, shown beside it. */
export const DIELECTRIC_CAUTION =
  'A measured ε∞ comes from the refractive index below the absorption edge, a measured ε₀ from capacitance or a fit to infrared reflectance, near room temperature; a computed one is for the relaxed structure at rest, and semilocal functionals tend to overestimate ε∞ because their band gap is too small. For a non-cubic crystal both sides hold the orientational average (ε_xx + ε_yy + ε_zz)/3: principal values are not compared one by one.';

/** What a Born-charge benchmark compares, shown beside it. */
export const BORN_CHARGE_CAUTION =
  'A measured Born charge is inferred, usually from the LO–TO splitting or infrared oscillator strengths with a model of the crystal, and gives one number per element; a computed one is a tensor per atom. Both sides are compared by the mean of the diagonal (a third of the trace, the same in any axes), oriented by the sign of the measured charge, so anions and cations are compared as magnitudes and a positive error means a charge larger in magnitude; the full tensors are compared by the Frobenius norm of their difference only where both sides hold one, in the same Cartesian axes.';

/** What an LO–TO splitting benchmark compares, shown beside it. */
export const LO_TO_CAUTION =
  'Each splitting is ω_LO − ω_TO of one polar mode, from a TO and an LO of the same species measured in one source and from the same species of the method; the k-th TO is coupled with the k-th LO of its species. A method without the non-analytic (LO–TO) correction has no LO modes at Γ and so no splitting. The error of a splitting is the difference of two errors: a method can get both frequencies wrong by the same amount and the splitting right.';

export function unitOf(quantity: BenchmarkInput['quantity']): string {
  return QUANTITY_UNIT[quantity];
}

/** The caution a benchmark of this quantity carries on its page (null: none). */
export function cautionOf(quantity: BenchmarkInput['quantity'], rules?: Pick<BenchmarkRules, 'heatCapacityCorrection'>): string | null {
  if (quantity === 'entropy') return ENTROPY_CAUTION;
  if (quantity === 'heat-capacity') return rules?.heatCapacityCorrection === 'cp-minus-cv' ? HEAT_CAPACITY_CORRECTED_CAUTION : HEAT_CAPACITY_CAUTION;
  if (isDielectric(quantity)) return DIELECTRIC_CAUTION;
  if (quantity === 'born-charge') return BORN_CHARGE_CAUTION;
  if (quantity === 'lo-to-splitting') return LO_TO_CAUTION;
  return null;
}

function pairValue(p: PairRecord): PairValue {
  const v: PairValue = { measured: p.measured, calculated: p.calculated };
  if (p.measuredUncertainty !== null) v.measuredUncertainty = p.measuredUncertainty;
  if (p.calculatedUncertainty !== null) v.calculatedUncertainty = p.calculatedUncertainty;
  return v;
}

function stored(s: ErrorStatistics, pairs: PairRecord[]): StoredStatistics {
  const { n: _n, maxAbsoluteErrorIndex, ...rest } = s;
  return { ...rest, maxAbsoluteErrorPair: pairs[maxAbsoluteErrorIndex].key };
}

/** Statistics of a group of pairs, clustered by material, or null below the minimum N. */
export function groupStatistics(pairs: PairRecord[], bootstrapSamples: number): StoredStatistics | null {
  if (pairs.length < MIN_PAIRS_FOR_STATISTICS) return null;
  return stored(errorStatistics(pairs.map(pairValue), { bootstrapSamples, seed: 1, clusters: pairs.map((p) => p.materialId) }), pairs);
}

/** Marks the included pairs of one method that the rule flags, with the reason in words. */
export function markOutliers(pairs: PairRecord[], rule: BenchmarkRules['outlierRule'], unit: string, scale: 'absolute' | 'relative' = rule.scale ?? 'absolute'): void {
  if (pairs.length === 0) return;
  if (isSampleRule(rule.kind) && pairs.length < (rule.minN ?? 1)) return;
  const values = pairs.map(pairValue);
  const flags = flagOutliers(values, { ...rule, scale });
  const scaled = outlierScaleValues(values, scale);
  const scores = rule.kind === 'modified-z' ? modifiedZScores(scaled) : null;
  const fences = rule.kind === 'tukey' ? tukeyFences(scaled, rule.threshold) : null;
  const relative = scale === 'relative';
  const shown = (v: number) => (relative ? `${stat('percent', 100 * v)} %` : `${stat('error', v)} ${unit}`);
  pairs.forEach((p, i) => {
    if (!flags[i]) return;
    switch (rule.kind) {
      case 'modified-z':
        p.outlier = `modified z-score${relative ? ' of the relative error' : ''} ${stat('score', scores![i])} beyond ±${rule.threshold}`;
        break;
      case 'tukey':
        p.outlier = `${relative ? 'relative error' : 'error'} ${shown(scaled[i])} outside the Tukey fences [${shown(fences!.lower)}, ${shown(fences!.upper)}] (k = ${rule.threshold})`;
        break;
      case 'relative':
        p.outlier = `relative error ${stat('percent', 100 * Math.abs(p.relativeError))} % above ${stat('percent', 100 * rule.threshold)} %`;
        break;
      case 'sigma': {
        const sigma = Math.hypot(p.measuredUncertainty ?? 0, p.calculatedUncertainty ?? 0);
        p.outlier = `|error| = ${fixed(Math.abs(p.error) / sigma, 1)} σ above ${rule.threshold} σ`;
        break;
      }
    }
  });
}

/** Band label of a measured value for the given upper edges. */
export function bandOf(value: number, edges: readonly number[]): string {
  for (let i = 0; i < edges.length; i++) {
    if (value < edges[i]) return i === 0 ? `< ${edges[0]}` : `${edges[i - 1]}–${edges[i]}`;
  }
  return edges.length ? `≥ ${edges[edges.length - 1]}` : 'all';
}

function applyDecisions(pairs: PairRecord[], decisions: BenchmarkInput['decisions']): void {
  const byPair = new Map<string, BenchmarkInput['decisions'][number]>();
  const byMeasurement = new Map<string, BenchmarkInput['decisions'][number]>();
  for (const d of decisions) {
    if (d.kind === 'exclude-pair' && d.methodId) byPair.set(`${d.methodId}|${d.measurementId}`, d);
    else if (d.kind === 'exclude-measurement') byMeasurement.set(d.measurementId, d);
  }
  for (const p of pairs) {
    const id = p.measurementIds[0];
    // An LO–TO splitting names two measurements: excluding either excludes it.
    const d = p.measurementIds.map((m) => byMeasurement.get(m)).find((x) => x !== undefined) ?? byPair.get(`${p.methodId}|${id}`);
    if (d) {
      p.excluded = d.reason;
      p.excludedBy = d.id;
    }
  }
}

/** Every band label of the given upper edges, lowest band first. */
export function bandLabels(edges: readonly number[]): string[] {
  if (edges.length === 0) return ['all'];
  return [`< ${edges[0]}`, ...edges.slice(1).map((e, i) => `${edges[i]}–${e}`), `≥ ${edges[edges.length - 1]}`];
}

/** Rows per group × method; groups in the given order (frequency bands), else alphabetical (classes). */
function breakdown(groups: Map<string, PairRecord[]>, order?: readonly string[]): BreakdownRow[] {
  const rows: BreakdownRow[] = [];
  for (const [key, pairs] of groups) {
    const cut = key.lastIndexOf('|');
    rows.push({ group: key.slice(0, cut), methodId: key.slice(cut + 1), n: pairs.length, statistics: groupStatistics(pairs, 0) });
  }
  const rank = (g: string) => (order ? order.indexOf(g) : -1);
  return rows.sort((a, b) => rank(a.group) - rank(b.group) || a.group.localeCompare(b.group) || a.methodId.localeCompare(b.methodId));
}

function comparisons(methodIds: string[], included: Map<string, PairRecord[]>): ComparisonRecord[] {
  const byMeasurements = new Map<string, Map<string, PairRecord>>();
  for (const id of methodIds) {
    const map = new Map<string, PairRecord>();
    for (const p of included.get(id) ?? []) map.set(p.measurementIds.join('+'), p);
    byMeasurements.set(id, map);
  }
  const out: ComparisonRecord[] = [];
  for (let i = 0; i < methodIds.length; i++) {
    for (let j = i + 1; j < methodIds.length; j++) {
      const a = byMeasurements.get(methodIds[i])!;
      const b = byMeasurements.get(methodIds[j])!;
      const paired: Array<{ a: number; b: number }> = [];
      for (const [key, pa] of [...a].sort(([x], [y]) => (x < y ? -1 : x > y ? 1 : 0))) {
        const pb = b.get(key);
        if (pb) paired.push({ a: Math.abs(pa.error), b: Math.abs(pb.error) });
      }
      if (paired.length === 0) continue;
      out.push({ a: methodIds[i], b: methodIds[j], ...compareMethods(paired) });
    }
  }
  return out;
}

function push<K, V>(map: Map<K, V[]>, key: K, value: V): void {
  const list = map.get(key);
  if (list) list.push(value);
  else map.set(key, [value]);
}

/** Per material × method: the rows of the per-material table. */
function materialRows(scopeMaterials: BenchmarkInput['materials'], byMethod: Map<string, PairRecord[]>, qualityRecords: QualityRecord[]): MaterialRow[] {
  const materials = new Map(scopeMaterials.map((m) => [m.id, m]));
  const flags = new Map<string, number>();
  for (const q of qualityRecords) flags.set(`${q.methodId}|${q.materialId}`, (flags.get(`${q.methodId}|${q.materialId}`) ?? 0) + 1);
  const rows: MaterialRow[] = [];
  for (const [methodId, pairs] of byMethod) {
    const byMaterial = groupBy(pairs, (p) => p.materialId);
    for (const [materialId, list] of byMaterial) {
      const inc = list.filter((p) => p.excluded === null);
      const abs = inc.map((p) => Math.abs(p.error));
      const m = materials.get(materialId);
      rows.push({
        methodId,
        materialId,
        name: m?.name ?? materialId,
        formula: m?.formula ?? '',
        n: inc.length,
        meanAbsoluteError: inc.length ? abs.reduce((a, b) => a + b, 0) / inc.length : null,
        meanSignedError: inc.length ? inc.reduce((a, p) => a + p.error, 0) / inc.length : null,
        maxAbsoluteError: inc.length ? Math.max(...abs) : null,
        outliers: inc.filter((p) => p.outlier !== null).length,
        ambiguous: inc.filter((p) => p.ambiguous).length,
        excluded: list.length - inc.length,
        qualityFlags: flags.get(`${methodId}|${materialId}`) ?? 0,
      });
    }
  }
  return rows.sort((a, b) => (b.meanAbsoluteError ?? -1) - (a.meanAbsoluteError ?? -1) || a.methodId.localeCompare(b.methodId) || a.name.localeCompare(b.name));
}

function byKey(a: PairRecord, b: PairRecord): number {
  return a.key < b.key ? -1 : a.key > b.key ? 1 : 0;
}

/** Runs the whole computation (module header) and returns the snapshot a Revision stores. */
export function computeBenchmark(input: BenchmarkInput): BenchmarkSnapshot {
  return finishBenchmark(input, pairMaterials(input));
}

/** What the statistics need besides the per-material pairing: every material in scope, the methods, decisions and pins. */
export type FinishContext = Pick<BenchmarkInput, 'quantity' | 'rules' | 'materials' | 'methods' | 'decisions' | 'pins' | 'referenceMethod'>;

/**
 * From the per-material pairings (material-stage.ts) to the snapshot: decisions, merged repeats, outliers,
 * statistics, ranking, breakdowns and comparisons, over every pair. The stages are not changed (pairs are copied),
 * so a caller may keep them and hand them in again.
 */
export function finishBenchmark(context: FinishContext, stages: readonly MaterialStage[]): BenchmarkSnapshot {
  const { rules, quantity } = context;
  const unit = unitOf(quantity);
  const methods = [...context.methods].sort((a, b) => a.label.localeCompare(b.label) || a.id.localeCompare(b.id));
  const methodIds = methods.map((m) => m.id);
  const ordered = [...stages].sort((a, b) => (a.materialId < b.materialId ? -1 : a.materialId > b.materialId ? 1 : 0));
  const entropyBasis = isThermal(quantity) ? (rules.entropyBasis ?? 'formula-unit') : undefined;

  let pairs: PairRecord[] = [];
  const unpaired = new Map<string, number>();
  let measuredInScope = 0;
  const matchedBy = { index: 0, pairing: 0 };
  let measurementCount = 0;
  let calculationCount = 0;
  const qualityList: QualityRecord[] = [];
  const notApplied: NonNullable<BenchmarkSnapshot['qualityNotApplied']> = [];
  const tensorDistances = new Map<string, number>();
  const cpCorrection = { corrected: 0, lacking: [] as string[] };
  const materialNames = new Map(context.materials.map((m) => [m.id, m.name]));
  for (const s of ordered) {
    if (s.cpCorrection === 'corrected') cpCorrection.corrected++;
    else if (s.cpCorrection === 'lacking') cpCorrection.lacking.push(materialNames.get(s.materialId) ?? s.materialId);
    for (const [key, d] of Object.entries(s.tensorDistances ?? {})) tensorDistances.set(key, d);
    for (const p of s.pairs) pairs.push({ ...p });
    for (const [methodId, n] of Object.entries(s.unpaired)) unpaired.set(methodId, (unpaired.get(methodId) ?? 0) + n);
    measuredInScope += s.measuredInScope;
    matchedBy.index += s.matchedBy?.index ?? 0;
    matchedBy.pairing += s.matchedBy?.pairing ?? 0;
    measurementCount += s.measurements;
    calculationCount += s.calculations;
    for (const q of s.quality) qualityList.push({ ...q });
    for (const n of s.notApplied) notApplied.push({ ...n });
  }
  const qualityRecords = qualityList.sort(qualityOrder);
  notApplied.sort(qualityOrder);

  applyDecisions(pairs, context.decisions);
  if (rules.repeatedMeasurements === 'weighted-mean') pairs = mergeRepeatedMeasurements(pairs);
  pairs.sort(byKey);

  const byMethod = groupBy(pairs, (p) => p.methodId);
  const included = new Map<string, PairRecord[]>();
  const outlierScale = outlierScaleOf(rules.outlierRule, quantity);
  for (const id of methodIds) {
    const list = (byMethod.get(id) ?? []).filter((p) => p.excluded === null);
    markOutliers(list, rules.outlierRule, unit, outlierScale);
    included.set(id, list);
  }

  const results: MethodResult[] = methods.map((m) => {
    const all = byMethod.get(m.id) ?? [];
    const inc = included.get(m.id)!;
    const reasons = new Map<string, number>();
    for (const p of all) if (p.excluded !== null) reasons.set(p.excluded, (reasons.get(p.excluded) ?? 0) + 1);
    return {
      methodId: m.id,
      label: m.label,
      n: inc.length,
      excluded: all.length - inc.length,
      excludedReasons: [...reasons].map(([reason, count]) => ({ reason, count })).sort((a, b) => b.count - a.count || a.reason.localeCompare(b.reason)),
      outliers: inc.filter((p) => p.outlier !== null).length,
      qualityFlags: qualityRecords.filter((q) => q.methodId === m.id).length,
      unpairedMeasurements: unpaired.get(m.id) ?? 0,
      statistics: groupStatistics(inc, rules.bootstrapSamples),
      rank: null,
    };
  });
  const ranking = rankOnCommonGround(results, included, pairs, measuredInScope, rules.ranking, quantity === 'lo-to-splitting');
  results.sort((a, b) => (a.rank ?? Infinity) - (b.rank ?? Infinity) || b.n - a.n || a.label.localeCompare(b.label));

  const tagsOf = new Map(context.materials.map((m) => [m.id, m.tags.length ? m.tags : [UNTAGGED]]));
  const includedAll = [...included.values()].flat().sort(byKey);
  const classGroups = new Map<string, PairRecord[]>();
  const bandGroups = new Map<string, PairRecord[]>();
  const speciesGroups = new Map<string, PairRecord[]>();
  const branchGroups = new Map<string, PairRecord[]>();
  const techniqueGroups = new Map<string, PairRecord[]>();
  for (const p of includedAll) {
    for (const tag of tagsOf.get(p.materialId) ?? [UNTAGGED]) push(classGroups, `${tag}|${p.methodId}`, p);
    push(techniqueGroups, `${p.technique ?? 'not stated'}|${p.methodId}`, p);
    if (quantity === 'lo-to-splitting') push(speciesGroups, `${p.species ?? UNLABELLED}|${p.methodId}`, p);
    if (quantity === 'frequency') {
      push(bandGroups, `${bandOf(p.measured, rules.bandEdgesCm1)}|${p.methodId}`, p);
      push(speciesGroups, `${p.species ?? UNLABELLED}|${p.methodId}`, p);
      push(branchGroups, `${p.branch ?? NO_BRANCH}|${p.methodId}`, p);
    }
  }

  return {
    version: 2,
    quantity,
    unit,
    rules,
    methods: results,
    classes: breakdown(classGroups),
    bands: breakdown(bandGroups, bandLabels(rules.bandEdgesCm1)),
    species: breakdown(speciesGroups),
    branches: breakdown(branchGroups, ['TO', 'LO', NO_BRANCH]),
    techniques: breakdown(techniqueGroups),
    materialRows: materialRows(context.materials, byMethod, qualityRecords),
    ranking,
    entropyBasis,
    // Against a reference method both sides are computed alike: the cautions about experiment do not apply.
    caution: context.referenceMethod ? null : cautionOf(quantity, rules),
    outlierScale,
    qualityNotApplied: notApplied,
    comparisons: comparisons(methodIds, included),
    pairs,
    quality: qualityRecords,
    decisions: [...context.decisions].sort((a, b) => a.createdAt - b.createdAt || (a.id < b.id ? -1 : 1)),
    pins: [...context.pins].sort((a, b) => (a.id < b.id ? -1 : 1)),
    counts: {
      measurements: measurementCount,
      calculations: calculationCount,
      materials: context.materials.length,
      methods: methods.length,
      measuredInScope,
    },
    empty: pairs.length === 0 ? emptyReason(context, measurementCount, calculationCount) : null,
    ...(context.referenceMethod ? { reference: referenceSummary(context, results, included, matchedBy) } : {}),
    ...(tensorDistances.size ? { tensors: tensorSummary(results, included, tensorDistances) } : {}),
    ...(cpCorrection.corrected || cpCorrection.lacking.length ? { cpCorrection: { corrected: cpCorrection.corrected, lacking: cpCorrection.lacking.sort() } } : {}),
  };
}

/** Born charges: per method, ‖ΔZ‖_F over its included pairs where both sides hold a full tensor (site-and-splitting-pairs.ts). */
function tensorSummary(results: readonly MethodResult[], included: Map<string, PairRecord[]>, distances: Map<string, number>): TensorComparisonRecord[] {
  return results.map((m) => {
    const list = (included.get(m.methodId) ?? []).map((p) => distances.get(p.key)).filter((d): d is number => d !== undefined);
    return {
      methodId: m.methodId,
      label: m.label,
      n: list.length,
      meanFrobenius: list.length ? list.reduce((a, b) => a + b, 0) / list.length : null,
      maxFrobenius: list.length ? Math.max(...list) : null,
    };
  });
}

/** Against a reference method: per candidate, |Δ| and |Δ|/ref over its included pairs and the share of materials within the tolerance (module header). */
function referenceSummary(
  context: FinishContext,
  results: readonly MethodResult[],
  included: Map<string, PairRecord[]>,
  matchedBy: { index: number; pairing: number },
): ReferenceRecord {
  const tolerance = referenceToleranceOf(context.rules, context.quantity);
  const perMethod = results.map((m): ReferenceMethodRecord => {
    const list = included.get(m.methodId) ?? [];
    const worst = new Map<string, number>();
    for (const p of list) worst.set(p.materialId, Math.max(worst.get(p.materialId) ?? 0, Math.abs(p.error)));
    const within = [...worst.values()].filter((d) => d <= tolerance).length;
    const relative = list.filter((p) => p.measured !== 0).map((p) => Math.abs(p.error / p.measured));
    const absolute = list.map((p) => Math.abs(p.error));
    return {
      methodId: m.methodId,
      label: m.label,
      materials: worst.size,
      withinTolerance: within,
      shareWithin: worst.size ? within / worst.size : null,
      n: list.length,
      meanAbsolute: absolute.length ? absolute.reduce((a, b) => a + b, 0) / absolute.length : null,
      maxAbsolute: absolute.length ? Math.max(...absolute) : null,
      meanRelative: relative.length ? relative.reduce((a, b) => a + b, 0) / relative.length : null,
      maxRelative: relative.length ? Math.max(...relative) : null,
    };
  });
  return {
    methodId: context.referenceMethod!.id,
    label: context.referenceMethod!.label,
    tolerance,
    share: context.rules.convergenceShare ?? DEFAULT_CONVERGENCE_SHARE,
    matchedBy,
    perMethod,
  };
}

function emptyReason(input: FinishContext, measurements: number, calculations: number): string {
  const what = `measured ${QUANTITY_PLURAL[input.quantity]}`;
  if (input.methods.length === 0) return 'No method is in scope: the benchmark names no method that exists, or the workspace has none.';
  if (input.referenceMethod) {
    if (measurements === 0) return `The reference method ${input.referenceMethod.label} has no ${QUANTITY_PLURAL[input.quantity]} on the materials in scope.`;
    if (calculations === 0) return `No candidate method has ${QUANTITY_PLURAL[input.quantity]} on the materials the reference method ${input.referenceMethod.label} covers.`;
    return `No computed value of a candidate method found its partner in the reference method ${input.referenceMethod.label}.`;
  }
  if (measurements === 0) return `No ${what} match the scope.`;
  if (calculations === 0) return `The ${measurements} ${what} in scope have no calculation of the selected methods on the same materials.`;
  if (input.quantity === 'born-charge') return 'No measured Born charge found a computed one of the same site (or element) of the selected methods.';
  if (input.quantity === 'lo-to-splitting')
    return 'No LO–TO splitting could be formed and paired: a splitting needs a measured TO and LO of the same species from one source, and the method the same species with as many TO as LO lines (a method without the non-analytic correction has no LO).';
  if (isDielectric(input.quantity)) return `No material in scope has both a measured and a computed ${QUANTITY_PLURAL[input.quantity].replace(/ values$/, '')} of the selected methods.`;
  return input.quantity === 'frequency'
    ? `No measured peak found a computed mode within the pairing window (±${Math.round(100 * input.rules.maxRelativeDeviation)} %) with a compatible activity and label.`
    : `No measured and computed ${QUANTITY_PLURAL[input.quantity]} of the same material lie within the temperature tolerance.`;
}
