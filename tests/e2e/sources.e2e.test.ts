import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { parse as parseBib } from '@retorquere/bibtex-parser';
import { newBrowser, screenshot } from './support/browser';
import { DEMO_SLUG, signInDemo } from './support/demo';

const base = inject('baseURL');
let browser: BrowserContext;
let page: Page;

beforeAll(async () => {
  browser = await newBrowser();
  page = await browser.newPage();
  await signInDemo(page, base, 'contributor');
});
afterAll(async () => {
  await browser?.close();
});

describe('source form', () => {
  it('splits a typed author list as you type, saves it, and the BibTeX export carries the same names', async () => {
    await page.goto(`${base}/w/${DEMO_SLUG}/sources/new`);
    await page.getByLabel('Cite key (unique)').fill('e2e-kessel2026');
    await page.getByLabel('Title', { exact: true }).fill('Low-temperature Raman lines of wurtzite nitrides (invented e2e source)');
    await page.getByLabel('Year').fill('2026');
    // Invented people, typed in three of the usual ways, one with a particle and one hyphenated.
    await page.getByLabel('Authors', { exact: true }).fill('Kessel-Brandt M.; van der Berg, Johanna; T. Oyelaran');
    const parsed = page.getByTestId('authors-parsed');
    await parsed.waitFor();
    const family = (i: number) => page.getByLabel(`Authors ${i}: family name`);
    const given = (i: number) => page.getByLabel(`Authors ${i}: given names`);
    await expect.poll(() => family(3).inputValue()).toBe('Oyelaran');
    expect(await family(1).inputValue()).toBe('Kessel-Brandt');
    expect(await given(1).inputValue()).toBe('M.');
    expect(await family(2).inputValue()).toBe('Berg');
    expect(await page.getByLabel('Authors 2: particle').inputValue()).toBe('van der');
    expect(await given(3).inputValue()).toBe('T.');
    expect(await page.getByText('Read as:').textContent()).toContain('M. Kessel-Brandt, J. van der Berg and T. Oyelaran');
    // A correction before saving: the given name in full.
    await given(3).fill('Tunde');
    await page.getByLabel('Journal').fill('J. Invented Phys.');
    await page.getByLabel('Volume').fill('12');
    await page.getByLabel('Pages').fill('101--108');
    await screenshot(page, 'source-form-parsed');
    await page.getByRole('button', { name: 'Create source' }).click();
    await page.waitForURL(/\/sources\/(?!new$)[^/]+$/);
    await page.getByRole('heading', { name: 'e2e-kessel2026' }).waitFor();
    expect(await page.getByText('M. Kessel-Brandt, J. van der Berg and T. Oyelaran').count()).toBeGreaterThan(0);
    await page.getByTestId('incomplete-source').first().waitFor();
    await screenshot(page, 'source-page');

    const href = await page.getByRole('link', { name: 'BibTeX', exact: true }).getAttribute('href');
    const res = await page.request.get(new URL(href!, base).toString());
    expect(res.status()).toBe(200);
    const library = parseBib(await res.text(), { sentenceCase: false, english: false });
    expect(library.errors).toEqual([]);
    expect(library.entries.map((e) => e.key)).toEqual(['e2e-kessel2026']);
    expect(library.entries[0].fields.author?.map((a) => [a.prefix ?? '', a.lastName, a.firstName])).toEqual([
      ['', 'Kessel-Brandt', 'M.'],
      ['van der', 'Berg', 'Johanna'],
      ['', 'Oyelaran', 'Tunde'],
    ]);
    expect(library.entries[0].fields.pages).toBe('101–108');
  });

  it('marks incomplete sources in the sources table', async () => {
    await page.goto(`${base}/w/${DEMO_SLUG}/sources?q=sapphire2016`);
    const row = page.getByRole('row', { name: /sapphire2016/ });
    await row.getByTestId('incomplete-source').waitFor();
    await screenshot(page, 'sources-table');
  });
});
