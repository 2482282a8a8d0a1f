import { describe, expect, it } from 'vitest';
import { detectFormat, parseReferences, describeReferenceError } from '@/lib/citations/import';
import { exportSources } from '@/lib/citations/export';
import { storedSource } from '@/lib/citations/stored';
import { howToCiteSource } from '@/lib/citations/how-to-cite';
import { normalizeDoi } from '@/lib/catalog/doi';
import { readBibtexIndependently, readCslJsonIndependently, readRisIndependently } from '../../support/reference-checkers';

// Invented entries (the people and titles do not exist) built to exercise BibTeX's hard parts:
// particles (van der, de la, von), hyphenated family names, accents written as TeX commands,
// braces protecting case, a braced organisation and a "Jr." suffix.
const TRICKY = String.raw`@string{prb = "Phys. Rev. B"}

@article{vanderberg2011,
  author  = {van der Berg, Johanna and de la Cruz-Ob{\'e}nita, Jos{\'e} and M{\"u}ller-L{\"u}denscheid, S{\'e}gol{\`e}ne and von Stra{\ss}burg, Lothar},
  title   = {Zone-centre phonons of {GaN} and {AlN} under {\c{c}}ompression: a {Raman} study (invented)},
  journal = prb,
  volume  = {84}, number = {12}, pages = {125201--125209},
  year    = 2011,
  doi     = {https://doi.org/10.9999/Invented.PRB.84.125201}
}

@article{oyelaran2019,
  author  = {{Halden Phonon Group} and Oyelaran, Jr., Ad{\'e}{\`o}la and N{\o}rgaard, Bj{\o}rn},
  title   = {Entropies of {$\alpha$}-quartz from a phonon density of states (invented)},
  journal = {J. Invented Phys.},
  volume  = {7}, pages = {L12},
  year    = {2019},
  doi     = {10.9999/invented.2019.l12}
}
`;

describe('BibTeX with particles, hyphens, accents and braces', () => {
  const parsed = parseReferences(TRICKY, 'bibtex');

  it('imports every entry with structured names', () => {
    expect(parsed.errors).toEqual([]);
    expect(parsed.sources.map((s) => s.citeKey)).toEqual(['vanderberg2011', 'oyelaran2019']);
    expect(parsed.sources[0].authors).toEqual([
      { family: 'Berg', given: 'Johanna', particle: 'van der' },
      { family: 'Cruz-Obénita', given: 'José', particle: 'de la' },
      { family: 'Müller-Lüdenscheid', given: 'Ségolène' },
      { family: 'Straßburg', given: 'Lothar', particle: 'von' },
    ]);
    expect(parsed.sources[1].authors).toEqual([{ literal: 'Halden Phonon Group' }, { family: 'Oyelaran', given: 'Adéòla', suffix: 'Jr.' }, { family: 'Nørgaard', given: 'Bjørn' }]);
    expect(parsed.sources[0]).toMatchObject({ venue: 'Phys. Rev. B', volume: '84', issue: '12', pages: '125201–125209', year: 2011, doi: '10.9999/invented.prb.84.125201' });
  });

  it('exports it unchanged in meaning, read by an independent BibTeX parser (@retorquere/bibtex-parser)', () => {
    const exported = exportSources(parsed.sources.map(storedSource), 'bibtex');
    const before = readBibtexIndependently(TRICKY);
    const after = readBibtexIndependently(exported);
    expect(before.errors).toEqual([]);
    expect(after.errors).toEqual([]);
    const normalised = (r: (typeof before.records)[number]) => ({ ...r, doi: normalizeDoi(r.doi).ok ? (normalizeDoi(r.doi) as { doi: string }).doi : r.doi });
    const sorted = (list: typeof before.records) => list.map(normalised).sort((a, b) => a.key.localeCompare(b.key));
    expect(sorted(after.records)).toEqual(sorted(before.records));
    expect(after.records[0].authors[0]).toEqual({ family: 'Halden Phonon Group', given: '' });
  });

  it('comes back from its own export as the same sources', () => {
    const stored = parsed.sources.map(storedSource);
    for (const format of ['bibtex', 'ris', 'csl-json'] as const) {
      const back = parseReferences(exportSources(stored, format), format);
      expect(back.errors, format).toEqual([]);
      const byKey = (list: typeof stored) => [...list].sort((a, b) => a.citeKey.localeCompare(b.citeKey));
      expect(byKey(back.sources.map(storedSource)), format).toEqual(byKey(stored));
    }
  });
});

