import { spawn } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { connect, isBusyError, retryBusy } from '@/db/connection';

// Two real processes on one SQLite file, with SQLite's own wait cut to 1 ms so that the lock of
// the other process is met constantly; the parent also holds the write lock for 2.5 s at the start.
// Before db/connection.ts closed connections whose statement failed busy, the first test failed with
// "cannot commit transaction - SQL statements in progress" (a failed BEGIN IMMEDIATE left behind).
const dir = mkdtempSync(join(tmpdir(), 'ledger-xproc-'));
const clients: Array<{ close(): void }> = [];
afterAll(() => clients.forEach((c) => c.close()));

function writer(url: string, tag: string, count: number, retryMs: number): Promise<{ tag: string; errors: number; first: string | null }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--conditions=react-server', '--import', 'tsx', 'tests/support/busy-writer.ts', url, tag, String(count), '1', String(retryMs)], {
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    let out = '';
    child.stdout.on('data', (d) => (out += d));
    child.on('error', reject);
    child.on('exit', (code) => (code === 0 ? resolve(JSON.parse(out.trim().split('\n').pop()!)) : reject(new Error(`writer ${tag} exited ${code}`))));
  });
}

async function scenario(name: string, retryMs: number) {
  const url = `file:${join(dir, `${name}.db`)}`;
  const parent = connect({ url });
  clients.push(parent);
  await parent.execute('CREATE TABLE w (id INTEGER PRIMARY KEY AUTOINCREMENT, tag TEXT NOT NULL, n INTEGER NOT NULL)');
  const holder = await parent.transaction('write');
  await holder.execute("INSERT INTO w (tag, n) VALUES ('parent', 0)");
  const running = Promise.all([writer(url, 'a', 100, retryMs), writer(url, 'b', 100, retryMs)]);
  // Held long enough for both children to start (tsx, connect) and meet it: another process's lock.
  await new Promise((r) => setTimeout(r, 2500));
  await holder.commit();
  const results = await running;
  const counts = await parent.execute('SELECT tag, count(*) AS c FROM w GROUP BY tag ORDER BY tag');
  return { results, counts: Object.fromEntries(counts.rows.map((r) => [r.tag as string, Number(r.c)])) };
}

describe('writes across processes', () => {
  it('200 concurrent writes from two processes against a held lock: no error surfaces and every row is there', async () => {
    const { results, counts } = await scenario('retry', 30_000);
    expect(results.map((r) => [r.tag, r.errors, r.first])).toEqual([
      ['a', 0, null],
      ['b', 0, null],
    ]);
    // 50 autocommit inserts (1 row) and 50 transactions (2 rows) per writer.
    expect(counts).toEqual({ a: 150, b: 150, parent: 1 });
  }, 60_000);

  it('without the retry budget the same run surfaces SQLITE_BUSY (the test above can fail)', async () => {
    const { results } = await scenario('no-retry', 0);
    const errors = results.reduce((n, r) => n + r.errors, 0);
    expect(errors).toBeGreaterThan(0);
    expect(results.find((r) => r.first)?.first).toMatch(/SQLITE_BUSY/);
  }, 60_000);

  it('retryBusy retries only SQLITE_BUSY, and gives up after its budget with the last error', async () => {
    const busy = Object.assign(new Error('database is locked'), { code: 'SQLITE_BUSY' });
    let calls = 0;
    const noSleep = async () => {};
    await expect(retryBusy(async () => (++calls < 4 ? Promise.reject(busy) : 'done'), 10_000, noSleep)).resolves.toBe('done');
    expect(calls).toBe(4);
    calls = 0;
    const other = Object.assign(new Error('UNIQUE constraint failed'), { code: 'SQLITE_CONSTRAINT' });
    await expect(retryBusy(async () => (++calls, Promise.reject(other)), 10_000, noSleep)).rejects.toBe(other);
    expect(calls).toBe(1);
    await expect(retryBusy(async () => Promise.reject(busy), 0, noSleep)).rejects.toBe(busy);
    expect(isBusyError({ code: 'SQLITE_BUSY_SNAPSHOT' })).toBe(true);
    expect(isBusyError(new Error('x'))).toBe(false);
  });
});
