/**
 * Quality checks on one calculation. Each check runs only when its inputs are given.
 *
 * acoustic-sum-rule      (warning) an acoustic |ω| above acousticCm1 (10 cm⁻¹)
 * imaginary-mode         (error)   a non-acoustic mode below −imaginaryCm1 (−10 cm⁻¹)
 * mode-count             (error)   Σ degeneracy ≠ 3 × atomsInCell
 * k-point-density        (warning) k1·k2·k3 × atomsInCell below kPointsPerReciprocalAtom (1500)
 * grid-commensurability  (warning) some q_i does not divide k_i
 * born-charge-neutrality (warning) some Cartesian component of Σ_atoms Z* beyond bornNeutrality (0.1 e)
 * lyddane-sachs-teller   (warning) |Π(ω_LO/ω_TO)² / (ε₀/ε∞) − 1| > lstRelative (0.05), using the
 *                                   TO and LO lines (degenerates collapsed); the isotropic form, so
 *                                   it is evaluated only when there are as many LO as TO lines.
 *                                   Scalar ε₀ and ε∞ describe a cubic crystal only: with
 *                                   `spaceGroupNumber` of a non-cubic crystal (below 195) the
 *                                   product over all TO/LO lines mixes polarisations (wurtzite
 *                                   gives a false +88 %), so the check is not applied and
 *                                   qualityReport says so in `notApplied`. Without a space group
 *                                   the check runs as for a cubic crystal.
 *
 * Acoustic modes are those of acousticModeIds (modes.ts), with `atomsInCell` and the
 * acousticCm1 threshold: a stated optical mode is never called acoustic, and in a partial
 * list only modes below acousticCm1 are, so an optical-only list raises no
 * acoustic-sum-rule warning about an optical line.
 */
import { ScienceInputError, requireFinite, requirePositive } from './errors';
import { acousticModeIds, collapseDegenerateModes, validateComputedModes, type ComputedMode } from './modes';
import { crystalSystem } from './symmetry';

/** Input of qualityChecks. */
export interface QualityInput {
  modes: ComputedMode[];
  atomsInCell?: number;
  kGrid?: [number, number, number];
  qGrid?: [number, number, number];
  /** [atom][3][3] Born effective charges in units of e. */
  bornCharges?: number[][][];
  dielectric?: { epsInf: number; eps0: number };
  /** International Tables number (1–230): the LST check needs a cubic crystal for scalar ε. */
  spaceGroupNumber?: number;
  thresholds?: QualityThresholds;
}

/** A check that had its inputs but was not applied, and why. */
export interface QualityNotApplied {
  code: QualityFlag['code'];
  reason: string;
}

/** qualityReport's result: the flags and the checks deliberately not applied. */
export interface QualityReport {
  flags: QualityFlag[];
  notApplied: QualityNotApplied[];
}

/** Thresholds of the quality checks (defaults in DEFAULT_QUALITY_THRESHOLDS). */
export interface QualityThresholds {
  acousticCm1?: number;
  imaginaryCm1?: number;
  kPointsPerReciprocalAtom?: number;
  bornNeutrality?: number;
  lstRelative?: number;
}

/** One finding of qualityChecks. */
export interface QualityFlag {
  code:
    | 'acoustic-sum-rule'
    | 'imaginary-mode'
    | 'mode-count'
    | 'k-point-density'
    | 'grid-commensurability'
    | 'born-charge-neutrality'
    | 'lyddane-sachs-teller';
  severity: 'warning' | 'error';
  message: string;
  value?: number;
}

/** Default quality thresholds. */
export const DEFAULT_QUALITY_THRESHOLDS: Required<QualityThresholds> = {
  acousticCm1: 10,
  imaginaryCm1: 10,
  kPointsPerReciprocalAtom: 1500,
  bornNeutrality: 0.1,
  lstRelative: 0.05,
};

function requireGrid(argument: string, grid: readonly number[]): void {
  if (!Array.isArray(grid) || grid.length !== 3 || !grid.every((k) => Number.isInteger(k) && k >= 1)) {
    throw new ScienceInputError(argument, `must be three positive integers, got ${JSON.stringify(grid)}`);
  }
}

