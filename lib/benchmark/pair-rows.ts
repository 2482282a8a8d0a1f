/**
 * From scope rows to pairs, per material × method.
 *
 * Frequencies: the measurements of a material are split into spectra (same
 * source, technique and temperature), because pairModes assigns each computed
 * line to at most one peak and two spectra of the same crystal must both be able
 * to pair with the same mode. Each spectrum is paired with the method's computed
 * modes by `pairModes`, with the workspace's pins, the material's atoms in the cell
 * (the acoustic rule for complete lists), the method's LO–TO correction flag and the
 * benchmark's windows. A stored optical activity (raman, ir, raman+ir, silent) marks
 * the mode `acoustic: false`, so it is never taken as acoustic; 'acoustic' marks it true.
 *
 * With `repeatedMeasurements: 'weighted-mean'`, the pairs of one method that land
 * on the same computed line (several measurements of one mode) are merged into one
 * pair whose measured value is the inverse-variance weighted mean (plain mean when
 * any member lacks an uncertainty) and whose uncertainty is 1/√Σw (plain: the
 * standard error of the members, when there are several). Members excluded by a
 * decision stay out of the mean and are listed as excluded pairs of their own.
 *
 * Entropies: a measured entropy within the tolerance of the benchmark temperature
 * is compared with the method's computed entropy of the same material closest in
 * temperature (no mode pairing).
 */
import { irrepBranch, irrepSpecies, pairModes, ScienceInputError, type ComputedMode, type MeasuredPeak, type Technique } from '@/lib/science';
import type { BenchmarkRules } from './schemas';
import type { PairRecord, ScopeCalculation, ScopeMeasurement, ScopePin } from './types';

/** Stored technique → the pairing rule it follows; an unknown technique pairs like INS (any optical line). */
export function pairingTechnique(technique: string | null): Technique {
  switch (technique) {
    case 'raman':
      return 'raman';
    case 'ir-reflectance':
    case 'ir-absorption':
      return 'ir';
    case 'hyper-raman':
      return 'hyper-raman';
    default:
      return 'ins';
  }
}

/**
 * Modes for qualityChecks, named for its messages: the label and the rank by frequency
 * ("T1u(TO) no. 4", or "no. 2" without a label, so that messages never read "mode mode")
 * instead of a row id, and still unique as ids must be.
 */
export function qualityModes(calcs: readonly ScopeCalculation[]): ComputedMode[] {
  const rank = new Map([...calcs].sort((a, b) => a.value - b.value).map((c, i) => [c.id, i + 1]));
  return calcs.map((c) => ({ ...computedMode(c), id: c.irrep ? `${c.irrep} no. ${rank.get(c.id)}` : `no. ${rank.get(c.id)}` }));
}

export function computedMode(c: ScopeCalculation): ComputedMode {
  const mode: ComputedMode = { id: c.id, frequencyCm1: c.value };
  if (c.irrep) mode.irrep = c.irrep;
  if (c.branch) mode.branch = c.branch;
  if (c.degeneracy) mode.degeneracy = c.degeneracy;
  switch (c.activity) {
    case 'raman':
      mode.ramanActive = true;
      mode.irActive = false;
      mode.acoustic = false;
      break;
    case 'ir':
      mode.ramanActive = false;
      mode.irActive = true;
      mode.acoustic = false;
      break;
    case 'raman+ir':
      mode.ramanActive = true;
      mode.irActive = true;
      mode.acoustic = false;
      break;
    case 'silent':
      mode.ramanActive = false;
      mode.irActive = false;
      mode.acoustic = false;
      break;
    case 'acoustic':
      mode.acoustic = true;
      break;
  }
  return mode;
}

function measuredPeak(m: ScopeMeasurement): MeasuredPeak {
  const peak: MeasuredPeak = { id: m.id, frequencyCm1: m.value, technique: pairingTechnique(m.technique) };
  if (m.uncertainty !== null) peak.uncertaintyCm1 = m.uncertainty;
  if (m.irrep) peak.irrep = m.irrep;
  if (m.branch) peak.branch = m.branch;
  return peak;
}

