/**
 * Benchmark of the import path. `--kind=materials` runs the catalogue benchmark
 * instead (see catalogueMain below); the default is the calculations benchmark.
 *
 * Calculations:  Generates a calculations CSV (100,000 rows by
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
const kindArg = process.argv.find((a) => a.startsWith('--kind='))?.slice('--kind='.length) ?? 'calculations';
if (!['calculations', 'materials'].includes(kindArg)) throw new Error(`--kind must be calculations or materials, got ${kindArg}`);
const ROWS = rowsArg ? Number(rowsArg.slice('--rows='.length)) : kindArg === 'materials' ? 15_000 : 100_000;
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
const { importCsvFile, importFile } = await import('../lib/services/imports/csv-import');
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
  (await import('../lib/services/jobs/runner')).stopJobRunner();
  closeDb();
  rmSync(dir, { recursive: true, force: true });
}

/** Synthetic materials (invented handles and identifiers; formulas with their commonly tabulated space groups and primitive-cell atom counts). */
const PROTOTYPES = [
  { formula: 'MgO', spaceGroup: 225, atoms: 2, tags: 'oxide, synthetic' },
  { formula: 'GaN', spaceGroup: 186, atoms: 4, tags: 'nitride, semiconductor, synthetic' },
  { formula: 'SrTiO3', spaceGroup: 221, atoms: 5, tags: 'oxide, perovskite, synthetic' },
  { formula: 'Al2O3', spaceGroup: 167, atoms: 10, tags: 'oxide, synthetic' },
  { formula: 'Si', spaceGroup: 227, atoms: 2, tags: 'semiconductor, synthetic' },
];

function writeMaterialsCsv(path: string, n: number): number {
  const lines = ['name,formula,display_name,space_group,atoms_in_cell,external_id,tags'];
  for (let i = 0; i < n; i++) {
    const p = PROTOTYPES[i % PROTOTYPES.length];
    lines.push(`M${i}-synthetic,${p.formula},Synthetic ${p.formula} no. ${i},${p.spaceGroup},${p.atoms},synthetic-${i},"${p.tags}"`);
  }
  const text = lines.join('\n') + '\n';
  writeFileSync(path, text);
  return Buffer.byteLength(text);
}

/** 30 calculated modes per material under one method; with `catalogue`, the createMissing columns too (invented values). */
function writePipelineCsv(path: string, materials: number, catalogue: boolean): number {
  const rnd = random(7);
  const head = 'material,method,quantity,value,unit,mode_index,irrep,degeneracy,activity,source';
  const lines = [catalogue ? `${head},material_formula,material_space_group,material_atoms_in_cell,method_functional,method_k_grid` : head];
  for (let m = 0; m < materials; m++) {
    const p = PROTOTYPES[m % PROTOTYPES.length];
    for (let mode = 1; mode <= 30; mode++) {
      const value = mode <= 3 ? (rnd() * 0.4 - 0.2).toFixed(3) : (40 + rnd() * 1100).toFixed(2);
      const irrep = IRREPS[(m + mode) % IRREPS.length];
      const row = `P${m}-synthetic,PBEsol-pipeline,frequency,${value},cm-1,${mode},${irrep},1,${mode <= 3 ? 'acoustic' : 'raman'},bench-synthetic`;
      lines.push(catalogue ? `${row},${p.formula},${p.spaceGroup},${p.atoms},PBEsol,8x8x8` : row);
    }
  }
  const text = lines.join('\n') + '\n';
  writeFileSync(path, text);
  return Buffer.byteLength(text);
}

/**
 * Catalogue benchmark (`--kind=materials`, 15,000 rows by default), after an untimed warm-up import of
 * 500 materials into another workspace (as a running server has compiled its code): a materials CSV
 * through the same function the wizard and the API call (spool, decode, parse, the
 * form's zod checks, derivation, identity matching against the stored materials,
 * multi-row INSERTs of materials and tags in one transaction), against the floor: the
 * very same material and tag rows inserted with raw multi-row INSERTs into a fresh
 * database in one transaction. Then a pipeline push: 1,500 new materials with 45,000
 * calculation rows through createMissing, beside the plain import of the same 45,000
 * rows into a workspace where those materials and the method already exist.
 */
