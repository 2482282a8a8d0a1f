import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, benchmark, deck, deckView } from '@/db/schema';
import { addToDeckAction, createDeckAction, listDecksAction, moveViewAction, refreshViewAction, removeViewAction, retitleDeckAction, updateViewAction } from '@/app/(app)/w/[workspace]/decks/actions';
import { decideAction } from '@/app/(app)/w/[workspace]/benchmarks/actions';
import { getDeck } from '@/db/queries/decks';
import { whenRecomputeIdle } from '@/lib/services/benchmarks/recompute-queue';
import { createWorkspaceWith, signInAs } from '@/tests/support/users';
import { formData } from './benchmark-support';
import { meetingBenchmark } from './meeting-support';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;
let bm: Awaited<ReturnType<typeof meetingBenchmark>>;
let deckId: string;

async function counts() {
  return { decks: (await db.select().from(deck)).length, views: (await db.select().from(deckView)).length };
}

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator', 'reviewer']);
  other = await createWorkspaceWith();
  bm = await meetingBenchmark(ws.workspaceId, ws.members.curator.email);
});

describe('decks', () => {
  it('a reviewer creates a deck and adds views to it, each pinned to the revision shown', async () => {
    await signInAs(ws.members.reviewer.email);
    const created = await createDeckAction(undefined, formData({ workspaceId: ws.workspaceId, title: '  Group meeting, 12 March ' }));
    expect(created.ok, created.message).toBe(true);
    deckId = (created.data as { id: string }).id;

    const add = (fields: Record<string, string>) => addToDeckAction(undefined, formData({ workspaceId: ws.workspaceId, deckId, benchmarkId: bm.benchmarkId, revisionNumber: String(bm.revision.number), ...fields }));
    expect((await add({ viewKind: 'leaderboard', note: 'Start here' })).ok).toBe(true);
    const parity = await add({ viewKind: 'parity', filters: JSON.stringify({ bandPercent: 10, hiddenMethods: [], showExcluded: false }) });
    expect(parity.ok, parity.message).toBe(true);
    expect((await add({ viewKind: 'outliers', title: 'What to argue about' })).ok).toBe(true);

    const d = (await getDeck(ws.workspaceId, deckId))!;
    expect(d.title).toBe('Group meeting, 12 March');
    expect(d.views.map((v) => [v.position, v.viewKind])).toEqual([
      [1, 'leaderboard'],
      [2, 'parity'],
      [3, 'outliers'],
    ]);
    expect(d.views.every((v) => v.revision?.number === bm.revision.number && v.problem === null)).toBe(true);
    expect(d.views[1].filters).toEqual({ bandPercent: 10, hiddenMethods: [], showExcluded: false });
    expect(d.views[0].note).toBe('Start here');

    const listed = await listDecksAction(undefined, formData({ workspaceId: ws.workspaceId }));
    expect(listed.data).toMatchObject({ decks: [{ id: deckId, title: 'Group meeting, 12 March', views: 3 }], canCreate: true });
  });

  it('adds a view to a new deck in one go, and a material view', async () => {
    const state = await addToDeckAction(undefined, formData({ workspaceId: ws.workspaceId, newDeckTitle: 'Outliers only', viewKind: 'material', filters: JSON.stringify({ materialId: bm.materials.A }) }));
    expect(state.ok, state.message).toBe(true);
    const d = (await getDeck(ws.workspaceId, (state.data as { deckId: string }).deckId))!;
    expect(d.title).toBe('Outliers only');
    expect(d.views[0]).toMatchObject({ viewKind: 'material', material: { id: bm.materials.A, name: 'A' }, problem: null, revision: null });
  });

  it('refuses bad input with the field that is wrong, and writes nothing', async () => {
    const before = await counts();
    const badFilters = await addToDeckAction(undefined, formData({ workspaceId: ws.workspaceId, deckId, benchmarkId: bm.benchmarkId, viewKind: 'parity', filters: JSON.stringify({ script: '<b>' }) }));
    expect(badFilters).toMatchObject({ ok: false, code: 'bad-request' });
    expect(badFilters.fieldErrors?.filters).toBeDefined();
    const badKind = await addToDeckAction(undefined, formData({ workspaceId: ws.workspaceId, deckId, benchmarkId: bm.benchmarkId, viewKind: 'pie-chart' }));
    expect(badKind.fieldErrors?.viewKind).toEqual(['Choose what the view shows.']);
    const noRevision = await addToDeckAction(undefined, formData({ workspaceId: ws.workspaceId, deckId, benchmarkId: bm.benchmarkId, viewKind: 'parity', revisionNumber: '99' }));
    expect(noRevision).toMatchObject({ ok: false, code: 'not-found', message: 'No revision 99 of this benchmark.' });
    expect(await counts()).toEqual(before);
  });

  it('reorders with up and down, retitles, edits a note and removes a view (audited)', async () => {
    const ids = (await getDeck(ws.workspaceId, deckId))!.views.map((v) => v.id);
    expect((await moveViewAction(undefined, formData({ workspaceId: ws.workspaceId, viewId: ids[2], direction: 'up' }))).ok).toBe(true);
    let order = (await getDeck(ws.workspaceId, deckId))!.views.map((v) => v.id);
    expect(order).toEqual([ids[0], ids[2], ids[1]]);
    const top = await moveViewAction(undefined, formData({ workspaceId: ws.workspaceId, viewId: ids[0], direction: 'up' }));
    expect(top.message).toBe('Already at the top.');
    await moveViewAction(undefined, formData({ workspaceId: ws.workspaceId, viewId: ids[0], direction: 'down' }));
    order = (await getDeck(ws.workspaceId, deckId))!.views.map((v) => v.id);
    expect(order).toEqual([ids[2], ids[0], ids[1]]);

    expect((await retitleDeckAction(undefined, formData({ workspaceId: ws.workspaceId, deckId, title: 'Meeting 13 March' }))).ok).toBe(true);
    expect((await updateViewAction(undefined, formData({ workspaceId: ws.workspaceId, viewId: ids[1], title: 'Parity', note: 'Look at the top right' }))).ok).toBe(true);
    const d = (await getDeck(ws.workspaceId, deckId))!;
    expect(d.title).toBe('Meeting 13 March');
    expect(d.views.find((v) => v.id === ids[1])).toMatchObject({ title: 'Parity', note: 'Look at the top right' });

    expect((await removeViewAction(undefined, formData({ workspaceId: ws.workspaceId, viewId: ids[0] }))).ok).toBe(true);
    expect((await getDeck(ws.workspaceId, deckId))!.views.map((v) => v.id)).toEqual([ids[2], ids[1]]);
    const audit = await db.select().from(auditLog).where(eq(auditLog.entityId, deckId));
    expect(audit.map((a) => a.action).sort()).toEqual(['create', 'remove-view', 'update']);
    expect(audit.find((a) => a.action === 'remove-view')!.before).toMatchObject({ id: ids[0], viewKind: 'leaderboard' });
  });

  it('shows when a newer revision exists and refreshes a view to it', async () => {
    await signInAs(ws.members.curator.email);
    const pair = bm.revision.statistics.pairs[0];
    const decided = await decideAction(
      undefined,
      formData({ workspaceId: ws.workspaceId, benchmarkId: bm.benchmarkId, kind: 'exclude-pair', measurementId: pair.measurementIds[0], methodId: pair.methodId, reason: 'test exclusion' }),
    );
    expect(decided.ok, decided.message).toBe(true);
    await whenRecomputeIdle(ws.workspaceId, bm.benchmarkId);
    await signInAs(ws.members.reviewer.email);
    let views = (await getDeck(ws.workspaceId, deckId))!.views;
    expect(views[0].latestNumber).toBe(bm.revision.number + 1);
    expect(views[0].revision!.number).toBe(bm.revision.number);
    const refreshed = await refreshViewAction(undefined, formData({ workspaceId: ws.workspaceId, viewId: views[0].id }));
    expect(refreshed.message).toBe(`Now showing revision ${bm.revision.number + 1}.`);
    views = (await getDeck(ws.workspaceId, deckId))!.views;
    expect(views[0].revision!.number).toBe(bm.revision.number + 1);
    expect(views[1].revision!.number).toBe(bm.revision.number);
  });

  it('shows what is missing when a view points at a retracted benchmark, instead of failing', async () => {
    await db.update(benchmark).set({ retractedAt: new Date('2026-03-01T00:00:00Z'), retractionReason: 'superseded' }).where(eq(benchmark.id, bm.benchmarkId));
    try {
      const d = (await getDeck(ws.workspaceId, deckId))!;
      expect(d.views.every((v) => v.problem?.kind === 'benchmark-retracted')).toBe(true);
      expect(d.views[0].problem).toMatchObject({ name: 'Raman, room temperature', reason: 'superseded' });
    } finally {
      await db.update(benchmark).set({ retractedAt: null, retractionReason: null }).where(eq(benchmark.id, bm.benchmarkId));
    }
  });

  it('refuses another workspace’s deck, view or benchmark with 404 and writes nothing', async () => {
    const view = (await getDeck(ws.workspaceId, deckId))!.views[0];
    await signInAs(other.owner.email);
    const before = await counts();
    const tries = [
      await moveViewAction(undefined, formData({ workspaceId: other.workspaceId, viewId: view.id, direction: 'down' })),
      await removeViewAction(undefined, formData({ workspaceId: other.workspaceId, viewId: view.id })),
      await updateViewAction(undefined, formData({ workspaceId: other.workspaceId, viewId: view.id, note: 'hijacked' })),
      await retitleDeckAction(undefined, formData({ workspaceId: other.workspaceId, deckId, title: 'hijacked' })),
      await addToDeckAction(undefined, formData({ workspaceId: other.workspaceId, deckId, benchmarkId: bm.benchmarkId, viewKind: 'leaderboard' })),
      await addToDeckAction(undefined, formData({ workspaceId: other.workspaceId, newDeckTitle: 'Stolen', benchmarkId: bm.benchmarkId, viewKind: 'leaderboard' })),
      await addToDeckAction(undefined, formData({ workspaceId: ws.workspaceId, deckId, benchmarkId: bm.benchmarkId, viewKind: 'leaderboard' })),
    ];
    for (const t of tries) expect(t).toMatchObject({ ok: false, code: 'not-found' });
    expect(await counts()).toEqual(before);
    expect(await getDeck(other.workspaceId, deckId)).toBeNull();
    expect((await getDeck(ws.workspaceId, deckId))!.title).toBe('Meeting 13 March');
  });
});
