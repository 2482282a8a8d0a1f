import { createClient } from '@libsql/client';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { newBrowser } from './support/browser';
import { DEMO_SLUG, signInDemo } from './support/demo';

// A recomputation that failed on its every attempt is shown on the benchmark page with its error, and a curator
// can retry it from there. The failure is written into the job table as the runner leaves it after its last attempt.
const base = inject('baseURL');
const databaseURL = inject('databaseURL');
const BENCHMARK = 'Γ-point frequencies — all methods (demo)';
const ERROR = 'disk I/O error (written by the test)';
let browser: BrowserContext;
let page: Page;
let key = '';
let url = '';

beforeAll(async () => {
  const db = createClient({ url: databaseURL });
  const ws = await db.execute({ sql: 'select id from organization where slug = ?', args: [DEMO_SLUG] });
  const workspaceId = String(ws.rows[0].id);
  const bm = await db.execute({ sql: 'select id from benchmark where workspace_id = ? and name = ? and retracted_at is null', args: [workspaceId, BENCHMARK] });
  const benchmarkId = String(bm.rows[0].id);
  key = `${workspaceId}|${benchmarkId}`;
  url = `${base}/w/${DEMO_SLUG}/benchmarks/${benchmarkId}`;
  await db.execute({
    sql: `insert or replace into job (id, kind, key, workspace_id, payload, status, run_after, attempts, last_error, last_error_at)
          values (?, 'recompute', ?, ?, '[{"trigger":"import"}]', 'failed', ?, 5, ?, ?)`,
    args: [crypto.randomUUID(), key, workspaceId, Date.now(), ERROR, Date.now()],
  });
  db.close();
  browser = await newBrowser();
  page = await browser.newPage();
});
afterAll(async () => {
  await browser?.close();
});

async function jobRows(): Promise<number> {
  const db = createClient({ url: databaseURL });
  const rows = await db.execute({ sql: "select count(*) as n from job where kind = 'recompute' and key = ?", args: [key] });
  db.close();
  return Number(rows.rows[0].n);
}

describe('a failed recomputation', () => {
  it('the reviewer sees the error and that the figures are of the latest stored revision, without a retry button', async () => {
    await signInDemo(page, base, 'reviewer');
    await page.goto(url);
    const box = page.getByTestId('recompute-failed');
    await box.waitFor();
    expect(await box.innerText()).toContain('The recomputation failed after 5 attempts.');
    expect(await box.innerText()).toContain(ERROR);
    expect(await box.innerText()).toContain('The figures below are of the latest stored revision');
    expect(await box.getByRole('button', { name: 'Retry the recomputation' }).count()).toBe(0);
    expect(await box.innerText()).toContain('A curator or owner can retry it.');
    await page.context().clearCookies();
  });

  it('the curator retries it from the page; the job runs and the notice goes away', async () => {
    await signInDemo(page, base, 'curator');
    for (const width of [1024, 1400]) {
      await page.setViewportSize({ width, height: 900 });
      await page.goto(url);
      await page.getByTestId('recompute-failed').waitFor();
      // the top of the page, where the notice is (a full-page shot of the benchmark is ten screens long)
      await page.screenshot({ path: `test-results/recompute-failed-${width}.png` });
    }
    await page.getByRole('button', { name: 'Retry the recomputation' }).click();
    await page.getByTestId('recompute-failed').waitFor({ state: 'detached', timeout: 20_000 });
    expect(await jobRows()).toBe(0);
  });
});
