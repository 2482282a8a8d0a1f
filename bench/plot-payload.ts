/**
 * Bytes and latency of the pairs endpoint that feeds the benchmark plots, on the
 * 30,000-pair scenario (invented data: 1,500 materials with 4 measurements each,
 * 5 methods, 20 sources). Prints, in the same run:
 *  - the old row shape (one object per point, citation text on each: the floor /
 *    baseline) and the columnar payload the endpoint sends now, raw, gzip (what
 *    Next's server sends to a client that accepts gzip: zlib's default level, as
 *    its compression middleware) and brotli (for reference);
 *  - the endpoint's p50/p99 over 20 sequential requests, measured on the query +
 *    encoding + serialisation + gzip functions the request runs (the session check
 *    is left out: it needs Next's request context), next to the same for the old shape.
 * Target: ≤ 2 MB on the wire for 30,000 points. Run with `npm run bench:plot-payload`.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { brotliCompressSync, constants, gzipSync } from 'node:zlib';

const dir = mkdtempSync(join(tmpdir(), 'ledger-bench-plot-'));
process.env.DATABASE_URL = `file:${join(dir, 'bench.db')}`;

const { getClient, closeDb } = await import('../db/client');
const { migrateClient } = await import('../db/migrate');
const { createBenchmark } = await import('../db/queries/benchmarks');
const { getRevision, pairLookups } = await import('../db/queries/revisions');
const { recomputeBenchmark } = await import('../lib/services/benchmarks/recompute');
const { plotPoints } = await import('../lib/benchmark/pairs-export');
const { encodePlotColumns, decodePlotColumns } = await import('../lib/benchmark/plot-columns');
const { createRandom } = await import('../lib/science');

const MATERIALS = 1500;
const METHODS = 5;
const PER_MATERIAL = 4;
const REQUESTS = 20;
const CHUNK = 500;
const TARGET_BYTES = 2 * 1024 * 1024;

const client = getClient();
await migrateClient(client);

async function insertRows(table: string, columns: string[], rows: unknown[][]): Promise<void> {
  const tx = await client.transaction('write');
  try {
    for (let i = 0; i < rows.length; i += CHUNK) {
      const chunk = rows.slice(i, i + CHUNK);
      const placeholders = chunk.map(() => `(${columns.map(() => '?').join(',')})`).join(',');
      await tx.execute({ sql: `insert into ${table} (${columns.join(',')}) values ${placeholders}`, args: chunk.flat() as never });
    }
    await tx.commit();
  } finally {
    tx.close();
  }
}

/** Computed modes per material and method (4 of them measured). */
const IRREPS = ['A1g', 'Eg', 'T2g', 'A2u', 'Eu', 'B1g', 'B2g', 'E2g', 'A1', 'E', 'T2', 'B2'];

async function buildScenario(): Promise<{ workspaceId: string; userId: string }> {
  const random = createRandom(2024);
  const workspaceId = crypto.randomUUID();
  const userId = crypto.randomUUID();
  const now = Date.now();
  await client.execute({ sql: 'insert into organization (id, name, slug, created_at) values (?, ?, ?, ?)', args: [workspaceId, 'Bench', 'bench', now] });
  await client.execute({ sql: 'insert into user (id, name, email, email_verified, created_at, updated_at) values (?, ?, ?, 1, ?, ?)', args: [userId, 'Bench', 'bench@example.org', now, now] });
  const sources = Array.from({ length: 20 }, (_, i) => [
    crypto.randomUUID(), workspaceId, `src${i}`, 'journal-article', `Invented study number ${i} of lattice vibrations in layered compounds`, 'Doe, J.; Roe, R.; Poe, P.', 2000 + i, 'Journal of Invented Results',
  ]);
  await insertRows('source', ['id', 'workspace_id', 'cite_key', 'kind', 'title', 'authors', 'year', 'venue'], sources);
  const methodBias = [-0.03, -0.01, 0, 0.015, 0.04];
  const methods = methodBias.map((_, i) => [crypto.randomUUID(), workspaceId, `method-${i}`, 'PBEsol', JSON.stringify([8, 8, 8]), JSON.stringify([4, 4, 4])]);
  await insertRows('method', ['id', 'workspace_id', 'label', 'functional', 'k_grid', 'q_grid'], methods);
  const materials: unknown[][] = [];
  const measurements: unknown[][] = [];
  const calculations: unknown[][] = [];
  for (let m = 0; m < MATERIALS; m++) {
    const materialId = crypto.randomUUID();
    materials.push([materialId, workspaceId, `mat-${m}`, 'AB2', 'AB2', 3, '{"A":1,"B":2}', 10]);
    const truth = IRREPS.map((irrep) => ({ irrep, value: 40 + 1100 * random() }));
    for (let k = 0; k < PER_MATERIAL; k++) {
      const value = truth[k].value + 4 * (random() - 0.5);
      measurements.push([crypto.randomUUID(), workspaceId, materialId, sources[m % sources.length][0], 'frequency', value, value.toFixed(2), 'cm-1', 1 + random(), 295, truth[k].irrep, 'raman', `m${m}-${k}`]);
    }
    methods.forEach(([methodId], i) => {
      truth.forEach((mode, k) => {
        const value = mode.value * (1 + methodBias[i]) + 6 * (random() - 0.5) + (random() < 0.002 ? 300 : 0);
        calculations.push([crypto.randomUUID(), workspaceId, materialId, sources[19][0], methodId, 'frequency', value, value.toFixed(2), 'cm-1', mode.irrep, 'raman', `c${m}-${i}-${k}`]);
      });
    });
  }
  await insertRows('material', ['id', 'workspace_id', 'name', 'formula', 'reduced_formula', 'atoms_per_formula_unit', 'element_counts', 'atoms_in_cell'], materials);
  await insertRows('measurement', ['id', 'workspace_id', 'material_id', 'source_id', 'quantity', 'value', 'value_text', 'unit', 'uncertainty', 'temperature_k', 'irrep', 'technique', 'row_hash'], measurements);
  await insertRows('calculation', ['id', 'workspace_id', 'material_id', 'source_id', 'method_id', 'quantity', 'value', 'value_text', 'unit', 'irrep', 'activity', 'row_hash'], calculations);
  return { workspaceId, userId };
}

