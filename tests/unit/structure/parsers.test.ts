import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  ambiguousElement,
  cellFormula,
  elementFromLabel,
  cellVolume,
  cifNumber,
  detectStructureFormat,
  parseCif,
  parseOperation,
  parsePoscar,
  parseStructure,
  periodicDistance,
  toCartesian,
  type Cell,
  type CellResult,
  type Vector3,
} from '@/lib/science/structure';

const file = (name: string) => readFileSync(new URL(`../../../data/structures/${name}`, import.meta.url), 'utf8');

function cellOf(result: CellResult): Cell {
  if (!result.ok) throw new Error(`expected a cell, got: ${result.reason} (line ${result.line})`);
  return result.cell;
}

/** Every atom of `a` has an atom of the same element in `b` within 1e-6 Å (periodic images), and the counts match. */
function expectSameCell(a: Cell, b: Cell) {
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(a.lattice[i][j]).toBeCloseTo(b.lattice[i][j], 9);
  expect(a.species.length).toBe(b.species.length);
  a.fractional.forEach((f, i) => {
    const match = b.fractional.findIndex((g, j) => b.species[j] === a.species[i] && periodicDistance(a.lattice, f, g) < 1e-6);
    expect(match, `atom ${i + 1} (${a.species[i]} at ${f.join(', ')})`).toBeGreaterThanOrEqual(0);
  });
}

// Rock-salt NaCl, conventional cell. a = 5.6402 Å: textbook value, from memory (a ≈ 5.64 Å).
const NACL_DIRECT = file('NaCl-rocksalt.POSCAR');
const A_NACL = 5.6402;