function readThresholds(thresholds: QualityThresholds = {}): Required<QualityThresholds> {
  const merged = { ...DEFAULT_QUALITY_THRESHOLDS, ...thresholds };
  for (const [name, value] of Object.entries(merged)) requirePositive(`thresholds.${name}`, value);
  return merged;
}

function formatCm1(value: number): string {
  return `${Number(value.toFixed(2))} cm⁻¹`;
}

function modeChecks(modes: ComputedMode[], limits: Required<QualityThresholds>, atomsInCell?: number): QualityFlag[] {
  const flags: QualityFlag[] = [];
  const acoustic = acousticModeIds(modes, { atomsInCell, acousticThresholdCm1: limits.acousticCm1 });
  const acousticModes = modes.filter((m) => acoustic.has(m.id));
  if (acousticModes.length > 0) {
    const worst = acousticModes.reduce((a, b) => (Math.abs(b.frequencyCm1) > Math.abs(a.frequencyCm1) ? b : a));
    if (Math.abs(worst.frequencyCm1) > limits.acousticCm1) {
      flags.push({
        code: 'acoustic-sum-rule',
        severity: 'warning',
        message: `Acoustic mode ${worst.id} is at ${formatCm1(worst.frequencyCm1)}; the acoustic sum rule expects ≈ 0 (limit ${limits.acousticCm1} cm⁻¹).`,
        value: worst.frequencyCm1,
      });
    }
  }
  const imaginary = modes.filter((m) => !acoustic.has(m.id) && m.frequencyCm1 < -limits.imaginaryCm1);
  if (imaginary.length > 0) {
    const lowest = imaginary.reduce((a, b) => (b.frequencyCm1 < a.frequencyCm1 ? b : a));
    flags.push({
      code: 'imaginary-mode',
      severity: 'error',
      message: `${imaginary.length} imaginary optical mode${imaginary.length === 1 ? '' : 's'} (${imaginary.map((m) => m.id).join(', ')}), lowest ${formatCm1(lowest.frequencyCm1)}: a dynamical instability or an unconverged calculation.`,
      value: lowest.frequencyCm1,
    });
  }
  if (atomsInCell !== undefined) {
    const count = modes.reduce((sum, m) => sum + (m.degeneracy ?? 1), 0);
    if (count !== 3 * atomsInCell) {
      flags.push({
        code: 'mode-count',
        severity: 'error',
        message: `${count} modes for ${atomsInCell} atoms in the cell; expected 3N = ${3 * atomsInCell}.`,
        value: count,
      });
    }
  }
  return flags;
}

function bornCheck(bornCharges: number[][][], limit: number, atomsInCell?: number): QualityFlag[] {
  if (!Array.isArray(bornCharges) || bornCharges.length === 0) {
    throw new ScienceInputError('bornCharges', 'must be a non-empty [atom][3][3] array');
  }
  if (atomsInCell !== undefined && bornCharges.length !== atomsInCell) {
    throw new ScienceInputError('bornCharges', `has ${bornCharges.length} atoms but atomsInCell is ${atomsInCell}`);
  }
  const total = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  bornCharges.forEach((tensor, atom) => {
    if (!Array.isArray(tensor) || tensor.length !== 3) throw new ScienceInputError(`bornCharges[${atom}]`, 'must be a 3 × 3 tensor');
    tensor.forEach((row, i) => {
      if (!Array.isArray(row) || row.length !== 3) throw new ScienceInputError(`bornCharges[${atom}][${i}]`, 'must have 3 components');
      row.forEach((z, j) => {
        requireFinite(`bornCharges[${atom}][${i}][${j}]`, z);
        total[3 * i + j] += z;
      });
    });
  });
  const worst = total.reduce((a, b) => (Math.abs(b) > Math.abs(a) ? b : a));
  if (Math.abs(worst) <= limit) return [];
  return [
    {
      code: 'born-charge-neutrality',
      severity: 'warning',
      message: `The Born effective charges sum to ${Number(worst.toFixed(4))} e in one Cartesian component; charge neutrality expects 0 (limit ${limit} e).`,
      value: worst,
    },
  ];
}

