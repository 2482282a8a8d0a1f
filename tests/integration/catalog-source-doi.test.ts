import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq, inArray } from 'drizzle-orm';
import { db, getClient } from '@/db/client';
import { auditLog, calculation, measurement, source } from '@/db/schema';
import { createSourceAction, mergeSourcesAction } from '@/app/(app)/w/[workspace]/sources/actions';
import { findDoiDuplicates } from '@/db/queries/sources';
import { backfillStructuredSources, splitLegacyVenue } from '@/db/source-backfill';
import { callAction } from '../support/actions';
import { createWorkspaceWith, signInAs } from '../support/users';

type Action = Parameters<typeof callAction>[0];
const run = async (action: unknown, fields: Record<string, string>) => (await callAction(action as Action, fields)).state!;
import { addCalculation, addMaterial, addMeasurement, addMethod } from './benchmark-support';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator', 'contributor']);
  other = await createWorkspaceWith(['curator']);
});

// Parker, Feldman & Ashkin, Phys. Rev. 155, 712 (1967) — shared/reference/check-values.md
const PARKER = { kind: 'journal-article', title: 'Raman scattering by silicon and germanium', authors: 'Parker J. H.; Feldman D. W.; Ashkin M.', year: '1967', venue: 'Phys. Rev.', volume: '155', pages: '712' };

/** Sources stored before DOIs were unique per workspace: inserted directly, as the old code could. */
async function legacySource(workspaceId: string, citeKey: string, doi: string) {
  const [row] = await db.insert(source).values({ workspaceId, citeKey, kind: 'journal-article', title: PARKER.title, doi, authorList: [], gaps: [] }).returning({ id: source.id });
  return row.id;
}

describe('one source per DOI', () => {
  it('refuses a second source with the same DOI, whatever its spelling, and names the first', async () => {
    await signInAs(ws.members.contributor.email);
    expect(await run(createSourceAction, { workspaceId: ws.workspaceId, ...PARKER, citeKey: 'parker1967', doi: '10.1103/PhysRev.155.712' })).toMatchObject({ ok: true });
    const again = await run(createSourceAction, { workspaceId: ws.workspaceId, ...PARKER, citeKey: 'parker-si', doi: 'https://doi.org/10.1103/PHYSREV.155.712' });
    expect(again).toMatchObject({ ok: false, code: 'conflict' });
    expect(again.fieldErrors?.doi?.[0]).toBe('The DOI 10.1103/physrev.155.712 is already the source "parker1967" in this workspace: cite that one.');
  });

  it('refuses a malformed DOI with what a DOI looks like', async () => {
    const bad = await run(createSourceAction, { workspaceId: ws.workspaceId, ...PARKER, citeKey: 'x1', doi: 'PhysRev.155.712' });
    expect(bad.fieldErrors?.doi?.[0]).toBe('"PhysRev.155.712" is not a DOI: expected 10.NNNN/… (e.g. 10.1103/PhysRev.155.712).');
  });
});

