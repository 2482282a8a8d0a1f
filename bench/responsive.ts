/**
 * Is the server responsive during a big import and the recomputation after it?
 * Starts the production build (scripts/server.mjs, `npm run build` first) on a
 * fresh database with invented data: 1,000 materials, 4 methods, 4,000
 * measurements and one benchmark over them. A cheap page (GET /sign-in) is
 * probed every 250 ms: first on the idle server (the floor), then while a
 * 200,000-row calculations import goes through POST /api/v1/imports and the
 * benchmark's recomputation runs, until the status route says the new revision
 * is stored. Prints the probes' p50, p99 and max for both phases. The first
 * request to the import route loads its modules; it is sent (and timed, with a
 * probe beside it) before the idle phase, so the loaded phase measures the import.
 * Target: probe p99 under 250 ms and max under 1 s while the import and the
 * recomputation finish.
 * Run with `npm run bench:responsive` (ROWS=… for another size).
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';

if (!existsSync('.next/BUILD_ID')) {
  console.error('bench:responsive needs the production build: run `npm run build` first.');
  process.exit(2);
}

const MATERIALS = 1000;
const METHODS = 4;
const ROWS = Number(process.env.ROWS ?? 200_000);
const MODES = Math.ceil(ROWS / (MATERIALS * METHODS));
const PROBE_EVERY_MS = 250;
const IDLE_PROBES = 60;

const dir = mkdtempSync(join(tmpdir(), 'ledger-responsive-'));
const databaseUrl = `file:${join(dir, 'bench.db')}`;
process.env.DATABASE_URL = databaseUrl;

const { getClient, closeDb } = await import('../db/client');
const { migrateClient } = await import('../db/migrate');
const { createBenchmark } = await import('../db/queries/benchmarks');
const { recomputeBenchmark } = await import('../lib/services/benchmarks/recompute');
const { generateApiToken } = await import('../lib/api/tokens');
const { createRandom } = await import('../lib/science');
const { stopJobRunner } = await import('../lib/services/jobs/runner');

async function seed() {
  const client = getClient();
  await migrateClient(client);
  const random = createRandom(7);
  const now = Date.now();
  const [workspaceId, userId] = ['bench-workspace', 'bench-user'];
  await client.execute({ sql: 'insert into user (id, name, email, email_verified, created_at, updated_at) values (?, ?, ?, 1, ?, ?)', args: [userId, 'Bench', 'bench@example.org', now, now] });
  await client.execute({ sql: 'insert into organization (id, name, slug, created_at) values (?, ?, ?, ?)', args: [workspaceId, 'Bench (invented)', 'bench', now] });
  await client.execute({ sql: 'insert into member (id, organization_id, user_id, role, created_at) values (?, ?, ?, ?, ?)', args: ['bench-member', workspaceId, userId, 'owner', now] });
  const token = generateApiToken();
  await client.execute({
    sql: 'insert into api_token (id, workspace_id, name, prefix, token_hash, role, created_by) values (?, ?, ?, ?, ?, ?, ?)',
    args: ['bench-token', workspaceId, 'bench', token.prefix, token.hash, 'contributor', userId],
  });
  await client.execute({ sql: "insert into source (id, workspace_id, cite_key, kind, title) values ('src', ?, 'bench-lab', 'journal-article', 'Invented measurements')", args: [workspaceId] });
  await client.execute({ sql: "insert into source (id, workspace_id, cite_key, kind, title) values ('src-calc', ?, 'bench-runs', 'computed-data-set', 'Invented runs')", args: [workspaceId] });
  for (let k = 0; k < METHODS; k++) await client.execute({ sql: "insert into method (id, workspace_id, label, functional) values (?, ?, ?, 'PBEsol')", args: [`method-${k}`, workspaceId, `Recipe-${k}`] });
  const tx = await client.transaction('write');
  for (let m = 0; m < MATERIALS; m++) {
    await tx.execute({
      sql: "insert into material (id, workspace_id, name, formula, reduced_formula, atoms_per_formula_unit, element_counts) values (?, ?, ?, 'MgO', 'MgO', 2, '{\"Mg\":1,\"O\":1}')",
      args: [`mat-${m}`, workspaceId, `Crystal-${m}`],
    });
    for (let j = 0; j < 4; j++) {
      const value = 100 + 10 * (j * 7 + 1) + 2 * (random() - 0.5);
      await tx.execute({
        sql: "insert into measurement (id, workspace_id, material_id, source_id, quantity, value, value_text, unit, uncertainty, temperature_k, irrep, technique, row_hash) values (?, ?, ?, 'src', 'frequency', ?, ?, 'cm-1', 1, 295, ?, 'raman', ?)",
        args: [crypto.randomUUID(), workspaceId, `mat-${m}`, value, value.toFixed(2), `A${j}g`, `m-${m}-${j}`],
      });
    }
  }
  await tx.commit();
  const { id: benchmarkId } = await createBenchmark(workspaceId, { userId }, { name: 'Responsiveness (invented)', scope: { quantity: 'frequency' } });
  await recomputeBenchmark(workspaceId, benchmarkId, [{ trigger: 'benchmark-created' }]);
  stopJobRunner();
  closeDb();
  return { token: token.token, benchmarkId };
}

/** Invented computed modes: every method and material, modes 1…MODES (modes 1–4 carry the measured labels). */
function csv(): string {
  const random = createRandom(11);
  const lines = ['material,method,quantity,value,unit,mode_index,irrep,activity,source'];
  let n = 0;
  for (let m = 0; m < MATERIALS && n < ROWS; m++)
    for (let k = 0; k < METHODS && n < ROWS; k++)
      for (let j = 0; j < MODES && n < ROWS; j++, n++) {
        const value = j < 4 ? 100 + 10 * (j * 7 + 1) * (1 + 0.01 * k) + 3 * (random() - 0.5) : 400 + 800 * random();
        lines.push(`Crystal-${m},Recipe-${k},frequency,${value.toFixed(2)},cm-1,${j + 1},${j < 4 ? `A${j}g` : ''},${j < 4 ? 'raman' : ''},bench-runs`);
      }
  return lines.join('\n') + '\n';
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.listen(0, '127.0.0.1', () => {
      const port = (srv.address() as { port: number }).port;
      srv.close(() => resolve(port));
    });
    srv.on('error', reject);
  });
}

