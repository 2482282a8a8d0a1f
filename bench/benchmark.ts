/**
 * Benchmark of a full benchmark recomputation on a fresh database with the
 * high-throughput scenario (invented data): 1,500 materials, 5 methods, 30
 * computed modes per material and method (225,000 calculations) and 6,000
 * measurements. Times recomputeBenchmark (read the scope rows, pair, statistics
 * with 1,000 bootstrap resamples, outliers, comparisons, quality checks, store
 * the revision and its flags) next to a floor measured in the same run: reading
 * the same rows (same columns) with one raw SELECT through @libsql/client.
 * Target: recomputation ≤ 1.5 × floor (the scale issue's; ≤ 3 × before it). Then three 1,000-row imports, each
 * followed by the incremental recomputation (only the materials the import touched are paired again): target
 * ≤ 10 % of the full recomputation's time. Then the latency of the benchmark page's
 * JSON endpoints over 200 sequential requests, measured on the query +
 * serialisation functions the route handlers call (the session check is left
 * out: it needs Next's request context). Last, the bytes the latest revision
 * stores: its row set (target ≤ 1 MB, beside the JSON list of row ids revisions
 * stored before row sets), its statistics snapshot and the total.
 * Then a reference benchmark: the same five methods against a sixth, reference method (its modes indexed like
 * theirs), three full recomputations, printed next to the same floor with the same 1.5 × target.
 * Last, the peak RSS of the whole run (target for `--scale=10`: under 2 GB).
 * Run with `npm run bench:benchmark` (`-- --scale=10`: 15,000 materials, 2.25 M calculation rows).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';

const dir = mkdtempSync(join(tmpdir(), 'ledger-bench-'));
process.env.DATABASE_URL = `file:${join(dir, 'bench.db')}`;

const { getClient, closeDb } = await import('../db/client');
const { migrateClient } = await import('../db/migrate');
const { createBenchmark, getBenchmark, loadBenchmarkInput } = await import('../db/queries/benchmarks');
const { getRevision, pairLookups } = await import('../db/queries/revisions');
const { recomputeBenchmark } = await import('../lib/services/benchmarks/recompute');
const { computeBenchmark } = await import('../lib/benchmark/compute');
const { statisticsPayload } = await import('../lib/benchmark/statistics-payload');
const { plotPoints } = await import('../lib/benchmark/pairs-export');
const { encodePlotColumns } = await import('../lib/benchmark/plot-columns');
const { createRandom } = await import('../lib/science');

// `--scale=10`: ten times the materials and measurements (2.25 M calculation rows), for sizing a set-up.
const scaleArg = process.argv.find((a) => a.startsWith('--scale='));
const SCALE = scaleArg ? Number(scaleArg.slice('--scale='.length)) : 1;
if (!Number.isInteger(SCALE) || SCALE < 1) throw new Error(`--scale must be a positive whole number, got ${scaleArg}`);
const MATERIALS = 1500 * SCALE;
const METHODS = 5;
const MODES = 30;
const MEASUREMENTS = 6000 * SCALE;
const REQUESTS = SCALE === 1 ? 200 : 20;
const CHUNK = 500;

const client = getClient();
await migrateClient(client);

const LABELS = [
  { irrep: 'A1g', activity: 'raman' },
  { irrep: 'Eg', activity: 'raman' },
  { irrep: 'T2g', activity: 'raman' },
  { irrep: 'A2u', activity: 'ir' },
  { irrep: 'Eu', activity: 'ir' },
  { irrep: 'B1u', activity: 'silent' },
] as const;

async function insertRows(table: string, columns: string[], rows: unknown[][]): Promise<void> {
  const tx = await client.transaction('write');
  try {
    for (let i = 0; i < rows.length; i += CHUNK) {
      const chunk = rows.slice(i, i + CHUNK);
      const placeholders = chunk.map(() => `(${columns.map(() => '?').join(',')})`).join(',');
      await tx.execute({ sql: `insert into ${table} (${columns.join(',')}) values ${placeholders}`, args: chunk.flat() as never });
      await new Promise(setImmediate);
    }
    await tx.commit();
  } finally {
    tx.close();
  }
}

async function buildScenario(): Promise<{ workspaceId: string; userId: string; candidateIds: string[]; referenceId: string }> {
  const random = createRandom(2024);
  const workspaceId = crypto.randomUUID();
  const userId = crypto.randomUUID();
  const now = Date.now();
  await client.execute({ sql: 'insert into organization (id, name, slug, created_at) values (?, ?, ?, ?)', args: [workspaceId, 'Bench', 'bench', now] });
  await client.execute({
    sql: 'insert into user (id, name, email, email_verified, created_at, updated_at) values (?, ?, ?, 1, ?, ?)',
    args: [userId, 'Bench', 'bench@example.org', now, now],
  });
  const sources = Array.from({ length: 20 }, (_, i) => [crypto.randomUUID(), workspaceId, `src${i}`, 'journal-article', `Invented study ${i}`, 'Doe, J.; Roe, R.', 2000 + i]);
  await insertRows('source', ['id', 'workspace_id', 'cite_key', 'kind', 'title', 'authors', 'year'], sources);
  const methodBias = [-0.03, -0.01, 0, 0.015, 0.04];
  const methods = methodBias.map((_, i) => [crypto.randomUUID(), workspaceId, `method-${i}`, 'PBEsol', JSON.stringify([8, 8, 8]), JSON.stringify([4, 4, 4])]);
  await insertRows('method', ['id', 'workspace_id', 'label', 'functional', 'k_grid', 'q_grid'], methods);
  // The dense-grid reference of the reference benchmark: the modes' true values, indexed like the candidates'.
  const referenceId = crypto.randomUUID();
  await insertRows('method', ['id', 'workspace_id', 'label', 'functional', 'k_grid', 'q_grid'], [[referenceId, workspaceId, 'reference', 'PBEsol', JSON.stringify([24, 24, 24]), JSON.stringify([4, 4, 4])]]);
  const tags = ['oxide', 'halide', 'semiconductor', 'nitride'];
  const materials: unknown[][] = [];
  const materialTags: unknown[][] = [];
  const measurements: unknown[][] = [];
  const calculations: unknown[][] = [];
  const perMaterial = MEASUREMENTS / MATERIALS;
  // Written every 500 materials, so the harness never holds millions of rows (the peak RSS printed is the app's).
  const flush = async () => {
    await insertRows('material', ['id', 'workspace_id', 'name', 'formula', 'reduced_formula', 'atoms_per_formula_unit', 'element_counts', 'atoms_in_cell'], materials.splice(0));
    await insertRows('material_tag', ['material_id', 'workspace_id', 'tag'], materialTags.splice(0));
    await insertRows(
      'measurement',
      ['id', 'workspace_id', 'material_id', 'source_id', 'quantity', 'value', 'value_text', 'unit', 'uncertainty', 'temperature_k', 'irrep', 'technique', 'row_hash'],
      measurements.splice(0),
    );
    await insertRows(
      'calculation',
      ['id', 'workspace_id', 'material_id', 'source_id', 'method_id', 'quantity', 'value', 'value_text', 'unit', 'irrep', 'activity', 'row_hash', 'mode_index'],
      calculations.splice(0),
    );
  };
  for (let m = 0; m < MATERIALS; m++) {
    const materialId = crypto.randomUUID();
    materials.push([materialId, workspaceId, `mat-${m}`, 'AB2', 'AB2', 3, '{"A":1,"B":2}', 10]);
    materialTags.push([materialId, workspaceId, tags[m % tags.length]]);
    const truth = Array.from({ length: MODES - 3 }, () => ({ value: 40 + 1100 * random(), ...LABELS[(random() * LABELS.length) | 0] }));
    const chosen = new Set<number>();
    while (chosen.size < perMaterial) {
      const k = (random() * truth.length) | 0;
      if (chosen.has(k) || truth[k].activity === 'silent') continue;
      chosen.add(k);
      const mode = truth[k];
      const value = mode.value + 4 * (random() - 0.5);
      measurements.push([
        crypto.randomUUID(), workspaceId, materialId, sources[m % sources.length][0], 'frequency', value, value.toFixed(2), 'cm-1', 1 + random(), 295,
        random() < 0.7 ? mode.irrep : null, mode.activity === 'raman' ? 'raman' : 'ir-reflectance', `m${m}-${k}`,
      ]);
    }
    methods.forEach(([methodId], i) => {
      for (let a = 0; a < 3; a++) {
        calculations.push([crypto.randomUUID(), workspaceId, materialId, sources[19][0], methodId, 'frequency', 0.2 * a, '0', 'cm-1', null, 'acoustic', `c${m}-${i}-a${a}`, a + 1]);
      }
      truth.forEach((mode, k) => {
        const value = mode.value * (1 + methodBias[i]) + 6 * (random() - 0.5);
        calculations.push([crypto.randomUUID(), workspaceId, materialId, sources[19][0], methodId, 'frequency', value, value.toFixed(2), 'cm-1', mode.irrep, mode.activity, `c${m}-${i}-${k}`, k + 4]);
      });
    });
    for (let a = 0; a < 3; a++) calculations.push([crypto.randomUUID(), workspaceId, materialId, sources[19][0], referenceId, 'frequency', 0, '0', 'cm-1', null, 'acoustic', `r${m}-a${a}`, a + 1]);
    truth.forEach((mode, k) => {
      calculations.push([crypto.randomUUID(), workspaceId, materialId, sources[19][0], referenceId, 'frequency', mode.value, mode.value.toFixed(2), 'cm-1', mode.irrep, mode.activity, `r${m}-${k}`, k + 4]);
    });
    if ((m + 1) % 500 === 0 || m === MATERIALS - 1) await flush();
  }
  return { workspaceId, userId, candidateIds: methods.map((r) => String(r[0])), referenceId };
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

function percentile(values: number[], p: number): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil(p * s.length) - 1)];
}

const FLOOR_SQL = `
select id, material_id, source_id, import_id, value, uncertainty, temperature_k, irrep, branch, technique, null as method_id, null as activity, null as degeneracy
  from measurement where workspace_id = ?1 and quantity = 'frequency' and retracted_at is null
union all
select id, material_id, source_id, import_id, value, uncertainty, temperature_k, irrep, branch, null, method_id, activity, degeneracy
  from calculation where workspace_id = ?1 and quantity = 'frequency' and retracted_at is null and method_id != ?2`;

/** The experimental benchmark's rows: measurements and the five candidates' calculations (not the reference's). */
async function floorMs(workspaceId: string, referenceId: string): Promise<{ ms: number; rows: number }> {
  const start = performance.now();
  const result = await client.execute({ sql: FLOOR_SQL, args: [workspaceId, referenceId] });
  return { ms: performance.now() - start, rows: result.rows.length };
}