export function groupBy<T>(rows: readonly T[], keyOf: (row: T) => string): Map<string, T[]> {
  const groups = new Map<string, T[]>();
  for (const row of rows) {
    const key = keyOf(row);
    const group = groups.get(key);
    if (group) group.push(row);
    else groups.set(key, [row]);
  }
  return groups;
}

/** Species and branch of a label, or nulls when it is absent or not a label normalizeIrrep reads. */
export function labelParts(label: string | null, branch: 'TO' | 'LO' | null): { species: string | null; branch: 'TO' | 'LO' | null } {
  if (!label || label.trim() === '') return { species: null, branch };
  try {
    return { species: irrepSpecies(label), branch: branch ?? irrepBranch(label) ?? null };
  } catch (error) {
    if (error instanceof ScienceInputError) return { species: null, branch };
    throw error;
  }
}

export function pairKey(methodId: string, measurementIds: readonly string[]): string {
  return `${methodId}|${measurementIds.join('+')}`;
}

export function newPair(
  methodId: string,
  m: ScopeMeasurement,
  calculationIds: string[],
  calculated: number,
  calculatedUncertainty: number | null,
  basis: PairRecord['basis'],
  ambiguous: boolean,
  sourceIds: string[],
  label: string | null,
): PairRecord {
  const error = calculated - m.value;
  const parts = labelParts(label, m.branch);
  return {
    key: pairKey(methodId, [m.id]),
    methodId,
    materialId: m.materialId,
    measurementIds: [m.id],
    calculationIds,
    measured: m.value,
    calculated,
    error,
    relativeError: error / m.value,
    measuredUncertainty: m.uncertainty,
    calculatedUncertainty,
    label,
    species: parts.species,
    branch: parts.branch,
    technique: m.technique,
    temperatureK: m.temperatureK,
    basis,
    ambiguous,
    sourceIds,
    excluded: null,
    excludedBy: null,
    outlier: null,
  };
}

/** Pins a spectrum may use: one per measurement and per computed mode, so pairModes accepts them. */
function usablePins(peaks: MeasuredPeak[], pinsByMeasurement: Map<string, ScopePin>) {
  const usedCalc = new Set<string>();
  const pins: Array<{ measuredId: string; computedId: string | null }> = [];
  for (const peak of peaks) {
    const pin = pinsByMeasurement.get(peak.id);
    if (!pin) continue;
    if (pin.calculationId !== null) {
      if (usedCalc.has(pin.calculationId)) continue;
      usedCalc.add(pin.calculationId);
    }
    pins.push({ measuredId: pin.measurementId, computedId: pin.calculationId });
  }
  return pins;
}

/** What pairing needs to know of materials and methods beyond their rows. */
export interface PairingContext {
  atomsInCell: ReadonlyMap<string, number | null>;
  nonAnalyticCorrection: ReadonlyMap<string, boolean | null | undefined>;
  acousticThresholdCm1?: number;
}

export interface FrequencyPairing {
  pairs: PairRecord[];
  unpaired: Map<string, number>;
  pinConflicts: Array<{ methodId: string; materialId: string; message: string }>;
}

