import { describe, expect, it } from 'vitest';
import { deriveMaterial, materialInputSchema, parseTags } from '@/lib/catalog/material-schema';
import { sourceInputSchema } from '@/lib/catalog/source-schema';
import { methodInputSchema } from '@/lib/catalog/method-schema';
import { parseListParams } from '@/lib/catalog/list-params';

function errorsOf(result: { success: boolean; error?: { issues: Array<{ path: PropertyKey[]; message: string }> } }) {
  const out: Record<string, string> = {};
  for (const i of result.error?.issues ?? []) out[i.path.join('.')] ??= i.message;
  return out;
}

describe('materialInputSchema', () => {
  it('accepts form strings and turns blanks into "not given"', () => {
    const r = materialInputSchema.parse({ name: 'GaN-wz', displayName: '', formula: 'GaN', spaceGroup: '186', atomsInCell: '4', externalId: '', tags: 'Semiconductor, nitride, semiconductor' });
    expect(r).toEqual({ name: 'GaN-wz', displayName: undefined, formula: 'GaN', spaceGroup: 186, atomsInCell: 4, externalId: undefined, tags: ['semiconductor', 'nitride'] });
  });

  it('names the position of an unknown element', () => {
    const r = materialInputSchema.safeParse({ name: 'x', formula: 'GaXx', tags: '' });
    expect(errorsOf(r).formula).toMatch(/unknown element symbol "Xx" at position 3/);
  });

  it('refuses a space group outside 1–230', () => {
    expect(errorsOf(materialInputSchema.safeParse({ name: 'x', formula: 'Si', spaceGroup: '231', tags: '' })).spaceGroup).toMatch(/between 1 and 230/);
    expect(errorsOf(materialInputSchema.safeParse({ name: 'x', formula: 'Si', spaceGroup: '0', tags: '' })).spaceGroup).toMatch(/between 1 and 230/);
    expect(errorsOf(materialInputSchema.safeParse({ name: 'x', formula: 'Si', spaceGroup: '12.5', tags: '' })).spaceGroup).toMatch(/whole number/);
  });

  it('refuses a name with spaces', () => {
    expect(errorsOf(materialInputSchema.safeParse({ name: 'Ga N', formula: 'GaN', tags: '' })).name).toMatch(/letters, digits/);
  });

  it('derives the reduced formula, atoms per formula unit and crystal system', () => {
    // wurtzite GaN: P6_3mc, space group 186 (hexagonal; International Tables for Crystallography A)
    expect(deriveMaterial({ formula: 'Ga2N2', spaceGroup: 186 })).toEqual({
      reducedFormula: 'GaN',
      atomsPerFormulaUnit: 4,
      elementCounts: { Ga: 2, N: 2 },
      crystalSystem: 'hexagonal',
    });
    expect(deriveMaterial({ formula: 'Al2O3', spaceGroup: undefined }).crystalSystem).toBeNull();
  });

  it('reads the Cp − Cv fields from form text or JSON numbers; blank or null is "not given"', () => {
    // MgO, handbook values from memory (tests/unit/science/heat-capacity.test.ts)
    const form = materialInputSchema.parse({ name: 'MgO', formula: 'MgO', tags: '', thermalExpansionPerK: ' 3.12e-5 ', bulkModulusGpa: '160', molarVolumeCm3: '11.25' });
    expect(form).toMatchObject({ thermalExpansionPerK: 3.12e-5, bulkModulusGpa: 160, molarVolumeCm3: 11.25 });
    const json = materialInputSchema.parse({ name: 'MgO', formula: 'MgO', tags: [], thermalExpansionPerK: -2.7e-5, bulkModulusGpa: null, molarVolumeCm3: '' });
    expect(json).toMatchObject({ thermalExpansionPerK: -2.7e-5, bulkModulusGpa: undefined, molarVolumeCm3: undefined });
  });

  it('refuses a thermal expansion that looks like a percentage or 10⁻⁶ K⁻¹, and a bulk modulus or molar volume out of range', () => {
    const bad = errorsOf(materialInputSchema.safeParse({ name: 'x', formula: 'MgO', tags: '', thermalExpansionPerK: '31.2', bulkModulusGpa: 2500, molarVolumeCm3: '-3' }));
    expect(bad.thermalExpansionPerK).toMatch(/too large for a solid.*percentage/);
    expect(bad.bulkModulusGpa).toMatch(/not below 2000 GPa/);
    expect(bad.molarVolumeCm3).toMatch(/greater than 0/);
    expect(errorsOf(materialInputSchema.safeParse({ name: 'x', formula: 'MgO', tags: '', thermalExpansionPerK: true })).thermalExpansionPerK).toMatch(/must be a number/);
    expect(errorsOf(materialInputSchema.safeParse({ name: 'x', formula: 'MgO', tags: '', bulkModulusGpa: Number.POSITIVE_INFINITY })).bulkModulusGpa).toMatch(/must be a number/);
    // the bound itself: 1e-3 K⁻¹ passes, just above it does not
    expect(materialInputSchema.safeParse({ name: 'x', formula: 'MgO', tags: '', thermalExpansionPerK: '1e-3' }).success).toBe(true);
    expect(materialInputSchema.safeParse({ name: 'x', formula: 'MgO', tags: '', thermalExpansionPerK: '1.01e-3' }).success).toBe(false);
  });

  it('parses tags from a list or comma-separated text', () => {
    expect(parseTags(['Oxide', ' halide '])).toEqual(['oxide', 'halide']);
    expect(parseTags('')).toEqual([]);
  });
});

