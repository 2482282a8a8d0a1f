import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { benchmark, mailOutbox, watch } from '@/db/schema';
import { unwatchAction, updateWatchAction, watchAction } from '@/app/(app)/w/[workspace]/watches/actions';
import { updateBenchmarkAction } from '@/app/(app)/w/[workspace]/benchmarks/actions';
import { listAlertLog } from '@/db/queries/alerts';
import { listMyWatches } from '@/db/queries/watches';
import { whenAlertsIdle } from '@/lib/services/alerts/scheduler';
import { callAction } from '@/tests/support/actions';
import { signInAs } from '@/tests/support/users';
import { alertScenario, outboxTo } from './alerts-support';

let s: Awaited<ReturnType<typeof alertScenario>>;

async function watchOf(userId: string) {
  const [row] = await db.select().from(watch).where(and(eq(watch.benchmarkId, s.benchmarkId), eq(watch.userId, userId)));
  return row;
}

beforeAll(async () => {
  process.env.ALERT_DEBOUNCE_MS = '100';
  s = await alertScenario();
  await whenAlertsIdle();
});

describe('watch settings', () => {
  it('lets a reviewer watch and set their own thresholds', async () => {
    await signInAs(s.ws.members.reviewer.email);
    const watched = await callAction(watchAction, { workspaceId: s.workspaceId, benchmarkId: s.benchmarkId });
    expect(watched.state).toMatchObject({ ok: true });
    const w = await watchOf(s.ws.members.reviewer.id);
    const saved = await callAction(updateWatchAction, {
      workspaceId: s.workspaceId,
      watchId: w.id,
      mode: 'immediate',
      maeCm1: '0.001',
      maeRelativePercent: '0.1',
      nRelativePercent: '',
    });
    expect(saved.state).toMatchObject({ ok: true });
    expect((await watchOf(s.ws.members.reviewer.id)).thresholds).toEqual({ maeCm1: 0.001, maeRelative: 0.001 });
  });

  it('refuses bad thresholds field by field, writing nothing', async () => {
    const w = await watchOf(s.ws.members.reviewer.id);
    const res = await callAction(updateWatchAction, { workspaceId: s.workspaceId, watchId: w.id, mode: 'hourly', maeCm1: '-1', maeRelativePercent: 'lots' });
    expect(res.state?.ok).toBe(false);
    expect(Object.keys(res.state?.fieldErrors ?? {}).sort()).toEqual(['maeCm1', 'maeRelativePercent', 'mode']);
    expect(res.state?.fieldErrors?.maeCm1?.[0]).toMatch(/greater than 0/);
    expect((await watchOf(s.ws.members.reviewer.id)).thresholds).toEqual({ maeCm1: 0.001, maeRelative: 0.001 });
  });

  it("a reviewer cannot change the benchmark's thresholds, nor another member's watch", async () => {
    const [before] = await db.select().from(benchmark).where(eq(benchmark.id, s.benchmarkId));
    const res = await callAction(updateBenchmarkAction, {
      workspaceId: s.workspaceId,
      benchmarkId: s.benchmarkId,
      name: before.name,
      quantity: 'frequency',
      outlierKind: 'modified-z',
      repeatedMeasurements: 'separate',
      alertMaeCm1: '0.01',
    });
    expect(res.state).toMatchObject({ ok: false, code: 'forbidden' });
    const [after] = await db.select().from(benchmark).where(eq(benchmark.id, s.benchmarkId));
    expect(after.alertThresholds).toEqual(before.alertThresholds);

    await signInAs(s.ws.members.curator.email);
    expect((await callAction(watchAction, { workspaceId: s.workspaceId, benchmarkId: s.benchmarkId })).state).toMatchObject({ ok: true });
    const curatorWatch = await watchOf(s.ws.members.curator.id);
    await signInAs(s.ws.members.reviewer.email);
    const foreign = await callAction(updateWatchAction, { workspaceId: s.workspaceId, watchId: curatorWatch.id, mode: 'digest', maeCm1: '9' });
    expect(foreign.state).toMatchObject({ ok: false, code: 'not-found' });
    expect(await callAction(unwatchAction, { workspaceId: s.workspaceId, watchId: curatorWatch.id })).toMatchObject({ state: { ok: false, code: 'not-found' } });
    expect(await watchOf(s.ws.members.curator.id)).toEqual(curatorWatch);
  });

  it("personal thresholds decide: a small drift alerts the reviewer, not the curator on the benchmark's defaults", async () => {
    await s.importMode(14);
    await whenAlertsIdle();
    expect(await outboxTo(s.ws.members.curator.email)).toHaveLength(0);
    const mails = await outboxTo(s.ws.members.reviewer.email);
    expect(mails).toHaveLength(1);
    const reviewerWatch = await watchOf(s.ws.members.reviewer.id);
    const log = await listAlertLog(s.workspaceId, reviewerWatch.id);
    expect(log).toEqual([expect.objectContaining({ kind: 'alert', subject: mails[0].subject, status: 'pending' })]);
    expect(await listAlertLog(s.workspaceId, (await watchOf(s.ws.members.curator.id)).id)).toEqual([]);
  });

  it('lists my watches, and unwatching stops alerts', async () => {
    const mine = await listMyWatches(s.workspaceId, s.ws.members.reviewer.id);
    expect(mine.map((w) => [w.benchmarkName, w.mode, w.baselineNumber])).toEqual([['Oxides <Raman> & IR', 'immediate', 2]]);
    const res = await callAction(unwatchAction, { workspaceId: s.workspaceId, watchId: mine[0].id });
    expect(res.state).toMatchObject({ ok: true });
    await s.importMode(15);
    await whenAlertsIdle();
    expect(await outboxTo(s.ws.members.reviewer.email)).toHaveLength(1);
    // the curator, still watching, hears about the outlier
    expect(await outboxTo(s.ws.members.curator.email)).toHaveLength(1);
    expect(await db.select().from(mailOutbox)).toHaveLength(2);
  });
});