/** Pairs every spectrum of every material with every method's modes (see the module header). */
export function pairFrequencies(
  measurements: readonly ScopeMeasurement[],
  calculationsByMaterialMethod: Map<string, ScopeCalculation[]>,
  methodIds: readonly string[],
  pins: readonly ScopePin[],
  rules: BenchmarkRules,
  context?: PairingContext,
): FrequencyPairing {
  const pinsByMethod = new Map<string, Map<string, ScopePin>>();
  for (const pin of pins) {
    let byMeasurement = pinsByMethod.get(pin.methodId);
    if (!byMeasurement) pinsByMethod.set(pin.methodId, (byMeasurement = new Map()));
    byMeasurement.set(pin.measurementId, pin);
  }
  const pairs: PairRecord[] = [];
  const unpaired = new Map<string, number>();
  const pinConflicts: FrequencyPairing['pinConflicts'] = [];
  const byMaterial = groupBy(measurements, (m) => m.materialId);
  for (const [materialId, rows] of byMaterial) {
    const spectra = [...groupBy(rows, (m) => `${m.sourceId}|${m.technique ?? ''}|${m.temperatureK ?? ''}`).values()];
    for (const methodId of methodIds) {
      const calcs = calculationsByMaterialMethod.get(`${materialId}|${methodId}`);
      if (!calcs || calcs.length === 0) continue;
      const modes = calcs.map(computedMode);
      const calcById = new Map(calcs.map((c) => [c.id, c]));
      const methodPins = pinsByMethod.get(methodId) ?? new Map<string, ScopePin>();
      for (const spectrum of spectra) {
        const peaks = spectrum.map(measuredPeak);
        const options = {
          maxRelativeDeviation: rules.maxRelativeDeviation,
          labelledMaxRelativeDeviation: rules.labelledMaxRelativeDeviation,
          atomsInCell: context?.atomsInCell.get(materialId) ?? undefined,
          nonAnalyticCorrection: context?.nonAnalyticCorrection.get(methodId) ?? undefined,
          acousticThresholdCm1: context?.acousticThresholdCm1,
          ambiguityCm1: rules.ambiguityCm1,
          ambiguityRelative: rules.ambiguityRelative,
          pins: usablePins(peaks, methodPins),
        };
        let result;
        try {
          result = pairModes(peaks, modes, options);
        } catch (error) {
          if (!(error instanceof ScienceInputError)) throw error;
          pinConflicts.push({ methodId, materialId, message: error.message });
          result = pairModes(peaks, modes, { ...options, pins: [] });
        }
        const byId = new Map(spectrum.map((m) => [m.id, m]));
        for (const p of result.pairs) {
          const m = byId.get(p.measuredId)!;
          const members = p.computedIds.map((id) => calcById.get(id)!);
          const uncertainties = members.map((c) => c.uncertainty).filter((u): u is number => u !== null);
          const label = m.irrep ?? members.find((c) => c.irrep)?.irrep ?? null;
          const sources = [...new Set([m.sourceId, ...members.map((c) => c.sourceId)])];
          pairs.push(
            newPair(methodId, m, p.computedIds, p.calculatedCm1, uncertainties.length ? Math.max(...uncertainties) : null, p.basis, p.ambiguous, sources, label),
          );
        }
        unpaired.set(methodId, (unpaired.get(methodId) ?? 0) + result.unpairedMeasured.length);
      }
    }
  }
  return { pairs, unpaired, pinConflicts };
}

/**
 * Measured vs computed entropy (or heat capacity) per material and method at the benchmark
 * temperature, or (temperatureK null) at each measurement's own temperature: a measured S(T) or
 * Cp(T) series pairs point by point with the computed value nearest in T within the tolerance.
 */
export function pairEntropies(
  measurements: readonly ScopeMeasurement[],
  calculationsByMaterialMethod: Map<string, ScopeCalculation[]>,
  methodIds: readonly string[],
  temperatureK: number | null,
  toleranceK: number,
): { pairs: PairRecord[]; unpaired: Map<string, number> } {
  const near = (t: number | null, target: number) => t !== null && Math.abs(t - target) <= toleranceK;
  const pairs: PairRecord[] = [];
  const unpaired = new Map<string, number>();
  for (const m of measurements) {
    const target = temperatureK ?? m.temperatureK;
    if (target === null || !near(m.temperatureK, target)) continue;
    for (const methodId of methodIds) {
      const candidates = (calculationsByMaterialMethod.get(`${m.materialId}|${methodId}`) ?? []).filter((c) => near(c.temperatureK, target));
      if (candidates.length === 0) {
        unpaired.set(methodId, (unpaired.get(methodId) ?? 0) + 1);
        continue;
      }
      const best = candidates.reduce((a, b) => {
        const da = Math.abs(a.temperatureK! - target);
        const db = Math.abs(b.temperatureK! - target);
        return db < da || (db === da && b.id < a.id) ? b : a;
      });
      pairs.push(newPair(methodId, m, [best.id], best.value, best.uncertainty, 'temperature', false, [...new Set([m.sourceId, best.sourceId])], null));
    }
  }
  return { pairs, unpaired };
}

