/**
 * Pairing of the measured peaks of one material with the computed modes of one method.
 *
 * Rules, in order:
 * 1. Acoustic modes follow acousticModeIds (modes.ts): `acoustic: true` is acoustic;
 *    `acoustic: false` or a stated optical activity (ramanActive or irActive true) never
 *    is; otherwise, with `atomsInCell` given and a complete list (3N modes counted with
 *    degeneracy), the three lowest |ω|; for a partial list or an unknown atom count only
 *    modes below `acousticThresholdCm1` (10 cm⁻¹), at most three. Acoustic modes never
 *    pair automatically and are not listed in `unpairedComputed`.
 * 2. Degenerate computed modes (same label species, branch and activity, within
 *    0.5 cm⁻¹ of the line's running mean) collapse into one line; a pair names every
 *    id of its line.
 * 3. Pins come first and override every rule below (window, activity, label,
 *    acoustic). `computedId: null` marks "no counterpart": the peak stays unpaired.
 *    A pin whose measured or computed id is not in the input is inert, so pins
 *    survive re-runs on changed mode lists; two pins on one measured id or one line throw.
 * 4. Eligibility of a line for a peak: Raman peaks need a line not marked
 *    ramanActive: false; IR peaks one not marked irActive: false; hyper-Raman peaks
 *    exclude lines that are Raman-active and marked IR-inactive (hyper-Raman sees the
 *    IR-active and some silent modes); INS peaks take any optical line. An unknown
 *    (undefined) activity does not exclude. TO pairs only with TO and LO with LO when
 *    both sides state a branch (a branch written in the label, "A1(TO)", counts).
 *    When both sides carry a label their species must match after normalizeIrrep,
 *    ignoring high/low and TO/LO qualifiers ("E2(high)" matches a computed "E2") and the
 *    ordinal of layered crystals ("E¹₂g" matches a computed "E2g").
 *    `nonAnalyticCorrection: false` (the calculation has no LO–TO splitting, so Γ gives
 *    the TO frequencies): computed lines without a branch are TO lines, and a measured
 *    LO peak never pairs with them. Undefined (unknown) keeps lines without a branch
 *    open to either branch.
 *    The relative deviation |ω − ν|/ν must not exceed maxRelativeDeviation (0.25), or
 *    labelledMaxRelativeDeviation (0.5; never narrower than maxRelativeDeviation) when
 *    both sides carry a label (their species then match): a labelled pair is a firm assignment, and dropping a badly computed
 *    labelled line would hide the worst errors.
 * 5. Assignment (Kuhn–Munkres, package `munkres`): the largest number of eligible
 *    pairs, and among those the smallest total relative deviation.
 * 6. A pair is ambiguous when another eligible unpinned line's deviation |ω' − ν|
 *    exceeds the chosen line's by at most max(ambiguityCm1, ambiguityRelative × ν),
 *    defaults 2 cm⁻¹ and 0.01 (a closer runner-up, possible in the global optimum,
 *    is ambiguous too). Pinned pairs are never ambiguous.
 * 7. basis: 'pinned' for pins, 'label' when both sides carry a label, else 'frequency'.
 * Output lists follow the input order.
 */
import { munkres } from 'munkres';
import { ScienceInputError, requireNonNegative, requirePositive } from './errors';
import {
  acousticModeIds,
  branchOf,
  collapseDegenerateModes,
  speciesOf,
  validateComputedModes,
  validateMeasuredPeaks,
  type ComputedMode,
  type MeasuredPeak,
  type ModeLine,
} from './modes';

/** Options of pairModes. */
export interface PairingOptions {
  /** Largest |ω − ν|/ν that may pair; default 0.25. */
  maxRelativeDeviation?: number;
  /** Largest |ω − ν|/ν when both sides carry a label of the same species; default 0.5. */
  labelledMaxRelativeDeviation?: number;
  /** Atoms in the cell, for the acoustic rule (a complete list has 3N modes). */
  atomsInCell?: number;
  /** Below this |ω| an unmarked mode of a partial list is acoustic; default 10 cm⁻¹. */
  acousticThresholdCm1?: number;
  /** false: lines without a branch are TO lines and never pair with LO peaks; undefined: unknown. */
  nonAnalyticCorrection?: boolean;
  /** Ambiguity window in cm⁻¹; default 2. */
  ambiguityCm1?: number;
  /** Ambiguity window relative to the measured value; default 0.01. */
  ambiguityRelative?: number;
  /** Curator pins; computedId null = the peak has no counterpart. */
  pins?: Array<{ measuredId: string; computedId: string | null }>;
}

/** One measured peak paired with one (collapsed) computed line. */
export interface Pair {
  measuredId: string;
  computedIds: string[];
  measuredCm1: number;
  calculatedCm1: number;
  /** calculated − measured. */
  errorCm1: number;
  /** errorCm1 / measuredCm1, signed. */
  relativeError: number;
  basis: 'label' | 'frequency' | 'pinned';
  ambiguous: boolean;
}

