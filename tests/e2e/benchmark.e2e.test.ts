import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { collectCspViolations, newBrowser, screenshot } from './support/browser';
import { DEMO_SLUG, signInDemo } from './support/demo';

const base = inject('baseURL');
const BENCHMARK = 'Γ-point frequencies — all methods (demo)';
let browser: BrowserContext;
let page: Page;
let benchmarkUrl = '';
let cspViolations: () => Promise<string[]>;

beforeAll(async () => {
  browser = await newBrowser();
  page = await browser.newPage();
  cspViolations = await collectCspViolations(page);
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

  it('draws every plot under the Content-Security-Policy (no eval, no inline script) and exports PNG through a canvas', async () => {
    const policy = (await page.request.get(benchmarkUrl)).headers()['content-security-policy'];
    expect(policy).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+' 'strict-dynamic'/);
    expect(policy).not.toMatch(/unsafe-eval/);
    await page.goto(benchmarkUrl);
    const plots = page.locator('[data-plot]');
    await expect.poll(() => plots.count(), { timeout: 20_000 }).toBeGreaterThan(2);
    for (let i = 0; i < (await plots.count()); i++) {
      await expect.poll(() => plots.nth(i).locator('svg.marks, canvas.marks').count(), { timeout: 20_000 }).toBeGreaterThan(0);
    }
    // Marks were drawn, not only the empty frame: Vega evaluated its expressions.
    expect(await page.locator('[data-plot] svg.marks path').count()).toBeGreaterThan(20);
    const figure = page.locator('figure', { hasText: 'Parity plot' }).first();
    await expect.poll(() => figure.getByRole('button', { name: 'PNG' }).isEnabled(), { timeout: 20_000 }).toBe(true);
    const [download] = await Promise.all([page.waitForEvent('download'), figure.getByRole('button', { name: 'PNG' }).click()]);
    expect(readFileSync((await download.path())!).subarray(1, 4).toString()).toBe('PNG');
    expect(await cspViolations()).toEqual([]);
  });

  it('compares two methods', async () => {
    const panel = page.locator('section', { hasText: 'Method comparison' }).first();
    await panel.getByLabel('Method A').selectOption({ label: 'PBE · NC · k8' });
    await panel.getByLabel('Method B').selectOption({ label: 'PBEsol · PAW · k12' });
    const result = page.getByTestId('comparison');
    await result.waitFor();
    expect(await result.textContent()).toMatch(/Wilcoxon signed-rank p/);
    expect(Number(await result.locator('dd').first().textContent())).toBeGreaterThan(10);
    // the pair is kept in the address: a reload shows the same comparison
    const url = new URL(page.url());
    expect(url.searchParams.get('methodA')).toBeTruthy();
    expect(url.searchParams.get('methodB')).toBeTruthy();
    await page.reload();
    const again = page.locator('section', { hasText: 'Method comparison' }).first();
    await page.getByTestId('comparison').waitFor();
    expect(await again.getByLabel('Method A').locator('option:checked').textContent()).toBe('PBE · NC · k8');
    expect(await again.getByLabel('Method B').locator('option:checked').textContent()).toBe('PBEsol · PAW · k12');
    // a method is never compared with itself
    await again.getByLabel('Method B').selectOption({ label: 'PBE · NC · k8' });
    expect(await page.getByTestId('comparison-error').textContent()).toBe('A method cannot be compared with itself: choose two different methods.');
    expect(await page.getByTestId('comparison').count()).toBe(0);
    expect(new URL(page.url()).searchParams.get('methodB')).toBe(url.searchParams.get('methodB'));
  });

  it('excludes an outlier with a reason; the statistics and the revision history change', async () => {
    await page.goto(benchmarkUrl);
    const before = await leaderboard();
    const revisionBefore = Number((await page.getByTestId('revision-line').textContent())!.match(/^Revision (\d+)/)![1]);
    const row = page.getByTestId('outliers').locator('tbody tr', { has: page.getByRole('button', { name: 'Exclude / keep…' }) }).first();
    const methodLabel = (await row.locator('td').nth(1).textContent())!.trim();
    // Earlier files (the meeting, the alerts) may have excluded pairs of this method already: compare with now.
    const excludedCell = () => page.getByTestId('leaderboard').locator(`tbody tr[data-method="${methodLabel}"] [data-stat="excluded"]`);
    const excludedBefore = Number(((await excludedCell().textContent()) ?? '').match(/\d+/)?.[0] ?? 0);
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
    await history.getByRole('link', { name: `Revision ${revisionBefore + 1}`, exact: true }).waitFor();
    expect(await history.textContent()).toContain('Strained film; not comparable (e2e)');
    expect(Number(((await excludedCell().textContent()) ?? '').match(/\d+/)?.[0] ?? 0)).toBe(excludedBefore + 1);
  });

  it('shows coverage, the common-pair ranking, the per-material table and the new breakdowns', async () => {
    await page.goto(benchmarkUrl);
    const basis = page.getByTestId('ranking-basis');
    expect(await basis.textContent()).toMatch(/Ranked on the \d+ pairs that all 3 ranked methods share/);
    const rows = page.getByTestId('leaderboard').locator('tbody tr[data-method]');
    for (let i = 0; i < (await rows.count()); i++) {
      expect(await rows.nth(i).locator('[data-stat="coverage"]').textContent()).toMatch(/\d+\s%/);
      expect(await rows.nth(i).locator('[data-stat="common-mae"] strong').textContent()).toMatch(/^\d+\.\d\d$/);
    }
    expect(await page.getByText(/resamples whole materials/).count()).toBeGreaterThan(0);
    const materials = page.getByTestId('material-table');
    await materials.waitFor();
    const first = Number(await materials.locator('tbody tr').first().locator('[data-stat="mae"]').textContent());
    const last = Number(await materials.locator('tbody tr').last().locator('[data-stat="mae"]').textContent());
    expect(first).toBeGreaterThanOrEqual(last);
    await materials.getByRole('button', { name: /^Material/ }).click();
    const names = await materials.locator('tbody th').allTextContents();
    expect(names).toEqual([...names].sort((a, b) => a.localeCompare(b)));
    for (const title of ['Per symmetry species', 'Per branch (TO / LO)', 'Per technique']) expect(await page.getByRole('heading', { name: title }).count()).toBe(1);
  });

  it('imports an optical-only calculation set for a new method: every line pairs, and the method is not ranked above better-covered ones', async () => {
    const label = `Optical-only recipe (e2e ${Date.now() % 100000})`;
    await page.goto(`${base}/w/${DEMO_SLUG}/methods/new`);
    await page.getByLabel('Label (unique)').fill(label);
    await page.getByLabel('Functional').fill('PBEsol');
    await page.getByRole('button', { name: 'Create method' }).click();
    await page.waitForURL((url) => !url.pathname.endsWith('/methods/new'));

    // the workspace and benchmark routes, read off the page's own download link
    await page.goto(benchmarkUrl);
    const pairsHref = (await page.getByRole('link', { name: 'Pairs (CSV)' }).getAttribute('href'))!;
    const workspaceApi = pairsHref.split('/benchmarks/')[0];
    const statisticsUrl = `${base}${pairsHref.split('/pairs')[0]}/statistics`;
    const revisionNumber = async () => ((await (await page.request.get(statisticsUrl)).json()) as { revision: { number: number } }).revision.number;
    const before = await revisionNumber();

    // Si 520.45, Ge 300.7 and diamond 1332.7 cm⁻¹ are the demo's measured T2g lines (published values); these computed lines are invented.
    const csv = [
      'material,method,quantity,value,unit,source,irrep,activity,degeneracy',
      `Si,${label},frequency,518.9,cm-1,demo-synthetic-2026,T2g,raman,3`,
      `Ge,${label},frequency,299.8,cm-1,demo-synthetic-2026,T2g,raman,3`,
      `C-diamond,${label},frequency,1329.5,cm-1,demo-synthetic-2026,T2g,raman,3`,
    ].join('\n');
    const res = await page.request.post(`${base}${workspaceApi}/imports?kind=calculations&fileName=optical-only.csv`, { headers: { origin: base, 'content-type': 'text/csv' }, data: `${csv}\n` });
    expect(res.status(), await res.text()).toBe(201);
    const outcome = (await res.json()) as { insertedCount: number; warnings: Array<{ message: string }>; warningCount: number };
    expect(outcome.insertedCount).toBe(3);
    // warned, not refused: each set lists 3 of 6 modes and marks no acoustic mode
    expect(outcome.warningCount).toBe(3);
    expect(outcome.warnings[0].message).toMatch(/lists 3 of the 3N = 6 modes .* marks no acoustic mode.*every optical line listed can pair/);

    await expect.poll(revisionNumber, { timeout: 45_000, interval: 500 }).toBeGreaterThan(before);
    await page.goto(benchmarkUrl);
    const row = page.getByTestId('leaderboard').locator(`tbody tr[data-method="${label}"]`);
    await row.waitFor();
    expect(await row.getAttribute('data-ranked')).toBe('no');
    expect(await row.locator('[data-stat="rank"]').textContent()).toBe('not ranked');
    expect(await page.getByTestId('unranked').textContent()).toContain(label);

    // every computed line paired: each of the three materials has a pair of the new method
    const latestPairs = (await page.getByRole('link', { name: 'Pairs (CSV)' }).getAttribute('href'))!;
    const pairsCsv = await (await page.request.get(`${base}${latestPairs}`)).text();
    const mine = Papa.parse<Record<string, string>>(pairsCsv, { header: true, skipEmptyLines: true }).data.filter((r) => r.method === label);
    expect(new Set(mine.map((r) => r.material))).toEqual(new Set(['Si', 'Ge', 'C-diamond']));
    // the ranked methods keep ranks 1–3 above it
    const ranks = await page.getByTestId('leaderboard').locator('tbody tr[data-ranked="yes"] [data-stat="rank"]').allTextContents();
    expect(ranks.map(Number).sort()).toEqual([1, 2, 3]);
    const order = await page.getByTestId('leaderboard').locator('tbody tr[data-method]').evaluateAll((trs) => trs.map((tr) => tr.getAttribute('data-method')));
    expect(order.indexOf(label)).toBe(order.length - 1);
    await screenshot(page, 'benchmark-optical-only');
  });

  it('after an import shows "Recomputing…" and then the new revision, without a reload', async () => {
    const label = `Recompute check (e2e ${Date.now() % 100000})`;
    await page.goto(`${base}/w/${DEMO_SLUG}/methods/new`);
    await page.getByLabel('Label (unique)').fill(label);
    await page.getByLabel('Functional').fill('PBEsol');
    await page.getByRole('button', { name: 'Create method' }).click();
    await page.waitForURL((url) => !url.pathname.endsWith('/methods/new'));

    await page.goto(benchmarkUrl);
    await page.getByTestId('leaderboard').waitFor();
    const revisionLine = page.getByTestId('revision-line');
    const before = Number((await revisionLine.textContent())!.match(/^Revision (\d+)/)![1]);
    // a mark in this document: a reload or a navigation would drop it
    await page.evaluate(() => ((window as unknown as { ledgerMark: number }).ledgerMark = 42));
    const pairsHref = (await page.getByRole('link', { name: 'Pairs (CSV)' }).getAttribute('href'))!;
    const workspaceApi = pairsHref.split('/benchmarks/')[0];
    // Si's measured T2g line is 520.45 cm⁻¹ (demo data, published); this computed line is invented.
    const csv = ['material,method,quantity,value,unit,source,irrep,activity,degeneracy', `Si,${label},frequency,517.3,cm-1,demo-synthetic-2026,T2g,raman,3`].join('\n');
    const res = await page.request.post(`${base}${workspaceApi}/imports?kind=calculations&fileName=recompute-check.csv`, { headers: { origin: base, 'content-type': 'text/csv' }, data: `${csv}\n` });
    expect(res.status(), await res.text()).toBe(201);

    await page.getByTestId('recomputing').getByText('Recomputing…').waitFor({ timeout: 15_000 });
    await expect.poll(async () => (await revisionLine.textContent()) ?? '', { timeout: 45_000, interval: 500 }).toMatch(new RegExp(`^Revision ${before + 1} `));
    expect(await page.evaluate(() => (window as unknown as { ledgerMark?: number }).ledgerMark)).toBe(42);
    await page.getByTestId('leaderboard').locator(`tbody tr[data-method="${label}"]`).waitFor();
    await expect.poll(() => page.getByTestId('recomputing').count(), { timeout: 10_000 }).toBe(0);
  });

  it('met no Content-Security-Policy violation on the way', async () => {
    expect(await cspViolations()).toEqual([]);
  });
});
