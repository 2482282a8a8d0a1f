/**
 * Crystal structure files (POSCAR/CONTCAR and CIF) → one Cell type, with formula from the atoms.
 * Pure: no I/O. Symmetry (space group, primitive cell) is found outside the science layer, in
 * lib/structure/symmetry.ts, since it loads a WebAssembly module.
 */
import { MAX_STRUCTURE_CHARACTERS, type CellResult } from './cell';
import { parseCif } from './cif';
import { parsePoscar, type PoscarOptions } from './poscar';

export {
  cellFormula,
  cellVolume,
  atomicNumber,
  elementFromLabel,
  ambiguousElement,
  latticeFromParameters,
  mergeCoincident,
  findCoincident,
  periodicDistance,
  toCartesian,
  toFractional,
  validateCell,
  MAX_STRUCTURE_ATOMS,
  MAX_STRUCTURE_CHARACTERS,
  MIN_CELL_VOLUME,
  SAME_POSITION_TOLERANCE,
} from './cell';
export type { Cell, CellResult, Matrix3, Vector3 } from './cell';
export { parsePoscar } from './poscar';
export type { PoscarOptions } from './poscar';
export { parseCif, parseOperation, cifNumber } from './cif';

export type StructureFormat = 'poscar' | 'cif';

/**
 * The format of a structure text: CIF when its first line that is neither blank nor a # comment starts with
 * "data_" (every CIF block does), POSCAR otherwise.
 */
export function detectStructureFormat(text: string): StructureFormat {
  for (const raw of text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/)) {
    const line = raw.trim();
    if (line === '' || line.startsWith('#')) continue;
    return /^data_/i.test(line) ? 'cif' : 'poscar';
  }
  return 'poscar';
}

/** Detects the format and parses; refuses empty and oversized text. Never throws. */
export function parseStructure(text: string, options: PoscarOptions = {}): ({ format: StructureFormat } & CellResult) | { ok: false; reason: string; line?: number } {
  if (typeof text !== 'string' || text.trim() === '') return { ok: false, reason: 'The structure file is empty.' };
  if (text.length > MAX_STRUCTURE_CHARACTERS) {
    return { ok: false, reason: `The structure file has ${text.length.toLocaleString('en')} characters; at most ${MAX_STRUCTURE_CHARACTERS.toLocaleString('en')} are accepted.` };
  }
  const format = detectStructureFormat(text);
  const result = format === 'cif' ? parseCif(text) : parsePoscar(text, options);
  return { format, ...result };
}
