import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { connect } from '@/db/connection';
import { importBatch, measurement } from '@/db/schema';
import { AppError } from '@/lib/errors';
import { importCsvFile, importJsonBody } from '@/lib/services/imports/csv-import';
import { importDosFile } from '@/lib/services/imports/dos-import';
import { material } from '@/db/schema';
import { seedCatalogue } from './import-fixtures';
import { stopJobRunner } from '@/lib/services/jobs/runner';
import { createWorkerChannel, OFF_LOOP_CHANNEL } from '../../scripts/worker-channel.mjs';
import { createWorkspaceWith } from '@/tests/support/users';
import { addMaterial, addSource } from './benchmark-support';

// The production server hands value imports to its worker process (lib/services/off-loop.ts, scripts/server.mjs).
// Here the worker is the real scripts/job-worker.ts on this test's database file, and this process plays the server.
const children: ChildProcess[] = [];
afterAll(() => children.forEach((c) => c.exitCode === null && c.kill('SIGKILL')));
afterEach(() => {
  delete (globalThis as Record<symbol, unknown>)[OFF_LOOP_CHANNEL];
});

async function worker() {
  stopJobRunner();
  const proc = spawn(process.execPath, ['--conditions=react-server', '--import', 'tsx', 'scripts/job-worker.ts'], {
    stdio: ['ignore', 'ignore', 'inherit', 'ipc'],
    // its job runner polls rarely: this test is about imports
    env: { ...process.env, LEDGER_JOBS_ELSEWHERE: '', JOB_POLL_MS: '60000' },
  });
  children.push(proc);
  const channel = createWorkerChannel();
  channel.attach(proc);
  const deadline = Date.now() + 60_000;
  while (!channel.available()) {
    if (Date.now() > deadline || proc.exitCode !== null) throw new Error('the worker did not start');
    await new Promise((r) => setTimeout(r, 50));
  }
  (globalThis as Record<symbol, unknown>)[OFF_LOOP_CHANNEL] = channel;
  return proc;
}

async function workspace() {
  const ws = await createWorkspaceWith(['contributor']);
  await addSource(ws.workspaceId, 'lab2026');
  for (let i = 0; i < 3; i++) await addMaterial(ws.workspaceId, `Crystal-${i}`, ['oxide']);
  return { w: ws.workspaceId, actor: { userId: ws.members.contributor.id, tokenId: null } };
}

const HEADER = 'material,quantity,value,unit,uncertainty,temperature_K,irrep,technique,source\n';
const line = (i: number, value: string | number = 300 + (i % 500) / 10) => `Crystal-${i % 3},frequency,${value},cm-1,1,295,A${i % 7}g,raman,lab2026\n`;

function importOf(s: { w: string; actor: { userId: string; tokenId: null } }, name: string, csv: string) {
  return importCsvFile({
    workspaceId: s.w,
    actor: s.actor,
    via: 'api',
    kind: 'measurements',
    fileName: name,
    body: (async function* () {
      yield new TextEncoder().encode(csv);
    })(),
  });
}

const refusal = (p: Promise<unknown>) =>
  p.then(
    () => null,
    (e: unknown) => (e instanceof AppError ? { code: e.code, message: e.message, errors: e.errors, errorCount: e.errorCount } : { thrown: String(e) }),
  );

