/**
 * A small k-point family in one calculations file, its three methods defined in the wizard's
 * method table (prefilled from the file's method_ columns, then copied line to line with one
 * field changed); a bad k-grid holds the commit back, and once fixed the import creates the
 * material, the methods and the rows; the methods page lists them with their k-grids. Invented values.
 */
import { describe, expect, inject, it } from 'vitest';
import { screenshot } from './support/browser';
import { DEMO_SLUG, demoSession } from './support/demo';

const base = inject('baseURL');
const session = demoSession('curator', base);

const GRIDS = [4, 6, 8] as const;
const label = (k: number) => `E2E-tab-k${k}`;
// The first row of the family's first label carries the shared recipe columns; the others carry none.
const csv = [
  'material,method,quantity,value,unit,mode_index,source,material_formula,material_space_group,material_atoms_in_cell,method_functional,method_pseudopotential,method_cutoff_eV',
  ...GRIDS.flatMap((k, i) => [
    `E2E-tab-C,${label(k)},frequency,0.00,cm-1,1,demo-synthetic-2026,C,227,2,${i === 0 ? 'PBEsol,PAW-e2e,700' : ',,'}`,
    `E2E-tab-C,${label(k)},frequency,${(1330 - 4 / k).toFixed(2)},cm-1,4,demo-synthetic-2026,,,,,,`,
  ]),
].join('\n');

describe('method table in the calculations wizard', () => {
  it('defines a family’s methods in one table and imports them with the rows', async () => {
    const { page } = session;
    await page.setViewportSize({ width: 1400, height: 900 });
    await page.goto(`${base}/w/${DEMO_SLUG}/imports/new`);
    await page.getByLabel('Calculations (computed)').check();
    await page.getByLabel('CSV file to import').setInputFiles({ name: 'tab-family.csv', mimeType: 'text/csv', buffer: Buffer.from(csv, 'utf8') });

    // without createMissing the wizard says which labels are new and offers the option
    const hint = page.getByTestId('new-methods-hint');
    await hint.waitFor();
    expect(await hint.innerText()).toContain(label(4));
    await hint.getByRole('button', { name: 'Create them in this import' }).click();
    expect(await page.getByLabel(/Create missing materials and methods/).isChecked()).toBe(true);

    // the file is checked again with the option: wait for that result (no row errors, one line per new label)
    const table = page.getByTestId('method-table');
    await expect.poll(async () => (await page.getByTestId('row-errors').count()) === 0 && (await table.locator('tbody tr').count()) === 3, { timeout: 15_000 }).toBe(true);
    // line 1 starts from the file's method_ cells
    expect(await page.getByLabel(`functional of ${label(4)}`).inputValue()).toBe('PBEsol');
    expect(await page.getByLabel(`pseudopotential of ${label(4)}`).inputValue()).toBe('PAW-e2e');
    await page.getByLabel(`k-grid of ${label(4)}`).fill('4x4x4');
    await page.getByLabel(`approach of ${label(4)}`).selectOption('perturbation');
    await page.getByLabel(`LO–TO of ${label(4)}`).selectOption('no');

    // lines 2 and 3 copy the line above, then change the one parameter
    await page.getByRole('button', { name: `Copy the recipe of line 1 into line 2 (${label(6)})` }).click();
    expect(await page.getByLabel(`functional of ${label(6)}`).inputValue()).toBe('PBEsol');
    expect(await page.getByLabel(`cutoff (eV) of ${label(6)}`).inputValue()).toBe('700');
    await page.getByLabel(`k-grid of ${label(6)}`).fill('6x6x6');
    await page.getByRole('button', { name: `Copy the recipe of line 2 into line 3 (${label(8)})` }).click();
    await page.getByLabel(`k-grid of ${label(8)}`).fill('8x8');

    // a bad line: named with its field, and the commit waits
    const errors = page.getByTestId('method-table-errors');
    await errors.waitFor();
    expect(await errors.innerText()).toContain('Line 3 · k-grid: The k-point grid must be three positive whole numbers like "8x8x8", got "8x8".');
    expect(await page.getByLabel(`k-grid of ${label(8)}`).getAttribute('aria-invalid')).toBe('true');
    const commit = page.getByRole('button', { name: `Import ${GRIDS.length * 2} rows` });
    expect(await commit.isDisabled()).toBe(true);
    await screenshot(page, 'method-table-bad-line');

    await page.getByLabel(`k-grid of ${label(8)}`).fill('8x8x8');
    await expect.poll(() => errors.count()).toBe(0);
    await expect.poll(() => commit.isEnabled()).toBe(true);
    await commit.click();
    await page.getByText(`Imported ${GRIDS.length * 2} of ${GRIDS.length * 2} rows`).waitFor();
    expect(await page.getByTestId('commit-result').innerText()).toMatch(/Created 1 material\. Created 3 methods\./);

    await page.goto(`${base}/w/${DEMO_SLUG}/methods?q=E2E-tab`);
    for (const k of GRIDS) {
      const row = page.getByRole('row', { name: new RegExp(label(k)) });
      await row.waitFor();
      const text = await row.innerText();
      expect(text).toContain(`${k}×${k}×${k}`);
      expect(text).toContain('PBEsol');
      expect(text).toContain('PAW-e2e');
    }
    await screenshot(page, 'method-table-methods');
  });
});
