/**
 * The optional `structure` column of a materials import: POSCAR/CONTCAR or CIF text in the cell. The
 * formula, the atoms in the primitive cell and the space group are derived from it (lib/structure/derive.ts)
 * and fill the cells left empty. Where a typed cell disagrees with the structure, the row is refused with
 * both values until a choice is made: `prefer` per row (a `prefer` column: typed | structure) or for the
 * whole file (the wizard's choice, `prefer=` in the API). A structure that does not parse or is not
 * periodic is a row error with the parser's reason. Server side only (the symmetry search runs WebAssembly).
 */
import { deriveStructure } from '@/lib/structure/derive';
import { parseFormula } from '@/lib/science/formula';
import type { CellReader } from './column-def';
import { excerpt, type RowError } from './errors';

export const PREFER = ['typed', 'structure'] as const;
export type Prefer = (typeof PREFER)[number];

const reducedOf = (formula: string): string | null => {
  try {
    return parseFormula(formula).reduced;
  } catch {
    return null;
  }
};

/**
 * Reads a row's structure; returns a reader whose formula, space_group and atoms_in_cell cells hold the
 * values to store (typed, derived, or the preferred one), or null with errors appended.
 */
export async function resolveStructureColumn(row: number, read: CellReader, filePrefer: Prefer | undefined, columnName: (key: string) => string, errors: RowError[]): Promise<CellReader | null> {
  const text = read('structure') ?? '';
  const derived = await deriveStructure(text);
  if (!derived.ok) {
    errors.push({ row, column: columnName('structure'), reason: `The structure cannot be read${derived.line ? ` (line ${derived.line} of the cell)` : ''}: ${derived.reason}` });
    return null;
  }
  const rowPreferText = (read('prefer') ?? '').trim().toLowerCase();
  let prefer: Prefer | undefined = filePrefer;
  if (rowPreferText) {
    if (!(PREFER as readonly string[]).includes(rowPreferText)) {
      errors.push({ row, column: columnName('prefer'), reason: `"${excerpt(rowPreferText)}" is not one of typed, structure.`, value: excerpt(rowPreferText) });
      return null;
    }
    prefer = rowPreferText as Prefer;
  }
  const fromStructure: Record<string, string | null> = {
    formula: derived.reducedFormula,
    space_group: derived.spaceGroup === null ? null : String(derived.spaceGroup),
    atoms_in_cell: derived.atomsInPrimitiveCell === null ? null : String(derived.atomsInPrimitiveCell),
  };
  const chosen: Record<string, string | undefined> = {};
  const before = errors.length;
  for (const key of ['formula', 'space_group', 'atoms_in_cell'] as const) {
    const typed = (read(key) ?? '').trim();
    const fromFile = fromStructure[key];
    if (fromFile === null) continue;
    if (typed === '') {
      chosen[key] = fromFile;
      continue;
    }
    const agree = key === 'formula' ? reducedOf(typed) === fromFile : Number(typed) === Number(fromFile);
    if (agree || prefer === 'typed') continue;
    if (prefer === 'structure') {
      chosen[key] = fromFile;
      continue;
    }
    const what = key === 'formula' ? 'reduced formula' : key === 'space_group' ? 'space group' : 'atoms in the primitive cell';
    errors.push({
      row,
      column: columnName(key),
      reason: `Typed ${excerpt(typed)}, the structure (${derived.format}) gives ${what} ${fromFile}. Choose one: prefer=typed or prefer=structure (for the file, or in a prefer column for this row).`,
      value: excerpt(typed),
    });
  }
  if (errors.length > before) return null;
  return (key) => (key in chosen ? chosen[key] : read(key));
}
