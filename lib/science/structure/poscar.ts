/**
 * POSCAR / CONTCAR text (the VASP structure format) → Cell.
 *
 * Layout read, line by line (1-based):
 *   1  comment
 *   2  scale: one number (> 0 multiplies the lattice and Cartesian positions; < 0 is the cell volume in Å³),
 *      or three positive numbers (one factor per Cartesian axis)
 *   3–5  the lattice vectors a, b, c (Å before scaling), three numbers each
 *   6  element symbols ("Na Cl"; POTCAR-style suffixes "Na_pv", "Cl/abc123" are cut off) — VASP 5 and later
 *   7  atom counts per element
 *   [ "Selective dynamics" — any line starting with S or s ]
 *   coordinate mode — a line starting with D/d (Direct, fractional) or C/c/K/k (Cartesian, Å before scaling)
 *   one line per atom: three numbers, then T/F flags under selective dynamics, then anything (ignored)
 * Whatever follows the positions (velocities, predictor–corrector data in a CONTCAR) is ignored.
 *
 * The old VASP 4 layout has no element line (line 6 holds the counts). It is read only when the elements
 * are given some other way: `options.species`, or a comment line made of exactly one element symbol per
 * count ("Na Cl"). Otherwise it is refused, since the file itself does not say which atoms it holds.
 */
import { isElementSymbol } from '../elements';
import { fail, findCoincident, periodicDistance, SAME_POSITION_TOLERANCE, MAX_STRUCTURE_ATOMS, StructureInputError, toFractional, type Cell, type CellResult, type Matrix3, type Vector3, validateCell, cellVolume, MIN_CELL_VOLUME } from './cell';

export interface PoscarOptions {
  /** Element symbols, one per count, for the old (VASP 4) layout without an element line. */
  species?: readonly string[];
}

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eEdD][+-]?\d+)?$/;

function toNumber(token: string): number | null {
  if (!NUMBER.test(token)) return null;
  return Number(token.replace(/[dD]/, 'e'));
}

function numbersOn(tokens: string[], count: number, what: string, line: number): number[] {
  if (tokens.length < count) fail(`Line ${line}: expected ${count} numbers for ${what}, found ${tokens.length}.`, line);
  const values = tokens.slice(0, count).map(toNumber);
  const bad = values.findIndex((v) => v === null);
  if (bad >= 0) fail(`Line ${line}: "${tokens[bad]}" in ${what} is not a number.`, line);
  return values as number[];
}

function speciesSymbol(token: string): string {
  // POTCAR titles in VASP 6 files: "Na_pv", "Ga_d", "O_s/5b1f…" → the element part.
  return token.split(/[_/]/)[0];
}

/** Parses POSCAR/CONTCAR text; never throws. */
export function parsePoscar(text: string, options: PoscarOptions = {}): CellResult {
  try {
    return { ok: true, cell: readPoscar(text, options) };
  } catch (e) {
    if (e instanceof StructureInputError) return { ok: false, reason: e.message, ...(e.line ? { line: e.line } : {}) };
    throw e;
  }
}