describe('bad input', () => {
  it('BibTeX syntax errors name their line; entries without a title or with a repeated cite key are refused one by one', () => {
    const bib = `@article{good, title={Fine}, author={Doe, J.}, year=2020}\n@article{unclosed, title={Oops}\n@article{notitle, author={Doe, J.}, year=2021}\n@article{good, title={Again}}\n@article{baddoi, title={X}, doi={10.99/x}}\n`;
    const r = parseReferences(bib, 'bibtex');
    expect(r.errors.map(describeReferenceError)).toEqual([
      expect.stringMatching(/^Entry 2 \(unclosed\), line 2: not valid BibTeX/),
      expect.stringMatching(/^Entry 3 \(notitle\), line 3: title: A title is required/),
      'Entry 4 (good), line 4: the cite key "good" is already used by entry 1 of this file.',
      expect.stringMatching(/^Entry 5 \(baddoi\), line 5: doi: "10.99\/x" is not a DOI/),
    ]);
    expect(r.errors.find((e) => e.citeKey === 'unclosed')?.syntax).toBe(true);
  });

  it('RIS: a line that is not "XX  - value", a record without ER, a tag outside a record', () => {
    const ris = 'TY  - JOUR\nTI  - One\nthis is not RIS\nER  - \nAU  - Stray, A.\nTY  - JOUR\nTI  - Two\n';
    const r = parseReferences(ris, 'ris');
    expect(r.errors.map((e) => [e.line, e.syntax])).toEqual([
      [3, true],
      [5, true],
      [6, true],
    ]);
    expect(r.errors[0].message).toMatch(/not a RIS line/);
    expect(r.errors[2].message).toMatch(/no closing "ER {2}- " line/);
  });

  it('CSL-JSON: a syntax error names its line; an item without a title is refused', () => {
    const broken = '[\n  {"type": "article-journal", "id": "a", "title": "T"},\n  {"type": "book" "id": "b"}\n]';
    const r = parseReferences(broken, 'csl-json');
    expect(r.errors).toEqual([expect.objectContaining({ entry: 0, line: 3, syntax: true, message: expect.stringMatching(/^not valid JSON/) })]);
    const untitled = parseReferences('[\n{"type": "article-journal", "id": "a", "title": "T"},\n{"type": "book", "id": "b"}\n]', 'csl-json');
    expect(untitled.errors).toEqual([expect.objectContaining({ entry: 2, citeKey: 'b', line: 3, syntax: false, message: expect.stringMatching(/title: A title is required/) })]);
  });

  it('recognises the format from the text', () => {
    expect(detectFormat(TRICKY)).toBe('bibtex');
    expect(detectFormat('TY  - JOUR\nER  - \n')).toBe('ris');
    expect(detectFormat(' [{"type":"book"}]')).toBe('csl-json');
    expect(detectFormat('hello')).toBeNull();
  });
});

