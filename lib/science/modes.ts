/**
 * Mode lists: validation, acoustic-mode detection and the collapse of degenerate
 * computed modes into lines. Shared by pairing and the quality checks.
 */
import { ScienceInputError, requireFinite, requireNonNegative } from './errors';
import { irrepBranch, irrepSpecies, normalizeIrrep } from './symmetry';

/** Experimental techniques a measured peak may come from. */
export type Technique = 'raman' | 'ir' | 'ins' | 'hyper-raman';

/** A measured peak position at Γ, in cm⁻¹. */
export interface MeasuredPeak {
  id: string;
  frequencyCm1: number;
  uncertaintyCm1?: number;
  technique: Technique;
  irrep?: string;
  branch?: 'TO' | 'LO';
}

/** A computed Γ-point mode, in cm⁻¹ (negative for imaginary modes). */
export interface ComputedMode {
  id: string;
  frequencyCm1: number;
  irrep?: string;
  branch?: 'TO' | 'LO';
  ramanActive?: boolean;
  irActive?: boolean;
  acoustic?: boolean;
  degeneracy?: number;
}

/** Degenerate computed modes collapsed into one spectral line. */
export interface ModeLine {
  ids: string[];
  /** Degeneracy-weighted mean frequency of the members. */
  frequencyCm1: number;
  degeneracy: number;
  species?: string;
  branch?: 'TO' | 'LO';
  ramanActive?: boolean;
  irActive?: boolean;
  acoustic: boolean;
}

/** Computed modes of the same label within this many cm⁻¹ collapse into one line. */
export const DEGENERACY_TOLERANCE_CM1 = 0.5;

const TECHNIQUES: readonly Technique[] = ['raman', 'ir', 'ins', 'hyper-raman'];

function requireId(argument: string, id: unknown, seen: Set<string>): void {
  if (typeof id !== 'string' || id === '') throw new ScienceInputError(argument, 'must be a non-empty string');
  if (seen.has(id)) throw new ScienceInputError(argument, `duplicate id "${id}"`);
  seen.add(id);
}

function requireIrrep(argument: string, irrep: unknown): void {
  if (irrep === undefined) return;
  if (typeof irrep !== 'string') throw new ScienceInputError(argument, 'must be a string');
  if (irrep.trim() === '') return;
  try {
    normalizeIrrep(irrep);
  } catch (error) {
    if (error instanceof ScienceInputError) throw new ScienceInputError(argument, error.message.replace(/^label: /, ''));
    throw error;
  }
}

function requireBranch(argument: string, branch: unknown): void {
  if (branch !== undefined && branch !== 'TO' && branch !== 'LO') {
    throw new ScienceInputError(argument, `must be "TO" or "LO", got ${String(branch)}`);
  }
}

/** Validates measured peaks: unique ids, finite positive frequencies, known techniques. */
export function validateMeasuredPeaks(measured: readonly MeasuredPeak[]): void {
  if (!Array.isArray(measured)) throw new ScienceInputError('measured', 'must be an array of peaks');
  const seen = new Set<string>();
  measured.forEach((peak, i) => {
    requireId(`measured[${i}].id`, peak.id, seen);
    requireFinite(`measured[${i}].frequencyCm1`, peak.frequencyCm1);
    if (peak.frequencyCm1 <= 0) throw new ScienceInputError(`measured[${i}].frequencyCm1`, `must be greater than 0, got ${peak.frequencyCm1}`);
    if (peak.uncertaintyCm1 !== undefined) requireNonNegative(`measured[${i}].uncertaintyCm1`, peak.uncertaintyCm1);
    if (!TECHNIQUES.includes(peak.technique)) {
      throw new ScienceInputError(`measured[${i}].technique`, `must be one of ${TECHNIQUES.join(', ')}, got ${String(peak.technique)}`);
    }
    requireBranch(`measured[${i}].branch`, peak.branch);
    requireIrrep(`measured[${i}].irrep`, peak.irrep);
  });
}

/** Validates computed modes: unique ids, finite frequencies, positive integer degeneracy. */
export function validateComputedModes(computed: readonly ComputedMode[]): void {
  if (!Array.isArray(computed)) throw new ScienceInputError('computed', 'must be an array of modes');
  const seen = new Set<string>();
  computed.forEach((mode, i) => {
    requireId(`computed[${i}].id`, mode.id, seen);
    requireFinite(`computed[${i}].frequencyCm1`, mode.frequencyCm1);
    if (mode.degeneracy !== undefined && !(Number.isInteger(mode.degeneracy) && mode.degeneracy >= 1)) {
      throw new ScienceInputError(`computed[${i}].degeneracy`, `must be a positive integer, got ${String(mode.degeneracy)}`);
    }
    requireBranch(`computed[${i}].branch`, mode.branch);
    requireIrrep(`computed[${i}].irrep`, mode.irrep);
  });
}