describe('sourceInputSchema', () => {
  it('strips a doi.org prefix', () => {
    const r = sourceInputSchema.parse({ kind: 'journal-article', citeKey: 'parker1967', title: 'Raman scattering by silicon and germanium', doi: 'https://doi.org/10.1103/PhysRev.155.712', year: '1967' });
    expect(r.doi).toBe('10.1103/physrev.155.712');
    expect(r.year).toBe(1967);
  });

  it('refuses a DOI that is not one', () => {
    expect(errorsOf(sourceInputSchema.safeParse({ kind: 'journal-article', citeKey: 'k', doi: 'hello' })).doi).toMatch(/not a DOI/);
  });

  it('needs a notebook reference for an in-house notebook', () => {
    expect(errorsOf(sourceInputSchema.safeParse({ kind: 'in-house-notebook', citeKey: 'nb1' })).notebookRef).toMatch(/notebook reference/);
    expect(sourceInputSchema.safeParse({ kind: 'in-house-notebook', citeKey: 'nb1', notebookRef: 'LL-3 p.12', recordedOn: '2024-03-05' }).success).toBe(true);
  });

  it('needs a title for the other kinds', () => {
    expect(errorsOf(sourceInputSchema.safeParse({ kind: 'data-set', citeKey: 'ds', url: 'https://zenodo.org/records/1' })).title).toMatch(/title is required/);
    expect(sourceInputSchema.safeParse({ kind: 'data-set', citeKey: 'ds', title: 'Phonons of 1500 oxides (invented)', url: 'https://zenodo.org/records/1' }).success).toBe(true);
  });

  it('refuses a date that is not YYYY-MM-DD and a URL that is not http(s)', () => {
    expect(errorsOf(sourceInputSchema.safeParse({ kind: 'in-house-notebook', citeKey: 'n', notebookRef: 'a', recordedOn: '5/3/2024' })).recordedOn).toMatch(/YYYY-MM-DD/);
    expect(errorsOf(sourceInputSchema.safeParse({ kind: 'data-set', citeKey: 'n', url: 'ftp://x.org/a' })).url).toMatch(/http/);
  });
});

describe('methodInputSchema', () => {
  it('reads grids and the LO–TO choice', () => {
    const r = methodInputSchema.parse({ label: 'PBEsol-PAW', functional: 'PBEsol', kGrid: '8x8x6', qGrid: '4x4x3', cutoffEv: '520', approach: 'perturbation', nonAnalyticCorrection: 'yes' });
    expect(r).toMatchObject({ kGrid: [8, 8, 6], qGrid: [4, 4, 3], cutoffEv: 520, approach: 'perturbation', nonAnalyticCorrection: true });
  });

  it('explains a malformed grid and a negative cutoff', () => {
    const e = errorsOf(methodInputSchema.safeParse({ label: 'x', functional: 'PBE', kGrid: '8x8', cutoffEv: '-1' }));
    expect(e.kGrid).toMatch(/three positive whole numbers like "8x8x8", got "8x8"/);
    expect(e.cutoffEv).toMatch(/greater than 0/);
  });
});

describe('parseListParams', () => {
  it('falls back to defaults for junk and keeps the allowed page sizes', () => {
    expect(parseListParams({ page: '-3', size: '7', dir: 'sideways' })).toMatchObject({ page: 1, size: 50, dir: 'asc', retracted: false });
    expect(parseListParams({ page: '3', size: '1000', dir: 'desc', retracted: '1', q: ' GaN ' })).toMatchObject({ page: 3, size: 1000, dir: 'desc', retracted: true, q: 'GaN' });
  });
});

describe('NUL bytes in text fields', () => {
  it('are refused in a method\'s notes and label, as in import notes', () => {
    const ok = methodInputSchema.safeParse({ label: 'PBE-PAW', functional: 'PBE', notes: 'plain notes' });
    expect(ok.success).toBe(true);
    expect(errorsOf(methodInputSchema.safeParse({ label: 'PBE-PAW', functional: 'PBE', notes: 'before\u0000after' })).notes).toBe('Remove the NUL byte (character code 0).');
    expect(errorsOf(methodInputSchema.safeParse({ label: 'PBE\u0000PAW', functional: 'PBE' })).label).toBe('Remove the NUL byte (character code 0).');
  });
});