const buildStart = performance.now();
const { workspaceId, userId, candidateIds, referenceId } = await buildScenario();
console.log(
  `scenario built in ${((performance.now() - buildStart) / 1000).toFixed(1)} s: ${MATERIALS} materials, ${METHODS} methods, ${MATERIALS * METHODS * MODES} calculations, ${MEASUREMENTS} measurements; a reference method with ${MATERIALS * MODES} more calculations`,
);

const { id: benchmarkId } = await createBenchmark(workspaceId, { userId }, { name: 'High-throughput bench', scope: { quantity: 'frequency', methodIds: candidateIds } });

// The app's runs come first, so the peak RSS read after them is the app's, not the floor's (a raw SELECT of every row
// into one result set); the floor is measured after them, on the same warm page cache.
const bm = (await getBenchmark(workspaceId, benchmarkId))!;
const measurementIds = (await client.execute({ sql: 'select id from measurement where workspace_id = ? order by seq limit 3', args: [workspaceId] })).rows.map((r) => String(r[0]));

const recompute: number[] = [];
const floors: number[] = [];
let rowsRead = 0;
let pairs = 0;
for (let run = 0; run < 3; run++) {
  if (run > 0) {
    // Retract one measurement so the fingerprint differs and a new revision is stored (rows are never edited).
    await client.execute({ sql: 'update measurement set retracted_at = ? where id = ?', args: [Date.now(), measurementIds[run]] });
  }
  const start = performance.now();
  const result = await recomputeBenchmark(workspaceId, benchmarkId, [{ trigger: 'manual' }], { full: true });
  recompute.push(performance.now() - start);
  if (!result.created) throw new Error('expected a new revision');
}