describe('POSCAR', () => {
  it('reads the VASP 5 layout: scale, lattice, element line, counts, Direct positions', () => {
    const cell = cellOf(parsePoscar(NACL_DIRECT));
    expect(cell.lattice).toEqual([
      [A_NACL, 0, 0],
      [0, A_NACL, 0],
      [0, 0, A_NACL],
    ]);
    expect(cell.species).toEqual(['Na', 'Na', 'Na', 'Na', 'Cl', 'Cl', 'Cl', 'Cl']);
    expect(cell.fractional[4]).toEqual([0.5, 0.5, 0.5]);
    expect(cellFormula(cell.species)).toMatchObject({ formula: 'Na4Cl4', reducedFormula: 'NaCl' });
  });

  it('gives the same cell from Cartesian and from Direct coordinates (Cartesian positions are scaled too)', () => {
    const direct = cellOf(parsePoscar(NACL_DIRECT));
    const lines = NACL_DIRECT.split('\n');
    const cartesian = [...lines.slice(0, 7), 'Cartesian', ...direct.fractional.map((f) => f.map((v) => (v * 1).toFixed(10)).join(' '))].join('\n');
    // With scale 5.6402 and unit lattice rows, a Cartesian position before scaling equals the fraction.
    expectSameCell(cellOf(parsePoscar(cartesian)), direct);
    // An oblique lattice: Cartesian positions computed from the fractions must come back to the fractions.
    const oblique = `oblique test cell\n1.5\n 3.0 0.2 0.1\n 0.4 2.8 0.3\n -0.2 0.5 4.1\nGa N\n1 1\n`;
    const fr: Vector3[] = [
      [0.1, 0.2, 0.3],
      [0.6, 0.25, 0.9],
    ];
    const d = cellOf(parsePoscar(`${oblique}Direct\n${fr.map((f) => f.join(' ')).join('\n')}\n`));
    const cart = fr.map((f) => toCartesian(d.lattice, f).map((v) => (v / 1.5).toFixed(12)).join(' '));
    const c = cellOf(parsePoscar(`${oblique}Cartesian\n${cart.join('\n')}\n`));
    c.fractional.forEach((f, i) => f.forEach((v, k) => expect(v).toBeCloseTo(fr[i][k], 10)));
  });

  it('reads a negative scale as the cell volume in Å³', () => {
    const text = NACL_DIRECT.replace(/^ {3}5\.6402$/m, `-${(A_NACL ** 3).toFixed(6)}`);
    expect(text).not.toBe(NACL_DIRECT);
    const cell = cellOf(parsePoscar(text));
    expect(cell.lattice[0][0]).toBeCloseTo(A_NACL, 6);
    expect(cellVolume(cell.lattice)).toBeCloseTo(A_NACL ** 3, 4);
  });

  it('reads three scale factors as one per Cartesian axis', () => {
    const text = NACL_DIRECT.replace(/^ {3}5\.6402$/m, '  5.0 6.0 7.0');
    const cell = cellOf(parsePoscar(text));
    expect(cell.lattice.map((r, i) => r[i])).toEqual([5, 6, 7]);
  });

  it('reads selective dynamics and Cartesian coordinates (the SrTiO3 example) and strips POTCAR suffixes', () => {
    const cell = cellOf(parsePoscar(file('SrTiO3-perovskite.POSCAR')));
    expect(cell.species).toEqual(['Sr', 'Ti', 'O', 'O', 'O']);
    cell.fractional[1].forEach((v) => expect(v).toBeCloseTo(0.5, 12));
    const suffixed = cellOf(parsePoscar(NACL_DIRECT.replace('   Na   Cl', '   Na_pv   Cl/3c7e1a')));
    expect(new Set(suffixed.species)).toEqual(new Set(['Na', 'Cl']));
  });

  it('refuses selective dynamics positions without their three T/F flags, with the line', () => {
    const text = file('SrTiO3-perovskite.POSCAR').replace('0.5   0.5   0.5   T T T', '0.5   0.5   0.5   T T');
    expect(parsePoscar(text)).toEqual({ ok: false, reason: expect.stringContaining('three T/F flags') as unknown, line: 11 });
  });

  it('refuses the old VASP 4 layout (counts on line 6) unless the elements are given another way', () => {
    const old = NACL_DIRECT.replace('   Na   Cl\n', '').replace(/^.*\n/, 'rock salt, no element line\n');
    const refused = parsePoscar(old);
    expect(refused).toMatchObject({ ok: false, line: 6 });
    expect(!refused.ok && refused.reason).toMatch(/no element symbols/);
    // Elements passed by the caller.
    expect(cellOf(parsePoscar(old, { species: ['Na', 'Cl'] })).species.slice(3, 5)).toEqual(['Na', 'Cl']);
    // Elements on the comment line, one per count.
    expect(cellOf(parsePoscar(old.replace(/^.*\n/, 'Na Cl\n'))).species.filter((s) => s === 'Cl')).toHaveLength(4);
  });

  it('refuses an unknown element symbol on line 6', () => {
    expect(parsePoscar(NACL_DIRECT.replace('   Na   Cl', '   Na   Xx'))).toEqual({ ok: false, reason: 'Line 6: "Xx" is not an element symbol.', line: 6 });
  });

  it('refuses a zero-volume (degenerate) lattice', () => {
    const flat = NACL_DIRECT.replace('0.0000000000     0.0000000000     1.0000000000', '1.0000000000     1.0000000000     0.0000000000');
    const result = parsePoscar(flat);
    expect(result).toMatchObject({ ok: false, line: 3 });
    expect(!result.ok && result.reason).toMatch(/degenerate.*not periodic/);
    const flatCartesian = flat.replace('Direct', 'Cartesian');
    expect(parsePoscar(flatCartesian)).toMatchObject({ ok: false, reason: expect.stringMatching(/degenerate/) as unknown });
  });

  it('refuses a position line with too few coordinates, naming the line', () => {
    const lines = NACL_DIRECT.split('\n');
    lines[10] = '  0.5000000000  0.0000000000'; // line 11: atom 3
    expect(parsePoscar(lines.join('\n'))).toEqual({ ok: false, reason: 'Line 11: expected 3 numbers for the position of atom 3, found 2.', line: 11 });
  });

  it('refuses two atoms on one position (closer than 0.01 Å, across the periodic boundary too), naming both lines', () => {
    const lines = NACL_DIRECT.split('\n');
    lines[13] = '  0.9999990000  0.5000000000  0.5000000000'; // line 14, Cl, 0.000006 Å from the Na of line 10 (0, 1/2, 1/2)
    expect(parsePoscar(lines.join('\n'))).toEqual({
      ok: false,
      reason: 'Lines 10 and 14: atoms 2 (Na) and 6 (Cl) are 0.0000 Å apart, closer than 0.01 Å: two atoms on one position.',
      line: 14,
    });
    lines[13] = '  0.0010000000  0.5000000000  0.5000000000'; // 0.0056 Å away: still refused
    expect(parsePoscar(lines.join('\n'))).toMatchObject({ ok: false, line: 14 });
    lines[13] = '  0.0020000000  0.5000000000  0.5000000000'; // 0.0113 Å away: two distinct (if odd) positions
    expect(parsePoscar(lines.join('\n')).ok).toBe(true);
  });

  it('refuses positions that end early, and counts that do not match the elements', () => {
    const short = NACL_DIRECT.split('\n').slice(0, 14).join('\n');
    expect(parsePoscar(short)).toMatchObject({ ok: false, line: 15, reason: expect.stringContaining('atom 7 of 8') as unknown });
    expect(parsePoscar(NACL_DIRECT.replace('    4    4', '    4'))).toMatchObject({ ok: false, line: 7 });
    expect(parsePoscar(NACL_DIRECT.replace('Direct', 'Fractional please'))).toMatchObject({ ok: false, line: 8 });
    expect(parsePoscar(NACL_DIRECT.replace('   5.6402', '   abc'))).toMatchObject({ ok: false, line: 2 });
  });
});

