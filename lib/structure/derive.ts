/**
 * What a structure file says about a material: formula, atoms in the cell as given and in the primitive
 * cell, space group. The catalogue import compares these with the typed values.
 */
import { cellFormula, parseStructure, type Cell, type StructureFormat } from '@/lib/science/structure';
import { DEFAULT_SYMPREC, findSymmetry, MAX_SYMMETRY_ATOMS, symmetryUnavailableReason } from './symmetry';

export type { StructureFormat } from '@/lib/science/structure';
export type { Cell } from '@/lib/science/structure';

export type DerivedStructure = {
  ok: true;
  format: StructureFormat;
  /** Element counts of the cell as given, in order of first appearance ("Na4Cl4"). */
  formula: string;
  /** The reduced formula, as parseFormula reduces a typed formula ("NaCl"). */
  reducedFormula: string;
  /** Atoms in the cell as given (for a CIF: after applying its symmetry operations). */
  atomsInConventionalInput: number;
  /** Atoms in the primitive cell found by the symmetry search; null when it was not run (see symmetryNote). */
  atomsInPrimitiveCell: number | null;
  /** ITA space-group number 1–230 at DEFAULT_SYMPREC; null when the search was not run (see symmetryNote). */
  spaceGroup: number | null;
  cell: Cell;
  /** Why spaceGroup and atomsInPrimitiveCell are null: a cell over MAX_SYMMETRY_ATOMS, or the library failed to load. */
  symmetryNote?: string;
};

export type StructureFailure = { ok: false; reason: string; line?: number };

export interface DeriveOptions {
  /** Symmetry tolerance in Å (default DEFAULT_SYMPREC, 0.01 Å). */
  symprec?: number;
}

/** Parses POSCAR/CONTCAR or CIF text (the format is detected) and derives formula, atom counts and space group. */
export async function deriveStructure(text: string, options: DeriveOptions = {}): Promise<DerivedStructure | StructureFailure> {
  const parsed = parseStructure(text);
  if (!parsed.ok) return { ok: false, reason: parsed.reason, ...(parsed.line ? { line: parsed.line } : {}) };
  const { cell } = parsed;
  const { formula, reducedFormula } = cellFormula(cell.species);
  const base = { ok: true as const, format: parsed.format, formula, reducedFormula, atomsInConventionalInput: cell.species.length, cell };
  if (cell.species.length > MAX_SYMMETRY_ATOMS) {
    return { ...base, atomsInPrimitiveCell: null, spaceGroup: null, symmetryNote: `Space group not derived: the cell has ${cell.species.length} atoms, more than the ${MAX_SYMMETRY_ATOMS} the symmetry search takes.` };
  }
  const symmetry = await findSymmetry(cell, options.symprec ?? DEFAULT_SYMPREC);
  if (!symmetry) return { ...base, atomsInPrimitiveCell: null, spaceGroup: null, symmetryNote: `Space group not derived: the symmetry library did not load (${symmetryUnavailableReason() ?? 'unknown reason'}).` };
  if (!symmetry.ok) return { ok: false, reason: symmetry.reason };
  return { ...base, atomsInPrimitiveCell: symmetry.atomsInPrimitiveCell, spaceGroup: symmetry.spaceGroup };
}
