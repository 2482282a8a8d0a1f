/**
 * A convergence study end to end: a curator imports a small method family and its dense-grid
 * reference in one calculations file (the methods created from the rows' method_… columns),
 * creates a benchmark compared with the reference method, opens the convergence view and reads
 * the recommended k-points per reciprocal atom for a class — which must equal an independent
 * computation over the same rows (tests/support/convergence-family.ts, no app code). Invented values.
 */
import { describe, expect, inject, it } from 'vitest';
import { screenshot } from './support/browser';
import { demoSession } from './support/demo';
import { familyCsv, familyLabel, FAMILY_GRIDS, independentRecommendation, referenceLabel } from '../support/convergence-family';

const base = inject('baseURL');
const session = demoSession('curator', base);
const csv = familyCsv('demo-synthetic-2026');
/** The demo's convergence-study workspace (db/seed.ts): the same members, its own data, so nothing here moves the main demo. */
const DEMO_SLUG = 'halden-convergence';

describe('convergence study', () => {
  it('imports a method family with its reference in one file', async () => {
    const { page } = session;
    await page.setViewportSize({ width: 1400, height: 900 });
    await page.goto(`${base}/w/${DEMO_SLUG}/imports/new`);
    await page.getByLabel('Calculations (computed)').check();
    await page.getByLabel(/Create missing materials and methods/).check();
    await page.getByLabel('CSV file to import').setInputFiles({ name: 'k-family.csv', mimeType: 'text/csv', buffer: Buffer.from(csv, 'utf8') });
    await page.getByTestId('import-preview').waitFor();
    const rows = csv.split('\n').length - 1;
    const commit = page.getByRole('button', { name: `Import ${rows} rows` });
    await expect.poll(() => commit.isEnabled()).toBe(true);
    await commit.click();
    await page.getByText(`Imported ${rows} of ${rows} rows`).waitFor();
  });

  it('compares the family with its reference and reads the recommended k-point density of a class', async () => {
    const { page } = session;
    await page.goto(`${base}/w/${DEMO_SLUG}/benchmarks/new`);
    await page.getByLabel('Name').fill('k-point family against its 16³ reference (e2e)');
    await page.getByLabel('Compared with').selectOption({ label: `Reference method: ${referenceLabel}` });
    for (const k of FAMILY_GRIDS) await page.getByLabel(familyLabel(k), { exact: true }).check();
    await page.getByRole('button', { name: 'Create benchmark' }).click();
    await page.getByTestId('reference-table').waitFor({ timeout: 60_000 });
    expect(await page.getByTestId('reference-note').innerText()).toMatch(/not from experiment/);
    await screenshot(page, 'reference-benchmark');

    await page.getByRole('link', { name: 'Convergence view' }).click();
    const table = page.getByTestId('convergence-classes');
    await table.waitFor();
    for (const tag of ['famclass-a', 'famclass-b']) {
      const expected = independentRecommendation(csv, tag);
      const shown = (await table.locator(`tr[data-class="${tag}"] [data-testid="recommended"]`).innerText()).trim();
      if (expected === null) expect(shown).toMatch(/^none: only \d+ of \d+ converge$/);
      else expect(shown.replace(/,/g, '')).toBe(String(expected));
    }
    expect(independentRecommendation(csv, 'famclass-a')).toBe(1024);
    expect(await page.getByTestId('never-converged').innerText()).toMatch(/Bb-fam/);
    await page.locator('[data-plot] svg').first().waitFor();
    await screenshot(page, 'convergence-view');

    // a parameter the methods do not store names them
    await page.getByRole('link', { name: 'plane-wave cutoff' }).click();
    const lacking = await page.getByTestId('methods-lacking').innerText();
    for (const k of FAMILY_GRIDS) expect(lacking).toContain(familyLabel(k));
  });
});
