/**
 * Pairs of the two quantities that are not one number per mode or per material.
 *
 * Born effective charges (pairSites): per material, a measured (or reference) charge pairs with
 * the method's charge of the same site. A bare element site ("Ga") on one side stands for every
 * atom of that element on the other: the computed value is then the mean of those sites'
 * diagonal means (equivalent atoms carry rotated copies of one tensor, so the means agree).
 * A numbered site without a match on the other side stays unpaired. Where both sides hold a
 * full tensor of one site, ‖Z_method − Z_reference‖_F is kept beside the pair (lib/science
 * tensors.ts; both must be written in the same Cartesian axes).
 *
 * Each Born-charge pair is oriented by the sign of its measured (reference) charge: both sides are
 * multiplied by that sign, so an anion's −2.07 against −2.20 is stored as 2.07 against 2.20 and a
 * positive error always means a charge larger in magnitude than the reference. Without it, the
 * errors of anions and cations of a neutral crystal cancel in the mean signed error (and relative
 * errors change sign with the ion).
 *
 * LO–TO splittings (pairSplittings): the measured frequencies of one material and one source,
 * and each method's computed lines (degenerate modes collapsed), are coupled TO with LO within
 * each species (lib/science lo-to.ts). A measured couple pairs with the computed couple of the
 * same species and rank when both sides have as many couples of that species; otherwise with
 * the computed couple whose TO is nearest, within the benchmark's largest relative deviation,
 * each computed couple used once. The pair's measured value is ω_LO − ω_TO of the measurement,
 * its calculated value the same of the method, and it names both measurements and both modes.
 */
import { collapseDegenerateModes, diagonalMean, frobeniusDistance, isBareSite, loToCouples, siteElement, type BranchLine, type LoToCouple } from '@/lib/science';
import { computedMode, groupBy, labelParts, newPair, pairKey } from './pair-rows';
import type { BenchmarkRules } from './schemas';
import type { PairRecord, ScopeCalculation, ScopeMeasurement } from './types';

/** ‖ΔZ‖_F of a pair, by pair key, where both sides hold one full tensor. */
export type TensorDistances = Record<string, number>;

export function pairSites(
  measurements: readonly ScopeMeasurement[],
  calculationsByMaterialMethod: Map<string, ScopeCalculation[]>,
  methodIds: readonly string[],
): { pairs: PairRecord[]; unpaired: Map<string, number>; tensorDistances: TensorDistances } {
  const pairs: PairRecord[] = [];
  const unpaired = new Map<string, number>();
  const tensorDistances: TensorDistances = {};
  for (const m of measurements) {
    if (!m.site) continue;
    for (const methodId of methodIds) {
      const calcs = (calculationsByMaterialMethod.get(`${m.materialId}|${methodId}`) ?? []).filter((c) => c.site);
      let members = calcs.filter((c) => c.site === m.site);
      if (members.length === 0 && isBareSite(m.site)) members = calcs.filter((c) => siteElement(c.site!) === m.site);
      if (members.length === 0) {
        const ofElement = calcs.filter((c) => siteElement(c.site!) === siteElement(m.site!));
        if (ofElement.length === 1 && isBareSite(ofElement[0].site!)) members = ofElement;
      }
      if (members.length === 0) {
        unpaired.set(methodId, (unpaired.get(methodId) ?? 0) + 1);
        continue;
      }
      members.sort((a, b) => (a.id < b.id ? -1 : 1));
      // Several rows of one exact site: the first by id, marked ambiguous (as for dielectric constants).
      const exact = members[0].site === m.site;
      const used = exact ? [members[0]] : members;
      const calculated = used.reduce((sum, c) => sum + (c.components ? diagonalMean(c.components) : c.value), 0) / used.length;
      const sources = [...new Set([m.sourceId, ...used.map((c) => c.sourceId)])];
      const sign = m.value < 0 ? -1 : 1;
      const oriented = { ...m, value: sign * m.value };
      const pair = newPair(methodId, oriented, used.map((c) => c.id), sign * calculated, used.length === 1 ? used[0].uncertainty : null, exact ? 'label' : 'material', exact && members.length > 1, sources, m.site);
      pairs.push(pair);
      if (used.length === 1 && used[0].components && m.components && used[0].components.length === 9 && m.components.length === 9) {
        tensorDistances[pair.key] = frobeniusDistance(used[0].components, m.components);
      }
    }
  }
  return { pairs, unpaired, tensorDistances };
}

function measuredLines(rows: readonly ScopeMeasurement[]): BranchLine[] {
  const lines: BranchLine[] = [];
  for (const m of rows) {
    const species = labelParts(m.irrep, null).species;
    if (!species || !m.branch) continue;
    lines.push({ id: m.id, frequencyCm1: m.value, species, branch: m.branch, ...(m.uncertainty !== null ? { uncertaintyCm1: m.uncertainty } : {}) });
  }
  return lines;
}

