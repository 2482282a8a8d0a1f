/**
 * The benchmark computation: scope rows → pairs → decisions → statistics per
 * method, per material class and per frequency band → outlier flags → method
 * comparisons → quality checks. Pure and deterministic: pairs are sorted by key
 * before any statistic, so the order of the input rows never matters.
 *
 * Decisions: 'exclude-pair' (method + measurement) and 'exclude-measurement'
 * (every method) keep the pair in the list, marked excluded with the reason, and
 * out of every statistic; 'keep' records that a flag was reviewed. Outlier rules
 * run on the included pairs. Methods with fewer than MIN_PAIRS_FOR_STATISTICS
 * included pairs show N only. Breakdowns (class, band) skip the bootstrap.
 */
import {
  compareMethods,
  errorStatistics,
  flagOutliers,
  modifiedZScores,
  qualityChecks,
  ScienceInputError,
  tukeyFences,
  type ErrorStatistics,
  type PairValue,
} from '@/lib/science';
import { groupBy, qualityModes, mergeRepeatedMeasurements, pairEntropies, pairFrequencies } from './pair-rows';
import type { BenchmarkRules } from './schemas';
import type {
  BenchmarkInput,
  BenchmarkSnapshot,
  BreakdownRow,
  ComparisonRecord,
  MethodResult,
  PairRecord,
  QualityRecord,
  ScopeCalculation,
  StoredStatistics,
} from './types';

export const MIN_PAIRS_FOR_STATISTICS = 3;
export const UNTAGGED = 'untagged';

