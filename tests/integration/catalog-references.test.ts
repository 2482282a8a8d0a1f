import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, source } from '@/db/schema';
import { importReferencesAction } from '@/app/(app)/w/[workspace]/sources/actions';
import { GET as exportRoute } from '@/app/api/workspaces/[workspaceId]/sources/export/route';
import { GET as exportBibtex } from '@/app/api/workspaces/[workspaceId]/sources/bibtex/route';
import { parseReferences } from '@/lib/citations/import';
import { callAction } from '../support/actions';
import { createWorkspaceWith, signInAs } from '../support/users';

type Action = Parameters<typeof callAction>[0];
const run = async (action: unknown, fields: Record<string, string>) => (await callAction(action as Action, fields)).state!;

// Real references from shared/reference/check-values.md:
//  Azuhata et al., J. Phys.: Condens. Matter 7, L129 (1995) — GaN Raman modes
//  Parker, Feldman & Ashkin, Phys. Rev. 155, 712 (1967) — Si and Ge optical phonons
// The thesis entry is invented for the test.
const BIB = `% references for the GaN and Si checks
@string{pr = "Physical Review"}

@article{azuhata1995,
  author  = {Azuhata, T. and Sota, T. and Suzuki, K. and Nakamura, S.},
  title   = {Polarized {Raman} spectra in {GaN}},
  journal = {Journal of Physics: Condensed Matter},
  volume  = {7}, number = {10}, pages = {L129},
  year    = {1995},
  doi     = {10.1088/0953-8984/7/10/002}
}

@article{parker1967,
  author  = {Parker, J. H. and Feldman, D. W. and Ashkin, M.},
  title   = {Raman Scattering by Silicon and Germanium},
  journal = pr,
  volume  = {155}, pages = {712},
  year    = 1967,
  doi     = {https://doi.org/10.1103/PhysRev.155.712}
}

@phdthesis{example2021thesis,
  author = {Example, Ada},
  title  = {Zone-centre phonons of wide-gap nitrides (invented)},
  school = {Example University},
  year   = {2021}
}
`;

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;

beforeAll(async () => {
  ws = await createWorkspaceWith(['contributor', 'reviewer']);
  other = await createWorkspaceWith(['curator', 'contributor']);
});

function get(workspaceId: string, query = '', route = exportRoute) {
  return route(new Request(`http://localhost:3999/api/workspaces/${workspaceId}/sources/export${query}`), { params: Promise.resolve({ workspaceId }) });
}

const sourcesOf = (workspaceId: string) => db.select().from(source).where(eq(source.workspaceId, workspaceId));

