/**
 * The demo workspace's sources exported as BibTeX, RIS and CSL-JSON, each read back by
 * a parser that shares no code with the exporter (citation-js):
 * BibTeX by @retorquere/bibtex-parser, RIS by astrocite-ris, CSL-JSON by JSON.parse with
 * ajv validation against the CSL 1.0.2 variables (tests/support/reference-checkers.ts).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { source, type Source } from '@/db/schema';
import { loadDemoScenario } from '@/db/demo-data';
import { GET as exportSourcesRoute } from '@/app/api/workspaces/[workspaceId]/sources/export/route';
import { familyOf } from '@/lib/citations/authors';
import { createWorkspaceWith, signInAs } from '../support/users';
import { readBibtexIndependently, readCslJsonIndependently, readRisIndependently, type CheckedRecord } from '../support/reference-checkers';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let stored: Source[];

beforeAll(async () => {
  ws = await createWorkspaceWith(['reviewer']);
  await db.transaction((tx) => loadDemoScenario(tx, ws.workspaceId, ws.owner.id));
  stored = await db.select().from(source).where(eq(source.workspaceId, ws.workspaceId));
  await signInAs(ws.members.reviewer.email);
});

async function exported(format: string): Promise<string> {
  const res = await exportSourcesRoute(new Request(`http://localhost:3999/api/workspaces/${ws.workspaceId}/sources/export?format=${format}`), { params: Promise.resolve({ workspaceId: ws.workspaceId }) });
  expect(res.status).toBe(200);
  return res.text();
}

/** What the stored source says, in the checkers' terms: an organisation's whole name stands in `family`. */
function expected(s: Source): CheckedRecord {
  return {
    key: s.citeKey,
    authors: (s.authorList ?? []).map((n) => (n.literal ? { family: n.literal, given: '' } : { family: familyOf(n), given: n.given ?? '' })),
    title: s.title ?? '',
    year: s.year?.toString() ?? '',
    journal: s.kind === 'journal-article' ? (s.venue ?? '') : '',
    volume: s.volume ?? '',
    pages: (s.pages ?? '').replace('–', '-'),
    doi: s.doi ?? '',
  };
}

/** RIS has no way to mark an organisation: a reader splits its words into given and family names, so it is compared as its whole name. */
function wholeNamesOfOrganisations(r: CheckedRecord, s: Source): CheckedRecord {
  const names = s.authorList ?? [];
  return { ...r, authors: r.authors.map((a, i) => (names[i]?.literal ? { family: [a.given, a.family].filter(Boolean).join(' '), given: '' } : a)) };
}

function journalArticlesOnly(r: CheckedRecord, s: Source): CheckedRecord {
  return s.kind === 'journal-article' ? r : { ...r, journal: '' };
}

describe('demo sources round trip through independent parsers', () => {
  it('the demo has sources with authors, volumes and pages to check', () => {
    expect(stored).toHaveLength(11);
    expect(stored.filter((s) => s.volume && s.pages && s.authorList?.length).length).toBeGreaterThanOrEqual(4);
    const azuhata = stored.find((s) => s.citeKey === 'azuhata1995')!;
    expect(azuhata).toMatchObject({ venue: 'J. Phys.: Condens. Matter', volume: '7', issue: '10', pages: 'L129', doi: '10.1088/0953-8984/7/10/002', gaps: [] });
    expect(azuhata.authorList?.map((n) => [n.family, n.given])).toEqual([
      ['Azuhata', 'T.'],
      ['Sota', 'T.'],
      ['Suzuki', 'K.'],
      ['Nakamura', 'S.'],
    ]);
  });

  it('BibTeX (@retorquere/bibtex-parser): same authors, title, year, journal, volume, pages and DOI for every source', async () => {
    const { records, errors } = readBibtexIndependently(await exported('bibtex'));
    expect(errors).toEqual([]);
    expect(records).toHaveLength(stored.length);
    for (const s of stored) expect(journalArticlesOnly(records.find((r) => r.key === s.citeKey)!, s), s.citeKey).toEqual(expected(s));
  });

  it('RIS (astrocite-ris): the same for every source', async () => {
    const records = readRisIndependently(await exported('ris'));
    expect(records).toHaveLength(stored.length);
    for (const s of stored) expect(journalArticlesOnly(wholeNamesOfOrganisations(records.find((r) => r.key === s.citeKey)!, s), s), s.citeKey).toEqual(expected(s));
  });

  it('CSL-JSON (ajv against the CSL 1.0.2 variables): valid, and the same for every source', async () => {
    const { records, errors } = readCslJsonIndependently(await exported('csl-json'));
    expect(errors).toEqual([]);
    expect(records).toHaveLength(stored.length);
    for (const s of stored) expect(journalArticlesOnly(records.find((r) => r.key === s.citeKey)!, s), s.citeKey).toEqual(expected(s));
  });

  it('flags the demo sources that are incomplete, and only those', () => {
    const incomplete = Object.fromEntries(stored.filter((s) => s.gaps.length).map((s) => [s.citeKey, s.gaps]));
    expect(incomplete).toEqual({
      ananthanarayanan1961: ['identifier'],
      codata1989: ['identifier'],
      diamond2000: ['identifier'],
      hass1962: ['identifier'],
      itoh2020: ['identifier'],
      janaf1998: ['identifier'],
      sapphire2016: ['authors', 'identifier'],
    });
  });
});
