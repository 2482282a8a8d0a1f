/**
 * A periodic crystal cell and the checks every structure parser applies to it.
 * Pure computation, no I/O.
 */
import { ELEMENT_SYMBOLS, isElementSymbol } from '../elements';
import { parseFormula } from '../formula';

export type Vector3 = [number, number, number];
export type Matrix3 = [Vector3, Vector3, Vector3];

/** A periodic cell: lattice in Å (rows are the three lattice vectors a, b, c), fractional positions, element symbols. */
export interface Cell {
  lattice: Matrix3;
  fractional: Vector3[];
  species: string[];
}

/** A parse result: the cell, or the reason (and 1-based line, where one applies) it was refused. */
export type CellResult = { ok: true; cell: Cell } | { ok: false; reason: string; line?: number };

/** Largest structure accepted, in characters of text (about 1 MB of ASCII). */
export const MAX_STRUCTURE_CHARACTERS = 1_000_000;
/** Largest structure accepted, in atoms of the cell as given (after CIF symmetry expansion). */
export const MAX_STRUCTURE_ATOMS = 10_000;
/** A cell whose volume is at or below this (Å³) is treated as degenerate (not periodic in 3-D). */
export const MIN_CELL_VOLUME = 1e-3;
/** Two atoms closer than this (Å, shortest periodic image) are the same position. */
export const SAME_POSITION_TOLERANCE = 0.01;

export class StructureInputError extends Error {
  constructor(
    message: string,
    readonly line?: number,
  ) {
    super(message);
    this.name = 'StructureInputError';
  }
}

export function fail(reason: string, line?: number): never {
  throw new StructureInputError(reason, line);
}

export function determinant(m: Matrix3): number {
  const [[a, b, c], [d, e, f], [g, h, i]] = m;
  return a * (e * i - f * h) - b * (d * i - f * g) + c * (d * h - e * g);
}

/** Cell volume in Å³ (absolute value of the lattice determinant). */
export function cellVolume(lattice: Matrix3): number {
  return Math.abs(determinant(lattice));
}

function inverse(m: Matrix3): Matrix3 {
  const det = determinant(m);
  const [[a, b, c], [d, e, f], [g, h, i]] = m;
  return [
    [(e * i - f * h) / det, (c * h - b * i) / det, (b * f - c * e) / det],
    [(f * g - d * i) / det, (a * i - c * g) / det, (c * d - a * f) / det],
    [(d * h - e * g) / det, (b * g - a * h) / det, (a * e - b * d) / det],
  ];
}

/** Cartesian position (Å) of a fractional position: r = f · L (rows of L are the lattice vectors). */
export function toCartesian(lattice: Matrix3, f: Vector3): Vector3 {
  return [0, 1, 2].map((j) => f[0] * lattice[0][j] + f[1] * lattice[1][j] + f[2] * lattice[2][j]) as Vector3;
}

/** Fractional position of a Cartesian position (Å): f = r · L⁻¹. */
export function toFractional(lattice: Matrix3, r: Vector3): Vector3 {
  const inv = inverse(lattice);
  return [0, 1, 2].map((j) => r[0] * inv[0][j] + r[1] * inv[1][j] + r[2] * inv[2][j]) as Vector3;
}

/** A fractional coordinate brought into [0, 1); values within 1e-8 of 1 become 0. */
export function wrapCoordinate(x: number): number {
  let w = x - Math.floor(x);
  if (w > 1 - 1e-8) w = 0;
  return w === 0 ? 0 : w; // no −0
}

/** Lattice from cell lengths (Å) and angles (degrees), a along x, b in the xy plane (the usual convention). */
export function latticeFromParameters(a: number, b: number, c: number, alphaDeg: number, betaDeg: number, gammaDeg: number): Matrix3 {
  const rad = Math.PI / 180;
  const [ca, cb, cg] = [Math.cos(alphaDeg * rad), Math.cos(betaDeg * rad), Math.cos(gammaDeg * rad)];
  const sg = Math.sin(gammaDeg * rad);
  const cx = c * cb;
  const cy = (c * (ca - cb * cg)) / sg;
  const cz2 = c * c - cx * cx - cy * cy;
  // A negative cz² means the three angles cannot close a cell; cz = 0 then fails the volume check.
  const cz = cz2 > 0 ? Math.sqrt(cz2) : 0;
  const clean = (v: number) => (Math.abs(v) < 1e-12 ? 0 : v);
  return [
    [a, 0, 0],
    [clean(b * cg), clean(b * sg), 0],
    [clean(cx), clean(cy), clean(cz)],
  ];
}