// Incremental: a 1,000-row import of computed modes (about 33 materials × 30 modes of one method), then the
// recomputation that starts from the stages kept by the last run. Three rounds, each its own import.
const incremental: number[] = [];
const repairedCounts: string[] = [];
const warm = await recomputeBenchmark(workspaceId, benchmarkId, [{ trigger: 'manual' }]);
if (warm.created) throw new Error('expected no change before the first incremental round');
const materialRows = (await client.execute({ sql: 'select id from material where workspace_id = ? order by name', args: [workspaceId] })).rows.map((r) => String(r[0]));
const methodRows = (await client.execute({ sql: 'select id from method where workspace_id = ? order by label', args: [workspaceId] })).rows.map((r) => String(r[0]));
const sourceRow = (await client.execute({ sql: 'select id from source where workspace_id = ? limit 1', args: [workspaceId] })).rows[0][0];
const IMPORT_ROWS = 1000;
for (let round = 0; round < 3; round++) {
  const importId = crypto.randomUUID();
  await client.execute({
    sql: "insert into import_batch (id, workspace_id, kind, file_name, sha256, byte_count, row_count, inserted_count, via, created_by, created_at) values (?, ?, 'calculations', 'bench.csv', ?, 1, ?, ?, 'api', ?, ?)",
    args: [importId, workspaceId, crypto.randomUUID(), IMPORT_ROWS, IMPORT_ROWS, userId, Date.now()],
  });
  const rows: unknown[][] = [];
  for (let i = 0; i < IMPORT_ROWS; i++) {
    const materialId = materialRows[(round * 40 + Math.floor(i / 30)) % materialRows.length];
    const value = 50 + ((i * 37) % 1000) + round;
    rows.push([crypto.randomUUID(), workspaceId, materialId, sourceRow, methodRows[round % methodRows.length], importId, 'frequency', value, value.toFixed(2), 'cm-1', 'A1g', 'raman', `inc${round}-${i}`]);
  }
  await insertRows('calculation', ['id', 'workspace_id', 'material_id', 'source_id', 'method_id', 'import_id', 'quantity', 'value', 'value_text', 'unit', 'irrep', 'activity', 'row_hash'], rows);
  const start = performance.now();
  const result = await recomputeBenchmark(workspaceId, benchmarkId, [{ trigger: 'import', importId }]);
  incremental.push(performance.now() - start);
  if (!result.created || !result.repaired) throw new Error('expected a new revision from the incremental run');
  repairedCounts.push(`${result.repaired.materials}/${result.repaired.of}`);
}