/** A method's computed lines with a species and a branch, degenerate modes collapsed (the line keeps every member id). */
function computedLines(calcs: readonly ScopeCalculation[]): Array<BranchLine & { ids: string[] }> {
  const lines: Array<BranchLine & { ids: string[] }> = [];
  for (const line of collapseDegenerateModes(calcs.map(computedMode), new Set())) {
    if (!line.species || !line.branch) continue;
    lines.push({ id: line.ids[0], ids: line.ids, frequencyCm1: line.frequencyCm1, species: line.species, branch: line.branch });
  }
  return lines;
}

/** Couples of one measured source matched with a method's couples (module header). */
function matchCouples(measured: LoToCouple[], computed: LoToCouple[], maxRelativeDeviation: number): Array<[LoToCouple, LoToCouple, 'label' | 'frequency']> {
  const out: Array<[LoToCouple, LoToCouple, 'label' | 'frequency']> = [];
  for (const [species, group] of groupBy(measured, (c) => c.species)) {
    const candidates = computed.filter((c) => c.species === species);
    if (candidates.length === group.length) {
      group.forEach((c, k) => out.push([c, candidates[k], 'label']));
      continue;
    }
    const options = group
      .flatMap((m) => candidates.map((c) => ({ m, c, d: Math.abs(c.to.frequencyCm1 - m.to.frequencyCm1) / m.to.frequencyCm1 })))
      .filter((o) => o.d <= maxRelativeDeviation)
      .sort((a, b) => a.d - b.d || a.m.rank - b.m.rank || a.c.rank - b.c.rank);
    const usedM = new Set<LoToCouple>();
    const usedC = new Set<LoToCouple>();
    for (const o of options) {
      if (usedM.has(o.m) || usedC.has(o.c)) continue;
      usedM.add(o.m);
      usedC.add(o.c);
      out.push([o.m, o.c, 'frequency']);
    }
  }
  return out;
}

export function pairSplittings(
  measurements: readonly ScopeMeasurement[],
  calculationsByMaterialMethod: Map<string, ScopeCalculation[]>,
  methodIds: readonly string[],
  rules: Pick<BenchmarkRules, 'maxRelativeDeviation'>,
): { pairs: PairRecord[]; unpaired: Map<string, number>; measuredCouples: number } {
  const pairs: PairRecord[] = [];
  const unpaired = new Map<string, number>();
  const byId = new Map(measurements.map((m) => [m.id, m]));
  let measuredCouples = 0;
  const computedCouples = new Map<string, { couples: LoToCouple[]; members: Map<string, string[]>; rows: Map<string, ScopeCalculation> }>();
  const couplesOf = (materialId: string, methodId: string) => {
    const key = `${materialId}|${methodId}`;
    let found = computedCouples.get(key);
    if (!found) {
      const calcs = calculationsByMaterialMethod.get(key) ?? [];
      const lines = computedLines(calcs);
      found = { couples: loToCouples(lines), members: new Map(lines.map((l) => [l.id, l.ids])), rows: new Map(calcs.map((c) => [c.id, c])) };
      computedCouples.set(key, found);
    }
    return found;
  };
  for (const [, rows] of groupBy(measurements, (m) => `${m.materialId}|${m.sourceId}`)) {
    const measured = loToCouples(measuredLines(rows));
    measuredCouples += measured.length;
    for (const methodId of methodIds) {
      const computed = couplesOf(rows[0].materialId, methodId);
      const matched = matchCouples(measured, computed.couples, rules.maxRelativeDeviation);
      unpaired.set(methodId, (unpaired.get(methodId) ?? 0) + measured.length - matched.length);
      for (const [m, c, basis] of matched) {
        const to = byId.get(m.to.id)!;
        const lo = byId.get(m.lo.id)!;
        const calculationIds = [...computed.members.get(c.to.id)!, ...computed.members.get(c.lo.id)!];
        const members = calculationIds.map((id) => computed.rows.get(id)!);
        const pair = newPair(methodId, { ...to, value: m.splittingCm1, uncertainty: m.uncertaintyCm1 ?? null }, calculationIds, c.splittingCm1, null, basis, false, [...new Set([to.sourceId, lo.sourceId, ...members.map((x) => x.sourceId)])], m.species);
        pair.measurementIds = [to.id, lo.id];
        pair.key = pairKey(methodId, pair.measurementIds);
        pair.branch = null;
        pairs.push(pair);
      }
    }
  }
  return { pairs, unpaired, measuredCouples };
}
