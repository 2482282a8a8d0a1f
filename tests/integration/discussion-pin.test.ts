import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, commentThread, decision, pairPin } from '@/db/schema';
import { pinFromThreadAction, postCommentAction } from '@/app/(app)/w/[workspace]/_discussion/actions';
import { listSubjectThreads } from '@/db/queries/comments';
import { listPins } from '@/db/queries/decisions';
import { getRevision } from '@/db/queries/revisions';
import { whenRecomputeIdle } from '@/lib/services/benchmarks/recompute-queue';
import { calculationSetId, loadMaterialThreads } from '@/app/(app)/w/[workspace]/materials/_components/material-discussion';
import { requestContext } from '@/tests/support/request-context';
import { createWorkspaceWith, signInAs } from '@/tests/support/users';
import { formData } from './benchmark-support';
import { meetingBenchmark } from './meeting-support';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;
let bm: Awaited<ReturnType<typeof meetingBenchmark>>;
type Pair = (typeof bm)['revision']['statistics']['pairs'][number];
let pinned: Pair;
let dropped: Pair;

const pinCount = async () => (await db.select().from(pairPin)).length;

async function openPairThread(pair: Pair, body: string) {
  const state = await postCommentAction(undefined, formData({ workspaceId: ws.workspaceId, subjectKind: 'pair', subjectId: pair.key, benchmarkId: bm.benchmarkId, body }));
  expect(state.ok, state.message).toBe(true);
  return (state.data as { threadId: string }).threadId;
}

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator', 'contributor', 'reviewer']);
  other = await createWorkspaceWith(['curator']);
  bm = await meetingBenchmark(ws.workspaceId, ws.members.curator.email);
  const singles = bm.revision.statistics.pairs.filter((p) => p.measurementIds.length === 1 && p.calculationIds.length === 1 && p.materialId === bm.materials.A);
  [pinned, dropped] = singles;
  expect(dropped).toBeDefined();
  expect(pinned.basis).not.toBe('pinned');
});