/** Result of pairModes. */
export interface PairingResult {
  pairs: Pair[];
  unpairedMeasured: string[];
  unpairedComputed: string[];
}

/** Default pairing window. */
export const DEFAULT_MAX_RELATIVE_DEVIATION = 0.25;
/** Default pairing window when both sides carry a label of the same species. */
export const DEFAULT_LABELLED_MAX_RELATIVE_DEVIATION = 0.5;
/** Default absolute ambiguity window, cm⁻¹. */
export const DEFAULT_AMBIGUITY_CM1 = 2;
/** Default relative ambiguity window. */
export const DEFAULT_AMBIGUITY_RELATIVE = 0.01;

interface PeakView {
  peak: MeasuredPeak;
  species?: string;
  branch?: 'TO' | 'LO';
}

interface Windows {
  maxRelativeDeviation: number;
  labelledMaxRelativeDeviation: number;
  ambiguityCm1: number;
  ambiguityRelative: number;
  nonAnalyticCorrection: boolean | undefined;
}

function isEligible(view: PeakView, line: ModeLine, windows: Windows): boolean {
  if (line.acoustic) return false;
  const { peak } = view;
  switch (peak.technique) {
    case 'raman':
      if (line.ramanActive === false) return false;
      break;
    case 'ir':
      if (line.irActive === false) return false;
      break;
    case 'hyper-raman':
      if (line.ramanActive === true && line.irActive === false) return false;
      break;
    case 'ins':
      break;
  }
  const lineBranch = line.branch ?? (windows.nonAnalyticCorrection === false ? 'TO' : undefined);
  if (view.branch && lineBranch && view.branch !== lineBranch) return false;
  const labelled = view.species !== undefined && line.species !== undefined;
  if (labelled && view.species !== line.species) return false;
  const window = labelled ? Math.max(windows.labelledMaxRelativeDeviation, windows.maxRelativeDeviation) : windows.maxRelativeDeviation;
  return Math.abs(line.frequencyCm1 - peak.frequencyCm1) <= window * peak.frequencyCm1;
}

function makePair(peak: MeasuredPeak, line: ModeLine, basis: Pair['basis'], ambiguous: boolean): Pair {
  const errorCm1 = line.frequencyCm1 - peak.frequencyCm1;
  return {
    measuredId: peak.id,
    computedIds: [...line.ids],
    measuredCm1: peak.frequencyCm1,
    calculatedCm1: line.frequencyCm1,
    errorCm1,
    relativeError: errorCm1 / peak.frequencyCm1,
    basis,
    ambiguous,
  };
}

function readOptions(options: PairingOptions) {
  const maxRelativeDeviation = options.maxRelativeDeviation ?? DEFAULT_MAX_RELATIVE_DEVIATION;
  const labelledMaxRelativeDeviation = options.labelledMaxRelativeDeviation ?? DEFAULT_LABELLED_MAX_RELATIVE_DEVIATION;
  requirePositive('options.labelledMaxRelativeDeviation', labelledMaxRelativeDeviation);
  if (options.nonAnalyticCorrection !== undefined && typeof options.nonAnalyticCorrection !== 'boolean') {
    throw new ScienceInputError('options.nonAnalyticCorrection', `must be true, false or undefined, got ${String(options.nonAnalyticCorrection)}`);
  }
  const ambiguityCm1 = options.ambiguityCm1 ?? DEFAULT_AMBIGUITY_CM1;
  const ambiguityRelative = options.ambiguityRelative ?? DEFAULT_AMBIGUITY_RELATIVE;
  requirePositive('options.maxRelativeDeviation', maxRelativeDeviation);
  requireNonNegative('options.ambiguityCm1', ambiguityCm1);
  requireNonNegative('options.ambiguityRelative', ambiguityRelative);
  const pins = options.pins ?? [];
  if (!Array.isArray(pins)) throw new ScienceInputError('options.pins', 'must be an array');
  const windows: Windows = { maxRelativeDeviation, labelledMaxRelativeDeviation, ambiguityCm1, ambiguityRelative, nonAnalyticCorrection: options.nonAnalyticCorrection };
  return { windows, pins };
}

