import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq, like, sql } from 'drizzle-orm';
import { db } from '@/db/client';
import { job, mailOutbox, material, revision } from '@/db/schema';
import { getBenchmark, loadBenchmarkInput } from '@/db/queries/benchmarks';
import { latestRevisionHead, getRevision } from '@/db/queries/revisions';
import { watchBenchmark } from '@/db/queries/watches';
import { computeBenchmark } from '@/lib/benchmark/compute';
import { benchmarkFingerprint } from '@/lib/benchmark/fingerprint';
import { scheduleRecompute } from '@/lib/services/benchmarks/recompute-queue';
import { whenAlertsIdle } from '@/lib/services/alerts/scheduler';
import { stopJobRunner, startJobRunner } from '@/lib/services/jobs/runner';
import { alertScenario, measured } from './alerts-support';
import { addMaterial, addMeasurement, addModeSet } from './benchmark-support';

// Several app processes on one SQLite file share the durable jobs (lib/services/jobs/runner.ts). The children are
// real processes running the real runner and handlers (tests/support/job-process.ts); this process only seeds and
// checks, with its own runner stopped so it takes no part.
const CHILD_ENV = {
  JOB_POLL_MS: '100',
  JOB_LEASE_MS: '2000',
  RECOMPUTE_DEBOUNCE_MS: '200',
  ALERT_DEBOUNCE_MS: '5000',
  MAIL_WORKER_INTERVAL_MS: '0',
};

interface Child {
  process: ChildProcess;
  events: Array<Record<string, unknown>>;
  next(event: string, timeoutMs?: number): Promise<Record<string, unknown>>;
  exited: Promise<number | null>;
}

const children: Child[] = [];
afterAll(() => children.forEach((c) => c.process.exitCode === null && c.process.kill('SIGKILL')));

function child(mode: string, config: Record<string, unknown>): Child {
  const proc = spawn(process.execPath, ['--conditions=react-server', '--import', 'tsx', 'tests/support/job-process.ts', mode, JSON.stringify(config)], {
    stdio: ['pipe', 'pipe', 'inherit'],
    env: { ...process.env, ...CHILD_ENV },
  });
  const events: Array<Record<string, unknown>> = [];
  const waiters: Array<() => void> = [];
  let buffered = '';
  proc.stdout!.on('data', (d) => {
    buffered += d;
    const lines = buffered.split('\n');
    buffered = lines.pop()!;
    for (const line of lines) if (line.startsWith('{')) events.push(JSON.parse(line));
    waiters.splice(0).forEach((w) => w());
  });
  const exited = new Promise<number | null>((resolve) => proc.on('exit', (code) => resolve(code)));
  const c: Child = {
    process: proc,
    events,
    exited,
    async next(event, timeoutMs = 90_000) {
      const deadline = Date.now() + timeoutMs;
      for (;;) {
        const found = events.find((e) => e.event === event);
        if (found) return found;
        if (proc.exitCode !== null) throw new Error(`${mode} child exited ${proc.exitCode} before "${event}"`);
        if (Date.now() > deadline) throw new Error(`${mode} child: no "${event}" in time`);
        await new Promise<void>((r) => {
          waiters.push(r);
          setTimeout(r, 200);
        });
      }
    },
  };
  children.push(c);
  return c;
}

const csv = (material: string, value: number) =>
  `material,quantity,value,unit,uncertainty,temperature_K,irrep,technique,source\n${material},frequency,${value},cm-1,1,295,A1g,raman,lab2026\n`;

let s: Awaited<ReturnType<typeof alertScenario>>;
let watchId: string;

beforeAll(async () => {
  process.env.ALERT_DEBOUNCE_MS = '50';
  s = await alertScenario();
  // The scenario's placeholder formula (AB) does not parse, and an import reads every material's formula.
  await db.update(material).set({ formula: 'MgO', reducedFormula: 'MgO', elementCounts: { Mg: 1, O: 1 } }).where(eq(material.workspaceId, s.workspaceId));
  await whenAlertsIdle();
  ({ id: watchId } = await watchBenchmark(s.workspaceId, s.benchmarkId, s.ws.members.curator.id, 'immediate'));
  stopJobRunner();
}, 60_000);

afterAll(() => startJobRunner());

async function fingerprints() {
  return db
    .select({ fingerprint: revision.fingerprint, n: sql<number>`count(*)` })
    .from(revision)
    .where(eq(revision.benchmarkId, s.benchmarkId))
    .groupBy(revision.fingerprint);
}