describe('pinning a pairing from a pair thread', () => {
  let threadId: string;

  it('refuses a reviewer, another workspace and an anonymous caller, and writes nothing', async () => {
    await signInAs(ws.members.reviewer.email);
    threadId = await openPairThread(pinned, 'Is this the right mode?');
    const before = await pinCount();
    const ask = (workspaceId: string) => pinFromThreadAction(undefined, formData({ workspaceId, threadId, kind: 'pin-pairing', reason: 'polarised spectra' }));
    expect(await ask(ws.workspaceId)).toMatchObject({ ok: false, code: 'forbidden' });
    await signInAs(other.members.curator.email);
    expect(await ask(other.workspaceId)).toMatchObject({ ok: false, code: 'not-found' });
    expect(await ask(ws.workspaceId)).toMatchObject({ ok: false, code: 'not-found' });
    requestContext.anonymous();
    expect(await ask(ws.workspaceId)).toMatchObject({ ok: false, code: 'unauthorized' });
    expect(await pinCount()).toBe(before);
  });

  it('a curator pins the pairing: the pin names the thread, is audited, and survives recomputation', async () => {
    await signInAs(ws.members.curator.email);
    const state = await pinFromThreadAction(undefined, formData({ workspaceId: ws.workspaceId, threadId, kind: 'pin-pairing', reason: 'polarised spectra assign it' }));
    expect(state.ok, state.message).toBe(true);
    expect(state.message).toBe('Pairing pinned; the next revision is being computed.');
    const pinId = (state.data as { id: string }).id;
    const [row] = await db.select().from(pairPin).where(eq(pairPin.id, pinId));
    expect(row).toMatchObject({
      workspaceId: ws.workspaceId,
      methodId: bm.methodId,
      measurementId: pinned.measurementIds[0],
      calculationId: pinned.calculationIds[0],
      reason: `polarised spectra assign it (from discussion ${threadId})`,
      revokedAt: null,
    });
    expect(await db.select().from(auditLog).where(and(eq(auditLog.entityType, 'pair-pin'), eq(auditLog.entityId, pinId)))).toHaveLength(1);
    // a pin is not a decision: nothing lands in the decision table
    expect(await db.select().from(decision)).toHaveLength(0);

    await whenRecomputeIdle(ws.workspaceId);
    expect((await listPins(ws.workspaceId)).map((p) => p.id)).toContain(pinId);
    const next = (await getRevision(ws.workspaceId, bm.benchmarkId))!;
    expect(next.number).toBeGreaterThan(bm.revision.number);
    expect(next.statistics.pins.map((p) => p.id)).toEqual([pinId]);
    const pair = next.statistics.pairs.find((p) => p.key === pinned.key)!;
    expect(pair).toMatchObject({ basis: 'pinned', calculationIds: pinned.calculationIds });
  });

  it('“no counterpart” unpairs the measurement in the next revision and lowers N', async () => {
    const n = (r: NonNullable<Awaited<ReturnType<typeof getRevision>>>) => r.statistics.methods.find((m) => m.methodId === bm.methodId)!.n;
    const before = (await getRevision(ws.workspaceId, bm.benchmarkId))!;
    const thread = await openPairThread(dropped, 'Measured on a strained film, no computed mode matches it.');
    const state = await pinFromThreadAction(undefined, formData({ workspaceId: ws.workspaceId, threadId: thread, kind: 'no-counterpart', reason: 'strained film artefact' }));
    expect(state.ok, state.message).toBe(true);
    const [row] = await db.select().from(pairPin).where(eq(pairPin.id, (state.data as { id: string }).id));
    expect(row).toMatchObject({ calculationId: null, measurementId: dropped.measurementIds[0], reason: `strained film artefact (from discussion ${thread})` });
    await whenRecomputeIdle(ws.workspaceId);
    const next = (await getRevision(ws.workspaceId, bm.benchmarkId))!;
    expect(next.number).toBe(before.number + 1);
    expect(next.statistics.pairs.some((p) => p.key === dropped.key)).toBe(false);
    expect(n(next)).toBe(n(before) - 1);
    // the earlier pin still holds
    expect(next.statistics.pairs.find((p) => p.key === pinned.key)?.basis).toBe('pinned');
  });

  it('refuses threads that do not discuss a pair, and unknown kinds, with nothing written', async () => {
    const onMaterial = await postCommentAction(undefined, formData({ workspaceId: ws.workspaceId, subjectKind: 'material', subjectId: bm.materials.B, body: 'General remark' }));
    expect(onMaterial.ok, onMaterial.message).toBe(true);
    const before = await pinCount();
    const materialThread = (onMaterial.data as { threadId: string }).threadId;
    expect(await pinFromThreadAction(undefined, formData({ workspaceId: ws.workspaceId, threadId: materialThread, kind: 'pin-pairing', reason: 'not a pair' }))).toMatchObject({
      ok: false,
      code: 'bad-request',
    });
    const bad = await pinFromThreadAction(undefined, formData({ workspaceId: ws.workspaceId, threadId, kind: 'exclude-pair', reason: 'x' }));
    expect(bad).toMatchObject({ ok: false, code: 'bad-request' });
    expect(Object.keys(bad.fieldErrors ?? {}).sort()).toEqual(['kind', 'reason']);
    expect(await pinCount()).toBe(before);
  });
});

describe('threads on a calculation set', () => {
  it('opens and lists a thread on a material’s calculations under one method, shown on the material page', async () => {
    await signInAs(ws.members.contributor.email);
    const subjectId = calculationSetId(bm.materials.B, bm.methodId);
    const state = await postCommentAction(undefined, formData({ workspaceId: ws.workspaceId, subjectKind: 'calculation-set', subjectId, body: 'Were these relaxed with the same k-grid?' }));
    expect(state.ok, state.message).toBe(true);
    const listed = await listSubjectThreads(ws.workspaceId, 'calculation-set', subjectId);
    expect(listed).toHaveLength(1);
    expect(listed[0]).toMatchObject({ id: (state.data as { threadId: string }).threadId, benchmarkId: null, resolvedAt: null });
    expect(listed[0].comments.map((c) => c.body)).toEqual(['Were these relaxed with the same k-grid?']);

    const onPage = await loadMaterialThreads(ws.workspaceId, bm.materials.B, [bm.methodId]);
    expect(onPage.get(subjectId)?.map((t) => t.id)).toEqual([listed[0].id]);
    expect(onPage.get(bm.materials.B)?.map((t) => t.subjectKind)).toEqual(['material']);
  });

  it('refuses a calculation set of another workspace or an unknown method, with nothing written', async () => {
    const count = async () => (await db.select().from(commentThread)).length;
    const before = await count();
    const post = (workspaceId: string, subjectId: string) => postCommentAction(undefined, formData({ workspaceId, subjectKind: 'calculation-set', subjectId, body: 'hello' }));
    expect(await post(ws.workspaceId, calculationSetId(bm.materials.A, 'no-such-method'))).toMatchObject({ ok: false, code: 'not-found' });
    await signInAs(other.members.curator.email);
    expect(await post(other.workspaceId, calculationSetId(bm.materials.A, bm.methodId))).toMatchObject({ ok: false, code: 'not-found' });
    expect(await count()).toBe(before);
  });
});