function stats(values: number[]) {
  const s = [...values].sort((a, b) => a - b);
  const at = (p: number) => s[Math.min(s.length - 1, Math.ceil(p * s.length) - 1)];
  return { n: s.length, p50: at(0.5), p99: at(0.99), max: s[s.length - 1] };
}

const { token, benchmarkId } = await seed();
const body = csv();
console.log(`seeded: ${MATERIALS} materials, ${METHODS} methods, ${MATERIALS * 4} measurements; import file ${ROWS.toLocaleString('en')} rows (${(body.length / 1048576).toFixed(1)} MB), invented values`);

const port = await freePort();
const base = `http://127.0.0.1:${port}`;
const server = spawn(process.execPath, ['scripts/server.mjs'], {
  env: {
    ...process.env,
    NODE_ENV: 'production',
    NEXT_TELEMETRY_DISABLED: '1',
    DATABASE_URL: databaseUrl,
    PORT: String(port),
    BETTER_AUTH_SECRET: 'bench-secret-0123456789abcdef0123456789abcdef',
    BETTER_AUTH_URL: base,
    RECOMPUTE_DEBOUNCE_MS: '500',
    MAIL_WORKER_INTERVAL_MS: '0',
  },
  stdio: ['ignore', 'ignore', 'inherit'],
});

async function probe(): Promise<number> {
  const t = performance.now();
  const res = await fetch(`${base}/sign-in`);
  await res.arrayBuffer();
  if (res.status !== 200) throw new Error(`probe answered ${res.status}`);
  return performance.now() - t;
}

