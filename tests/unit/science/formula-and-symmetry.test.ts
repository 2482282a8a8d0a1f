import { describe, expect, it } from 'vitest';
import { ScienceInputError, crystalSystem, irrepSpecies, normalizeIrrep, parseFormula } from '@/lib/science';

describe('parseFormula', () => {
  it('parses simple, nested and bracketed formulas', () => {
    expect(parseFormula('GaN')).toEqual({ counts: { Ga: 1, N: 1 }, atomsPerFormulaUnit: 2, reduced: 'GaN', atomsPerReducedFormulaUnit: 2 });
    // Per formula unit means per reduced formula unit: "Ga2N2" is counted per GaN, as thermochemical tables are.
    expect(parseFormula('Ga2N2')).toMatchObject({ atomsPerFormulaUnit: 4, reduced: 'GaN', atomsPerReducedFormulaUnit: 2 });
    expect(parseFormula('Al4O6')).toMatchObject({ reduced: 'Al2O3', atomsPerReducedFormulaUnit: 5 });
    expect(parseFormula('Ca3(Al(OH)4)2').counts).toEqual({ Ca: 3, Al: 2, O: 8, H: 8 });
    expect(parseFormula('K4[Fe(CN)6]').counts).toEqual({ K: 4, Fe: 1, C: 6, N: 6 });
    expect(parseFormula('Co').counts).toEqual({ Co: 1 });
    expect(parseFormula('CO').counts).toEqual({ C: 1, O: 1 });
  });

  it('parses hydrates with either separator and a leading multiplier', () => {
    const expected = { Cu: 1, S: 1, O: 9, H: 10 };
    expect(parseFormula('CuSO4·5H2O').counts).toEqual(expected);
    expect(parseFormula('CuSO4*5H2O').counts).toEqual(expected);
    expect(parseFormula('CuSO4 · 5 H2O').atomsPerFormulaUnit).toBe(21);
  });

  it('parses fractional occupancies without binary noise', () => {
    const parsed = parseFormula('Ba0.5Sr0.5TiO3');
    expect(parsed.counts).toEqual({ Ba: 0.5, Sr: 0.5, Ti: 1, O: 3 });
    expect(parsed.atomsPerFormulaUnit).toBe(5);
    expect(parseFormula('Li0.1Na0.2Cl0.3').atomsPerFormulaUnit).toBe(0.6);
  });

  it('reduces integer formulas by their greatest common divisor', () => {
    expect(parseFormula('Fe4O6').reduced).toBe('Fe2O3');
    expect(parseFormula('Si2').reduced).toBe('Si');
    expect(parseFormula('Ga2N2').atomsPerFormulaUnit).toBe(4);
  });

  it('throws with the character position for malformed formulas', () => {
    const cases: Array<[string, RegExp]> = [
      ['', /empty/],
      ['Xx2O', /unknown element symbol "Xx" at position 1/],
      ['GaQ', /unknown element symbol "Q" at position 3/],
      ['Cu(OH', /missing "\)"/],
      ['CuOH)2', /unmatched "\)" at position 5/],
      ['ga', /capital letter/],
      ['Fe2O3#', /unexpected "#" at position 6/],
      ['Fe0O', /must be greater than 0/],
      ['NaCl·', /ends after the separator/],
      ['()2', /empty group at position 1/],
    ];
    for (const [formula, reason] of cases) {
      expect(() => parseFormula(formula)).toThrow(ScienceInputError);
      expect(() => parseFormula(formula)).toThrow(reason);
    }
  });
});

describe('crystalSystem', () => {
  it('maps the space-group ranges of the International Tables', () => {
    // International Tables for Crystallography, Vol. A: 1–2, 3–15, 16–74, 75–142, 143–167, 168–194, 195–230
    const boundaries: Array<[number, string]> = [
      [1, 'triclinic'], [2, 'triclinic'], [3, 'monoclinic'], [15, 'monoclinic'], [16, 'orthorhombic'], [74, 'orthorhombic'],
      [75, 'tetragonal'], [142, 'tetragonal'], [143, 'trigonal'], [167, 'trigonal'], [168, 'hexagonal'], [186, 'hexagonal'],
      [194, 'hexagonal'], [195, 'cubic'], [227, 'cubic'], [230, 'cubic'],
    ];
    for (const [number, system] of boundaries) expect(crystalSystem(number)).toBe(system);
  });
});

describe('normalizeIrrep', () => {
  it('treats T and F alike, ignores case, whitespace, underscores and braces', () => {
    for (const label of ['T2g', 'F2g', 'f2g', 't2G', 'F_{2g}', 'T_2g', ' T 2 g ', 'T₂g', 'F₂g']) expect(normalizeIrrep(label)).toBe('T2g');
    expect(normalizeIrrep('E g')).toBe('Eg');
    expect(normalizeIrrep('a1g')).toBe('A1g');
    expect(normalizeIrrep('B1U')).toBe('B1u');
    expect(normalizeIrrep('Tᵤ')).toBe('Tu');
  });

  it('writes primes as apostrophes', () => {
    expect(normalizeIrrep('A1′')).toBe("A1'");
    expect(normalizeIrrep("A1'")).toBe("A1'");
    expect(normalizeIrrep('A″')).toBe("A''");
    expect(normalizeIrrep("E''")).toBe("E''");
    expect(normalizeIrrep('E′′')).toBe("E''");
  });

  it('normalises the high/low and TO/LO qualifiers', () => {
    for (const label of ['E2(high)', 'E2 high', 'E_2^high', 'E2^H', 'E2h', 'e2(HIGH)', 'E2 (hi)']) expect(normalizeIrrep(label)).toBe('E2(high)');
    for (const label of ['E2(low)', 'E2 low', 'E_2^low', 'E2^L']) expect(normalizeIrrep(label)).toBe('E2(low)');
    expect(normalizeIrrep('A1(TO)')).toBe('A1(TO)');
    expect(normalizeIrrep('A1 to')).toBe('A1(TO)');
    expect(normalizeIrrep('E1 (LO)')).toBe('E1(LO)');
    expect(irrepSpecies('E2(high)')).toBe('E2');
    expect(irrepSpecies('A1(LO)')).toBe('A1');
  });

  it('leaves labels outside the Mulliken pattern readable and stable', () => {
    expect(normalizeIrrep('Γ5+')).toBe('Γ5+');
    expect(normalizeIrrep(' Γ 4 ')).toBe('Γ4');
  });
});