async function catalogueMain() {
  const client = getClient();
  await migrateClient(client);
  const { userId, workspaceId } = await seedCatalogue();
  const csvPath = join(dir, 'materials.csv');
  const bytes = writeMaterialsCsv(csvPath, ROWS);
  console.log(`Generated ${ROWS.toLocaleString('en')} material rows (${mb(bytes)}) — synthetic, invented handles.`);
  // A running server has compiled its import code already: warm it with 500 rows in another workspace (untimed).
  const warmPath = join(dir, 'warm.csv');
  writeMaterialsCsv(warmPath, 500);
  await db.insert(schema.organization).values({ id: 'bench-warm', name: 'Bench warm-up (synthetic)', slug: 'bench-warm', createdAt: new Date() });
  await importFile({ workspaceId: 'bench-warm', actor: { userId, tokenId: null }, role: 'owner', via: 'api', kind: 'materials', fileName: 'warm.csv', body: createReadStream(warmPath) });
  const before = await client.execute({ sql: 'SELECT count(*) FROM material WHERE workspace_id = ?', args: [workspaceId] });
  const tImport = performance.now();
  const outcome = await importFile({ workspaceId, actor: { userId, tokenId: null }, role: 'owner', via: 'api', kind: 'materials', fileName: 'materials.csv', body: createReadStream(csvPath, { highWaterMark: 1 << 16 }) });
  const importMs = performance.now() - tImport;
  if (!('createdCount' in outcome) || outcome.createdCount !== ROWS) throw new Error(`expected ${ROWS} materials created, got ${JSON.stringify(outcome).slice(0, 200)}`);

  const floorClient = connect({ url: `file:${join(dir, 'floor-materials.db')}` });
  await migrateClient(floorClient);
  await floorClient.execute("INSERT INTO user (id, name, email, email_verified, created_at, updated_at) VALUES ('bench-user', 'Bench', 'bench@example.org', 1, 0, 0)");
  await floorClient.execute("INSERT INTO organization (id, name, slug, created_at) VALUES ('bench-workspace', 'Bench', 'bench', 0)");
  const imported = await client.execute({ sql: 'SELECT * FROM material WHERE import_id = ?', args: [outcome.importId] });
  const tags = await client.execute({ sql: 'SELECT t.* FROM material_tag t JOIN material m ON m.id = t.material_id WHERE m.import_id = ?', args: [outcome.importId] });
  let floorMs = 0;
  const floorTx = await floorClient.transaction('write');
  for (const [table, result, chunk] of [
    ['material', imported, 500],
    ['material_tag', tags, 900],
  ] as const) {
    const cols = result.columns;
    for (let i = 0; i < result.rows.length; i += chunk) {
      const page = result.rows.slice(i, i + chunk);
      const args: InValue[] = [];
      for (const r of page) for (const c of cols) args.push(r[c] as InValue);
      const t = performance.now();
      // (multiRowInsertSql caches by table and row count; the floor inserts every stored column, so it builds its own)
      await floorTx.execute({ sql: `INSERT INTO ${table} (${cols.join(',')}) VALUES ${page.map(() => `(${cols.map(() => '?').join(',')})`).join(',')}`, args });
      floorMs += performance.now() - t;
    }
  }
  const tCommit = performance.now();
  await floorTx.commit();
  floorMs += performance.now() - tCommit;
  floorTx.close();
  floorClient.close();

  const ratio = importMs / floorMs;
  console.log('');
  console.log(`catalogue import of ${ROWS.toLocaleString('en')} materials (spool, decode, parse, check, derive, match ${Number(before.rows[0][0]).toLocaleString('en')} stored, insert ${imported.rows.length.toLocaleString('en')} + ${tags.rows.length.toLocaleString('en')} tags, commit): ${(importMs / 1000).toFixed(2)} s  (${Math.round(ROWS / (importMs / 1000)).toLocaleString('en')} rows/s)`);
  console.log(`floor (raw multi-row INSERTs of the same material and tag rows, one transaction): ${(floorMs / 1000).toFixed(2)} s`);
  console.log(`ratio import / floor: ${ratio.toFixed(2)}×  (target ≤ ${TARGET_RATIO}×) ${ratio <= TARGET_RATIO ? 'OK' : 'ABOVE TARGET'}`);

  // Pipeline push: 1,500 new materials × 30 modes = 45,000 calculation rows.
  const PIPELINE_MATERIALS = 1_500;
  const now = new Date();
  for (const [id, slug] of [
    ['bench-plain', 'bench-plain'],
    ['bench-push', 'bench-push'],
  ])
    await db.insert(schema.organization).values({ id, name: `Bench ${slug} (synthetic)`, slug, createdAt: now });
  for (const ws of ['bench-plain', 'bench-push']) await db.insert(schema.source).values({ workspaceId: ws, citeKey: 'bench-synthetic', kind: 'computed-data-set', title: 'Synthetic benchmark data' });
  const existing = Array.from({ length: PIPELINE_MATERIALS }, (_, m) => {
    const p = PROTOTYPES[m % PROTOTYPES.length];
    return { workspaceId: 'bench-plain', name: `P${m}-synthetic`, formula: p.formula, reducedFormula: p.formula, atomsPerFormulaUnit: p.atoms / (p.formula === 'GaN' || p.formula === 'Si' || p.formula === 'Al2O3' ? 2 : 1), elementCounts: {}, spaceGroup: p.spaceGroup, atomsInCell: p.atoms };
  });
  for (let i = 0; i < existing.length; i += 500) await db.insert(schema.material).values(existing.slice(i, i + 500));
  await db.insert(schema.method).values({ workspaceId: 'bench-plain', label: 'PBEsol-pipeline', functional: 'PBEsol', kGrid: [8, 8, 8] });
  const plainPath = join(dir, 'plain.csv');
  const pushPath = join(dir, 'push.csv');
  writePipelineCsv(plainPath, PIPELINE_MATERIALS, false);
  writePipelineCsv(pushPath, PIPELINE_MATERIALS, true);
  const tPlain = performance.now();
  const plain = await importCsvFile({ workspaceId: 'bench-plain', actor: { userId, tokenId: null }, role: 'owner', via: 'api', kind: 'calculations', fileName: 'plain.csv', body: createReadStream(plainPath, { highWaterMark: 1 << 16 }) });
  const plainMs = performance.now() - tPlain;
  const tPush = performance.now();
  const push = await importCsvFile({ workspaceId: 'bench-push', actor: { userId, tokenId: null }, role: 'owner', via: 'api', kind: 'calculations', fileName: 'push.csv', createMissing: true, body: createReadStream(pushPath, { highWaterMark: 1 << 16 }) });
  const pushMs = performance.now() - tPush;
  if (plain.insertedCount !== PIPELINE_MATERIALS * 30 || push.insertedCount !== PIPELINE_MATERIALS * 30 || push.createdMaterials !== PIPELINE_MATERIALS) {
    throw new Error(`pipeline counts: plain ${plain.insertedCount}, push ${push.insertedCount} with ${push.createdMaterials} materials`);
  }
  console.log('');
  console.log(`pipeline push, createMissing (${PIPELINE_MATERIALS.toLocaleString('en')} new materials + 1 method, ${push.insertedCount.toLocaleString('en')} calculation rows): ${(pushMs / 1000).toFixed(2)} s`);
  console.log(`plain import of the same ${plain.insertedCount.toLocaleString('en')} rows into existing materials:                   ${(plainMs / 1000).toFixed(2)} s  (push / plain ${(pushMs / plainMs).toFixed(2)}×)`);
  (await import('../lib/services/jobs/runner')).stopJobRunner();
  closeDb();
  rmSync(dir, { recursive: true, force: true });
}

(kindArg === 'materials' ? catalogueMain() : main()).catch((e) => {
  console.error(e);
  rmSync(dir, { recursive: true, force: true });
  process.exit(1);
});