try {
  for (let i = 0; ; i++) {
    try {
      await probe();
      break;
    } catch {
      if (i > 240) throw new Error('the server did not start in 60 s');
      await new Promise((r) => setTimeout(r, 250));
    }
  }
  for (let i = 0; i < 8; i++) await probe(); // warm-up, not counted

  /** Probes every PROBE_EVERY_MS (or right after a probe slower than that) until `done` resolves. */
  /** When each probe started (ms since the import was sent) and how long it took: where the slow ones fall. */
  const timeline: Array<{ at: number; ms: number }> = [];
  let t0 = 0;
  async function probing(done: Promise<unknown> | number): Promise<number[]> {
    const times: number[] = [];
    let finished = false;
    if (typeof done !== 'number') void done.finally(() => (finished = true));
    while (typeof done === 'number' ? times.length < done : !finished) {
      const start = performance.now();
      times.push(await probe());
      if (typeof done !== 'number') timeline.push({ at: start - t0, ms: times[times.length - 1] });
      const wait = PROBE_EVERY_MS - (performance.now() - start);
      if (wait > 0) await new Promise((r) => setTimeout(r, wait));
    }
    return times;
  }

  const auth = { authorization: `Bearer ${token}` };
  // The first request to a route loads its modules (once per server process): the import route's is timed on its own,
  // and a probe sent meanwhile, so that the loaded phase below measures the import, not the start-up.
  const coldStart = performance.now();
  const [coldProbe] = await Promise.all([
    new Promise<number>((resolve) => setTimeout(() => void probe().then(resolve), 20)),
    fetch(`${base}/api/v1/imports?size=1`, { headers: auth }).then((r) => {
      if (r.status !== 200) throw new Error(`GET /api/v1/imports answered ${r.status}`);
    }),
  ]);
  const coldMs = performance.now() - coldStart;

  const idle = stats(await probing(IDLE_PROBES));

  t0 = performance.now();
  let importMs = 0;
  let recomputeMs = 0;
  const work = (async () => {
    const res = await fetch(`${base}/api/v1/imports?kind=calculations&fileName=responsive.csv`, { method: 'POST', headers: { ...auth, 'content-type': 'text/csv' }, body });
    const answer = await res.json();
    if (res.status !== 201) throw new Error(`import answered ${res.status}: ${JSON.stringify(answer).slice(0, 300)}`);
    importMs = performance.now() - t0;
    for (;;) {
      const status = await (await fetch(`${base}/api/v1/benchmarks/${benchmarkId}/status?import=${answer.importId}`, { headers: auth })).json();
      if (status.state === 'failed') throw new Error(`recomputation failed: ${status.error}`);
      if (status.import?.settled) break;
      await new Promise((r) => setTimeout(r, 500));
    }
    recomputeMs = performance.now() - t0 - importMs;
  })();
  const loaded = stats(await probing(work));
  await work;

  const row = (label: string, s: ReturnType<typeof stats>) =>
    `${label.padEnd(42)}p50 ${s.p50.toFixed(0).padStart(5)} ms   p99 ${s.p99.toFixed(0).padStart(6)} ms   max ${s.max.toFixed(0).padStart(6)} ms   (${s.n} probes)`;
  console.log('');
  console.log(`first request to the import route  ${coldMs.toFixed(0)} ms (its modules load, once per process); a probe sent meanwhile took ${coldProbe.toFixed(0)} ms`);
  console.log(`import (POST, until 201)             ${(importMs / 1000).toFixed(1)} s`);
  console.log(`recomputation (201 → revision stored) ${(recomputeMs / 1000).toFixed(1)} s`);
  console.log(row('GET /sign-in, idle server (floor)', idle));
  console.log(row('GET /sign-in, during import + recompute', loaded));
  console.log(`ratio p99 loaded / idle              ${(loaded.p99 / idle.p99).toFixed(1)} ×`);
  const slow = timeline.filter((p) => p.ms > 250).sort((a, b) => b.ms - a.ms).slice(0, 8);
  console.log(
    `slowest probes (sent at, took): ${slow.map((p) => `${(p.at / 1000).toFixed(1)} s ${p.ms.toFixed(0)} ms ${p.at < importMs ? '(import)' : '(recompute)'}`).join(' · ') || 'none over 250 ms'}`,
  );
  console.log(`target p99 < 250 ms: ${loaded.p99 < 250 ? 'PASS' : 'MISS'} · target max < 1 s: ${loaded.max < 1000 ? 'PASS' : 'MISS'}`);
} finally {
  server.kill('SIGTERM');
  await new Promise((r) => server.once('exit', r));
  rmSync(dir, { recursive: true, force: true });
}
