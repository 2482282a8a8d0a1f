import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { deriveStructure, type DerivedStructure } from '@/lib/structure/derive';
import { DEFAULT_SYMPREC, findSymmetry, MAX_SYMMETRY_ATOMS, symmetryUnavailableReason } from '@/lib/structure/symmetry';
import { parsePoscar, type Cell } from '@/lib/science/structure';

const file = (name: string) => readFileSync(new URL(`../../../data/structures/${name}`, import.meta.url), 'utf8');

async function derived(text: string): Promise<DerivedStructure> {
  const result = await deriveStructure(text);
  if (!result.ok) throw new Error(`expected a structure, got: ${result.reason} (line ${result.line})`);
  return result;
}

function poscarText(cell: Cell, comment: string): string {
  const order = [...new Set(cell.species)];
  const rows = order.flatMap((s) => cell.fractional.filter((_, i) => cell.species[i] === s));
  return [
    comment,
    '1.0',
    ...cell.lattice.map((r) => r.map((v) => v.toFixed(10)).join(' ')),
    order.join(' '),
    order.map((s) => cell.species.filter((x) => x === s).length).join(' '),
    'Direct',
    ...rows.map((f) => f.map((v) => v.toFixed(10)).join(' ')),
    '',
  ].join('\n');
}

// The cells and their sources are in data/structures/ (each file's header): textbook values from memory —
// NaCl a = 5.64 Å; GaN a = 3.189 Å, c = 5.185 Å, u = 0.377; SrTiO3 a = 3.905 Å. The expected space groups are
// common practice (rock salt F m -3 m, 225; wurtzite P 63 m c, 186; cubic perovskite P m -3 m, 221) and the
// primitive cells hold one formula unit for rock salt and perovskite, two for wurtzite.
const CASES = [
  { name: 'rock-salt NaCl', stem: 'NaCl-rocksalt', formula: 'Na4Cl4', reduced: 'NaCl', input: 8, primitive: 2, spaceGroup: 225 },
  { name: 'wurtzite GaN', stem: 'GaN-wurtzite', formula: 'Ga2N2', reduced: 'GaN', input: 4, primitive: 4, spaceGroup: 186 },
  { name: 'cubic perovskite SrTiO3', stem: 'SrTiO3-perovskite', formula: 'SrTiO3', reduced: 'SrTiO3', input: 5, primitive: 5, spaceGroup: 221 },
] as const;