// The CIF files' sources are named in their headers (textbook values, from memory).
describe('CIF', () => {
  const nacl = file('NaCl-rocksalt.cif');

  it('expands the F m -3 m operations of rock-salt NaCl into the 8-atom conventional cell', () => {
    const cell = cellOf(parseCif(nacl));
    expect(cell.species.filter((s) => s === 'Na')).toHaveLength(4);
    expect(cell.species.filter((s) => s === 'Cl')).toHaveLength(4);
    expectSameCell(cell, cellOf(parsePoscar(NACL_DIRECT)));
  });

  it('gives the same cell from a reduced list (identity plus the three F-centring translations)', () => {
    const start = nacl.indexOf('loop_\n _symmetry_equiv_pos_site_id');
    const end = nacl.indexOf('loop_\n _atom_site_label');
    const reduced = `${nacl.slice(0, start)}loop_\n _symmetry_equiv_pos_as_xyz\n 'x,y,z'\n 'x,y+1/2,z+1/2'\n '1/2+x,y,1/2+z'\n 'x+0.5,y+0.5,z'\n${nacl.slice(end)}`;
    expectSameCell(cellOf(parseCif(reduced)), cellOf(parseCif(nacl)));
  });

  it('reads numbers with a standard uncertainty: 5.6402(3) is 5.6402', () => {
    expect(cifNumber('5.6402(3)')).toBe(5.6402);
    expect(cifNumber('-0.25')).toBe(-0.25);
    expect(cifNumber('1e-3')).toBe(0.001);
    expect(cifNumber('5.64(')).toBeNull();
    expect(cellOf(parseCif(nacl)).lattice[0][0]).toBe(5.6402);
  });

  it('builds a hexagonal lattice from lengths and angles (γ = 120°) and reads elements from labels', () => {
    const cell = cellOf(parseCif(file('GaN-wurtzite.cif')));
    expect(cell.species.sort()).toEqual(['Ga', 'Ga', 'N', 'N']);
    expect(cell.lattice[1][0]).toBeCloseTo(-3.189 / 2, 12);
    expect(cell.lattice[1][1]).toBeCloseTo((3.189 * Math.sqrt(3)) / 2, 12);
    expect(cell.lattice[2]).toEqual([0, 0, 5.185]);
  });

  it('parses symmetry operations written in the usual ways', () => {
    expect(parseOperation('-x+1/2, y, z+1/2')).toEqual({ rotation: [[-1, 0, 0], [0, 1, 0], [0, 0, 1]], translation: [0.5, 0, 0.5] });
    expect(parseOperation('1/2+X,x-y,-Z')).toEqual({ rotation: [[1, 0, 0], [1, -1, 0], [0, 0, -1]], translation: [0.5, 0, 0] });
    expect(parseOperation('+y,-x+y,0.25+z').translation).toEqual([0, 0, 0.25]);
    expect(() => parseOperation('x,y')).toThrow(/three comma-separated parts/);
    expect(() => parseOperation('x,y,q')).toThrow(/cannot read/);
    expect(() => parseOperation('x,x,z')).toThrow(/not a rotation/);
  });

  it('refuses a CIF without a cell, and names the missing cell tags', () => {
    const noCell = nacl.replace(/^_cell_.*\n/gm, '');
    expect(parseCif(noCell)).toMatchObject({ ok: false, reason: expect.stringContaining('_cell_length_a, _cell_length_b, _cell_length_c') as unknown });
    const noAngle = nacl.replace(/^_cell_angle_gamma.*\n/m, '');
    expect(parseCif(noAngle)).toMatchObject({ ok: false, reason: 'The cell is incomplete: _cell_angle_gamma is missing.' });
    const noSites = 'data_x\n_cell_length_a 1\n';
    expect(parseCif(noSites)).toMatchObject({ ok: false, reason: expect.stringContaining('_cell_length_b') as unknown });
  });

  it('refuses a partially occupied site, with the line of the occupancy', () => {
    const partial = nacl.replace(' Cl1 Cl- 0.50000 0.50000 0.50000 1.0', ' Cl1 Cl- 0.50000 0.50000 0.50000 0.5');
    const line = partial.split('\n').findIndex((l) => l.startsWith(' Cl1')) + 1;
    expect(parseCif(partial)).toEqual({ ok: false, reason: 'Line ' + line + ': site "Cl1" has occupancy 0.5; partially occupied sites are not supported (occupancy must be 1).', line });
    // Rounded full occupancy is accepted.
    expect(parseCif(nacl.replace('0.50000 1.0', '0.50000 0.9999')).ok).toBe(true);
  });

  it('refuses unknown elements, Cartesian sites, two elements on one position, a symbol without operations', () => {
    expect(parseCif(nacl.replace(' Cl1 Cl- ', ' Xx1 Xx '))).toMatchObject({ ok: false, reason: expect.stringContaining('"Xx" does not name a known element') as unknown });
    expect(parseCif(nacl.replace(/_atom_site_fract_/g, '_atom_site_Cartn_'))).toMatchObject({ ok: false, reason: expect.stringContaining('Cartesian') as unknown });
    expect(parseCif(nacl.replace(' Cl1 Cl- 0.50000 0.50000 0.50000', ' Cl1 Cl- 0.00000 0.50000 0.50000'))).toMatchObject({ ok: false, reason: expect.stringContaining('Na and Cl sit at the same position') as unknown });
    const start = nacl.indexOf('loop_\n _symmetry_equiv_pos_site_id');
    const end = nacl.indexOf('loop_\n _atom_site_label');
    expect(parseCif(nacl.slice(0, start) + nacl.slice(end))).toMatchObject({ ok: false, reason: expect.stringContaining('"F m -3 m" is named but no symmetry operations') as unknown });
  });

  it('reads elements from labels in capitals only where one element fits; "CL1" (Cl or C?) is refused, not read as carbon', () => {
    const labelsOnly = (na: string, cl: string) =>
      nacl.replace(' _atom_site_type_symbol\n', '').replace(' Na1 Na+ ', ` ${na} `).replace(' Cl1 Cl- ', ` ${cl} `);
    expect(cellOf(parseCif(labelsOnly('Na1', 'Cl1'))).species.sort()).toEqual(['Cl', 'Cl', 'Cl', 'Cl', 'Na', 'Na', 'Na', 'Na']);
    const refused = parseCif(labelsOnly('Na1', 'CL1'));
    expect(refused).toMatchObject({ ok: false, reason: expect.stringContaining('site "CL1": "CL1" could be Cl or C') as unknown });
    // a type symbol decides whatever the label says
    expect(cellOf(parseCif(nacl.replace(' Cl1 Cl- ', ' CL1 Cl- '))).species.filter((x) => x === 'Cl')).toHaveLength(4);
    expect(elementFromLabel('ZN1')).toBe('Zn');
    expect(elementFromLabel('OA1')).toBe('O');
    expect(ambiguousElement('NA1')).toEqual(['Na', 'N']);
    expect(ambiguousElement('Na1')).toBeNull();
  });

  it('refuses text that is not CIF, and several structures in one file', () => {
    expect(parseCif('_cell_length_a 5\n')).toMatchObject({ ok: false, line: 1 });
    expect(parseCif(`${nacl}\n${nacl.replace('data_NaCl_rocksalt', 'data_second')}`)).toMatchObject({ ok: false, reason: expect.stringContaining('2 structures') as unknown });
    expect(parseCif("data_x\n_cell_length_a '5.0\n")).toMatchObject({ ok: false, line: 2, reason: expect.stringContaining('not closed') as unknown });
  });
});

describe('format detection and size limits', () => {
  it('detects CIF by its data_ line and POSCAR otherwise', () => {
    expect(detectStructureFormat(`# comment\n\n${file('GaN-wurtzite.cif')}`)).toBe('cif');
    expect(detectStructureFormat(NACL_DIRECT)).toBe('poscar');
    expect(parseStructure(file('SrTiO3-perovskite.cif'))).toMatchObject({ ok: true, format: 'cif' });
  });

  it('refuses empty text, text over 1,000,000 characters and more than 10,000 atoms', () => {
    expect(parseStructure('  \n')).toEqual({ ok: false, reason: 'The structure file is empty.' });
    expect(parseStructure(NACL_DIRECT + ' '.repeat(1_000_000))).toMatchObject({ ok: false, reason: expect.stringContaining('at most 1,000,000') as unknown });
    expect(parsePoscar(NACL_DIRECT.replace('    4    4', ' 6000 6000'))).toMatchObject({ ok: false, line: 7, reason: expect.stringContaining('12,000 atoms') as unknown });
  });
});
