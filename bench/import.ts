/**
 * Benchmark of the import path. Generates a calculations CSV (100,000 rows by
 * default; `--rows=1000000` for the large run), imports it through the same
 * function the wizard's and the API's route handlers call (spool + hash, strict
 * UTF-8 decode, CSV parse, validation, identical-row check, chunked multi-row
 * INSERTs in one transaction), then, in a fresh database, inserts the very same
 * rows with raw multi-row INSERT statements through @libsql/client in one
 * transaction: the floor. Prints both times, the ratio (target ≤ 2×) and the
 * peak RSS of the import. Run with `npm run bench:import`.
 */
import { createReadStream, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import type { InValue } from '@libsql/client';

const rowsArg = process.argv.find((a) => a.startsWith('--rows='));
const ROWS = rowsArg ? Number(rowsArg.slice('--rows='.length)) : 100_000;
if (!Number.isInteger(ROWS) || ROWS < 1) throw new Error(`--rows must be a positive whole number, got ${rowsArg}`);
// One synthetic material per 90 rows (30 modes × 3 methods), so no two rows are identical.
const MATERIALS = Math.ceil(ROWS / 90);
const METHODS = ['PBE-PAW-520', 'PBEsol-PAW-600', 'r2SCAN-PAW-700'];
const IRREPS = ['A1g', 'Eg', 'T2g', 'A2u', 'Eu', 'E2(high)', 'B1u'];
const TARGET_RATIO = 2;

const dir = mkdtempSync(join(tmpdir(), 'ledger-bench-import-'));
process.env.DATABASE_URL = `file:${join(dir, 'import.db')}`;

const { getClient, db, closeDb } = await import('../db/client');
const { connect } = await import('../db/connection');
const { migrateClient } = await import('../db/migrate');
const schema = await import('../db/schema');
const { importCsvFile } = await import('../lib/services/imports/csv-import');
const { multiRowInsertSql, valueTableOf } = await import('../db/queries/imports');
const { INSERT_CHUNK_ROWS } = await import('../lib/import/row-validator');

function mb(bytes: number): string {
  return `${(bytes / 1024 / 1024).toFixed(0)} MB`;
}

/** A deterministic pseudo-random sequence (mulberry32) so every run imports the same file. */
function random(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

async function seedCatalogue() {
  const userId = 'bench-user';
  const workspaceId = 'bench-workspace';
  const now = new Date();
  await db.insert(schema.user).values({ id: userId, name: 'Bench', email: 'bench@example.org', emailVerified: true, createdAt: now, updatedAt: now });
  await db.insert(schema.organization).values({ id: workspaceId, name: 'Bench (synthetic)', slug: 'bench', createdAt: now });
  const materials = Array.from({ length: MATERIALS }, (_, i) => ({
    id: `mat-${i}`,
    workspaceId,
    name: `X${i}-synthetic`,
    formula: 'MgO',
    reducedFormula: 'MgO',
    atomsPerFormulaUnit: 2,
    elementCounts: { Mg: 1, O: 1 },
  }));
  for (let i = 0; i < materials.length; i += 500) await db.insert(schema.material).values(materials.slice(i, i + 500));
  await db.insert(schema.source).values({ id: 'src-bench', workspaceId, citeKey: 'bench-synthetic', kind: 'computed-data-set', title: 'Synthetic benchmark data' });
  await db.insert(schema.method).values(METHODS.map((label, i) => ({ id: `method-${i}`, workspaceId, label, functional: label.split('-')[0] })));
  return { userId, workspaceId };
}

/** Synthetic calculations (invented numbers): 30 modes per material and method. */
function writeCsv(path: string): number {
  const rnd = random(2026);
  const header = 'material,method,quantity,value,unit,mode_index,irrep,branch,degeneracy,activity,temperature_K,source,notes';
  const parts: string[] = [header];
  const flushTo: string[] = [];
  for (let i = 0; i < ROWS; i++) {
    const material = `X${Math.floor(i / (30 * METHODS.length))}-synthetic`;
    const method = METHODS[Math.floor(i / 30) % METHODS.length];
    const mode = (i % 30) + 1;
    const value = mode <= 3 ? (rnd() * 0.4 - 0.2).toFixed(3) : (40 + rnd() * 1100).toFixed(2);
    const irrep = IRREPS[(i * 7) % IRREPS.length];
    const activity = mode <= 3 ? 'acoustic' : irrep.endsWith('g') ? 'raman' : 'ir';
    parts.push(`${material},${method},frequency,${value},cm-1,${mode},${irrep},,${irrep.startsWith('E') ? 2 : 1},${activity},,bench-synthetic,synthetic`);
    if (parts.length >= 50_000) {
      flushTo.push(parts.join('\n'));
      parts.length = 0;
    }
  }
  flushTo.push(parts.join('\n'));
  const text = flushTo.join('\n') + '\n';
  writeFileSync(path, text);
  return Buffer.byteLength(text);
}

async function main() {
  const client = getClient();
  await migrateClient(client);
  const { userId, workspaceId } = await seedCatalogue();
  const csvPath = join(dir, 'calculations.csv');
  const t0 = performance.now();
  const bytes = writeCsv(csvPath);
  console.log(`Generated ${ROWS.toLocaleString('en')} calculation rows (${mb(bytes)}) in ${((performance.now() - t0) / 1000).toFixed(1)} s — synthetic, invented values.`);

  let peakRss = process.memoryUsage().rss;
  const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 50);
  const tImport = performance.now();
  const outcome = await importCsvFile({
    workspaceId,
    actor: { userId, tokenId: null },
    via: 'api',
    kind: 'calculations',
    fileName: 'calculations.csv',
    body: createReadStream(csvPath, { highWaterMark: 1 << 16 }),
  });
  const importMs = performance.now() - tImport;
  clearInterval(sampler);
  peakRss = Math.max(peakRss, process.memoryUsage().rss, process.resourceUsage().maxRSS * 1024);
  if (outcome.insertedCount !== ROWS) throw new Error(`expected ${ROWS} rows inserted, got ${outcome.insertedCount} (${outcome.duplicateCount} duplicates)`);

  // The floor: the same rows, read back outside the timer, inserted into a fresh database.
  const floorClient = connect({ url: `file:${join(dir, 'floor.db')}` });
  await migrateClient(floorClient);
  for (const stmt of [
    "INSERT INTO user (id, name, email, email_verified, created_at, updated_at) VALUES ('bench-user', 'Bench', 'bench@example.org', 1, 0, 0)",
    "INSERT INTO organization (id, name, slug, created_at) VALUES ('bench-workspace', 'Bench', 'bench', 0)",
  ])
    await floorClient.execute(stmt);
  for (const t of ['material', 'source', 'method', 'import_batch']) {
    const rows = await client.execute(`SELECT * FROM ${t}`);
    const cols = rows.columns;
    for (const r of rows.rows) {
      await floorClient.execute({ sql: `INSERT INTO ${t} (${cols.join(',')}) VALUES (${cols.map(() => '?').join(',')})`, args: cols.map((c) => r[c] as InValue) });
    }
  }
  const { table, columns } = valueTableOf('calculations');
  const floorTx = await floorClient.transaction('write');
  let floorMs = 0;
  let lastRowid = 0;
  let copied = 0;
  while (true) {
    const page = await client.execute({ sql: `SELECT rowid, ${columns.join(',')} FROM ${table} WHERE rowid > ? ORDER BY rowid LIMIT ${INSERT_CHUNK_ROWS}`, args: [lastRowid] });
    if (page.rows.length === 0) break;
    const args: InValue[] = [];
    for (const r of page.rows) for (let c = 1; c <= columns.length; c++) args.push(r[c] as InValue);
    lastRowid = Number(page.rows[page.rows.length - 1][0]);
    const t = performance.now();
    await floorTx.execute({ sql: multiRowInsertSql(table, columns, page.rows.length), args });
    floorMs += performance.now() - t;
    copied += page.rows.length;
  }
  const tCommit = performance.now();
  await floorTx.commit();
  floorMs += performance.now() - tCommit;
  floorTx.close();
  floorClient.close();
  if (copied !== ROWS) throw new Error(`floor copied ${copied} rows, expected ${ROWS}`);

  const ratio = importMs / floorMs;
  console.log('');
  console.log(`import path (spool, decode, parse, validate, dedupe, insert, commit): ${(importMs / 1000).toFixed(2)} s  (${Math.round(ROWS / (importMs / 1000)).toLocaleString('en')} rows/s)`);
  console.log(`floor (raw multi-row INSERTs of the same rows, one transaction):       ${(floorMs / 1000).toFixed(2)} s  (${Math.round(ROWS / (floorMs / 1000)).toLocaleString('en')} rows/s)`);
  console.log(`ratio import / floor: ${ratio.toFixed(2)}×  (target ≤ ${TARGET_RATIO}×) ${ratio <= TARGET_RATIO ? 'OK' : 'ABOVE TARGET'}`);
  console.log(`peak RSS during the import: ${mb(peakRss)}  (target < 1 GB at 1,000,000 rows)`);
  closeDb();
  rmSync(dir, { recursive: true, force: true });
}

main().catch((e) => {
  console.error(e);
  rmSync(dir, { recursive: true, force: true });
  process.exit(1);
});