/** Optimal assignment of the unpinned peaks to the unpinned optical lines (rules 4–7). */
function assignByFrequency(
  views: PeakView[],
  pool: ModeLine[],
  windows: Windows,
  pairByMeasured: Map<string, Pair>,
): void {
  const columns = pool.length;
  const eligible = new Uint8Array(views.length * columns);
  const rows: number[] = [];
  const usedColumn = new Uint8Array(columns);
  for (let r = 0; r < views.length; r++) {
    let any = false;
    for (let c = 0; c < columns; c++) {
      if (isEligible(views[r], pool[c], windows)) {
        eligible[r * columns + c] = 1;
        usedColumn[c] = 1;
        any = true;
      }
    }
    if (any) rows.push(r);
  }
  const cols: number[] = [];
  for (let c = 0; c < columns; c++) if (usedColumn[c]) cols.push(c);
  if (rows.length === 0) return;

  // A cost above any sum of real costs makes the optimum maximise the number of pairs first.
  const forbidden = (rows.length + 1) * (Math.max(windows.maxRelativeDeviation, windows.labelledMaxRelativeDeviation) + 1);
  const cost: number[][] = rows.map((r) => {
    const measuredCm1 = views[r].peak.frequencyCm1;
    return cols.map((c) => (eligible[r * columns + c] ? Math.abs(pool[c].frequencyCm1 - measuredCm1) / measuredCm1 : forbidden));
  });
  for (const [i, j] of munkres(cost)) {
    const r = rows[i];
    const c = cols[j];
    if (!eligible[r * columns + c]) continue;
    const { peak, species } = views[r];
    const line = pool[c];
    const chosenDeviation = Math.abs(line.frequencyCm1 - peak.frequencyCm1);
    const window = Math.max(windows.ambiguityCm1, windows.ambiguityRelative * peak.frequencyCm1);
    let ambiguous = false;
    for (let k = 0; k < columns && !ambiguous; k++) {
      if (k === c || !eligible[r * columns + k]) continue;
      ambiguous = Math.abs(pool[k].frequencyCm1 - peak.frequencyCm1) - chosenDeviation <= window;
    }
    const basis = species !== undefined && line.species !== undefined ? 'label' : 'frequency';
    pairByMeasured.set(peak.id, makePair(peak, line, basis, ambiguous));
  }
}

/**
 * Pairs measured peaks with computed modes of one method (rules in the module
 * header): pins first, then an optimal Kuhn–Munkres assignment of the eligible
 * lines within the window, each pair marked ambiguous when a runner-up is close.
 */
export function pairModes(measured: MeasuredPeak[], computed: ComputedMode[], options: PairingOptions = {}): PairingResult {
  validateMeasuredPeaks(measured);
  validateComputedModes(computed);
  const { windows, pins } = readOptions(options);

  const acoustic = acousticModeIds(computed, { atomsInCell: options.atomsInCell, acousticThresholdCm1: options.acousticThresholdCm1 });
  const lines = collapseDegenerateModes(computed, acoustic);
  const lineOfId = new Map<string, ModeLine>();
  for (const line of lines) for (const id of line.ids) lineOfId.set(id, line);
  const peakById = new Map(measured.map((peak) => [peak.id, peak]));

  const pairByMeasured = new Map<string, Pair>();
  const settledMeasured = new Set<string>();
  const pinnedLines = new Set<ModeLine>();
  const pinnedMeasured = new Set<string>();
  pins.forEach((pin, i) => {
    if (!pin || typeof pin.measuredId !== 'string') throw new ScienceInputError(`options.pins[${i}].measuredId`, 'must be a string');
    if (pin.computedId !== null && typeof pin.computedId !== 'string') {
      throw new ScienceInputError(`options.pins[${i}].computedId`, 'must be a string or null');
    }
    if (pinnedMeasured.has(pin.measuredId)) {
      throw new ScienceInputError(`options.pins[${i}].measuredId`, `"${pin.measuredId}" is pinned more than once`);
    }
    pinnedMeasured.add(pin.measuredId);
    const peak = peakById.get(pin.measuredId);
    if (!peak) return;
    if (pin.computedId === null) {
      settledMeasured.add(peak.id);
      return;
    }
    const line = lineOfId.get(pin.computedId);
    if (!line) return;
    if (pinnedLines.has(line)) {
      throw new ScienceInputError(`options.pins[${i}].computedId`, `"${pin.computedId}" belongs to a line that is already pinned`);
    }
    pinnedLines.add(line);
    settledMeasured.add(peak.id);
    pairByMeasured.set(peak.id, makePair(peak, line, 'pinned', false));
  });

  const views: PeakView[] = [];
  for (const peak of measured) {
    if (!settledMeasured.has(peak.id)) views.push({ peak, species: speciesOf(peak.irrep), branch: branchOf(peak.branch, peak.irrep) });
  }
  const pool: ModeLine[] = [];
  for (const line of lines) if (!line.acoustic && !pinnedLines.has(line)) pool.push(line);
  assignByFrequency(views, pool, windows, pairByMeasured);

  const pairs: Pair[] = [];
  const unpairedMeasured: string[] = [];
  const pairedComputed = new Set<string>();
  for (const peak of measured) {
    const pair = pairByMeasured.get(peak.id);
    if (pair) {
      pairs.push(pair);
      for (const id of pair.computedIds) pairedComputed.add(id);
    } else {
      unpairedMeasured.push(peak.id);
    }
  }
  const unpairedComputed = computed
    .filter((mode) => !pairedComputed.has(mode.id) && !lineOfId.get(mode.id)?.acoustic)
    .map((mode) => mode.id);
  return { pairs, unpairedMeasured, unpairedComputed };
}
