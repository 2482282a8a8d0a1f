/**
 * Pairs of a candidate method with a reference method (a computed reference side: the same
 * functional on a much denser grid, or a higher level of theory), per material.
 *
 * Frequencies, by mode index when it can be trusted: both lists give every row an index, no index
 * twice, the same set of indices, and (atoms in the cell known) 3N modes counted with degeneracy;
 * where both rows of one index carry a label, their species must agree. Then mode i pairs with
 * mode i (basis 'index').
 *
 * Otherwise by the pairing rules with the activities ignored: the reference's degenerate modes are
 * collapsed into lines (modes.ts), each optical line is a peak that pairs like an INS line (any
 * optical mode may take it), and the candidate's stored activities are dropped except 'acoustic'.
 *
 * Either way the reference's acoustic modes (acousticModeIds: marked, else the three lowest of a
 * complete list, else |ω| under the acoustic threshold) are left out with their partners: they are
 * zero by the acoustic sum rule, so their relative difference means nothing and their absolute one
 * measures the sum-rule correction rather than the recipe.
 *
 * Entropies, heat capacities and dielectric constants pair as against experiment (pair-rows.ts),
 * with the reference's values in place of the measured ones.
 */
import { acousticModeIds, collapseDegenerateModes, modeCount } from '@/lib/science';
import { computedMode, newPair, pairFrequencies, type PairingContext } from './pair-rows';
import type { BenchmarkRules } from './schemas';
import type { PairRecord, ScopeCalculation, ScopeMeasurement } from './types';

/** A reference calculation as the reference side of a pair: the row a measurement would be. */
export function asReference(c: ScopeCalculation): ScopeMeasurement {
  return {
    id: c.id,
    seq: c.seq,
    materialId: c.materialId,
    sourceId: c.sourceId,
    importId: c.importId,
    value: c.value,
    uncertainty: c.uncertainty,
    temperatureK: c.temperatureK,
    irrep: c.irrep,
    branch: c.branch,
    technique: null,
    ...(c.site !== undefined ? { site: c.site } : {}),
    ...(c.components !== undefined ? { components: c.components } : {}),
  };
}

function speciesKey(irrep: string | null): string | null {
  return irrep ? irrep.replace(/\((TO|LO)\)/g, '').replace(/[^A-Za-z0-9']/g, '') : null;
}

/** True when the two lists can be matched index by index (module header). */
export function indexable(reference: readonly ScopeCalculation[], candidate: readonly ScopeCalculation[], atomsInCell: number | null | undefined): boolean {
  if (reference.length !== candidate.length || reference.length === 0) return false;
  const indices = (rows: readonly ScopeCalculation[]) => {
    const seen = new Map<number, ScopeCalculation>();
    for (const r of rows) {
      if (r.modeIndex == null || seen.has(r.modeIndex)) return null;
      seen.set(r.modeIndex, r);
    }
    return seen;
  };
  const a = indices(reference);
  const b = indices(candidate);
  if (!a || !b) return false;
  for (const [i, r] of a) {
    const c = b.get(i);
    if (!c) return false;
    const ra = speciesKey(r.irrep);
    const cb = speciesKey(c.irrep);
    if (ra !== null && cb !== null && ra !== cb) return false;
  }
  if (atomsInCell != null) {
    const count = (rows: readonly ScopeCalculation[]) => modeCount(rows.map(computedMode));
    if (count(reference) !== 3 * atomsInCell || count(candidate) !== 3 * atomsInCell) return false;
  }
  return true;
}

export interface ReferenceFrequencyPairing {
  pairs: PairRecord[];
  /** Optical reference modes no candidate mode took, per method. */
  unpaired: Map<string, number>;
  /** Optical reference rows: what the coverage counts. */
  referenceModes: number;
  matchedBy: { index: number; pairing: number };
}

/** Every candidate method's modes of one material against the reference's (module header). */
export function pairReferenceFrequencies(
  materialId: string,
  reference: readonly ScopeCalculation[],
  candidates: Map<string, ScopeCalculation[]>,
  methodIds: readonly string[],
  rules: BenchmarkRules,
  context: PairingContext,
): ReferenceFrequencyPairing {
  const atomsInCell = context.atomsInCell.get(materialId) ?? undefined;
  const referenceModes = reference.map((c) => ({ ...computedMode(c), ramanActive: undefined, irActive: undefined, acoustic: c.activity === 'acoustic' ? true : undefined }));
  const acoustic = acousticModeIds(referenceModes, { atomsInCell, acousticThresholdCm1: context.acousticThresholdCm1 });
  const lines = collapseDegenerateModes(referenceModes, acoustic).filter((l) => !l.acoustic);
  const byId = new Map(reference.map((c) => [c.id, c]));
  const peaks: ScopeMeasurement[] = lines.map((l) => ({ ...asReference(byId.get(l.ids[0])!), value: l.frequencyCm1 }));
  const lineOf = new Map(lines.map((l) => [l.ids[0], l]));
  const pairs: PairRecord[] = [];
  const unpaired = new Map<string, number>();
  const matchedBy = { index: 0, pairing: 0 };
  for (const methodId of methodIds) {
    const calcs = candidates.get(methodId);
    if (!calcs || calcs.length === 0) continue;
    if (indexable(reference, calcs, atomsInCell)) {
      const partner = new Map(calcs.map((c) => [c.modeIndex!, c]));
      for (const r of reference) {
        if (acoustic.has(r.id)) continue;
        const c = partner.get(r.modeIndex!)!;
        pairs.push(newPair(methodId, asReference(r), [c.id], c.value, c.uncertainty, 'index', false, [...new Set([r.sourceId, c.sourceId])], r.irrep ?? c.irrep));
      }
      matchedBy.index++;
      continue;
    }
    const stripped = calcs.map((c) => ({ ...c, activity: c.activity === 'acoustic' ? 'acoustic' : null }));
    const result = pairFrequencies(peaks, new Map([[`${materialId}|${methodId}`, stripped]]), [methodId], [], rules, context);
    // One pair per reference row of a paired line, as the index match counts them, so N means the same either way.
    for (const p of result.pairs) {
      for (const id of lineOf.get(p.measurementIds[0])!.ids) {
        const r = byId.get(id)!;
        pairs.push(newPair(methodId, asReference(r), p.calculationIds, p.calculated, p.calculatedUncertainty, p.basis, p.ambiguous, p.sourceIds, p.label));
      }
    }
    const paired = new Set(result.pairs.map((p) => p.measurementIds[0]));
    unpaired.set(methodId, lines.filter((l) => !paired.has(l.ids[0])).reduce((n, l) => n + l.ids.length, 0));
    matchedBy.pairing++;
  }
  return { pairs, unpaired, referenceModes: reference.length - acoustic.size, matchedBy };
}
