import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { newBrowser, screenshot } from './support/browser';
import { DEMO_SLUG, signInDemo } from './support/demo';

const base = inject('baseURL');
let browser: BrowserContext;
let page: Page;

// Invented handles and identifiers; formulas with their commonly tabulated space groups and primitive-cell atom counts.
const materials = [
  'name,formula,display_name,space_group,atoms_in_cell,external_id,tags',
  'E2E-AlN-wz,AlN,AlN (wurtzite; e2e),186,4,e2e-invented-001,"nitride, semiconductor"',
  'E2E-KCl-rs,KCl,KCl (rocksalt; e2e),225,2,e2e-invented-002,halide',
].join('\n');

beforeAll(async () => {
  browser = await newBrowser();
  page = await browser.newPage();
  await signInDemo(page, base, 'curator');
});
afterAll(async () => {
  await browser?.close();
});

async function chooseFile(name: string, text: string) {
  await page.getByLabel('CSV file to import').setInputFiles({ name, mimeType: 'text/csv', buffer: Buffer.from(text, 'utf8') });
}

describe('catalogue import with the wizard', () => {
  it('imports a materials CSV, lists the new materials, and reports a second import as unchanged', async () => {
    await page.goto(`${base}/w/${DEMO_SLUG}/imports/new`);
    await page.getByLabel('Materials', { exact: true }).check();
    const template = page.getByRole('link', { name: /Download the materials template/ });
    const res = await page.request.get(new URL((await template.getAttribute('href'))!, base).toString());
    expect(res.status()).toBe(200);
    expect((await res.text()).split('\n')[0]).toContain('name,formula,display_name,space_group,atoms_in_cell');

    // a bad row first: shown with its column, and the commit stays disabled
    await chooseFile('bad-materials.csv', `${materials}\nE2E-bad,GaN,GaN,186,3,,`);
    const errors = page.getByTestId('row-errors');
    await errors.waitFor();
    expect(await errors.textContent()).toMatch(/3 atoms contradict the formula GaN/);
    expect(await page.getByRole('button', { name: /^Import \d+ rows/ }).isDisabled()).toBe(true);

    await chooseFile('materials.csv', materials);
    await page.getByTestId('import-preview').waitFor();
    const commit = page.getByRole('button', { name: 'Import 2 rows' });
    await expect.poll(() => commit.isEnabled()).toBe(true);
    await commit.click();
    await page.getByText(/2 materials created, 0 updated, 0 unchanged/).waitFor();
    await screenshot(page, 'catalogue-import-done');

    await page.goto(`${base}/w/${DEMO_SLUG}/materials?q=E2E-`);
    await page.getByRole('link', { name: 'E2E-AlN-wz' }).first().waitFor();
    await page.getByRole('link', { name: 'E2E-KCl-rs' }).first().waitFor();

    // the same catalogue again writes nothing
    await page.goto(`${base}/w/${DEMO_SLUG}/imports/new`);
    await page.getByLabel('Materials', { exact: true }).check();
    await chooseFile('materials-again.csv', materials);
    await page.getByTestId('import-preview').waitFor();
    await page.getByRole('button', { name: 'Import 2 rows' }).click();
    await page.getByText(/Nothing to write: all 2 rows are identical to stored materials/).waitFor();
  });
});
