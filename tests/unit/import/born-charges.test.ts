/**
 * Born-charge and dielectric-tensor rows through the browser preview (the same validateRow and
 * neutrality tally the server runs). Neutrality per Cartesian component is a fact of the trade
 * (common practice); the charges below are invented for the checks.
 */
import { describe, expect, it } from 'vitest';
import { previewCsv, type ReferenceLists } from '@/lib/import/preview';
import { parseSite, parseTensorCell, tensorMeanMismatch } from '@/lib/import/tensor-cells';

const references: ReferenceLists = {
  materials: [
    { name: 'GaN-wz', id: 'm-gan', atomsPerFormulaUnit: 2, atomsInCell: 4, elements: { Ga: 1, N: 1 } },
    { name: 'GaAs', id: 'm-gaas', atomsPerFormulaUnit: 2, atomsInCell: 2, elements: { Ga: 1, As: 1 } },
  ],
  sources: [{ citeKey: 'calc2026', id: 's-1' }],
  methods: [{ label: 'PBEsol', id: 'me-1' }],
};
const header = 'material,method,quantity,value,unit,site,tensor,source\n';
const ga = '2.60 0 0; 0 2.60 0; 0 0 2.74';
const n = '-2.60 0 0; 0 -2.60 0; 0 0 -2.74';