// The same five methods against the reference method instead of experiment: 1,500 materials × 5 candidates, mode lists
// matched by index. Each run retracts one reference row first, so that every run stores a revision.
const { id: referenceBenchmarkId } = await createBenchmark(workspaceId, { userId }, { name: 'Reference bench', scope: { quantity: 'frequency', methodIds: candidateIds, referenceMethodId: referenceId } });
const referenceRows = (await client.execute({ sql: "select id from calculation where method_id = ? and activity != 'acoustic' order by seq limit 3", args: [referenceId] })).rows.map((r) => String(r[0]));
const referenceRuns: number[] = [];
let referenceMatched = '';
for (let run = 0; run < 3; run++) {
  if (run > 0) await client.execute({ sql: 'update calculation set retracted_at = ? where id = ?', args: [Date.now(), referenceRows[run]] });
  const start = performance.now();
  const result = await recomputeBenchmark(workspaceId, referenceBenchmarkId, [{ trigger: 'manual' }], { full: true });
  referenceRuns.push(performance.now() - start);
  if (!result.created) throw new Error('expected a new revision of the reference benchmark');
}
{
  const rev = (await getRevision(workspaceId, referenceBenchmarkId))!;
  referenceMatched = `${rev.statistics.pairs.length.toLocaleString('en')} pairs; lists matched by index ${rev.statistics.reference!.matchedBy.index}, by pairing ${rev.statistics.reference!.matchedBy.pairing}`;
}

const appPeakRss = process.resourceUsage().maxRSS * 1024;
for (let run = 0; run < 3; run++) {
  const f = await floorMs(workspaceId, referenceId);
  floors.push(f.ms);
  rowsRead = f.rows;
}

const loadStart = performance.now();
const input = await loadBenchmarkInput(workspaceId, bm);
const loadMs = performance.now() - loadStart;
const computeStart = performance.now();
const snapshot = computeBenchmark(input);
const computeMs = performance.now() - computeStart;
pairs = snapshot.pairs.length;

const recomputeMs = median(recompute);
const floor = median(floors);
console.log('');
console.log(`rows read per recomputation   ${rowsRead.toLocaleString('en')} (floor: one raw SELECT of the same columns)`);
console.log(`pairs                         ${pairs.toLocaleString('en')}`);
console.log(`floor (raw SELECT)            ${floor.toFixed(0)} ms (median of 3)`);
console.log(`full recomputation            ${recomputeMs.toFixed(0)} ms (median of 3; runs ${recompute.map((r) => r.toFixed(0)).join(', ')} ms)`);
console.log(`  of which: read ${loadMs.toFixed(0)} ms, compute ${computeMs.toFixed(0)} ms (separate run), the rest fingerprint + store`);
console.log(`ratio                         ${(recomputeMs / floor).toFixed(2)} × floor (target ≤ 1.5 ×) ${recomputeMs / floor <= 1.5 ? 'PASS' : 'MISS'}`);
const incrementalMs = median(incremental);
console.log(
  `incremental after a ${IMPORT_ROWS.toLocaleString('en')}-row import  ${incrementalMs.toFixed(0)} ms (median of 3; runs ${incremental.map((r) => r.toFixed(0)).join(', ')} ms; materials re-paired ${repairedCounts.join(', ')})`,
);
console.log(
  `incremental / full            ${((100 * incrementalMs) / recomputeMs).toFixed(1)} % (target ≤ 10 %) ${incrementalMs <= 0.1 * recomputeMs ? 'PASS' : 'MISS'}`,
);

