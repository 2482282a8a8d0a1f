import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, source } from '@/db/schema';
import { importBibtexAction } from '@/app/(app)/w/[workspace]/sources/actions';
import { GET as exportBibtex } from '@/app/api/workspaces/[workspaceId]/sources/bibtex/route';
import { parseBibtex } from '@/lib/bibtex';
import { createWorkspaceWith, signInAs } from '../support/users';

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
  volume  = {7}, number = {10}, pages = {L129--L133},
  year    = {1995},
  doi     = {10.1088/0953-8984/7/10/002}
}

@article{parker1967,
  author  = {Parker, J. H. and Feldman, D. W. and Ashkin, M.},
  title   = {Raman Scattering by Silicon and Germanium},
  journal = pr,
  volume  = {155}, pages = {712--714},
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

function form(fields: Record<string, string>) {
  const fd = new FormData();
  for (const [k, v] of Object.entries(fields)) fd.append(k, v);
  return fd;
}

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;

beforeAll(async () => {
  ws = await createWorkspaceWith(['contributor', 'reviewer']);
  other = await createWorkspaceWith(['curator']);
});

function get(workspaceId: string, query = '') {
  return exportBibtex(new Request(`http://localhost:3999/api/workspaces/${workspaceId}/sources/bibtex${query}`), { params: Promise.resolve({ workspaceId }) });
}

describe('BibTeX import and export', () => {
  it('maps entry types to source kinds and fields', () => {
    const parsed = parseBibtex(BIB);
    expect(parsed.errors).toEqual([]);
    expect(parsed.sources).toEqual([
      expect.objectContaining({ citeKey: 'azuhata1995', kind: 'journal-article', doi: '10.1088/0953-8984/7/10/002', year: 1995, venue: 'Journal of Physics: Condensed Matter', authors: 'Azuhata, T. and Sota, T. and Suzuki, K. and Nakamura, S.', title: 'Polarized Raman spectra in GaN' }),
      expect.objectContaining({ citeKey: 'parker1967', kind: 'journal-article', doi: '10.1103/PhysRev.155.712', year: 1967, venue: 'Physical Review' }),
      expect.objectContaining({ citeKey: 'example2021thesis', kind: 'thesis', venue: 'Example University' }),
    ]);
  });

  it('names the entry, cite key and line of a syntax error and of a bad DOI', () => {
    const broken = `@article{good, title={Fine}, doi={10.1103/PhysRev.155.712}}\n@article{unclosed, title={Oops}\n@article{baddoi, title={X}, doi={10.99/x}}\n`;
    const parsed = parseBibtex(broken);
    expect(parsed.errors).toEqual([
      expect.objectContaining({ entry: 2, citeKey: 'unclosed', line: 2, message: expect.stringMatching(/not valid BibTeX/) }),
      expect.objectContaining({ entry: 3, citeKey: 'baddoi', line: 3, message: expect.stringMatching(/doi: .*not a DOI/) }),
    ]);
  });

  it('imports every entry in one transaction with an audit row each; known cite keys are reported, not duplicated', async () => {
    await signInAs(ws.members.contributor.email);
    const first = await importBibtexAction(undefined, form({ workspaceId: ws.workspaceId, bibtex: BIB }));
    expect(first).toMatchObject({ ok: true, message: 'Imported 3 sources.' });
    const rows = await db.select().from(source).where(eq(source.workspaceId, ws.workspaceId));
    expect(rows.map((r) => r.citeKey).sort()).toEqual(['azuhata1995', 'example2021thesis', 'parker1967']);
    const audits = await db.select().from(auditLog).where(eq(auditLog.workspaceId, ws.workspaceId));
    expect(audits.filter((a) => a.entityType === 'source' && a.action === 'create')).toHaveLength(3);

    const second = await importBibtexAction(undefined, form({ workspaceId: ws.workspaceId, bibtex: BIB }));
    expect(second.ok).toBe(true);
    expect(second.message).toMatch(/Imported 0 sources\. Already present, not duplicated: azuhata1995, parker1967, example2021thesis/);
    expect(await db.select().from(source).where(eq(source.workspaceId, ws.workspaceId))).toHaveLength(3);
  });

  it('imports nothing when one entry is broken, and says which', async () => {
    const bib = `@article{fresh1, title={A}, doi={10.1000/a}}\n@article{fresh2, title={B}, doi={not-a-doi}}\n`;
    const state = await importBibtexAction(undefined, form({ workspaceId: ws.workspaceId, bibtex: bib }));
    expect(state).toMatchObject({ ok: false, code: 'unprocessable' });
    expect(state.fieldErrors?.bibtex?.[0]).toMatch(/^Entry 2 \(fresh2\), line 2: doi: /);
    expect(await db.select().from(source).where(eq(source.citeKey, 'fresh1'))).toHaveLength(0);
  });

  it('refuses a reviewer to import', async () => {
    await signInAs(ws.members.reviewer.email);
    expect(await importBibtexAction(undefined, form({ workspaceId: ws.workspaceId, bibtex: BIB }))).toMatchObject({ ok: false, code: 'forbidden' });
  });

  it('exports text/x-bibtex that parses back to the same sources (round trip)', async () => {
    await signInAs(ws.members.reviewer.email);
    const res = await get(ws.workspaceId);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/x-bibtex/);
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename=".*-sources\.bib"$/);
    const text = await res.text();
    const back = parseBibtex(text);
    expect(back.errors).toEqual([]);
    const original = parseBibtex(BIB).sources;
    const byKey = (list: typeof original) => Object.fromEntries(list.map((s) => [s.citeKey, s]));
    expect(byKey(back.sources)).toEqual(byKey(original));
  });

  it('exports only the requested ids, and refuses ids of another workspace', async () => {
    const [azuhata] = await db.select().from(source).where(eq(source.citeKey, 'azuhata1995'));
    const one = await (await get(ws.workspaceId, `?ids=${azuhata.id}`)).text();
    expect(parseBibtex(one).sources.map((s) => s.citeKey)).toEqual(['azuhata1995']);

    await signInAs(other.members.curator.email);
    expect((await get(other.workspaceId, `?ids=${azuhata.id}`)).status).toBe(404);
    expect((await get(ws.workspaceId)).status).toBe(404);
  });
});
