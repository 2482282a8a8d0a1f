import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { promisify } from 'node:util';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { calculation, importBatch } from '@/db/schema';
import { createWorkspaceWith } from '../support/users';
import { startApiServer } from '../support/api-server';
import { calculationsCsv, makeToken, seedWorkflow } from './api-workflow-fixtures';

/**
 * The README's workflow example, scripts/examples/check-benchmark.sh, run as it is (bash, curl, jq) against a
 * fresh database behind a real HTTP server: a good calculations import passes, a later bad one fails.
 */
const SCRIPT = resolve(__dirname, '../../scripts/examples/check-benchmark.sh');
const run = promisify(execFile);

let server: Awaited<ReturnType<typeof startApiServer>>;
let env: Record<string, string>;
let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
const dir = mkdtempSync(join(tmpdir(), 'ledger-workflow-'));

async function script(csv: string, name: string, extra: Record<string, string> = {}) {
  const file = join(dir, name);
  writeFileSync(file, csv);
  try {
    const out = await run('bash', [SCRIPT, file], { env: { ...process.env, ...env, ...extra }, timeout: 60_000 });
    return { code: 0, stdout: out.stdout, stderr: out.stderr };
  } catch (e) {
    const err = e as { code: number; stdout: string; stderr: string };
    return { code: err.code, stdout: err.stdout, stderr: err.stderr };
  }
}

beforeAll(async () => {
  process.env.RECOMPUTE_DEBOUNCE_MS = '200';
  ws = await createWorkspaceWith(['contributor']);
  const seeded = await seedWorkflow(ws.workspaceId, ws.owner.id);
  const token = await makeToken(ws.members.contributor.email, ws.workspaceId, 'contributor');
  server = await startApiServer();
  env = { LEDGER_URL: server.url, LEDGER_TOKEN: token, BENCHMARK_ID: seeded.benchmarkId, METHOD_ID: seeded.methodId, MAX_MAE: '10', MIN_COVERAGE: '0.5', WAIT_SECONDS: '30' };
});

afterAll(async () => {
  await server?.close();
});

describe('the README workflow script', () => {
  it('is shown in the README verbatim', () => {
    const readme = readFileSync(resolve(__dirname, '../../README.md'), 'utf8');
    expect(readme).toContain('```bash\n' + readFileSync(SCRIPT, 'utf8') + '```');
  });

  it('passes after a good import, replays a retried run, then fails after a bad import', async () => {
    // Three of four materials, every computed peak 4 cm⁻¹ off: MAE 4 on 6 common pairs, coverage 6/8.
    const good = calculationsCsv(['Inv-A', 'Inv-B', 'Inv-C'], (_n, irrep) => (irrep === 'A1g' ? 4 : -4));
    const first = await script(good, 'good.csv');
    expect(first.stderr).toBe('');
    expect(first.code).toBe(0);
    expect(first.stdout).toMatch(/^import [0-9a-f-]{36}: 6 rows in, 0 duplicates$/m);
    expect(first.stdout).toMatch(/^revision 2 includes it \(6 of its rows in scope\)$/m);
    expect(first.stdout).toMatch(/^PASS: Recipe-R1 on Invented Raman peaks, revision 2$/m);
    expect(first.stdout).toContain('MAE 4 cm⁻¹ on N = 6 common pairs (max 10)');
    expect(first.stdout).toContain('coverage 0.75 (min 0.5)');

    // The same file again: the Idempotency-Key (its hash) replays the stored answer; nothing is imported twice.
    const again = await script(good, 'good.csv');
    expect(again.code).toBe(0);
    expect(again.stdout).toContain(first.stdout.split('\n')[0]);
    const batches = await db.select().from(importBatch).where(eq(importBatch.workspaceId, ws.workspaceId));
    expect(batches).toHaveLength(1);

    // The fourth material, 60 cm⁻¹ off (still within the pairing window): MAE (6·4 + 2·60)/8 = 18 > 10.
    const bad = calculationsCsv(['Inv-D'], () => 60);
    const second = await script(bad, 'bad.csv');
    expect(second.code).toBe(1);
    expect(second.stdout).toMatch(/^revision 3 includes it \(2 of its rows in scope\)$/m);
    expect(second.stdout).toMatch(/^FAIL: Recipe-R1 on Invented Raman peaks, revision 3$/m);
    expect(second.stdout).toContain('MAE 18 cm⁻¹ on N = 8 common pairs (max 10)');
    expect(second.stdout).toContain('fail: MAE 18 cm⁻¹ on 8 common pairs is above maxMae 10 cm⁻¹.');
    expect(await db.$count(calculation, eq(calculation.workspaceId, ws.workspaceId))).toBe(8);
  });

  it('exits 2 with the row errors when the import is refused', async () => {
    const out = await script('material,method,quantity,value,unit,source\nNope,Recipe-R1,frequency,12x,cm-1,pipeline-runs\n', 'broken.csv');
    expect(out.code).toBe(2);
    expect(out.stderr).toContain('import refused:');
    expect(out.stderr).toMatch(/row 2, column value: "12x" is not a number\./);
  });
});
