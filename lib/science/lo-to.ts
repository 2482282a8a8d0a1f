/**
 * LO–TO splittings of polar modes, derived from a list of Γ-point lines that carry a species
 * and a branch (TO or LO): within one species the TO and LO frequencies interleave
 * (ω_TO,1 < ω_LO,1 < ω_TO,2 < …, the ordering the Lyddane–Sachs–Teller product relies on), so
 * the k-th TO by frequency couples with the k-th LO, and the splitting is ω_LO,k − ω_TO,k.
 * A species with unequal numbers of TO and LO lines gives no couples: which LO belongs to which
 * TO is then a guess. Lines without a species or a branch are ignored.
 *
 * The uncertainty of a splitting, where both lines have one, is √(σ_TO² + σ_LO²) (independent
 * errors; a shared calibration offset would cancel, so this is an upper estimate).
 */
import { requireFinite } from './errors';

export interface BranchLine {
  id: string;
  frequencyCm1: number;
  species: string;
  branch: 'TO' | 'LO';
  uncertaintyCm1?: number;
}

export interface LoToCouple {
  species: string;
  /** 1-based rank of the couple within its species, lowest TO first. */
  rank: number;
  /** How many couples the species has. */
  of: number;
  to: BranchLine;
  lo: BranchLine;
  splittingCm1: number;
  uncertaintyCm1?: number;
}

export function loToCouples(lines: readonly BranchLine[]): LoToCouple[] {
  const bySpecies = new Map<string, { to: BranchLine[]; lo: BranchLine[] }>();
  lines.forEach((line, i) => {
    requireFinite(`lines[${i}].frequencyCm1`, line.frequencyCm1);
    let group = bySpecies.get(line.species);
    if (!group) bySpecies.set(line.species, (group = { to: [], lo: [] }));
    (line.branch === 'TO' ? group.to : group.lo).push(line);
  });
  const couples: LoToCouple[] = [];
  const byFrequency = (a: BranchLine, b: BranchLine) => a.frequencyCm1 - b.frequencyCm1 || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
  for (const [species, { to, lo }] of [...bySpecies].sort(([a], [b]) => a.localeCompare(b))) {
    if (to.length === 0 || to.length !== lo.length) continue;
    to.sort(byFrequency);
    lo.sort(byFrequency);
    to.forEach((t, k) => {
      const l = lo[k];
      const couple: LoToCouple = { species, rank: k + 1, of: to.length, to: t, lo: l, splittingCm1: l.frequencyCm1 - t.frequencyCm1 };
      if (t.uncertaintyCm1 !== undefined && l.uncertaintyCm1 !== undefined) couple.uncertaintyCm1 = Math.hypot(t.uncertaintyCm1, l.uncertaintyCm1);
      couples.push(couple);
    });
  }
  return couples;
}