function readPoscar(text: string, options: PoscarOptions): Cell {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  const tokensOf = (index: number) => (lines[index] ?? '').trim().split(/\s+/).filter(Boolean);
  const need = (index: number, what: string) => {
    if (index >= lines.length || (lines[index].trim() === '' && index >= lines.length - 1)) fail(`The file ends before line ${index + 1} (${what}).`, index + 1);
    const tokens = tokensOf(index);
    if (tokens.length === 0) fail(`Line ${index + 1} is empty; expected ${what}.`, index + 1);
    return tokens;
  };

  // Line 2: scale.
  const scaleTokens = need(1, 'the scale factor');
  const scaleNumbers = scaleTokens.slice(0, 3).map(toNumber);
  let scale: Vector3;
  let targetVolume: number | null = null;
  if (scaleNumbers.length === 3 && scaleNumbers.every((v) => v !== null)) {
    if (scaleNumbers.some((v) => !(v! > 0))) fail('Line 2: three scale factors (one per axis) must all be positive.', 2);
    scale = scaleNumbers as Vector3;
  } else {
    const s = scaleNumbers[0];
    if (s === null || s === undefined) fail(`Line 2: the scale factor "${scaleTokens[0]}" is not a number.`, 2);
    if (s === 0) fail('Line 2: the scale factor is 0.', 2);
    if (s < 0) targetVolume = -s;
    scale = s > 0 ? [s, s, s] : [1, 1, 1];
  }

  // Lines 3–5: lattice.
  const raw = [2, 3, 4].map((i) => numbersOn(need(i, `lattice vector ${'abc'[i - 2]}`), 3, `lattice vector ${'abc'[i - 2]}`, i + 1)) as Matrix3;
  let lattice = raw.map((row) => row.map((v, j) => v * scale[j])) as Matrix3;
  let cartesianScale = scale;
  if (targetVolume !== null) {
    const v0 = cellVolume(raw);
    if (!(v0 > MIN_CELL_VOLUME)) fail(`The lattice vectors are degenerate (cell volume ${v0.toPrecision(3)} Å³): the structure is not periodic in three dimensions.`, 3);
    const s = Math.cbrt(targetVolume / v0);
    lattice = raw.map((row) => row.map((v) => v * s)) as Matrix3;
    cartesianScale = [s, s, s];
  }

  // Line 6: element symbols (VASP 5) or counts (VASP 4).
  let next = 5;
  const line6 = need(next, 'element symbols or atom counts');
  let species: string[];
  let counts: number[];
  if (line6.every((t) => /^\d+$/.test(t))) {
    counts = line6.map(Number);
    const fromComment = tokensOf(0);
    if (options.species) {
      species = [...options.species];
    } else if (fromComment.length === counts.length && fromComment.every(isElementSymbol)) {
      species = fromComment;
    } else {
      fail('Line 6 gives atom counts but no element symbols (the old VASP 4 layout). Add a line of element symbols above the counts (e.g. "Na Cl"), as VASP 5 files have.', 6);
    }
    if (species.length !== counts.length) fail(`Line 6: ${counts.length} atom counts but ${species.length} element symbols were given.`, 6);
    next = 6;
  } else {
    species = line6.map(speciesSymbol);
    const unknown = species.findIndex((s) => !isElementSymbol(s));
    if (unknown >= 0) fail(`Line 6: "${line6[unknown]}" is not an element symbol.`, 6);
    const countTokens = need(6, 'atom counts');
    if (countTokens.length < species.length) fail(`Line 7: ${species.length} element symbols on line 6 but ${countTokens.length} atom counts.`, 7);
    counts = countTokens.slice(0, species.length).map((t) => {
      if (!/^\d+$/.test(t)) fail(`Line 7: atom count "${t}" is not a whole number.`, 7);
      return Number(t);
    });
    if (countTokens.length > species.length) fail(`Line 7: ${countTokens.length} atom counts but ${species.length} element symbols on line 6.`, 7);
    next = 7;
  }
  if (counts.some((n) => n === 0)) fail(`Line ${next}: an atom count is 0.`, next);
  const total = counts.reduce((a, b) => a + b, 0);
  if (total > MAX_STRUCTURE_ATOMS) fail(`Line ${next}: the structure has ${total.toLocaleString('en')} atoms; at most ${MAX_STRUCTURE_ATOMS.toLocaleString('en')} are accepted.`, next);

  // Optional selective dynamics, then the coordinate mode.
  let selective = false;
  let modeTokens = need(next, 'the coordinate mode (Direct or Cartesian)');
  if (/^[sS]/.test(modeTokens[0])) {
    selective = true;
    next++;
    modeTokens = need(next, 'the coordinate mode (Direct or Cartesian)');
  }
  const modeChar = modeTokens[0][0];
  let cartesian: boolean;
  if (/[cCkK]/.test(modeChar)) cartesian = true;
  else if (/[dD]/.test(modeChar)) cartesian = false;
  else fail(`Line ${next + 1}: expected the coordinate mode "Direct" or "Cartesian", found "${modeTokens.join(' ')}".`, next + 1);
  next++;

  const atomSpecies: string[] = [];
  counts.forEach((n, i) => {
    for (let k = 0; k < n; k++) atomSpecies.push(species[i]);
  });
  const fractional: Vector3[] = [];
  for (let atom = 0; atom < total; atom++) {
    const index = next + atom;
    const line = index + 1;
    if (index >= lines.length || lines[index].trim() === '') fail(`Line ${line}: expected the position of atom ${atom + 1} of ${total} (${atomSpecies[atom]}); the positions end early.`, line);
    const tokens = tokensOf(index);
    const xyz = numbersOn(tokens, 3, `the position of atom ${atom + 1}`, line) as Vector3;
    if (selective) {
      const flags = tokens.slice(3, 6);
      if (flags.length < 3 || flags.some((f) => !/^[TF]$/i.test(f))) fail(`Line ${line}: selective dynamics needs three T/F flags after the coordinates of atom ${atom + 1}.`, line);
    }
    if (xyz.some((v) => !Number.isFinite(v))) fail(`Line ${line}: a coordinate is not a finite number.`, line);
    fractional.push(cartesian ? toFractional(lattice, xyz.map((v, j) => v * cartesianScale[j]) as Vector3) : xyz);
  }

  const cell: Cell = { lattice, fractional, species: atomSpecies };
  try {
    validateCell(cell);
  } catch (e) {
    // A degenerate lattice is a fault of lines 3–5.
    if (e instanceof StructureInputError && /degenerate/.test(e.message) && !e.line) throw new StructureInputError(e.message, 3);
    throw e;
  }
  const pair = findCoincident(lattice, fractional);
  if (pair) {
    const [i, j] = pair;
    const d = periodicDistance(lattice, fractional[i], fractional[j]);
    fail(`Lines ${next + i + 1} and ${next + j + 1}: atoms ${i + 1} (${atomSpecies[i]}) and ${j + 1} (${atomSpecies[j]}) are ${d.toFixed(4)} Å apart, closer than ${SAME_POSITION_TOLERANCE} Å: two atoms on one position.`, next + j + 1);
  }
  return cell;
}