describe('durable jobs across app processes', () => {
  it('imports split across two processes end in one correct latest revision, no repeated fingerprint, and one alert', async () => {
    const before = await latestRevisionHead(s.workspaceId, s.benchmarkId);
    const modes = [13, 14, 15, 16, 17, 18, 19];
    const files = (list: number[]) => list.map((i) => ({ name: `mode-${i}.csv`, csv: csv(`Crystal-${i}`, measured(i)) }));
    const base = { workspaceId: s.workspaceId, userId: s.ws.members.contributor.id, gapMs: 150 };
    const a = child('import', { ...base, files: files(modes.filter((i) => i % 2)) });
    const b = child('import', { ...base, files: files(modes.filter((i) => i % 2 === 0)) });
    // Both start importing at once (process start-up takes seconds and varies under load).
    await Promise.all([a.next('ready'), b.next('ready')]);
    a.process.stdin!.write('go\n');
    b.process.stdin!.write('go\n');
    const [doneA, doneB] = await Promise.all([a.next('done'), b.next('done')]);
    expect([await a.exited, await b.exited]).toEqual([0, 0]);
    expect(doneA.owner).not.toBe(doneB.owner);

    // The latest revision is what a fresh computation over the stored rows gives, with every imported row.
    const bm = (await getBenchmark(s.workspaceId, s.benchmarkId))!;
    const input = await loadBenchmarkInput(s.workspaceId, bm);
    const latest = (await getRevision(s.workspaceId, s.benchmarkId))!;
    expect(latest.number).toBeGreaterThan(before!.number);
    expect(latest.fingerprint).toBe(benchmarkFingerprint(input, bm.scope));
    expect(JSON.parse(JSON.stringify(latest.statistics.methods))).toEqual(JSON.parse(JSON.stringify(computeBenchmark(input).methods)));
    expect(latest.statistics.methods.find((m) => m.methodId === s.methods.X)!.n).toBe(19);

    // No two revisions of the same rows.
    expect((await fingerprints()).filter((f) => Number(f.n) > 1)).toEqual([]);

    // The burst gives one alert, of the latest revision, queued once (no announce job is left either).
    const alerts = await db
      .select({ dedupeKey: mailOutbox.dedupeKey })
      .from(mailOutbox)
      .where(and(eq(mailOutbox.toAddress, s.ws.members.curator.email), like(mailOutbox.dedupeKey, 'alert:%')));
    expect(alerts).toEqual([{ dedupeKey: `alert:${watchId}:${latest.id}` }]);
    expect(await db.select({ kind: job.kind }).from(job).where(eq(job.workspaceId, s.workspaceId))).toEqual([]);
  }, 120_000);

  it('a process killed in the middle of a recomputation: another takes the job over once the lease has expired', async () => {
    const before = (await latestRevisionHead(s.workspaceId, s.benchmarkId))!;
    const m = await addMaterial(s.workspaceId, 'Crystal-20', ['oxide']);
    const calcSource = (await db.select({ id: sql<string>`id` }).from(sql`source`).where(sql`cite_key = 'calc2026'`))[0].id;
    const labSource = (await db.select({ id: sql<string>`id` }).from(sql`source`).where(sql`cite_key = 'lab2026'`))[0].id;
    await addModeSet(s.workspaceId, m, calcSource, s.methods.X, { A1g: 701 });
    await addModeSet(s.workspaceId, m, calcSource, s.methods.Y, { A1g: 703 });
    await addMeasurement(s.workspaceId, { materialId: m, sourceId: labSource, value: 700, irrep: 'A1g', uncertainty: 1 });
    await scheduleRecompute(s.workspaceId, [s.benchmarkId], { trigger: 'manual' }, 0);

    const victim = child('hang', {});
    const claimed = await victim.next('claimed');
    expect(claimed.key).toBe(`${s.workspaceId}|${s.benchmarkId}`);
    const [held] = await db.select().from(job).where(and(eq(job.kind, 'recompute'), eq(job.key, `${s.workspaceId}|${s.benchmarkId}`)));
    expect(held.leaseOwner).toBe(claimed.owner);
    const leaseEnd = held.leaseExpiresAt!.getTime();
    victim.process.kill('SIGKILL');
    await victim.exited;

    const survivor = child('work', { workspaceId: s.workspaceId, benchmarkId: s.benchmarkId });
    await survivor.next('done');
    expect(await survivor.exited).toBe(0);

    const after = (await getRevision(s.workspaceId, s.benchmarkId))!;
    expect(after.number).toBe(before.number + 1);
    expect(after.createdAt.getTime()).toBeGreaterThanOrEqual(leaseEnd);
    expect(after.statistics.methods.find((x) => x.methodId === s.methods.X)!.n).toBe(20);
    expect(after.cause?.reported).toEqual([{ trigger: 'manual' }]);
    expect(await db.select({ kind: job.kind }).from(job).where(eq(job.kind, 'recompute'))).toEqual([]);
    expect((await fingerprints()).filter((f) => Number(f.n) > 1)).toEqual([]);
  }, 120_000);
});