describe('deriveStructure: space group and primitive cell through moyo (WebAssembly)', () => {
  it('loads the symmetry library under Node', async () => {
    const cell = (parsePoscar(file('NaCl-rocksalt.POSCAR')) as { ok: true; cell: Cell }).cell;
    const result = await findSymmetry(cell);
    expect(symmetryUnavailableReason()).toBeNull();
    expect(result).toMatchObject({ ok: true, spaceGroup: 225, symprec: DEFAULT_SYMPREC });
  });

  for (const c of CASES) {
    for (const [format, ext] of [
      ['poscar', 'POSCAR'],
      ['cif', 'cif'],
    ] as const) {
      it(`${c.name} from its ${format === 'cif' ? 'CIF' : 'POSCAR'}: space group ${c.spaceGroup}, ${c.primitive} atoms in the primitive cell`, async () => {
        const r = await derived(file(`${c.stem}.${ext}`));
        expect(r).toMatchObject({ format, formula: c.formula, reducedFormula: c.reduced, atomsInConventionalInput: c.input, atomsInPrimitiveCell: c.primitive, spaceGroup: c.spaceGroup });
      });
    }
  }

  it('a 2×1×1 supercell of rock-salt NaCl still gives 225 and 2 atoms in the primitive cell', async () => {
    const cell = (parsePoscar(file('NaCl-rocksalt.POSCAR')) as { ok: true; cell: Cell }).cell;
    const supercell: Cell = {
      lattice: [cell.lattice[0].map((v) => 2 * v) as Cell['lattice'][0], cell.lattice[1], cell.lattice[2]],
      fractional: cell.fractional.flatMap((f) => [0, 1].map((k) => [(f[0] + k) / 2, f[1], f[2]] as Cell['fractional'][0])),
      species: cell.species.flatMap((s) => [s, s]),
    };
    const r = await derived(poscarText(supercell, 'NaCl 2x1x1 supercell (test)'));
    expect(r).toMatchObject({ formula: 'Na8Cl8', reducedFormula: 'NaCl', atomsInConventionalInput: 16, atomsInPrimitiveCell: 2, spaceGroup: 225 });
  });

  it('a cell over MAX_SYMMETRY_ATOMS keeps formula and atom count, and says why there is no space group', async () => {
    const cell = (parsePoscar(file('NaCl-rocksalt.POSCAR')) as { ok: true; cell: Cell }).cell;
    const n = 3; // 3×3×4 conventional cells: 288 atoms
    const big: Cell = { lattice: [cell.lattice[0].map((v) => n * v), cell.lattice[1].map((v) => n * v), cell.lattice[2].map((v) => 4 * v)] as Cell['lattice'], fractional: [], species: [] };
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < 4; k++) {
      cell.fractional.forEach((f, m) => {
        big.fractional.push([(f[0] + i) / n, (f[1] + j) / n, (f[2] + k) / 4]);
        big.species.push(cell.species[m]);
      });
    }
    expect(big.species.length).toBeGreaterThan(MAX_SYMMETRY_ATOMS);
    const r = await derived(poscarText(big, 'NaCl 3x3x4 supercell (test)'));
    expect(r).toMatchObject({ reducedFormula: 'NaCl', formula: 'Na144Cl144', atomsInConventionalInput: 288, spaceGroup: null, atomsInPrimitiveCell: null });
    expect(r.symmetryNote).toMatch(/288 atoms, more than the 250/);
    expect(await findSymmetry(big)).toMatchObject({ ok: false, reason: expect.stringContaining('at most 250 atoms') as unknown });
  });

  it('a slightly distorted cell: the tolerance (symprec) decides whether the distortion counts', async () => {
    // One Na of the conventional NaCl cell moved by 0.03 Å along x. Within a 0.01 Å tolerance that breaks the
    // F centring (no translation maps the cell onto itself any more), so the primitive cell is the whole
    // 8-atom cell and the group is lower than 225. With 0.05 Å the move is below the tolerance and 225 comes back.
    const cell = (parsePoscar(file('NaCl-rocksalt.POSCAR')) as { ok: true; cell: Cell }).cell;
    const a = cell.lattice[0][0];
    const moved: Cell = { ...cell, fractional: cell.fractional.map((f, i) => (i === 1 ? [f[0] + 0.03 / a, f[1], f[2]] : f)) };
    const text = poscarText(moved, 'NaCl with one Na moved 0.03 Å (test)');

    const tight = await deriveStructure(text, { symprec: 0.01 });
    expect(tight.ok).toBe(true);
    if (!tight.ok) return;
    // Reasoned by hand: the moved atom keeps the 4-fold axis along x through it and the four mirror planes that
    // contain that axis, loses inversion and every centring translation: P 4 m m, 99.
    expect(tight.spaceGroup).toBe(99);
    expect(tight.atomsInPrimitiveCell).toBe(8);

    const loose = await deriveStructure(text, { symprec: 0.05 });
    expect(loose).toMatchObject({ ok: true, spaceGroup: 225, atomsInPrimitiveCell: 2 });
  });

  it('passes on the parser’s reason and line', async () => {
    const bad = file('NaCl-rocksalt.POSCAR').replace('   Na   Cl', '   Na   Qq');
    expect(await deriveStructure(bad)).toEqual({ ok: false, reason: 'Line 6: "Qq" is not an element symbol.', line: 6 });
    expect(await deriveStructure('')).toEqual({ ok: false, reason: 'The structure file is empty.' });
  });

  it('refuses a non-positive tolerance', async () => {
    const cell = (parsePoscar(file('NaCl-rocksalt.POSCAR')) as { ok: true; cell: Cell }).cell;
    await expect(findSymmetry(cell, 0)).rejects.toThrow(/symprec/);
  });
});