describe('Born-charge rows', () => {
  it('store the tensor, take the value as the diagonal mean when it is left empty, and pass a neutral cell without warning', () => {
    const text = `${header}GaN-wz,PBEsol,born-charge,,,Ga1,${ga},calc2026\nGaN-wz,PBEsol,born-charge,2.65,e,Ga2,${ga},calc2026\nGaN-wz,PBEsol,born-charge,,,N1,${n},calc2026\nGaN-wz,PBEsol,born-charge,,,N2,${n},calc2026\n`;
    const result = previewCsv(text, { kind: 'calculations', references });
    expect(result.errors).toEqual([]);
    expect(result).toMatchObject({ rowCount: 4, validCount: 4, errorCount: 0, warningCount: 0 });
    // the derived value is written with two decimals more than the tensor's cells; the typed 2.65 stays as typed
    expect(result.preview.map((p) => p.stored?.value)).toEqual(['2.6467\u00a0e', '2.65\u00a0e', '−2.6467\u00a0e', '−2.6467\u00a0e']);
  });

  it('warns on a small residue (sum rule not imposed) and names the component, importing all the same', () => {
    const nOff = '-2.58 0 0; 0 -2.58 0; 0 0 -2.67';
    const text = `${header}GaN-wz,PBEsol,born-charge,,,Ga1,${ga},calc2026\nGaN-wz,PBEsol,born-charge,,,Ga2,${ga},calc2026\nGaN-wz,PBEsol,born-charge,,,N1,${nOff},calc2026\nGaN-wz,PBEsol,born-charge,,,N2,${nOff},calc2026\n`;
    const result = previewCsv(text, { kind: 'calculations', references });
    expect(result.errorCount).toBe(0);
    expect(result.warnings).toHaveLength(1);
    // Σ zz = 2 × 2.74 − 2 × 2.67 = 0.14 e, beyond the 0.1 e limit
    expect(result.warnings[0].message).toMatch(/sum to 0\.14 e in the zz component over the 4 atoms of the cell/);
    expect(result.warnings[0].message).toMatch(/Imported all the same/);
  });

  it('refuses a cell far from neutral (a wrong sign), naming the material, method, row and sum', () => {
    const text = `${header}GaAs,PBEsol,born-charge,2.07,,Ga,,calc2026\nGaAs,PBEsol,born-charge,2.07,,As,,calc2026\n`;
    const result = previewCsv(text, { kind: 'calculations', references });
    expect(result.errorCount).toBe(1);
    expect(result.errors[0]).toMatchObject({ row: 2, column: 'tensor' });
    expect(result.errors[0].reason).toMatch(/GaAs \(PBEsol\) sum to 4\.14 e/);
  });

  it('checks one site per element per formula unit (scalars), and warns when some atoms are missing', () => {
    const perElement = `${header}GaN-wz,PBEsol,born-charge,2.64,,Ga,,calc2026\nGaN-wz,PBEsol,born-charge,-2.64,,N,,calc2026\n`;
    expect(previewCsv(perElement, { kind: 'calculations', references })).toMatchObject({ errorCount: 0, warningCount: 0 });
    const partial = `${header}GaN-wz,PBEsol,born-charge,,,Ga1,${ga},calc2026\nGaN-wz,PBEsol,born-charge,,,N1,${n},calc2026\nGaN-wz,PBEsol,born-charge,,,N2,${n},calc2026\n`;
    const result = previewCsv(partial, { kind: 'calculations', references });
    expect(result.errorCount).toBe(0);
    expect(result.warnings[0].message).toMatch(/not checked \(3 of the 4 atoms of the cell given\)/);
  });

  it('refuses malformed tensors, a value that is not the diagonal mean, and sites that are not atoms of the material', () => {
    const text = [
      `GaN-wz,PBEsol,born-charge,,,Ga1,2.6 0 0 0 2.6 0 0 0,calc2026`,
      `GaN-wz,PBEsol,born-charge,,,Ga2,2.6 0 0 0 2.6 0 0 0 inf,calc2026`,
      `GaN-wz,PBEsol,born-charge,2.70,,N1,${n},calc2026`,
      `GaN-wz,PBEsol,born-charge,2.6,,As1,,calc2026`,
      `GaN-wz,PBEsol,born-charge,2.6,,,,calc2026`,
      `GaN-wz,PBEsol,frequency,500,cm-1,Ga1,,calc2026`,
    ].join('\n');
    const result = previewCsv(`${header}${text}\n`, { kind: 'calculations', references });
    const by = (row: number) => result.errors.filter((e) => e.row === row).map((e) => `${e.column}: ${e.reason}`);
    expect(by(2)[0]).toMatch(/^tensor: A Born-charge tensor needs 9 numbers .*got 8/);
    expect(by(3)[0]).toMatch(/^tensor: Component 9 "inf" is not a finite number/);
    expect(by(4)[0]).toMatch(/^value: The value 2\.70 is not the mean of the tensor's diagonal \(-2\.64667\)/);
    expect(by(5)[0]).toMatch(/^site: As is not an element of this material \(Ga, N\)/);
    expect(by(6)[0]).toMatch(/^site: A Born charge needs its atom/);
    expect(by(7)[0]).toMatch(/^site: Only Born charges carry a site/);
  });

  it('refuses the same site twice with other values', () => {
    const text = `${header}GaAs,PBEsol,born-charge,2.07,,Ga,,calc2026\nGaAs,PBEsol,born-charge,2.10,,Ga,,calc2026\nGaAs,PBEsol,born-charge,-2.07,,As,,calc2026\n`;
    const result = previewCsv(text, { kind: 'calculations', references });
    expect(result.errors.some((e) => e.row === 3 && /Site Ga already has a Born charge in row 2/.test(e.reason))).toBe(true);
  });
});

describe('dielectric principal values', () => {
  it('take three values ≥ 1, the value being their mean', () => {
    const text = `${header}GaN-wz,PBEsol,eps-inf,,,,5.35 5.35 5.60,calc2026\nGaN-wz,PBEsol,eps-static,9.8,,,9.5 9.5 10.4,calc2026\nGaN-wz,PBEsol,eps-inf,,,,0.9 5 5,calc2026\n`;
    const result = previewCsv(text, { kind: 'calculations', references });
    expect(result.errors.map((e) => [e.row, e.column])).toEqual([[4, 'tensor']]);
    expect(result.errors[0].reason).toMatch(/Principal value 1 is 0\.9; a dielectric constant is ≥ 1/);
    expect(result.validCount).toBe(2);
  });
});

describe('cells', () => {
  it('read brackets and commas, and count components', () => {
    expect(parseTensorCell('born-charge', '[[2.6, 0, 0], [0, 2.6, 0], [0, 0, 2.74]]')).toEqual({ components: [2.6, 0, 0, 0, 2.6, 0, 0, 0, 2.74] });
    expect(parseTensorCell('frequency', '1 2 3')).toHaveProperty('reason');
  });
  it('allow half a unit of the last written decimal between a value and the diagonal mean', () => {
    expect(tensorMeanMismatch(2.65, '2.65', [2.6, 0, 0, 0, 2.6, 0, 0, 0, 2.74])).toBeNull();
    expect(tensorMeanMismatch(2.6, '2.6', [2.6, 0, 0, 0, 2.6, 0, 0, 0, 2.74])).toBeNull();
    expect(tensorMeanMismatch(2.64, '2.64', [2.6, 0, 0, 0, 2.6, 0, 0, 0, 2.74])).toMatch(/not the mean/);
  });
  it('read element sites', () => {
    expect(parseSite('O2')).toEqual({ site: 'O2' });
    expect(parseSite('Xx1')).toHaveProperty('reason');
    expect(parseSite('ga')).toHaveProperty('reason');
  });
});