const referenceMs = median(referenceRuns);
console.log(
  `reference benchmark           ${referenceMs.toFixed(0)} ms (median of 3; runs ${referenceRuns.map((r) => r.toFixed(0)).join(', ')} ms; 5 candidates against a reference method, ${referenceMatched})`,
);
console.log(`  ratio                       ${(referenceMs / floor).toFixed(2)} × the same floor (target ≤ 1.5 ×, as the experimental benchmark) ${referenceMs / floor <= 1.5 ? 'PASS' : 'MISS'}`);

// Revision size: the row set as stored, next to the JSON list of row ids revisions stored before it (same rows).
const sizes = await client.execute({
  sql: 'select length(row_set), length(statistics), length(snapshot), length(cause) from revision where benchmark_id = ? order by number desc limit 1',
  args: [benchmarkId],
});
const [rowSetBytes, headBytes, packedBytes, causeBytes] = [0, 1, 2, 3].map((i) => Number(sizes.rows[0][i]));
const jsonSnapshotBytes = Buffer.byteLength(JSON.stringify(snapshot));
const legacyRowIdBytes = Buffer.byteLength(
  JSON.stringify({ measurements: input.measurements.map((m) => m.id).sort(), calculations: input.calculations.map((c) => c.id).sort() }),
);
const kb = (n: number) => `${(n / 1024).toFixed(1)} KiB`;
console.log('');
console.log(`revision row set              ${rowSetBytes.toLocaleString('en')} bytes for ${rowsRead.toLocaleString('en')} rows (the JSON list of row ids: ${(legacyRowIdBytes / 1024 / 1024).toFixed(2)} MB) (target ≤ 1 MB) ${rowSetBytes <= 1024 * 1024 ? 'PASS' : 'MISS'}`);
console.log(
  `revision snapshot             head ${kb(headBytes)} (methods, decisions, pins as JSON) + packed rest ${kb(packedBytes)} (pairs in columns, deflated); as one JSON text it was ${(jsonSnapshotBytes / 1024 / 1024).toFixed(2)} MB; cause ${kb(causeBytes)}`,
);
const totalBytes = rowSetBytes + headBytes + packedBytes + causeBytes;
console.log(`revision total                ${(totalBytes / 1024 / 1024).toFixed(2)} MB (target ≤ 1 MB) ${totalBytes <= 1024 * 1024 ? 'PASS' : 'MISS'}`);

async function latency(label: string, fn: () => Promise<string>) {
  const times: number[] = [];
  let bytes = 0;
  for (let i = 0; i < REQUESTS; i++) {
    const start = performance.now();
    bytes = (await fn()).length;
    times.push(performance.now() - start);
  }
  console.log(
    `${label.padEnd(30)}first ${times[0].toFixed(1)} ms, median ${median(times).toFixed(2)} ms, p99 ${percentile(times, 0.99).toFixed(2)} ms over ${REQUESTS} sequential requests (${(bytes / 1024).toFixed(0)} KiB)`,
  );
}

console.log('');
console.log('JSON endpoints, measured on the query + serialisation functions of the route handlers (session check excluded):');
await latency('GET …/statistics', async () => {
  const revision = await getRevision(workspaceId, benchmarkId);
  return JSON.stringify(statisticsPayload({ id: bm.id, name: bm.name }, revision, false));
});
await latency('GET …/pairs (plot columns)', async () => {
  const revision = (await getRevision(workspaceId, benchmarkId))!;
  const lookups = await pairLookups(workspaceId, revision.statistics);
  return JSON.stringify(encodePlotColumns(plotPoints(revision.statistics, lookups), { revision: revision.number, unit: revision.statistics.unit }));
});

const peakRss = process.resourceUsage().maxRSS * 1024;
console.log('');
const mb = (n: number) => `${(n / 1024 / 1024).toFixed(0)} MB`;
console.log(`peak RSS of the app's runs    ${mb(appPeakRss)} (full and incremental recomputations; scale ${SCALE}; target < 2 GB) ${appPeakRss < 2 * 1024 ** 3 ? 'PASS' : 'MISS'}`);
console.log(`peak RSS of the whole run     ${mb(peakRss)} (with the floor's raw SELECT and the separate read + compute)`);

(await import('../lib/services/jobs/runner')).stopJobRunner();
closeDb();
rmSync(dir, { recursive: true, force: true });