function percentile(values: number[], p: number): number {
  const s = [...values].sort((x, y) => x - y);
  return s[Math.min(s.length - 1, Math.ceil(p * s.length) - 1)];
}

const mb = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(2)} MB`.padStart(9);
const gzip = (text: string) => gzipSync(text);
const brotli = (text: string) => brotliCompressSync(text, { params: { [constants.BROTLI_PARAM_QUALITY]: 5, [constants.BROTLI_PARAM_SIZE_HINT]: text.length } });

const buildStart = performance.now();
const { workspaceId, userId } = await buildScenario();
const { id: benchmarkId } = await createBenchmark(workspaceId, { userId }, { name: 'Plot payload bench', scope: { quantity: 'frequency' } });
await recomputeBenchmark(workspaceId, benchmarkId, [{ trigger: 'manual' }]);
console.log(`scenario built and computed in ${((performance.now() - buildStart) / 1000).toFixed(1)} s: ${MATERIALS} materials, ${METHODS} methods, ${MATERIALS * PER_MATERIAL} measurements (invented)`);

async function oldBody(): Promise<string> {
  const revision = (await getRevision(workspaceId, benchmarkId))!;
  const lookups = await pairLookups(workspaceId, revision.statistics);
  return JSON.stringify({ revision: revision.number, unit: revision.statistics.unit, points: plotPoints(revision.statistics, lookups) });
}
async function newBody(): Promise<string> {
  const revision = (await getRevision(workspaceId, benchmarkId))!;
  const lookups = await pairLookups(workspaceId, revision.statistics);
  return JSON.stringify(encodePlotColumns(plotPoints(revision.statistics, lookups), { revision: revision.number, unit: revision.statistics.unit }));
}

const before = await oldBody();
const after = await newBody();
const points = (JSON.parse(before) as { points: unknown[] }).points;
const same = JSON.stringify(decodePlotColumns(JSON.parse(after))) === JSON.stringify(points);
const sizes = (text: string) => ({ raw: Buffer.byteLength(text), gzip: gzip(text).length, br: brotli(text).length });
const b = sizes(before);
const a = sizes(after);
console.log('');
console.log(`plot points                   ${points.length.toLocaleString('en')} (columnar payload decodes to the same rows: ${same ? 'yes' : 'NO'})`);
console.log(`                                    raw      gzip    brotli-5`);
console.log(`old rows (baseline)           ${mb(b.raw)} ${mb(b.gzip)} ${mb(b.br)}`);
console.log(`columns (sent now)            ${mb(a.raw)} ${mb(a.gzip)} ${mb(a.br)}`);
console.log(`ratio columns / old rows      ${(a.raw / b.raw).toFixed(3)}     ${(a.gzip / b.gzip).toFixed(3)}     ${(a.br / b.br).toFixed(3)}`);
console.log(`on the wire (gzip, Next's)    ${mb(a.gzip)} (target ≤ ${mb(TARGET_BYTES).trim()}) ${a.gzip <= TARGET_BYTES ? 'PASS' : 'MISS'}; uncompressed ${mb(a.raw).trim()} ${a.raw <= TARGET_BYTES ? '(also ≤ 2 MB)' : '(over 2 MB)'}`);

async function latency(label: string, body: () => Promise<string>) {
  await body(); // warm-up, not timed
  const plain: number[] = [];
  const zipped: number[] = [];
  for (let i = 0; i < REQUESTS; i++) {
    const start = performance.now();
    const text = await body();
    plain.push(performance.now() - start);
    gzip(text);
    zipped.push(performance.now() - start);
  }
  console.log(
    `${label.padEnd(30)}p50 ${percentile(plain, 0.5).toFixed(0)} ms, p99 ${percentile(plain, 0.99).toFixed(0)} ms; with gzip p50 ${percentile(zipped, 0.5).toFixed(0)} ms, p99 ${percentile(zipped, 0.99).toFixed(0)} ms`,
  );
  return percentile(zipped, 0.99);
}
console.log('');
console.log(`GET …/pairs over ${REQUESTS} sequential requests (query + encode + JSON + gzip; session check excluded):`);
const oldP99 = await latency('old rows (baseline)', oldBody);
const newP99 = await latency('columns (sent now)', newBody);
console.log(`ratio p99 columns / old rows  ${(newP99 / oldP99).toFixed(2)}`);

(await import('../lib/services/jobs/runner')).stopJobRunner();
closeDb();
rmSync(dir, { recursive: true, force: true });
