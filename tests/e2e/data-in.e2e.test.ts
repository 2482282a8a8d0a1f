import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { newBrowser, screenshot } from './support/browser';
import { DEMO_SLUG, signInDemo } from './support/demo';

const base = inject('baseURL');
let browser: BrowserContext;
let page: Page;

const header = 'material,quantity,value,unit,uncertainty,temperature_K,irrep,branch,degeneracy,activity,technique,laser_nm,sample_form,source,notes';
// Invented demo rows (low-temperature re-measurement of GaN and ZnO peaks).
const good = [
  header,
  'GaN-wz,frequency,571.40,cm-1,0.3,80,E2(high),,,raman,raman,532,single-crystal,demo-invented-2026,invented e2e row',
  'GaN-wz,frequency,146.10,cm-1,0.3,80,E2(low),,,raman,raman,532,single-crystal,demo-invented-2026,invented e2e row',
  'ZnO,frequency,439.90,cm-1,0.3,80,E2(high),,,raman,raman,532,single-crystal,demo-invented-2026,invented e2e row',
].join('\n');
const broken = [header, 'GaN-wz,frequency,57x,cm-1,,80,E2(high),,,raman,raman,,,demo-invented-2026,', 'Unobtainium,frequency,100,cm-1,,80,,,,raman,raman,,,demo-invented-2026,'].join('\n');

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

describe('import wizard', () => {
  let importUrl = '';

  it('offers the template and shows every row error of a broken file, refusing to commit it', async () => {
    await page.goto(`${base}/w/${DEMO_SLUG}/imports/new`);
    const template = page.getByRole('link', { name: /Download the measurements template/ });
    const res = await page.request.get(new URL((await template.getAttribute('href'))!, base).toString());
    expect(res.status()).toBe(200);
    expect((await res.text()).split('\n')[0]).toContain('material,quantity,value,unit');

    await chooseFile('broken.csv', broken);
    const errors = page.getByTestId('row-errors');
    await errors.waitFor();
    const text = await errors.textContent();
    expect(text).toContain('value');
    expect(text).toMatch(/57x/);
    expect(text).toMatch(/Unobtainium/);
    expect(await page.getByRole('button', { name: /^Import \d+ rows/ }).isDisabled()).toBe(true);
    await screenshot(page, 'import-errors');
  });

  it('commits a good file atomically and finds its rows on the material page', async () => {
    await chooseFile('gan-zno-80K.csv', good);
    await page.getByTestId('import-preview').waitFor();
    const commit = page.getByRole('button', { name: 'Import 3 rows' });
    await expect.poll(() => commit.isEnabled()).toBe(true);
    await commit.click();
    await page.getByText('Imported 3 of 3 rows').waitFor();
    await page.getByRole('link', { name: 'Open the import' }).click();
    await page.waitForURL(/\/imports\/(?!new$)[^/]+$/);
    importUrl = page.url();

    await page.goto(`${base}/w/${DEMO_SLUG}/materials?q=GaN`);
    await page.getByRole('link', { name: 'GaN-wz' }).first().click();
    await page.waitForURL(/\/materials\/[^/?]+/);
    await page.getByTitle('571.40 cm-1 as entered').first().waitFor();
    await screenshot(page, 'material-gan');

    // the same file again is refused and points at the first import
    await page.goto(`${base}/w/${DEMO_SLUG}/imports/new`);
    await chooseFile('gan-zno-80K.csv', good);
    await page.getByRole('button', { name: 'Import 3 rows' }).click();
    await page.getByText(/already imported/i).first().waitFor();
  });

  it('undoes the import: its rows leave the material page, the history keeps them', async () => {
    await page.goto(importUrl);
    await page.getByLabel('Reason').fill('Wrong calibration of the 80 K spectra (e2e)');
    await page.getByRole('button', { name: 'Undo this import' }).click();
    await page.getByText(/undone/).first().waitFor();

    await page.goto(`${base}/w/${DEMO_SLUG}/materials?q=GaN`);
    await page.getByRole('link', { name: 'GaN-wz' }).first().click();
    await page.waitForURL(/\/materials\/[^/?]+/);
    await page.getByTitle('569 cm-1 as entered').first().waitFor();
    expect(await page.getByTitle('571.40 cm-1 as entered').count()).toBe(0);

    await page.goto(`${base}/w/${DEMO_SLUG}/imports`);
    await page.getByText('gan-zno-80K.csv').first().waitFor();
    await page.getByText('undone').first().waitFor();
  });
});
