/**
 * The benchmark page at 1024 px and 1400 px: the leaderboard's last column (Excluded) is
 * in view without scrolling the page or the table, nothing overflows the page sideways,
 * and the print view shows the whole leaderboard with every method's other statistics.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot } from './support/browser';
import { DEMO_SLUG, demoSession } from './support/demo';

const base = inject('baseURL');
const BENCHMARK = 'Γ-point frequencies — all methods (demo)';
const session = demoSession('reviewer', base);

async function openBenchmark(page: Page) {
  await page.goto(`${base}/w/${DEMO_SLUG}/benchmarks`);
  await page.getByRole('link', { name: BENCHMARK }).first().click();
  await page.getByTestId('leaderboard').waitFor();
}

/** Where the leaderboard's last header cell sits, against the window and against its own scroll box. */
function lastHeaderBox(page: Page) {
  return page.evaluate(() => {
    const table = document.querySelector('[data-testid="leaderboard"]')!;
    const ths = table.querySelectorAll('thead th');
    const last = ths[ths.length - 1].getBoundingClientRect();
    const region = table.closest('[role="region"]')!.getBoundingClientRect();
    return {
      text: ths[ths.length - 1].textContent,
      left: last.left,
      right: last.right,
      regionRight: region.right,
      innerWidth: window.innerWidth,
      scrollWidth: document.documentElement.scrollWidth,
    };
  });
}

describe('benchmark page width', () => {
  for (const width of [1024, 1400]) {
    it(`at ${width} px shows the leaderboard's Excluded column without scrolling, and the page does not overflow`, async () => {
      const { page } = session;
      await page.setViewportSize({ width, height: 900 });
      await openBenchmark(page);
      const box = await lastHeaderBox(page);
      expect(box.text).toBe('Excluded');
      expect(box.left).toBeGreaterThanOrEqual(0);
      expect(box.right).toBeLessThanOrEqual(box.innerWidth);
      // not hidden to the right of the table's own scroll box either
      expect(box.right).toBeLessThanOrEqual(box.regionRight + 1);
      expect(box.scrollWidth).toBeLessThanOrEqual(box.innerWidth);
      expect(await page.getByTestId('leaderboard').locator('[data-testid="scroll-cue"]').count()).toBe(0);
      // the other statistics of a method open in its details row
      const first = page.getByTestId('leaderboard').locator('tbody tr[data-method]').first();
      const label = (await first.getAttribute('data-method'))!;
      const details = page.locator(`tr[data-details-of="${label}"]`);
      expect(await details.isVisible()).toBe(false);
      await first.getByRole('button', { name: new RegExp(`more statistics of ${label.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`) }).click();
      await details.waitFor({ state: 'visible' });
      expect(await details.textContent()).toMatch(/Lin's CCC/);
      expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
      await screenshot(page, `benchmark-${width}`);
    });
  }

  it('prints the whole leaderboard: no column cut off, every method with its other statistics', async () => {
    const { page } = session;
    await page.setViewportSize({ width: 1024, height: 900 });
    await openBenchmark(page);
    await page.emulateMedia({ media: 'print' });
    try {
      const cut = await page.evaluate(() => {
        const table = document.querySelector('[data-testid="leaderboard"]') as HTMLElement;
        const region = table.closest('[role="region"]') as HTMLElement;
        return { table: table.scrollWidth, region: region.clientWidth, page: document.documentElement.scrollWidth, inner: window.innerWidth };
      });
      expect(cut.table).toBeLessThanOrEqual(cut.region);
      expect(cut.page).toBeLessThanOrEqual(cut.inner);
      const rows = page.getByTestId('leaderboard').locator('tr[data-details-of]');
      const n = await rows.count();
      expect(n).toBeGreaterThanOrEqual(3);
      for (let i = 0; i < n; i++) expect(await rows.nth(i).isVisible()).toBe(true);
      // and Chromium's PDF of the page has the Excluded header and the details on its first page
      const file = join(mkdtempSync(join(tmpdir(), 'ledger-leaderboard-pdf-')), 'benchmark.pdf');
      await page.pdf({ path: file, format: 'A4', landscape: true, printBackground: true });
      const firstPage = execFileSync('pdftotext', ['-layout', '-f', '1', '-l', '1', file, '-'], { encoding: 'utf8' });
      expect(firstPage).toContain('Excluded');
      expect(firstPage).toContain("Lin's CCC");
    } finally {
      await page.emulateMedia({ media: 'screen' });
    }
  });
});
