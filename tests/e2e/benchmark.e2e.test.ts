import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { newBrowser, screenshot } from './support/browser';
import { DEMO_SLUG, signInDemo } from './support/demo';

const base = inject('baseURL');
const BENCHMARK = 'Γ-point frequencies — all methods (demo)';
let browser: BrowserContext;
let page: Page;
let benchmarkUrl = '';

beforeAll(async () => {
  browser = await newBrowser();
  page = await browser.newPage();
  await signInDemo(page, base, 'curator');
});
afterAll(async () => {
  await browser?.close();
});

/** MAE per method recomputed here from the pairs CSV, with plain loops (independent of lib/science). */
async function maeFromCsv(): Promise<Map<string, { n: number; mae: number }>> {
  const href = await page.getByRole('link', { name: 'Pairs (CSV)' }).getAttribute('href');
  const res = await page.request.get(new URL(href!, base).toString());
  expect(res.status()).toBe(200);
  const rows = Papa.parse<Record<string, string>>(await res.text(), { header: true, skipEmptyLines: true }).data;
  const sums = new Map<string, { n: number; sum: number }>();
  for (const r of rows) {
    if (r.excluded_reason) continue;
    const e = Math.abs(Number(r.calculated) - Number(r.measured));
    const s = sums.get(r.method) ?? { n: 0, sum: 0 };
    s.n++;
    s.sum += e;
    sums.set(r.method, s);
  }
  return new Map([...sums].map(([k, v]) => [k, { n: v.n, mae: v.sum / v.n }]));
}

async function leaderboard(): Promise<Map<string, { n: number; mae: string }>> {
  const rows = page.getByTestId('leaderboard').locator('tbody tr[data-method]');
  const out = new Map<string, { n: number; mae: string }>();
  for (let i = 0; i < (await rows.count()); i++) {
    const row = rows.nth(i);
    out.set((await row.getAttribute('data-method'))!, {
      n: Number(await row.locator('[data-stat="n"]').textContent()),
      mae: (await row.locator('[data-stat="mae"] strong').textContent())!.trim(),
    });
  }
  return out;
}

describe('benchmark page', () => {
  it('shows a leaderboard whose N and MAE match an independent computation from the pairs', async () => {
    await page.goto(`${base}/w/${DEMO_SLUG}/benchmarks`);
    await page.getByRole('link', { name: BENCHMARK }).first().click();
    await page.getByTestId('leaderboard').waitFor();
    benchmarkUrl = page.url().split('?')[0];
    const shown = await leaderboard();
    const expected = await maeFromCsv();
    expect(shown.size).toBe(3);
    for (const [label, s] of shown) {
      expect(expected.get(label)?.n, label).toBe(s.n);
      expect(s.mae, label).toBe(expected.get(label)!.mae.toFixed(2));
    }
    await page.getByTestId('quality-bar-note').waitFor();
    await screenshot(page, 'benchmark');
  });

  it('downloads the parity plot as SVG', async () => {
    const figure = page.locator('figure', { hasText: 'Parity plot' }).first();
    await expect.poll(() => figure.getByRole('button', { name: 'SVG' }).isEnabled(), { timeout: 20_000 }).toBe(true);
    const [download] = await Promise.all([page.waitForEvent('download'), figure.getByRole('button', { name: 'SVG' }).click()]);
    const svg = readFileSync((await download.path())!, 'utf8');
    expect(svg.trimStart().startsWith('<svg')).toBe(true);
    expect(svg).toContain('</svg>');
  });

  it('compares two methods', async () => {
    const panel = page.locator('section', { hasText: 'Method comparison' }).first();
    await panel.getByLabel('Method A').selectOption({ label: 'PBE · NC · k8' });
    await panel.getByLabel('Method B').selectOption({ label: 'PBEsol · PAW · k12' });
    const result = page.getByTestId('comparison');
    await result.waitFor();
    expect(await result.textContent()).toMatch(/Wilcoxon signed-rank p/);
    expect(Number(await result.locator('dd').first().textContent())).toBeGreaterThan(10);
  });

  it('excludes an outlier with a reason; the statistics and the revision history change', async () => {
    const before = await leaderboard();
    const row = page.getByTestId('outliers').locator('tbody tr', { has: page.getByRole('button', { name: 'Exclude / keep…' }) }).first();
    const methodLabel = (await row.locator('td').nth(1).textContent())!.trim();
    await row.getByRole('button', { name: 'Exclude / keep…' }).click();
    await row.getByLabel('Decision').selectOption('exclude-pair');
    await row.getByLabel('Reason').fill('Strained film; not comparable (e2e)');
    await row.getByRole('button', { name: 'Record decision' }).click();

    await expect.poll(async () => {
      await page.goto(benchmarkUrl);
      return (await leaderboard()).get(methodLabel)?.n;
    }, { timeout: 30_000, interval: 1000 }).toBe(before.get(methodLabel)!.n - 1);
    const after = await leaderboard();
    expect(after.get(methodLabel)!.mae).not.toBe(before.get(methodLabel)!.mae);
    const expected = await maeFromCsv();
    expect(after.get(methodLabel)!.mae).toBe(expected.get(methodLabel)!.mae.toFixed(2));

    const history = page.getByTestId('revision-history');
    await history.getByRole('link', { name: 'Revision 2' }).waitFor();
    expect(await history.textContent()).toContain('Strained film; not comparable (e2e)');
    expect(await page.locator('[data-stat="excluded"]', { hasText: '1' }).count()).toBeGreaterThan(0);
  });
});