/**
 * Ids of the acoustic modes. When any mode carries the `acoustic` field the marks
 * decide; otherwise the modes of lowest |ω| are acoustic until their degeneracies
 * add up to three (ties broken by input order).
 */
export function acousticModeIds(computed: readonly ComputedMode[]): Set<string> {
  const ids = new Set<string>();
  if (computed.some((m) => m.acoustic !== undefined)) {
    for (const mode of computed) if (mode.acoustic === true) ids.add(mode.id);
    return ids;
  }
  const taken = new Uint8Array(computed.length);
  let count = 0;
  while (count < 3 && ids.size < computed.length) {
    let best = -1;
    for (let i = 0; i < computed.length; i++) {
      if (taken[i]) continue;
      if (best < 0 || Math.abs(computed[i].frequencyCm1) < Math.abs(computed[best].frequencyCm1)) best = i;
    }
    taken[best] = 1;
    ids.add(computed[best].id);
    count += computed[best].degeneracy ?? 1;
  }
  return ids;
}

/** Species of a label, or undefined when there is none. */
export function speciesOf(irrep: string | undefined): string | undefined {
  return irrep === undefined || irrep.trim() === '' ? undefined : irrepSpecies(irrep);
}

/** Branch given explicitly, else the one written in the label ("A1(TO)"). */
export function branchOf(branch: 'TO' | 'LO' | undefined, irrep: string | undefined): 'TO' | 'LO' | undefined {
  if (branch) return branch;
  return irrep === undefined || irrep.trim() === '' ? undefined : irrepBranch(irrep);
}

interface OpenLine {
  line: ModeLine;
  lowestCm1: number;
  weightedSum: number;
}

function sameKind(line: ModeLine, species: string | undefined, branch: string | undefined, mode: ComputedMode, isAcoustic: boolean): boolean {
  return (
    line.species === species &&
    line.branch === branch &&
    line.ramanActive === mode.ramanActive &&
    line.irActive === mode.irActive &&
    line.acoustic === isAcoustic
  );
}

/**
 * Collapses degenerate modes into lines: modes with the same label species, branch,
 * activity and acoustic status whose frequencies lie within DEGENERACY_TOLERANCE_CM1
 * of the lowest member. Unlabelled modes collapse with unlabelled modes by the same rule.
 * Lines come out in order of frequency.
 */
export function collapseDegenerateModes(computed: readonly ComputedMode[], acoustic: Set<string>): ModeLine[] {
  const order = Array.from(computed.keys()).sort((i, j) => computed[i].frequencyCm1 - computed[j].frequencyCm1 || i - j);
  const open: OpenLine[] = [];
  const lines: ModeLine[] = [];
  for (const index of order) {
    const mode = computed[index];
    const species = speciesOf(mode.irrep);
    const branch = branchOf(mode.branch, mode.irrep);
    const isAcoustic = acoustic.has(mode.id);
    const degeneracy = mode.degeneracy ?? 1;
    let joined = false;
    // candidates are the recent lines whose lowest member is within the tolerance
    for (let k = open.length - 1; k >= 0 && mode.frequencyCm1 - open[k].lowestCm1 <= DEGENERACY_TOLERANCE_CM1; k--) {
      const candidate = open[k];
      if (!sameKind(candidate.line, species, branch, mode, isAcoustic)) continue;
      candidate.line.ids.push(mode.id);
      candidate.line.degeneracy += degeneracy;
      candidate.weightedSum += degeneracy * mode.frequencyCm1;
      candidate.line.frequencyCm1 = candidate.weightedSum / candidate.line.degeneracy;
      joined = true;
      break;
    }
    if (joined) continue;
    const line: ModeLine = {
      ids: [mode.id],
      frequencyCm1: mode.frequencyCm1,
      degeneracy,
      species,
      branch,
      ramanActive: mode.ramanActive,
      irActive: mode.irActive,
      acoustic: isAcoustic,
    };
    open.push({ line, lowestCm1: mode.frequencyCm1, weightedSum: degeneracy * mode.frequencyCm1 });
    lines.push(line);
  }
  return lines;
}
