import { describe, expect, it } from 'vitest';
import { computeDosValues, resolveDosBlocks, type DosReferences } from '@/lib/import/dos-compute';
import { parseDosText } from '@/lib/import/dos-parse';

// CODATA 2018 / SI 2019 exact constants (reference/check-values.md, "Constants").
const h = 6.62607015e-34;
const kB = 1.380649e-23;
const NA = 6.02214076e23;
const e = 1.602176634e-19;
const R = NA * kB;

function references(atomsInCell: number, atomsPerFormulaUnit: number): DosReferences {
  return {
    materials: new Map([['X', { id: 'mat-x', atomsPerFormulaUnit, atomsInCell }]]),
    sources: new Map([['src', 'src-id']]),
    methods: new Map([['M', 'method-id']]),
  };
}

/** Parses a file through the import reader and computes its values, as the server does. */
function computeFromFile(csv: string, refs: DosReferences, temperatures: number[]) {
  const parsed = parseDosText(csv);
  expect(parsed.errors).toEqual([]);
  const { resolved, errors } = resolveDosBlocks(parsed.blocks, refs);
  expect(errors).toEqual([]);
  expect(resolved).toHaveLength(1);
  return { resolved: resolved[0], values: computeDosValues(resolved[0], temperatures) };
}

describe('DOS import: harmonic thermodynamics through the file reader', () => {
  it('a Debye DOS (ρ ∝ ν² up to ν_D), written in THz, gives C_v = 3R × 0.9517321357 at T = θ_D for one atom per cell', () => {
    // Published: C_v/(3R) at T = θ_D = 0.9517321357, Adv. Cond. Matter Phys. 2017, article 9321439, Table 7
    // (reference/check-values.md, "Harmonic oscillator").
    const thetaD = 300;
    const nuDTHz = (thetaD * kB) / h / 1e12; // h ν_D = k_B θ_D
    const intervals = 2000;
    const lines = ['material,method,source,unit,frequency,density'];
    for (let i = 0; i <= intervals; i++) {
      const nu = (nuDTHz * i) / intervals;
      lines.push(`X,M,src,THz,${nu.toPrecision(15)},${(nu * nu).toPrecision(15)}`);
    }
    const { resolved, values } = computeFromFile(lines.join('\n'), references(1, 1), [thetaD]);
    expect(resolved.modesPerCell).toBe(3);
    expect(resolved.formulaUnitsPerCell).toBe(1);
    const cv = values.find((v) => v.quantity === 'heat-capacity')!;
    const expected = 3 * R * 0.9517321357;
    expect(Math.abs(cv.value - expected) / expected).toBeLessThan(1e-3);
    expect(cv.unit).toBe('J/mol/K');
    expect(cv.valueText).toBe(cv.value.toFixed(4));
  });

  it('an Einstein DOS (one narrow peak), written in meV, gives the closed-form entropy and heat capacity per formula unit', () => {
    // Einstein functions (reference/check-values.md): S/k_B = x/(eˣ − 1) − ln(1 − e⁻ˣ), C_v/k_B = x² eˣ/(eˣ − 1)², x = h ν / (k_B T).
    // The middle point alone carries weight: its neighbours have density 0, so the trapezoid sum is exactly one mode.
    const peakMeV = 40;
    const T = 298.15;
    const csv = ['material,method,source,unit,frequency,density', 'X,M,src,meV,0,0', 'X,M,src,meV,39.9,0', `X,M,src,meV,${peakMeV},1`, 'X,M,src,meV,40.1,0'].join('\r\n');
    // 4 atoms in the cell, 2 per formula unit: Z = 2 formula units per cell; 12 modes per cell.
    const { resolved, values } = computeFromFile(csv, references(4, 2), [T]);
    expect(resolved.modesPerCell).toBe(12);
    expect(resolved.formulaUnitsPerCell).toBe(2);
    const x = (peakMeV * 1e-3 * e) / (kB * T);
    const sMode = x / Math.expm1(x) - Math.log(1 - Math.exp(-x));
    const cMode = (x * x * Math.exp(x)) / Math.expm1(x) ** 2;
    const perFormulaUnit = 12 / 2;
    const s = values.find((v) => v.quantity === 'entropy')!;
    const c = values.find((v) => v.quantity === 'heat-capacity')!;
    expect(s.value).toBeCloseTo(perFormulaUnit * R * sMode, 9);
    expect(c.value).toBeCloseTo(perFormulaUnit * R * cMode, 9);
    expect(s.temperatureK).toBe(T);
  });

  it('divides the per-cell values by Z = atoms in the cell / atoms per formula unit', () => {
    const csv = 'material,method,source,unit,frequency,density\nX,M,src,cm-1,100,0\nX,M,src,cm-1,300,1\nX,M,src,cm-1,500,0\n';
    const perCell = computeFromFile(csv, references(6, 6), [300]).values; // Z = 1
    const perFu = computeFromFile(csv, references(6, 2), [300]).values; // Z = 3
    for (let i = 0; i < perCell.length; i++) expect(perFu[i].value).toBeCloseTo(perCell[i].value / 3, 12);
  });

  it('gives one entropy and one heat capacity per temperature, identities shaped like a typed-in calculation row', () => {
    const csv = 'material,method,source,unit,frequency,density\nX,M,src,cm-1,100,0\nX,M,src,cm-1,300,1\nX,M,src,cm-1,500,0\n';
    const { values } = computeFromFile(csv, references(2, 1), [100, 298.15]);
    expect(values.map((v) => [v.quantity, v.temperatureK])).toEqual([
      ['entropy', 100],
      ['heat-capacity', 100],
      ['entropy', 298.15],
      ['heat-capacity', 298.15],
    ]);
    expect(values[0].identity.split('\u001f')).toEqual(['calculations', 'mat-x', 'src-id', 'method-id', 'entropy', String(Number(values[0].valueText)), 'J/mol/K', '100', '', '', '', '', '']);
  });
});
