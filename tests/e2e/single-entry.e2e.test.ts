/**
 * The single-entry form, end to end on the demo: the contributor types one measured
 * peak; a bad value is refused with an accessible field error and nothing is stored;
 * the corrected entry is stored with its converted value, shows on the material page,
 * and the contributor can undo their own one-row import.
 */
import { describe, expect, inject, it } from 'vitest';
import { screenshot } from './support/browser';
import { DEMO_SLUG, demoSession } from './support/demo';

const base = inject('baseURL');
const session = demoSession('contributor', base);

describe('single-entry form', () => {
  let importUrl = '';

  it('refuses a bad value with an error tied to its field, keeping what was typed', async () => {
    const { page } = session;
    await page.goto(`${base}/w/${DEMO_SLUG}/materials?q=GaN`);
    await page.getByRole('link', { name: 'GaN-wz' }).first().click();
    await page.getByRole('link', { name: 'Add a measurement' }).click();
    await page.waitForURL(/\/measurements\/new\?material=GaN-wz/);
    const form = page.getByRole('form', { name: 'Add one measurement' });
    expect(await form.getByLabel('Material').inputValue()).toBe('GaN-wz');
    await form.getByLabel('Value').fill('17,13');
    await form.getByLabel('Unit', { exact: true }).selectOption('THz');
    await form.getByLabel('Irrep label').fill('E2(high)');
    await form.getByLabel('Temperature (K)').fill('10');
    await form.getByLabel('Source (cite key)').fill('demo-invented-2026');
    await form.getByLabel('Notes').fill('invented e2e entry (demo only)');
    await form.getByRole('button', { name: 'Save measurement' }).click();

    const value = form.getByLabel('Value');
    await expect.poll(() => value.getAttribute('aria-invalid')).toBe('true');
    const errorId = (await value.getAttribute('aria-describedby'))!;
    expect(await page.locator(`[id="${errorId}"]`).textContent()).toMatch(/decimal comma/);
    expect(await form.getByLabel('Irrep label').inputValue()).toBe('E2(high)');
    await screenshot(page, 'single-entry-error');
  });

  it('stores the corrected entry as a one-row import and shows it on the material page', async () => {
    const { page } = session;
    const form = page.getByRole('form', { name: 'Add one measurement' });
    await form.getByLabel('Value').fill('17.13');
    await form.getByRole('button', { name: 'Save measurement' }).click();
    await page.getByTestId('entry-saved').waitFor();
    expect(await page.getByTestId('entry-saved').textContent()).toBe('The measurement is saved.');
    // the per-line fields are cleared for the next line; the material and source stay
    expect(await form.getByLabel('Value').inputValue()).toBe('');
    expect(await form.getByLabel('Source (cite key)').inputValue()).toBe('demo-invented-2026');
    await screenshot(page, 'single-entry-saved');

    await page.getByRole('link', { name: 'Open its import' }).click();
    await page.waitForURL(/\/imports\/[^/]+$/);
    importUrl = page.url();
    const row = page.getByTestId('import-rows').locator('tbody tr').first();
    // 17.13 THz × 33.356 409 52 cm⁻¹/THz (CODATA 2018, derived) = 571.40 cm⁻¹; 4 figures typed
    expect(await row.textContent()).toContain('571.4\u00a0cm⁻¹');
    expect(await row.textContent()).toContain('E2(high)');

    await page.goto(`${base}/w/${DEMO_SLUG}/materials?q=GaN`);
    await page.getByRole('link', { name: 'GaN-wz' }).first().click();
    await page.getByTitle('17.13 THz as entered').first().waitFor();
  });

  it('lets the contributor undo their own entry', async () => {
    const { page } = session;
    await page.goto(importUrl);
    await page.getByTestId('undo-window').waitFor();
    await page.getByLabel('Reason').fill('Typed for the e2e test (demo only)');
    await page.getByRole('button', { name: 'Undo this import' }).click();
    await page.getByText(/undone .* by Lena Okafor: “Typed for the e2e test/).first().waitFor();
    await page.goto(`${base}/w/${DEMO_SLUG}/materials?q=GaN`);
    await page.getByRole('link', { name: 'GaN-wz' }).first().click();
    await page.getByTitle('569 cm-1 as entered').first().waitFor();
    expect(await page.getByTitle('17.13 THz as entered').count()).toBe(0);
  });
});
