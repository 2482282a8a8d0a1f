import { describe, expect, it } from 'vitest';
import { doiUrl, normalizeDoi } from '@/lib/catalog/doi';

// DOI syntax: "10." + registrant code + "/" + suffix (DOI Handbook, section 2.2); DOIs are case-insensitive (ibid.), stored lower-case.
describe('normalizeDoi', () => {
  it('accepts a bare DOI, lower-cased', () => {
    expect(normalizeDoi('10.1103/PhysRev.155.712')).toEqual({ ok: true, doi: '10.1103/physrev.155.712' });
  });

  it('strips https://doi.org/, http://dx.doi.org/ and doi: prefixes', () => {
    expect(normalizeDoi('https://doi.org/10.1088/0953-8984/7/10/002')).toEqual({ ok: true, doi: '10.1088/0953-8984/7/10/002' });
    expect(normalizeDoi('http://dx.doi.org/10.1103/PhysRevB.89.064305')).toEqual({ ok: true, doi: '10.1103/physrevb.89.064305' });
    expect(normalizeDoi('doi:10.1103/PhysRev.155.712')).toEqual({ ok: true, doi: '10.1103/physrev.155.712' });
    expect(normalizeDoi('  DOI: 10.5281/zenodo.1234  ')).toEqual({ ok: true, doi: '10.5281/zenodo.1234' });
  });

  it('keeps registrant sub-codes', () => {
    expect(normalizeDoi('10.1000.10/abc')).toEqual({ ok: true, doi: '10.1000.10/abc' });
  });

  it.each([
    ['not a doi'],
    ['10.1103'],
    ['10.12/too-short-registrant'],
    ['11.1103/PhysRev.155.712'],
    ['10.1103/'],
    ['10.1103/has space'],
    ['https://example.org/10.1103/PhysRev.155.712'],
  ])('refuses %s and says what a DOI looks like', (input) => {
    const result = normalizeDoi(input);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.message).toMatch(/10\.NNNN/);
  });

  it('refuses an empty value', () => {
    expect(normalizeDoi('doi:')).toEqual({ ok: false, message: 'A DOI is empty.' });
  });

  it('links to the doi.org resolver', () => {
    expect(doiUrl('10.1088/0953-8984/7/10/002')).toBe('https://doi.org/10.1088/0953-8984/7/10/002');
    expect(doiUrl('10.1002/(SICI)1097-4555')).toBe('https://doi.org/10.1002/(SICI)1097-4555');
  });
});
