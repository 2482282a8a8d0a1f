import { describe, expect, it } from 'vitest';
import { countPairsOnIncompleteSources, describeGaps, sourceGaps } from '@/lib/citations/completeness';
import { normaliseSourceRow } from '@/lib/catalog/source-schema';
import { normalizeDoi } from '@/lib/catalog/doi';
import { storedSource } from '@/lib/citations/stored';
import { shortCitation } from '@/lib/citations/short-citation';

function stored(row: Record<string, unknown>) {
  const r = normaliseSourceRow(row);
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return storedSource(r.source);
}

// Azuhata et al., J. Phys.: Condens. Matter 7, L129 (1995) — shared/reference/check-values.md
const AZUHATA = { kind: 'journal-article', citeKey: 'azuhata1995', title: 'Polarized Raman spectra in GaN', authors: 'Azuhata T.; Sota T.; Suzuki K.; Nakamura S.', year: '1995', venue: 'J. Phys.: Condens. Matter', volume: '7', pages: 'L129', doi: 'https://doi.org/10.1088/0953-8984/7/10/002' };

describe('incomplete sources', () => {
  it('a source with authors, a year and a DOI is complete', () => {
    expect(stored(AZUHATA).gaps).toEqual([]);
  });
  it('names what is missing', () => {
    expect(stored({ ...AZUHATA, authors: '', doi: '' }).gaps).toEqual(['authors', 'identifier']);
    expect(stored({ ...AZUHATA, year: '' }).gaps).toEqual(['year']);
    expect(stored({ ...AZUHATA, authors: 'Azuhata T. et al.' }).gaps).toEqual(['authors-review']);
    expect(describeGaps(['authors', 'identifier'])).toBe('Incomplete source: no authors, no DOI or notebook reference.');
  });
  it('in-house work counts its operator, recording date and notebook reference', () => {
    expect(sourceGaps({ kind: 'in-house-notebook', authorList: [], year: null, doi: null, notebookRef: 'LN-3 p. 41', operator: 'A. Example', recordedOn: '2024-03-05' })).toEqual([]);
    expect(sourceGaps({ kind: 'computed-data-set', authorList: [], year: 2026, doi: null, notebookRef: null, operator: null, recordedOn: null })).toEqual(['authors', 'identifier']);
  });
  it('counts the pairs that rest on at least one incomplete source', () => {
    const sources = new Map([
      ['ok', { gaps: [] }],
      ['bad', { gaps: ['identifier'] }],
    ]);
    const pairs = [{ sourceIds: ['ok'] }, { sourceIds: ['ok', 'bad'] }, { sourceIds: ['bad'] }, { sourceIds: ['unknown'] }];
    expect(countPairsOnIncompleteSources(pairs, sources)).toBe(2);
    expect(countPairsOnIncompleteSources([], sources)).toBe(0);
  });
});

describe('normaliseSourceRow (one row from a form, a CSV or JSON)', () => {
  it('splits names, strips and lower-cases the DOI, writes page ranges with an en dash', () => {
    const r = normaliseSourceRow({ ...AZUHATA, pages: '712--716' });
    expect(r).toMatchObject({ ok: true, review: [], source: { doi: '10.1088/0953-8984/7/10/002', pages: '712–716', year: 1995 } });
    if (r.ok) expect(r.source.authors[0]).toEqual({ family: 'Azuhata', given: 'T.' });
  });
  it('takes structured names as they are, and lists names kept as written', () => {
    const r = normaliseSourceRow({ ...AZUHATA, authors: [{ family: 'Azuhata', given: 'T.' }, 'Plato'] });
    expect(r).toMatchObject({ ok: true, review: ['Plato'] });
  });
  it('refuses a missing title, a bad DOI or a bad name, field by field', () => {
    const r = normaliseSourceRow({ ...AZUHATA, doi: '10.1088', authors: [{ given: 'T.' }] });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues.map((i) => i.field).sort()).toEqual(['authors.0', 'doi']);
    expect(normaliseSourceRow({ ...AZUHATA, title: '' })).toEqual({ ok: false, issues: [{ field: 'title', message: 'A title is required, so the source can be found and cited.' }] });
  });
});

describe('DOIs', () => {
  it.each([
    ['10.1103/PhysRev.155.712', '10.1103/physrev.155.712'],
    ['https://doi.org/10.1103/PhysRev.155.712', '10.1103/physrev.155.712'],
    ['http://dx.doi.org/10.1088/0953-8984/7/10/002', '10.1088/0953-8984/7/10/002'],
    ['doi:10.1103/PhysRevB.61.3391', '10.1103/physrevb.61.3391'],
    ['DOI 10.1103/PhysRevB.61.3391', '10.1103/physrevb.61.3391'],
    ['https://doi.org/10.1002%2Fjrs.1234', '10.1002/jrs.1234'],
  ])('%s → %s', (input, doi) => {
    expect(normalizeDoi(input)).toEqual({ ok: true, doi });
  });
  it.each(['10.1103', 'PhysRev.155.712', '10.12/abc', 'https://example.org/10.1103/x'])('refuses %s with a clear message', (input) => {
    expect(normalizeDoi(input)).toEqual({ ok: false, message: expect.stringMatching(/is not a DOI: expected 10\.NNNN\//) });
  });
});

describe('short citations', () => {
  it('in the one display format', () => {
    expect(shortCitation(stored(AZUHATA))).toBe('Azuhata et al., J. Phys.: Condens. Matter 7, L129 (1995)');
    expect(shortCitation(stored({ kind: 'in-house-notebook', citeKey: 'nb', notebookRef: 'LN-3 p. 41', operator: 'A. Example', recordedOn: '2024-03-05' }))).toBe('A. Example, notebook LN-3 p. 41 (2024-03-05)');
  });
});