describe('what a DOI resolver or reference manager gives', () => {
  // Azuhata et al., J. Phys.: Condens. Matter 7, L129 (1995) — shared/reference/check-values.md
  it('RIS with "Family G." authors and an end page', () => {
    const ris = 'TY  - JOUR\nAU  - Azuhata T.\nAU  - Sota, T.\nAU  - K. Suzuki\nAU  - Nakamura S\nTI  - Polarized Raman spectra in GaN\nT2  - J. Phys.: Condens. Matter\nVL  - 7\nIS  - 10\nSP  - L129\nPY  - 1995\nDO  - 10.1088/0953-8984/7/10/002\nER  - \n';
    const [s] = parseReferences(ris, 'ris').sources;
    expect(s).toMatchObject({ citeKey: 'azuhata1995', kind: 'journal-article', venue: 'J. Phys.: Condens. Matter', volume: '7', issue: '10', pages: 'L129', year: 1995 });
    expect(s.authors.map((a) => [a.family, a.given])).toEqual([
      ['Azuhata', 'T.'],
      ['Sota', 'T.'],
      ['Suzuki', 'K.'],
      ['Nakamura', 'S.'],
    ]);
  });

  it('CSL-JSON items without a cite key get one from the first author and the year', () => {
    const csl = JSON.stringify([{ type: 'article-journal', id: 'https://doi.org/10.1103/PhysRev.155.712', title: 'Raman Scattering by Silicon and Germanium', author: [{ family: 'Parker', given: 'J. H.' }], issued: { 'date-parts': [[1967, 5]] }, 'container-title': 'Physical Review', volume: 155, page: '712-716', DOI: '10.1103/PhysRev.155.712' }]);
    const [s] = parseReferences(csl, 'csl-json').sources;
    expect(s).toMatchObject({ citeKey: 'parker1967', doi: '10.1103/physrev.155.712', volume: '155', pages: '712–716', year: 1967 });
  });
});

describe('exports read by independent parsers', () => {
  const notebook = storedSource(
    parseReferences(JSON.stringify([{ type: 'manuscript', id: 'lab-nb-3', title: 'Raman of the new batch (invented)', author: [{ literal: 'Halden Phonon Group' }], issued: { 'date-parts': [[2024, 3, 5]] }, note: 'Notebook: LN-3 p. 41; Instrument: Raman microscope, 532 nm; Operator: A. Example; Recorded: 2024-03-05' }]), 'csl-json').sources[0],
  );
  it('keeps in-house fields through the note', () => {
    expect(notebook).toMatchObject({ kind: 'in-house-notebook', notebookRef: 'LN-3 p. 41', instrument: 'Raman microscope, 532 nm', operator: 'A. Example', recordedOn: '2024-03-05', gaps: [] });
  });
  it('RIS (astrocite-ris) and CSL-JSON (ajv, CSL 1.0.2 variables) accept what we write', () => {
    const sources = [notebook, ...parseReferences(TRICKY, 'bibtex').sources.map(storedSource)];
    expect(readRisIndependently(exportSources(sources, 'ris')).map((r) => r.key)).toEqual(['lab-nb-3', 'oyelaran2019', 'vanderberg2011']);
    const csl = readCslJsonIndependently(exportSources(sources, 'csl-json'));
    expect(csl.errors).toEqual([]);
    expect(csl.records[2].authors[0]).toEqual({ family: 'van der Berg', given: 'Johanna' });
  });
});

describe('how to cite', () => {
  // Parker, Feldman & Ashkin, Phys. Rev. 155, 712 (1967) — shared/reference/check-values.md; rendered by citeproc-js (APA and Vancouver styles shipped with @citation-js/plugin-csl).
  const parker = storedSource(parseReferences('TY  - JOUR\nAU  - Parker, J. H.\nAU  - Feldman, D. W.\nAU  - Ashkin, M.\nTI  - Raman scattering by silicon and germanium\nT2  - Physical Review\nVL  - 155\nSP  - 712\nPY  - 1967\nDO  - 10.1103/PhysRev.155.712\nID  - parker1967\nER  - \n', 'ris').sources[0]);
  // citeproc-js compiles a style on first use (a few seconds here).
  it('renders APA and Vancouver', { timeout: 30_000 }, () => {
    expect(howToCiteSource(parker, 'apa')).toBe('Parker, J. H., Feldman, D. W., & Ashkin, M. (1967). Raman scattering by silicon and germanium. Physical Review, 155, 712. https://doi.org/10.1103/physrev.155.712');
    expect(howToCiteSource(parker, 'vancouver')).toBe('Parker JH, Feldman DW, Ashkin M. Raman scattering by silicon and germanium. Physical Review. 1967;155:712. doi:10.1103/physrev.155.712');
  });
});