describe('reference import', () => {
  it('imports every BibTeX entry in one transaction with structured fields and an audit row each; entries already here are reported', async () => {
    await signInAs(ws.members.contributor.email);
    const first = await run(importReferencesAction, { workspaceId: ws.workspaceId, references: BIB });
    expect(first).toMatchObject({ ok: true, message: 'Imported 3 sources from BibTeX.' });
    const rows = await sourcesOf(ws.workspaceId);
    expect(rows.find((r) => r.citeKey === 'azuhata1995')).toMatchObject({
      kind: 'journal-article',
      venue: 'Journal of Physics: Condensed Matter',
      volume: '7',
      issue: '10',
      pages: 'L129',
      authorList: [
        { family: 'Azuhata', given: 'T.' },
        { family: 'Sota', given: 'T.' },
        { family: 'Suzuki', given: 'K.' },
        { family: 'Nakamura', given: 'S.' },
      ],
      authors: 'Azuhata, T.; Sota, T.; Suzuki, K.; Nakamura, S.',
      gaps: [],
    });
    expect(rows.find((r) => r.citeKey === 'parker1967')).toMatchObject({ doi: '10.1103/physrev.155.712', venue: 'Physical Review' });
    expect(rows.find((r) => r.citeKey === 'example2021thesis')).toMatchObject({ kind: 'thesis', publisher: 'Example University', gaps: ['identifier'] });
    const audits = await db.select().from(auditLog).where(eq(auditLog.workspaceId, ws.workspaceId));
    expect(audits.filter((a) => a.entityType === 'source' && a.action === 'create')).toHaveLength(3);

    const second = await run(importReferencesAction, { workspaceId: ws.workspaceId, references: BIB });
    expect(second).toMatchObject({ ok: true, message: 'Imported 0 sources from BibTeX. Already present, not duplicated: azuhata1995, parker1967, example2021thesis.' });
    expect(await sourcesOf(ws.workspaceId)).toHaveLength(3);
  });

  it('imports RIS and CSL-JSON the same way', async () => {
    const ris = 'TY  - JOUR\nAU  - Hass M.\nAU  - Henvis B. W.\nTI  - Infrared lattice reflection spectra of III-V compound semiconductors\nT2  - J. Phys. Chem. Solids\nVL  - 23\nSP  - 1099\nPY  - 1962\nID  - hass1962\nER  - \n';
    expect(await run(importReferencesAction, { workspaceId: ws.workspaceId, references: ris })).toMatchObject({ ok: true, message: 'Imported 1 source from RIS.' });
    const csl = JSON.stringify([{ id: 'codata1989', type: 'book', title: 'CODATA Key Values for Thermodynamics', author: [{ family: 'Cox', given: 'J. D.' }, { family: 'Wagman', given: 'D. D.' }, { family: 'Medvedev', given: 'V. A.' }], issued: { 'date-parts': [[1989]] }, publisher: 'Hemisphere' }]);
    expect(await run(importReferencesAction, { workspaceId: ws.workspaceId, references: csl, format: 'csl-json' })).toMatchObject({ ok: true, message: 'Imported 1 source from CSL-JSON.' });
    const rows = await sourcesOf(ws.workspaceId);
    expect(rows.find((r) => r.citeKey === 'hass1962')?.authorList).toEqual([
      { family: 'Hass', given: 'M.' },
      { family: 'Henvis', given: 'B. W.' },
    ]);
    expect(rows.find((r) => r.citeKey === 'codata1989')).toMatchObject({ kind: 'data-set', publisher: 'Hemisphere' });
  });

  it('imports nothing when the text has a syntax error, and says where', async () => {
    const bib = `@article{fresh1, title={A}, doi={10.1000/a}}\n@article{fresh2, title={B}\n`;
    const state = await run(importReferencesAction, { workspaceId: ws.workspaceId, references: bib });
    expect(state).toMatchObject({ ok: false, code: 'unprocessable', message: 'Nothing imported: the BibTeX text has an error.' });
    expect(state.fieldErrors?.references).toEqual([expect.stringMatching(/^Entry 2 \(fresh2\), line 2: not valid BibTeX/)]);
    expect(await db.select().from(source).where(eq(source.citeKey, 'fresh1'))).toHaveLength(0);
  });

  it('refuses, entry by entry, a missing title, a cite key used by a different source and a DOI that is already a source', async () => {
    const bib = [
      '@article{fresh3, title={Fine (invented)}, author={Doe, J.}, year=2020, doi={10.9999/fresh3}}',
      '@article{untitled, author={Doe, J.}, year=2020}',
      '@article{azuhata1995, title={Something else entirely (invented)}, doi={10.9999/other}}',
      '@article{parker-again, title={Raman scattering by silicon and germanium}, doi={10.1103/PHYSREV.155.712}}',
    ].join('\n');
    const parsed = await run(importReferencesAction, { workspaceId: ws.workspaceId, references: bib });
    expect(parsed).toMatchObject({ ok: false, message: 'Nothing imported: 1 entry is refused.' });
    expect(parsed.fieldErrors?.references).toEqual([expect.stringMatching(/^Entry 2 \(untitled\), line 2: title: A title is required/)]);

    const state = await run(importReferencesAction, { workspaceId: ws.workspaceId, references: bib.split('\n').filter((l) => !l.includes('untitled')).join('\n') });
    expect(state).toMatchObject({ ok: false, message: 'Nothing imported: 2 entries are refused.' });
    expect(state.fieldErrors?.references).toEqual([
      'Entry 2 (azuhata1995), line 2: the cite key "azuhata1995" is already used by a different source in this workspace ("Polarized Raman spectra in GaN").',
      'Entry 3 (parker-again), line 3: the DOI 10.1103/physrev.155.712 is already the source "parker1967" in this workspace.',
    ]);
    expect(await db.select().from(source).where(eq(source.citeKey, 'fresh3'))).toHaveLength(0);
  });

  it('refuses a reviewer', async () => {
    await signInAs(ws.members.reviewer.email);
    expect(await run(importReferencesAction, { workspaceId: ws.workspaceId, references: BIB })).toMatchObject({ ok: false, code: 'forbidden' });
  });
});

describe('reference export', () => {
  it('exports BibTeX, RIS and CSL-JSON that import back to the same sources', async () => {
    await signInAs(ws.members.reviewer.email);
    const rows = await sourcesOf(ws.workspaceId);
    const types = { bibtex: /^application\/x-bibtex/, ris: /^application\/x-research-info-systems/, 'csl-json': /^application\/vnd\.citationstyles\.csl\+json/ } as const;
    for (const format of ['bibtex', 'ris', 'csl-json'] as const) {
      const res = await get(ws.workspaceId, `?format=${format}`);
      expect(res.status, format).toBe(200);
      expect(res.headers.get('content-type')).toMatch(types[format]);
      expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename=".*-sources\.(bib|ris|json)"$/);
      const back = parseReferences(await res.text(), format);
      expect(back.errors, format).toEqual([]);
      expect(back.sources.map((s) => s.citeKey).sort(), format).toEqual(rows.map((r) => r.citeKey).sort());
      for (const s of back.sources) {
        const row = rows.find((r) => r.citeKey === s.citeKey)!;
        expect({ authors: s.authors, title: s.title, year: s.year, volume: s.volume, pages: s.pages, doi: s.doi }, `${format} ${s.citeKey}`).toEqual({
          authors: row.authorList,
          title: row.title,
          year: row.year ?? undefined,
          volume: row.volume ?? undefined,
          pages: row.pages ?? undefined,
          doi: row.doi ?? undefined,
        });
      }
    }
    expect((await get(ws.workspaceId, '?format=docx')).status).toBe(400);
    const bib = await (await get(ws.workspaceId, '', exportBibtex)).text();
    expect(bib).toMatch(/author = \{Azuhata, T\. and Sota, T\. and Suzuki, K\. and Nakamura, S\.\}/);
  });

  it('exports only the requested ids, and refuses ids of another workspace', async () => {
    const [azuhata] = await db.select().from(source).where(and(eq(source.workspaceId, ws.workspaceId), eq(source.citeKey, 'azuhata1995')));
    const one = await (await get(ws.workspaceId, `?format=ris&ids=${azuhata.id}`)).text();
    expect(parseReferences(one, 'ris').sources.map((s) => s.citeKey)).toEqual(['azuhata1995']);
    await signInAs(other.members.curator.email);
    expect((await get(other.workspaceId, `?ids=${azuhata.id}`)).status).toBe(404);
    expect((await get(ws.workspaceId)).status).toBe(404);
  });
});