/**
 * Measured vs computed dielectric constant per material and method: every measurement of the
 * material pairs with the method's value, whatever the temperatures. Several computed values of
 * one method for one material: the one with the smallest id, marked ambiguous.
 */
export function pairPerMaterial(
  measurements: readonly ScopeMeasurement[],
  calculationsByMaterialMethod: Map<string, ScopeCalculation[]>,
  methodIds: readonly string[],
): { pairs: PairRecord[]; unpaired: Map<string, number> } {
  const pairs: PairRecord[] = [];
  const unpaired = new Map<string, number>();
  for (const m of measurements) {
    for (const methodId of methodIds) {
      const candidates = calculationsByMaterialMethod.get(`${m.materialId}|${methodId}`) ?? [];
      if (candidates.length === 0) {
        unpaired.set(methodId, (unpaired.get(methodId) ?? 0) + 1);
        continue;
      }
      const first = candidates.reduce((a, b) => (b.id < a.id ? b : a));
      pairs.push(newPair(methodId, m, [first.id], first.value, first.uncertainty, 'material', candidates.length > 1, [...new Set([m.sourceId, first.sourceId])], null));
    }
  }
  return { pairs, unpaired };
}

/** Merges the included pairs of one method on the same computed line (see the module header). */
export function mergeRepeatedMeasurements(pairs: PairRecord[]): PairRecord[] {
  const out: PairRecord[] = [];
  const groups = groupBy(pairs, (p) => (p.excluded ? `x|${p.key}` : `${p.methodId}|${p.calculationIds.join('+')}`));
  for (const group of groups.values()) {
    if (group.length === 1) {
      out.push(group[0]);
      continue;
    }
    const allHaveUncertainty = group.every((p) => p.measuredUncertainty !== null && p.measuredUncertainty > 0);
    let measured: number;
    let uncertainty: number | null;
    if (allHaveUncertainty) {
      let sumW = 0;
      let sumWx = 0;
      for (const p of group) {
        const w = 1 / (p.measuredUncertainty! * p.measuredUncertainty!);
        sumW += w;
        sumWx += w * p.measured;
      }
      measured = sumWx / sumW;
      uncertainty = 1 / Math.sqrt(sumW);
    } else {
      measured = group.reduce((s, p) => s + p.measured, 0) / group.length;
      const variance = group.reduce((s, p) => s + (p.measured - measured) ** 2, 0) / (group.length - 1);
      uncertainty = Math.sqrt(variance / group.length);
    }
    const first = group[0];
    const measurementIds = group.flatMap((p) => p.measurementIds).sort();
    const error = first.calculated - measured;
    out.push({
      ...first,
      key: pairKey(first.methodId, measurementIds),
      measurementIds,
      measured,
      error,
      relativeError: error / measured,
      measuredUncertainty: uncertainty,
      basis: group.some((p) => p.basis === 'pinned') ? 'pinned' : first.basis,
      ambiguous: group.some((p) => p.ambiguous),
      sourceIds: [...new Set(group.flatMap((p) => p.sourceIds))],
      temperatureK: group.every((p) => p.temperatureK === first.temperatureK) ? first.temperatureK : null,
    });
  }
  return out;
}
