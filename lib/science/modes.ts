/**
 * Mode lists: validation, acoustic-mode detection and the collapse of degenerate
 * computed modes into lines. Shared by pairing and the quality checks, so both
 * call the same modes acoustic.
 *
 * Acoustic modes (acousticModeIds), in order:
 * 1. A mode marked `acoustic: true` is acoustic (a mode both marked acoustic and stated
 *    Raman- or IR-active contradicts itself; rule 2 wins and it is optical).
 * 2. A mode marked `acoustic: false`, or with a stated optical activity
 *    (`ramanActive` or `irActive` true), is never acoustic, whatever the list.
 * 3. When some mode is marked `acoustic: true`, no other mode is acoustic.
 * 4. Otherwise, among the remaining modes: when the atom count is given and the
 *    list is complete (Σ degeneracy = 3 × atomsInCell), the modes of lowest |ω| are
 *    acoustic until their degeneracies add up to three (ties by input order).
 *    When the list is partial, or the atom count is unknown, only modes with
 *    |ω| below the acoustic threshold (default 10 cm⁻¹) are, again at most three
 *    by degeneracy, lowest |ω| first. An optical-only list therefore keeps its
 *    lowest optical lines.
 *
 * Degenerate lines (collapseDegenerateModes): modes in frequency order join the
 * open line of the same species, branch, activity and acoustic status whose running
 * (degeneracy-weighted) mean is within DEGENERACY_TOLERANCE_CM1 (0.5 cm⁻¹), the
 * nearest such line when there are several; otherwise they open a new line. A
 * triplet at 517.0 / 517.3 / 517.6 is one line; two modes 1.2 cm⁻¹ apart stay apart.
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

/** Options of acousticModeIds. */
export interface AcousticOptions {
  /** Atoms in the cell: with a complete list (3N modes) the three lowest |ω| are acoustic. */
  atomsInCell?: number;
  /** Below this |ω| an unmarked mode of a partial list is acoustic; default 10 cm⁻¹. */
  acousticThresholdCm1?: number;
}

/** Default |ω| below which an unmarked mode of a partial list counts as acoustic, cm⁻¹. */
export const DEFAULT_ACOUSTIC_THRESHOLD_CM1 = 10;

/** True when a mode states that it is optical: marked `acoustic: false`, or Raman- or IR-active. */
export function isStatedOptical(mode: ComputedMode): boolean {
  return mode.acoustic === false || mode.ramanActive === true || mode.irActive === true;
}

/** Σ degeneracy of a mode list: the number of modes counted with degeneracy. */
export function modeCount(computed: readonly ComputedMode[]): number {
  let count = 0;
  for (const mode of computed) count += mode.degeneracy ?? 1;
  return count;
}

/** True when the list holds all 3N modes of a cell of `atomsInCell` atoms (counted with degeneracy). */
export function isCompleteModeList(computed: readonly ComputedMode[], atomsInCell: number | undefined): boolean {
  return atomsInCell !== undefined && modeCount(computed) === 3 * atomsInCell;
}

/** Ids of the acoustic modes, by the rules of the module header. */
export function acousticModeIds(computed: readonly ComputedMode[], options: AcousticOptions = {}): Set<string> {
  const threshold = options.acousticThresholdCm1 ?? DEFAULT_ACOUSTIC_THRESHOLD_CM1;
  requireNonNegative('options.acousticThresholdCm1', threshold);
  if (options.atomsInCell !== undefined && !(Number.isInteger(options.atomsInCell) && options.atomsInCell >= 1)) {
    throw new ScienceInputError('options.atomsInCell', `must be a positive integer, got ${String(options.atomsInCell)}`);
  }
  const ids = new Set<string>();
  const marked = (m: ComputedMode) => m.acoustic === true && m.ramanActive !== true && m.irActive !== true;
  if (computed.some(marked)) {
    for (const mode of computed) if (marked(mode)) ids.add(mode.id);
    return ids;
  }
  const complete = isCompleteModeList(computed, options.atomsInCell);
  const candidates: number[] = [];
  for (let i = 0; i < computed.length; i++) {
    if (isStatedOptical(computed[i])) continue;
    if (complete || Math.abs(computed[i].frequencyCm1) < threshold) candidates.push(i);
  }
  // lowest |ω| first, ties by input order
  candidates.sort((i, j) => Math.abs(computed[i].frequencyCm1) - Math.abs(computed[j].frequencyCm1) || i - j);
  let count = 0;
  for (const i of candidates) {
    if (count >= 3) break;
    ids.add(computed[i].id);
    count += computed[i].degeneracy ?? 1;
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
  highestCm1: number;
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
 * Collapses degenerate modes into lines (module header): a mode joins the nearest open
 * line of the same kind whose running mean is within DEGENERACY_TOLERANCE_CM1.
 * Unlabelled modes collapse with unlabelled modes by the same rule.
 * Lines come out in order of frequency.
 */
export function collapseDegenerateModes(computed: readonly ComputedMode[], acoustic: Set<string>): ModeLine[] {
  const order = Array.from(computed.keys()).sort((i, j) => computed[i].frequencyCm1 - computed[j].frequencyCm1 || i - j);
  let open: OpenLine[] = [];
  const lines: ModeLine[] = [];
  for (const index of order) {
    const mode = computed[index];
    const species = speciesOf(mode.irrep);
    const branch = branchOf(mode.branch, mode.irrep);
    const isAcoustic = acoustic.has(mode.id);
    const degeneracy = mode.degeneracy ?? 1;
    // Frequencies only grow: a line whose highest member is more than the tolerance below can take no more members.
    if (open.length > 8) open = open.filter((o) => mode.frequencyCm1 - o.highestCm1 <= DEGENERACY_TOLERANCE_CM1);
    let best: OpenLine | undefined;
    for (const candidate of open) {
      const distance = Math.abs(mode.frequencyCm1 - candidate.line.frequencyCm1);
      if (distance > DEGENERACY_TOLERANCE_CM1 || !sameKind(candidate.line, species, branch, mode, isAcoustic)) continue;
      if (!best || distance < Math.abs(mode.frequencyCm1 - best.line.frequencyCm1)) best = candidate;
    }
    if (best) {
      best.line.ids.push(mode.id);
      best.line.degeneracy += degeneracy;
      best.weightedSum += degeneracy * mode.frequencyCm1;
      best.line.frequencyCm1 = best.weightedSum / best.line.degeneracy;
      best.highestCm1 = mode.frequencyCm1;
      continue;
    }
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
    open.push({ line, highestCm1: mode.frequencyCm1, weightedSum: degeneracy * mode.frequencyCm1 });
    lines.push(line);
  }
  return lines;
}