describe('merging sources that share a DOI', () => {
  let keep: string;
  let twin: string;
  let moved: string[];

  beforeAll(async () => {
    keep = await legacySource(ws.workspaceId, 'ashkin-a', '10.9999/shared.1');
    twin = await legacySource(ws.workspaceId, 'ashkin-b', '10.9999/shared.1');
    const materialId = await addMaterial(ws.workspaceId, 'Si-merge');
    const methodId = await addMethod(ws.workspaceId, 'merge-method');
    moved = [await addMeasurement(ws.workspaceId, { materialId, sourceId: twin, value: 520.2 }), await addMeasurement(ws.workspaceId, { materialId, sourceId: twin, value: 300.7 })];
    await addCalculation(ws.workspaceId, { materialId, sourceId: twin, methodId, value: 515 });
    await addMeasurement(ws.workspaceId, { materialId, sourceId: keep, value: 521 });
  });

  it('finds them, with their value counts', async () => {
    const groups = await findDoiDuplicates(ws.workspaceId);
    expect(groups).toEqual([{ doi: '10.9999/shared.1', sources: [expect.objectContaining({ id: keep, citeKey: 'ashkin-a', valueCount: 1 }), expect.objectContaining({ id: twin, citeKey: 'ashkin-b', valueCount: 3 })] }]);
    expect(await findDoiDuplicates(other.workspaceId)).toEqual([]);
  });

  it('is for curators and owners only, and within the workspace', async () => {
    await signInAs(ws.members.contributor.email);
    expect(await run(mergeSourcesAction, { workspaceId: ws.workspaceId, keepId: keep, mergeId: twin })).toMatchObject({ ok: false, code: 'forbidden' });
    await signInAs(other.members.curator.email);
    expect(await run(mergeSourcesAction, { workspaceId: other.workspaceId, keepId: keep, mergeId: twin })).toMatchObject({ ok: false, code: 'not-found' });
    expect(await db.select().from(measurement).where(and(eq(measurement.sourceId, twin)))).toHaveLength(2);
  });

  it('moves every value to the kept source, retracts the other as merged, with an audit entry on both', async () => {
    await signInAs(ws.members.curator.email);
    const state = await run(mergeSourcesAction, { workspaceId: ws.workspaceId, keepId: keep, mergeId: twin, reason: 'entered twice' });
    expect(state).toMatchObject({ ok: true, message: 'Merged: 3 values now cite the kept source.' });
    expect(await db.select({ id: measurement.id }).from(measurement).where(eq(measurement.sourceId, twin))).toEqual([]);
    expect(await db.select({ id: calculation.id }).from(calculation).where(eq(calculation.sourceId, twin))).toEqual([]);
    expect((await db.select({ s: measurement.sourceId }).from(measurement).where(inArray(measurement.id, moved))).map((r) => r.s)).toEqual([keep, keep]);
    const [merged] = await db.select().from(source).where(eq(source.id, twin));
    expect(merged.retractionReason).toBe('merged into ashkin-a (same DOI 10.9999/shared.1): entered twice');
    const audits = await db.select().from(auditLog).where(and(eq(auditLog.workspaceId, ws.workspaceId), eq(auditLog.action, 'merge')));
    expect(audits.map((a) => a.entityId).sort()).toEqual([keep, twin].sort());
    expect(audits.find((a) => a.entityId === keep)?.after).toMatchObject({ mergedFrom: twin, moved: { measurements: expect.arrayContaining(moved) } });
    expect(await findDoiDuplicates(ws.workspaceId)).toEqual([]);
  });
});

describe('the one-time backfill of sources stored before structured fields', () => {
  it('splits the author text and "Journal volume pages", computes the gaps, and leaves other rows alone', async () => {
    const [legacy] = await db
      .insert(source)
      .values({ workspaceId: ws.workspaceId, citeKey: 'azuhata-legacy', kind: 'journal-article', title: 'Polarized Raman spectra in GaN', authors: 'Azuhata T.; Sota T.; Suzuki K.; Nakamura S.', venue: 'J. Phys.: Condens. Matter 7 L129', year: 1995 })
      .returning({ id: source.id });
    const [done] = await db.select().from(source).where(eq(source.citeKey, 'parker1967'));
    expect(await backfillStructuredSources(getClient())).toBe(1);
    const [row] = await db.select().from(source).where(eq(source.id, legacy.id));
    expect(row).toMatchObject({
      authorList: [
        { family: 'Azuhata', given: 'T.' },
        { family: 'Sota', given: 'T.' },
        { family: 'Suzuki', given: 'K.' },
        { family: 'Nakamura', given: 'S.' },
      ],
      authors: 'Azuhata, T.; Sota, T.; Suzuki, K.; Nakamura, S.',
      venue: 'J. Phys.: Condens. Matter',
      volume: '7',
      pages: 'L129',
      gaps: ['identifier'],
    });
    const [after] = await db.select().from(source).where(eq(source.citeKey, 'parker1967'));
    expect(after).toEqual(done);
    expect(await backfillStructuredSources(getClient())).toBe(0);
    const audit = await db.select().from(auditLog).where(eq(auditLog.entityId, legacy.id));
    expect(audit).toEqual([expect.objectContaining({ action: 'update', reason: 'structured citation fields (one-time migration)' })]);
  });

  it.each([
    ['Phys. Rev. 155 712', { venue: 'Phys. Rev.', volume: '155', pages: '712' }],
    ['J. Raman Spectrosc. 51', { venue: 'J. Raman Spectrosc.', volume: '51' }],
    ['Phys. Rev. B 61 3391-3395', { venue: 'Phys. Rev. B', volume: '61', pages: '3391–3395' }],
    ['Z. Phys.', { venue: 'Z. Phys.' }],
  ])('splits the legacy venue "%s"', (venue, expected) => {
    expect(splitLegacyVenue(venue)).toEqual(expected);
  });
});