/**
 * The element symbol a label or type symbol names: "Na", "Na1", "O2-", "Ti4+", "Fe3" → Na, Na, O, Ti, Fe.
 * Two letters are taken when they make an element as written ("Cl1" → Cl), else one ("Oa1" → O). Written in
 * capitals, "ZN1" → Zn (Z is no element) and "OA1" → O (Oa is none), but "CL1" could be Cl or C with the
 * label suffix L1: ambiguousElement names both, and the parsers refuse such a label rather than guess.
 */
export function elementFromLabel(label: string): string | null {
  const match = /^([A-Za-z])([A-Za-z]?)/.exec(label.trim());
  if (!match) return null;
  const first = match[1].toUpperCase();
  const second = match[2];
  if (second && isElementSymbol(first + second)) return first + second;
  if (second && second === second.toUpperCase() && isElementSymbol(first + second.toLowerCase()) && !isElementSymbol(first)) return first + second.toLowerCase();
  return isElementSymbol(first) ? first : null;
}

/** The two elements a label in capitals could name ("CL1" → [Cl, C]), or null when it names one. */
export function ambiguousElement(label: string): [string, string] | null {
  const match = /^([A-Za-z])([A-Z])/.exec(label.trim());
  if (!match) return null;
  const first = match[1].toUpperCase();
  const two = first + match[2].toLowerCase();
  return isElementSymbol(two) && isElementSymbol(first) ? [two, first] : null;
}

/** Atomic number (Z) of an element symbol. */
export function atomicNumber(symbol: string): number {
  const index = ELEMENT_SYMBOLS.indexOf(symbol);
  if (index < 0) throw new StructureInputError(`"${symbol}" is not an element symbol`);
  return index + 1;
}

/**
 * Checks what every cell must satisfy: known element symbols, one symbol per position, finite numbers,
 * a non-degenerate lattice, at least one atom and at most MAX_STRUCTURE_ATOMS.
 */
export function validateCell(cell: Cell): void {
  if (cell.lattice.flat().some((v) => !Number.isFinite(v))) fail('The lattice contains a value that is not a finite number.');
  const volume = cellVolume(cell.lattice);
  if (!(volume > MIN_CELL_VOLUME)) {
    fail(`The lattice vectors are degenerate (cell volume ${volume.toPrecision(3)} Å³, at most ${MIN_CELL_VOLUME} Å³): the structure is not periodic in three dimensions.`);
  }
  if (cell.fractional.length === 0) fail('The structure has no atoms.');
  if (cell.fractional.length !== cell.species.length) fail(`${cell.fractional.length} positions but ${cell.species.length} element symbols.`);
  if (cell.fractional.length > MAX_STRUCTURE_ATOMS) fail(`The structure has ${cell.fractional.length} atoms; at most ${MAX_STRUCTURE_ATOMS.toLocaleString('en')} are accepted.`);
  for (const symbol of new Set(cell.species)) {
    if (!isElementSymbol(symbol)) fail(`"${symbol}" is not an element symbol.`);
  }
  cell.fractional.forEach((f, i) => {
    if (f.some((v) => !Number.isFinite(v))) fail(`Atom ${i + 1} has a coordinate that is not a finite number.`);
  });
}

/**
 * Merges positions that coincide within `tolerance` Å (shortest periodic image) into a wrapped cell.
 * Same element at one position: kept once. Two different elements at one position: refused.
 * Uses a fractional grid so the cost stays about linear in the number of atoms.
 */