function lstCheck(modes: ComputedMode[], dielectric: { epsInf: number; eps0: number }, limits: Required<QualityThresholds>, atomsInCell?: number): QualityFlag[] {
  const limit = limits.lstRelative;
  const acoustic = acousticModeIds(modes, { atomsInCell, acousticThresholdCm1: limits.acousticCm1 });
  const lines = collapseDegenerateModes(modes, acoustic).filter((l) => !l.acoustic);
  const to = lines.filter((l) => l.branch === 'TO');
  const lo = lines.filter((l) => l.branch === 'LO');
  if (to.length === 0 || to.length !== lo.length || [...to, ...lo].some((l) => l.frequencyCm1 <= 0)) return [];
  let ratio = 1;
  for (let i = 0; i < to.length; i++) ratio *= (lo[i].frequencyCm1 / to[i].frequencyCm1) ** 2;
  const expected = dielectric.eps0 / dielectric.epsInf;
  const deviation = ratio / expected - 1;
  if (Math.abs(deviation) <= limit) return [];
  return [
    {
      code: 'lyddane-sachs-teller',
      severity: 'warning',
      message: `Π(ω_LO/ω_TO)² = ${ratio.toFixed(3)} but ε₀/ε∞ = ${expected.toFixed(3)} (${(100 * deviation).toFixed(1)} %; limit ${100 * limit} %).`,
      value: deviation,
    },
  ];
}

/** Runs the quality checks of the module header on one calculation and returns its flags. */
export function qualityChecks(input: QualityInput): QualityFlag[] {
  return qualityReport(input).flags;
}

/** The quality checks with the checks not applied and why (module header). */
export function qualityReport(input: QualityInput): QualityReport {
  if (!input || typeof input !== 'object') throw new ScienceInputError('input', 'must be a quality-check input object');
  validateComputedModes(input.modes);
  const limits = readThresholds(input.thresholds);
  const { atomsInCell, kGrid, qGrid } = input;
  if (atomsInCell !== undefined && !(Number.isInteger(atomsInCell) && atomsInCell >= 1)) {
    throw new ScienceInputError('atomsInCell', `must be a positive integer, got ${String(atomsInCell)}`);
  }
  const flags = modeChecks(input.modes, limits, atomsInCell);
  if (kGrid) requireGrid('kGrid', kGrid);
  if (qGrid) requireGrid('qGrid', qGrid);
  if (kGrid && atomsInCell !== undefined) {
    const density = kGrid[0] * kGrid[1] * kGrid[2] * atomsInCell;
    if (density < limits.kPointsPerReciprocalAtom) {
      flags.push({
        code: 'k-point-density',
        severity: 'warning',
        message: `${kGrid.join('×')} k-points × ${atomsInCell} atoms = ${density} per reciprocal atom, below the target ${limits.kPointsPerReciprocalAtom}.`,
        value: density,
      });
    }
  }
  if (kGrid && qGrid && qGrid.some((q, i) => kGrid[i] % q !== 0)) {
    flags.push({
      code: 'grid-commensurability',
      severity: 'warning',
      message: `The q-point grid ${qGrid.join('×')} is not commensurate with the k-point grid ${kGrid.join('×')} (each q_i should divide k_i).`,
    });
  }
  if (input.bornCharges) flags.push(...bornCheck(input.bornCharges, limits.bornNeutrality, atomsInCell));
  const notApplied: QualityNotApplied[] = [];
  if (input.spaceGroupNumber !== undefined) crystalSystem(input.spaceGroupNumber);
  if (input.dielectric) {
    requirePositive('dielectric.epsInf', input.dielectric.epsInf);
    requirePositive('dielectric.eps0', input.dielectric.eps0);
    const system = input.spaceGroupNumber === undefined ? undefined : crystalSystem(input.spaceGroupNumber);
    if (system !== undefined && system !== 'cubic') {
      notApplied.push({
        code: 'lyddane-sachs-teller',
        reason: `Not applied: the crystal is ${system} (space group ${input.spaceGroupNumber}) and ε₀, ε∞ are scalars; the Lyddane–Sachs–Teller product needs them per polarisation for a non-cubic crystal.`,
      });
    } else {
      flags.push(...lstCheck(input.modes, input.dielectric, limits, atomsInCell));
    }
  }
  return { flags, notApplied };
}
