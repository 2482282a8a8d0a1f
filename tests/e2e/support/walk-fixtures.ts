import { createClient } from '@libsql/client';
import type { Page } from 'playwright-core';

/**
 * Records the demo seed does not hold but some routes need: an invitation, an
 * import and a deck with views. Made through the app as the signed-in owner,
 * only when missing. The import is an invented entropy at 400 K, outside the
 * scope of every demo benchmark, so it moves no statistics other tests read.
 */
export async function ensureWalkFixtures(page: Page, base: string, databaseURL: string, slug: string) {
  const db = createClient({ url: databaseURL });
  const count = async (sql: string) => Number((await db.execute({ sql, args: [slug] })).rows[0]?.[0] ?? 0);
  const ws = 'select id from organization where slug = ?';
  try {
    if (!(await count(`select count(*) from invitation where organization_id = (${ws})`))) {
      await page.goto(`${base}/w/${slug}/settings/members`);
      const form = page.getByRole('form', { name: 'Invite a member' });
      await form.getByLabel('E-mail').fill('walk.guest@example.org');
      await form.getByLabel('Role').selectOption('reviewer');
      await form.getByRole('button', { name: 'Send invitation' }).click();
      await form.getByRole('status').waitFor();
    }
    if (!(await count(`select count(*) from import_batch where workspace_id = (${ws})`))) {
      await page.goto(`${base}/w/${slug}/imports/new`);
      const csv = 'material,quantity,value,unit,temperature_K,technique,source,notes\nMgO,entropy,31.40,J/mol/K,400,calorimetry,demo-invented-2026,invented row for the accessibility walk (demo only)\n';
      await page.getByLabel('CSV file to import').setInputFiles({ name: 'walk-entropy-400K.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
      await page.getByRole('button', { name: 'Import 1 rows' }).click();
      await page.getByText('Imported 1 of 1 rows').waitFor();
    }
    if (!(await count(`select count(*) from deck_view v join deck d on d.id = v.deck_id where d.workspace_id = (${ws})`))) {
      await page.goto(`${base}/w/${slug}/benchmarks`);
      await page.getByRole('link', { name: /Γ-point frequencies/ }).first().click();
      await page.waitForURL(/\/benchmarks\/[^/]+$/);
      const plots = page.locator('section', { has: page.getByRole('heading', { name: 'Plots' }) });
      for (const kind of ['parity', 'bland-altman', 'outliers']) {
        const trigger = kind === 'outliers' ? page.locator('section', { has: page.getByRole('heading', { name: /^Outliers/ }) }) : plots;
        await trigger.getByRole('button', { name: 'Add to deck' }).first().click();
        const dialog = page.getByRole('dialog', { name: 'Add this view to a deck' });
        const deck = dialog.getByRole('combobox', { name: 'Deck' });
        await deck.waitFor();
        const existing = await deck.locator('option[value]:not([value=""])').count();
        if (!existing) {
          await deck.selectOption('');
          await dialog.getByLabel('New deck title').fill('Accessibility walk deck');
        }
        await dialog.getByRole('combobox', { name: 'View' }).selectOption(kind);
        await dialog.getByRole('button', { name: 'Add view' }).click();
        await dialog.getByRole('link', { name: 'Open the deck' }).waitFor();
        await dialog.getByRole('button', { name: 'Close' }).click();
      }
    }
  } finally {
    db.close();
  }
}