describe('value imports in the worker process', () => {
  it('stores the rows and answers with the same outcome and the same refusals as in the server process', async () => {
    const s = await workspace();
    await worker();
    const rows = Array.from({ length: 40 }, (_, i) => line(i)).join('');
    const outcome = await importOf(s, 'good.csv', HEADER + rows);
    expect(outcome.insertedCount).toBe(40);
    const stored = await db.select({ id: measurement.id }).from(measurement).where(eq(measurement.importId, outcome.importId!));
    expect(stored).toHaveLength(40);

    // The same bad file through the worker and here: one answer, row errors included (row, column, reason).
    const bad = HEADER + line(1) + line(2, 'abc') + 'Nowhere-9,frequency,100,cm-1,1,295,A1g,raman,lab2026\n';
    const viaWorker = await refusal(importOf(s, 'bad.csv', bad));
    delete (globalThis as Record<symbol, unknown>)[OFF_LOOP_CHANNEL];
    const here = await refusal(importOf(s, 'bad.csv', bad));
    expect(viaWorker).not.toBeNull();
    expect(viaWorker).toEqual(here);
    expect(viaWorker).toMatchObject({ errorCount: 2 });
    // And a file sent twice is refused the same way (the duplicate-file rule runs in the worker too).
    await worker();
    expect(await refusal(importOf(s, 'good-again.csv', HEADER + rows))).toMatchObject({ code: 'conflict' });
  }, 120_000);

  it('takes JSON bodies and DOS files the same way: one outcome, one refusal, through the worker or here', async () => {
    const ws = await createWorkspaceWith(['contributor']);
    const cat = await seedCatalogue(ws.workspaceId);
    await db.update(material).set({ atomsInCell: 4 }).where(eq(material.id, cat.gan.id));
    const actor = { userId: ws.members.contributor.id, tokenId: null };
    const json = (rows: unknown[], fileName: string) =>
      importJsonBody({ workspaceId: ws.workspaceId, actor, role: 'contributor', bytes: new TextEncoder().encode(JSON.stringify({ kind: 'measurements', fileName, rows })) });
    const row = (value: unknown) => ({ material: 'GaN-wz', quantity: 'frequency', value, unit: 'cm-1', irrep: 'E2(high)', technique: 'raman', source: 'azuhata1995' });
    // Invented DOS for the test: all weight on one point (an Einstein-like spectrum).
    const dos = (peak: number) =>
      ['material,method,source,unit,frequency,density', ...[0, peak - 1, peak, peak + 1].map((f) => `GaN-wz,PBEsol-PAW-600,inhouse-2026,cm-1,${f},${f === peak ? 1 : 0}`)].join('\n') + '\n';
    const dosImport = (text: string, fileName: string) =>
      importDosFile({ workspaceId: ws.workspaceId, actor, via: 'api', fileName, temperatures: [298.15], body: (async function* () { yield new TextEncoder().encode(text); })() });

    await worker();
    const good = await json([row(568.2), row(144.1)], 'good.json');
    expect(good.importId).not.toBeNull();
    expect((await db.select({ id: measurement.id }).from(measurement).where(eq(measurement.importId, good.importId!))).length).toBe(2);
    const dosOutcome = await dosImport(dos(400), 'einstein.csv');
    expect(dosOutcome).toMatchObject({ dosCount: 1, computedCount: 2 });
    const badJson = await refusal(json([row('57x'), { ...row(1), material: 'Unobtainium' }], 'bad.json'));
    const badDos = await refusal(dosImport(dos(400).replace('GaN-wz,', 'Nowhere,'), 'bad-dos.csv'));
    delete (globalThis as Record<symbol, unknown>)[OFF_LOOP_CHANNEL];
    expect(await refusal(json([row('57x'), { ...row(1), material: 'Unobtainium' }], 'bad.json'))).toEqual(badJson);
    expect(await refusal(dosImport(dos(400).replace('GaN-wz,', 'Nowhere,'), 'bad-dos.csv'))).toEqual(badDos);
    expect(badJson).toMatchObject({ code: 'unprocessable' });
    expect(badDos).toMatchObject({ code: 'unprocessable' });
  }, 120_000);

  it('leaves nothing when the worker dies in the middle of an import, and says so', async () => {
    const s = await workspace();
    const proc = await worker();
    const big = HEADER + Array.from({ length: 60_000 }, (_, i) => line(i, (300 + i / 1000).toFixed(3))).join('');
    const pending = refusal(importOf(s, 'big.csv', big));
    await new Promise((r) => setTimeout(r, 700));
    proc.kill('SIGKILL');
    expect(await pending).toEqual({ thrown: expect.stringMatching(/worker process stopped .* nothing of it was stored/) });
    const batches = await db.select({ id: importBatch.id }).from(importBatch).where(and(eq(importBatch.workspaceId, s.w), eq(importBatch.fileName, 'big.csv')));
    expect(batches).toHaveLength(0);
    const rows = await db.select({ id: measurement.id }).from(measurement).where(eq(measurement.workspaceId, s.w));
    expect(rows).toHaveLength(0);
  }, 120_000);
});

describe('the write lock during an import', () => {
  it('is not taken by a file with errors, and a good file takes it only to store its rows', async () => {
    const s = await workspace();
    // Another connection (as another process would) holds the write lock for 2 s.
    const other = connect({ url: process.env.DATABASE_URL! });
    const holder = await other.transaction('write');
    await holder.execute({ sql: 'UPDATE organization SET name = name WHERE id = ?', args: [s.w] });
    const released = new Promise<number>((resolve) =>
      setTimeout(async () => {
        await holder.commit();
        resolve(Date.now());
      }, 2000),
    );
    const start = Date.now();
    const bad = HEADER + Array.from({ length: 3000 }, (_, i) => line(i)).join('') + line(1, 'abc');
    expect(await refusal(importOf(s, 'bad-while-locked.csv', bad))).toMatchObject({ code: 'unprocessable', errorCount: 1 });
    const refusedAfter = Date.now() - start;
    expect(refusedAfter).toBeLessThan(1900); // answered while the lock was still held by the other connection
    const good = await importOf(s, 'good-after-lock.csv', HEADER + Array.from({ length: 3000 }, (_, i) => line(i, (300 + i / 100).toFixed(2))).join(''));
    const storedAt = Date.now();
    const releasedAt = await released;
    expect(good.insertedCount).toBe(3000);
    expect(storedAt).toBeGreaterThanOrEqual(releasedAt); // it waited for the lock instead of failing
    other.close();
  }, 60_000);
});