export function mergeCoincident(lattice: Matrix3, fractional: Vector3[], species: string[], tolerance = SAME_POSITION_TOLERANCE, maxAtoms = MAX_STRUCTURE_ATOMS): { fractional: Vector3[]; species: string[] } {
  const inv = inverse(lattice);
  // Length of the reciprocal vectors (columns of L⁻¹): a displacement of d Å changes fraction i by at most d·|b_i|.
  const recip = [0, 1, 2].map((i) => Math.hypot(inv[0][i], inv[1][i], inv[2][i]));
  const bins = recip.map((r) => Math.max(1, Math.min(1000, Math.floor(1 / (tolerance * r * 1.0001))))) as Vector3;
  const grid = new Map<string, number[]>();
  const outF: Vector3[] = [];
  const outS: string[] = [];
  const key = (i: number, j: number, k: number) => `${i},${j},${k}`;
  const binOf = (f: Vector3) => f.map((v, axis) => Math.min(bins[axis] - 1, Math.floor(v * bins[axis]))) as Vector3;
  for (let n = 0; n < fractional.length; n++) {
    const f = fractional[n].map(wrapCoordinate) as Vector3;
    const [bi, bj, bk] = binOf(f);
    let found = -1;
    search: for (let di = -1; di <= 1; di++) {
      for (let dj = -1; dj <= 1; dj++) {
        for (let dk = -1; dk <= 1; dk++) {
          const cellKey = key((bi + di + bins[0]) % bins[0], (bj + dj + bins[1]) % bins[1], (bk + dk + bins[2]) % bins[2]);
          for (const m of grid.get(cellKey) ?? []) {
            if (periodicDistance(lattice, f, outF[m]) < tolerance) {
              found = m;
              break search;
            }
          }
        }
      }
    }
    if (found >= 0) {
      if (outS[found] !== species[n]) {
        fail(`${outS[found]} and ${species[n]} sit at the same position (${outF[found].map((v) => v.toFixed(4)).join(', ')}); mixed or partially occupied sites are not supported.`);
      }
      continue;
    }
    outF.push(f);
    outS.push(species[n]);
    if (outF.length > maxAtoms) fail(`The structure has more than ${maxAtoms.toLocaleString('en')} atoms; at most ${maxAtoms.toLocaleString('en')} are accepted.`);
    const k = key(bi, bj, bk);
    const list = grid.get(k);
    if (list) list.push(outF.length - 1);
    else grid.set(k, [outF.length - 1]);
  }
  return { fractional: outF, species: outS };
}

/** Shortest distance (Å) between two fractional positions over the neighbouring periodic images. */
export function periodicDistance(lattice: Matrix3, f: Vector3, g: Vector3): number {
  const d = [0, 1, 2].map((i) => {
    const x = f[i] - g[i];
    return x - Math.round(x);
  }) as Vector3;
  let best = Infinity;
  for (let i = -1; i <= 1; i++) {
    for (let j = -1; j <= 1; j++) {
      for (let k = -1; k <= 1; k++) {
        const r = toCartesian(lattice, [d[0] + i, d[1] + j, d[2] + k]);
        const dist = Math.hypot(r[0], r[1], r[2]);
        if (dist < best) best = dist;
      }
    }
  }
  return best;
}

/** Formula of the cell as given, elements in order of first appearance ("Na4Cl4"), and its reduced form ("NaCl"). */
export function cellFormula(species: readonly string[]): { formula: string; reducedFormula: string; counts: Record<string, number> } {
  const counts = new Map<string, number>();
  for (const s of species) counts.set(s, (counts.get(s) ?? 0) + 1);
  const formula = [...counts].map(([s, n]) => (n === 1 ? s : `${s}${n}`)).join('');
  // parseFormula is the one parser the material schema uses; going through it keeps the two in step.
  const parsed = parseFormula(formula);
  return { formula, reducedFormula: parsed.reduced, counts: parsed.counts };
}

/**
 * The first pair of atoms (0-based indices, in input order) closer than `tolerance` Å over the periodic images,
 * or null. Grid-bucketed like mergeCoincident, so about linear in the number of atoms.
 */
export function findCoincident(lattice: Matrix3, fractional: readonly Vector3[], tolerance = SAME_POSITION_TOLERANCE): [number, number] | null {
  const inv = inverse(lattice);
  const recip = [0, 1, 2].map((i) => Math.hypot(inv[0][i], inv[1][i], inv[2][i]));
  const bins = recip.map((r) => Math.max(1, Math.min(1000, Math.floor(1 / (tolerance * r * 1.0001)))));
  const grid = new Map<string, number[]>();
  const wrapped = fractional.map((f) => f.map(wrapCoordinate) as Vector3);
  for (let n = 0; n < wrapped.length; n++) {
    const b = wrapped[n].map((v, axis) => Math.min(bins[axis] - 1, Math.floor(v * bins[axis])));
    for (let di = -1; di <= 1; di++) {
      for (let dj = -1; dj <= 1; dj++) {
        for (let dk = -1; dk <= 1; dk++) {
          const k = `${(b[0] + di + bins[0]) % bins[0]},${(b[1] + dj + bins[1]) % bins[1]},${(b[2] + dk + bins[2]) % bins[2]}`;
          for (const m of grid.get(k) ?? []) {
            if (periodicDistance(lattice, wrapped[n], wrapped[m]) < tolerance) return [m, n];
          }
        }
      }
    }
    const own = `${b[0]},${b[1]},${b[2]}`;
    const list = grid.get(own);
    if (list) list.push(n);
    else grid.set(own, [n]);
  }
  return null;
}