export function unitOf(quantity: BenchmarkInput['quantity']): string {
  return quantity === 'frequency' ? 'cm⁻¹' : 'J mol⁻¹ K⁻¹';
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

/** Statistics of a group of pairs, or null below the minimum N. */
export function groupStatistics(pairs: PairRecord[], bootstrapSamples: number): StoredStatistics | null {
  if (pairs.length < MIN_PAIRS_FOR_STATISTICS) return null;
  return stored(errorStatistics(pairs.map(pairValue), { bootstrapSamples, seed: 1 }), pairs);
}

function format(value: number, digits = 2): string {
  return Number(value.toFixed(digits)).toString();
}

/** Marks the included pairs of one method that the rule flags, with the reason in words. */
export function markOutliers(pairs: PairRecord[], rule: BenchmarkRules['outlierRule'], unit: string): void {
  if (pairs.length === 0) return;
  const flags = flagOutliers(pairs.map(pairValue), rule);
  const errors = pairs.map((p) => p.error);
  const scores = rule.kind === 'modified-z' ? modifiedZScores(errors) : null;
  const fences = rule.kind === 'tukey' ? tukeyFences(errors, rule.threshold) : null;
  pairs.forEach((p, i) => {
    if (!flags[i]) return;
    switch (rule.kind) {
      case 'modified-z':
        p.outlier = `modified z-score ${format(scores![i])} beyond ±${rule.threshold}`;
        break;
      case 'tukey':
        p.outlier = `error ${format(p.error)} ${unit} outside the Tukey fences [${format(fences!.lower)}, ${format(fences!.upper)}] (k = ${rule.threshold})`;
        break;
      case 'relative':
        p.outlier = `relative error ${format(100 * Math.abs(p.relativeError), 1)} % above ${format(100 * rule.threshold, 1)} %`;
        break;
      case 'sigma': {
        const sigma = Math.hypot(p.measuredUncertainty ?? 0, p.calculatedUncertainty ?? 0);
        p.outlier = `|error| = ${format(Math.abs(p.error) / sigma, 1)} σ above ${rule.threshold} σ`;
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
    const d = byMeasurement.get(id) ?? byPair.get(`${p.methodId}|${id}`);
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

function quality(input: BenchmarkInput, calcsByMaterialMethod: Map<string, ScopeCalculation[]>): QualityRecord[] {
  if (input.quantity !== 'frequency') return [];
  const materials = new Map(input.materials.map((m) => [m.id, m]));
  const methods = new Map(input.methods.map((m) => [m.id, m]));
  const out: QualityRecord[] = [];
  for (const [key, calcs] of calcsByMaterialMethod) {
    const [materialId, methodId] = key.split('|');
    const material = materials.get(materialId);
    const method = methods.get(methodId);
    if (!material || !method) continue;
    try {
      const flags = qualityChecks({
        modes: qualityModes(calcs),
        atomsInCell: material.atomsInCell ?? undefined,
        kGrid: method.kGrid ?? undefined,
        qGrid: method.qGrid ?? undefined,
        thresholds: input.qualityThresholds,
      });
      for (const f of flags) out.push({ methodId, materialId, code: f.code, severity: f.severity, message: f.message });
    } catch (error) {
      if (!(error instanceof ScienceInputError)) throw error;
      out.push({ methodId, materialId, code: 'invalid-input', severity: 'error', message: error.message });
    }
  }
  return out.sort((a, b) => a.methodId.localeCompare(b.methodId) || a.materialId.localeCompare(b.materialId) || a.code.localeCompare(b.code));
}

function byKey(a: PairRecord, b: PairRecord): number {
  return a.key < b.key ? -1 : a.key > b.key ? 1 : 0;
}

/** Runs the whole computation (module header) and returns the snapshot a Revision stores. */
export function computeBenchmark(input: BenchmarkInput): BenchmarkSnapshot {
  const { rules, quantity } = input;
  const unit = unitOf(quantity);
  const methods = [...input.methods].sort((a, b) => a.label.localeCompare(b.label) || a.id.localeCompare(b.id));
  const methodIds = methods.map((m) => m.id);
  const calcsByMaterialMethod = groupBy(
    [...input.calculations].sort((a, b) => (a.id < b.id ? -1 : 1)),
    (c) => `${c.materialId}|${c.methodId}`,
  );
  const measurements = [...input.measurements].sort((a, b) => (a.id < b.id ? -1 : 1));

  let pairs: PairRecord[];
  let unpaired: Map<string, number>;
  if (quantity === 'frequency') {
    const pins = [...input.pins].sort((a, b) => (a.id < b.id ? -1 : 1));
    ({ pairs, unpaired } = pairFrequencies(measurements, calcsByMaterialMethod, methodIds, pins, rules));
  } else {
    const scope = { temperatureK: 298.15, toleranceK: 1, ...input.entropyWindow };
    ({ pairs, unpaired } = pairEntropies(measurements, calcsByMaterialMethod, methodIds, scope.temperatureK, scope.toleranceK));
  }
  applyDecisions(pairs, input.decisions);
  if (rules.repeatedMeasurements === 'weighted-mean') pairs = mergeRepeatedMeasurements(pairs);
  pairs.sort(byKey);

  const byMethod = groupBy(pairs, (p) => p.methodId);
  const included = new Map<string, PairRecord[]>();
  for (const id of methodIds) {
    const list = (byMethod.get(id) ?? []).filter((p) => p.excluded === null);
    markOutliers(list, rules.outlierRule, unit);
    included.set(id, list);
  }
  const qualityRecords = quality(input, calcsByMaterialMethod);

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
  const ranked = results.filter((r) => r.statistics !== null);
  for (const r of ranked) r.rank = 1 + ranked.filter((o) => o.statistics!.meanAbsoluteError < r.statistics!.meanAbsoluteError).length;
  results.sort((a, b) => (a.rank ?? Infinity) - (b.rank ?? Infinity) || b.n - a.n || a.label.localeCompare(b.label));

  const tagsOf = new Map(input.materials.map((m) => [m.id, m.tags.length ? m.tags : [UNTAGGED]]));
  const includedAll = [...included.values()].flat().sort(byKey);
  const classGroups = new Map<string, PairRecord[]>();
  const bandGroups = new Map<string, PairRecord[]>();
  for (const p of includedAll) {
    for (const tag of tagsOf.get(p.materialId) ?? [UNTAGGED]) {
      const key = `${tag}|${p.methodId}`;
      (classGroups.get(key) ?? classGroups.set(key, []).get(key)!).push(p);
    }
    if (quantity === 'frequency') {
      const key = `${bandOf(p.measured, rules.bandEdgesCm1)}|${p.methodId}`;
      (bandGroups.get(key) ?? bandGroups.set(key, []).get(key)!).push(p);
    }
  }

  return {
    version: 1,
    quantity,
    unit,
    rules,
    methods: results,
    classes: breakdown(classGroups),
    bands: breakdown(bandGroups, bandLabels(rules.bandEdgesCm1)),
    comparisons: comparisons(methodIds, included),
    pairs,
    quality: qualityRecords,
    decisions: [...input.decisions].sort((a, b) => a.createdAt - b.createdAt || (a.id < b.id ? -1 : 1)),
    pins: [...input.pins].sort((a, b) => (a.id < b.id ? -1 : 1)),
    counts: {
      measurements: input.measurements.length,
      calculations: input.calculations.length,
      materials: input.materials.length,
      methods: methods.length,
    },
    empty: pairs.length === 0 ? emptyReason(input) : null,
  };
}

function emptyReason(input: BenchmarkInput): string {
  const what = input.quantity === 'frequency' ? 'measured frequencies' : 'measured entropies';
  if (input.methods.length === 0) return 'No method is in scope: the benchmark names no method that exists, or the workspace has none.';
  if (input.measurements.length === 0) return `No ${what} match the scope.`;
  if (input.calculations.length === 0) return `The ${input.measurements.length} ${what} in scope have no calculation of the selected methods on the same materials.`;
  return input.quantity === 'frequency'
    ? `No measured peak found a computed mode within the pairing window (±${Math.round(100 * input.rules.maxRelativeDeviation)} %) with a compatible activity and label.`
    : 'No measured and computed entropy of the same material lie within the temperature tolerance.';
}
