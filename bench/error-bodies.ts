/**
 * Benchmark of refused imports: files just under the upload limit that are built
 * to make the 422 answer big — the 95 rows with a 2 MB unknown cell that once
 * produced a 380 MB body, rows of cells just under the cell limit with two errors
 * each, millions of short bad rows, and one cell that never ends. Each file goes
 * through the import path (spool, decode, parse, validate) in its own process, and
 * its problem document is built as the route handlers build it. Prints the 422 body
 * size and the peak RSS of that process next to the limits (1 MB, 1 GB).
 * Run with `npm run bench:error-bodies` (`-- --mb=50` for smaller files).
 */
import { spawnSync } from 'node:child_process';
import { createReadStream, createWriteStream, mkdtempSync, rmSync, statSync } from 'node:fs';
import { once } from 'node:events';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';

const BODY_LIMIT = 1024 * 1024;
const RSS_LIMIT = 1024 * 1024 * 1024;
const HEADER = 'material,quantity,value,unit,temperature_K,source,notes';

interface Scenario {
  name: string;
  /** Writes the file's lines (without the header) until `bytes` are reached. */
  write: (out: NodeJS.WritableStream, bytes: number) => Promise<void>;
}

async function put(out: NodeJS.WritableStream, text: string): Promise<void> {
  if (!out.write(text)) await once(out, 'drain');
}

async function repeatRows(out: NodeJS.WritableStream, bytes: number, row: string): Promise<void> {
  const block = row.repeat(Math.max(1, Math.floor((1 << 20) / row.length)));
  let written = HEADER.length + 1;
  while (written + block.length <= bytes) {
    await put(out, block);
    written += block.length;
  }
  while (written + row.length <= bytes) {
    await put(out, row);
    written += row.length;
  }
}

const SCENARIOS: Scenario[] = [
  {
    name: 'rows with a 2 MB unknown cell (the reported attack)',
    write: async (out, bytes) => {
      const cell = 'x'.repeat(2 * 1024 * 1024);
      await repeatRows(out, bytes, `${cell},frequency,520,cm-1,300,src-none,\n`);
    },
  },
  {
    name: 'rows of two 9,999-character bad cells',
    write: (out, bytes) => repeatRows(out, bytes, `${'m'.repeat(9999)},frequency,520,${'u'.repeat(9999)},300,src-none,\n`),
  },
  {
    name: 'millions of short rows with a bad number',
    write: (out, bytes) => repeatRows(out, bytes, 'Si,frequency,5x0,cm-1,300,bench-src,\n'),
  },
  {
    name: 'one quoted cell that never ends',
    write: async (out, bytes) => {
      await put(out, 'Si,frequency,520,cm-1,300,bench-src,"');
      await repeatRows(out, bytes - 40, 'never closed, still the same cell\n');
    },
  },
];

function mb(bytes: number): string {
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

/** Child: import one file and print the 422 body size and the peak RSS as JSON. */
async function child(file: string): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'ledger-bench-errors-'));
  process.env.DATABASE_URL = `file:${join(dir, 'bench.db')}`;
  const { getClient, db } = await import('../db/client');
  const { migrateClient } = await import('../db/migrate');
  const schema = await import('../db/schema');
  const { importCsvFile } = await import('../lib/services/imports/csv-import');
  const { toProblem } = await import('../lib/errors');
  await migrateClient(getClient());
  const now = new Date();
  await db.insert(schema.user).values({ id: 'bench-user', name: 'Bench', email: 'bench@example.org', emailVerified: true, createdAt: now, updatedAt: now });
  await db.insert(schema.organization).values({ id: 'bench-ws', name: 'Bench (synthetic)', slug: 'bench', createdAt: now });
  await db.insert(schema.material).values({ workspaceId: 'bench-ws', name: 'Si', formula: 'Si', reducedFormula: 'Si', atomsPerFormulaUnit: 1, elementCounts: { Si: 1 } });
  await db.insert(schema.source).values({ workspaceId: 'bench-ws', citeKey: 'bench-src', kind: 'computed-data-set', title: 'Synthetic' });

  const started = performance.now();
  let status = 201;
  let bodyBytes = 0;
  let errorCount = 0;
  let listed = 0;
  try {
    await importCsvFile({
      workspaceId: 'bench-ws',
      actor: { userId: 'bench-user', tokenId: null },
      via: 'api',
      kind: 'measurements',
      fileName: 'refused.csv',
      body: createReadStream(file, { highWaterMark: 1 << 16 }),
    });
  } catch (e) {
    const res = toProblem(e);
    status = res.status;
    const text = await res.text();
    bodyBytes = Buffer.byteLength(text);
    const body = JSON.parse(text) as { errorCount?: number; errors?: unknown[] };
    errorCount = body.errorCount ?? 0;
    listed = body.errors?.length ?? 0;
  }
  const seconds = (performance.now() - started) / 1000;
  rmSync(dir, { recursive: true, force: true });
  process.stdout.write(`${JSON.stringify({ status, bodyBytes, errorCount, listed, seconds, maxRssBytes: process.resourceUsage().maxRSS * 1024 })}\n`);
}

async function main(): Promise<void> {
  const mbArg = process.argv.find((a) => a.startsWith('--mb='));
  const fileBytes = Math.floor((mbArg ? Number(mbArg.slice(5)) : 190) * 1024 * 1024);
  const dir = mkdtempSync(join(tmpdir(), 'ledger-bench-errors-files-'));
  const self = fileURLToPath(import.meta.url);
  let failed = false;
  console.log(`Refused imports of ${mb(fileBytes)} files (upload limit ${mb(200 * 1024 * 1024)}); limits: 422 body < ${mb(BODY_LIMIT)}, peak RSS < ${mb(RSS_LIMIT)}.`);
  try {
    for (const [i, scenario] of SCENARIOS.entries()) {
      const file = join(dir, `scenario-${i}.csv`);
      const out = createWriteStream(file);
      await put(out, `${HEADER}\n`);
      await scenario.write(out, fileBytes);
      out.end();
      await once(out, 'close');
      const run = spawnSync(process.execPath, [...process.execArgv, self, '--child', file], { encoding: 'utf8', maxBuffer: 1 << 20, env: process.env });
      if (run.status !== 0) throw new Error(`scenario ${i} failed:\n${run.stderr}`);
      const r = JSON.parse(run.stdout.trim().split('\n').at(-1)!) as { status: number; bodyBytes: number; errorCount: number; listed: number; seconds: number; maxRssBytes: number };
      const ok = r.status === 422 && r.bodyBytes < BODY_LIMIT && r.maxRssBytes < RSS_LIMIT;
      failed ||= !ok;
      console.log(
        `${ok ? 'ok  ' : 'FAIL'} ${scenario.name}: ${mb(statSync(file).size)} in → ${r.status}, body ${(r.bodyBytes / 1024).toFixed(1)} KB of ${mb(BODY_LIMIT)} ` +
          `(${r.listed.toLocaleString('en')} of ${r.errorCount.toLocaleString('en')} errors listed), peak RSS ${mb(r.maxRssBytes)} of ${mb(RSS_LIMIT)}, ${r.seconds.toFixed(1)} s`,
      );
      rmSync(file, { force: true });
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  if (failed) process.exitCode = 1;
}

if (process.argv.includes('--child')) await child(process.argv[process.argv.indexOf('--child') + 1]);
else await main();
