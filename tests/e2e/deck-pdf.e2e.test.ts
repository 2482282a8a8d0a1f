/**
 * A deck in the presenter and as a PDF, end to end on a benchmark of the demo data
 * with a strict outlier rule (so its outlier table is long): the
 * outlier table continues over slides instead of being cut, the parity plot fills
 * its slide, table slides say nothing about hovering; the print route rendered by
 * Chromium's print-to-PDF gives one A4 landscape page per slide (plus the title
 * page), none blank, checked with poppler's pdftoppm and pdftotext.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, inject, it } from 'vitest';
import { screenshot } from './support/browser';
import { DEMO_SLUG, demoSession } from './support/demo';
import { addViewToDeck, panel } from './support/decks';

const base = inject('baseURL');
const BENCHMARK_NAME = 'Deck check: strict outlier rule (e2e)';
const deckTitle = `Deck as PDF ${Date.now()}`;

const session = demoSession('curator', base);
let deckId = '';

function poppler(tool: 'pdftoppm' | 'pdftotext', args: string[]): string {
  try {
    return execFileSync(tool, args, { encoding: 'utf8' });
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') throw new Error(`${tool} is missing: apt-get install -y poppler-utils`);
    throw e;
  }
}

/** Width, height and the share of non-white pixels of a binary PGM (P5) image. */
function pgmStats(file: string): { width: number; height: number; ink: number } {
  const data = readFileSync(file);
  const header = data.toString('latin1', 0, 64).match(/^P5\s+(\d+)\s+(\d+)\s+(\d+)\s/);
  if (!header) throw new Error(`${file} is not a binary PGM`);
  const [all, w, h] = header;
  const pixels = data.subarray(all.length);
  let dark = 0;
  for (const p of pixels) if (p < 235) dark++;
  return { width: Number(w), height: Number(h), ink: dark / pixels.length };
}


describe('deck in the presenter and as a PDF', () => {
  it('builds a deck of the leaderboard, the parity plot and the outlier table', async () => {
    const { page } = session;
    // A benchmark of its own with a strict outlier rule (|error| above 1 % of the measured value), so the outlier
    // table is longer than one slide whatever the other test files did to the demo benchmark.
    await page.goto(`${base}/w/${DEMO_SLUG}/benchmarks/new`);
    await page.getByLabel('Name').fill(`${BENCHMARK_NAME} ${Date.now() % 100000}`);
    await page.getByLabel('Outlier rule').selectOption('relative');
    await page.getByLabel('Outlier threshold').fill('0.01');
    await page.getByRole('button', { name: 'Create benchmark' }).click();
    await page.waitForURL((url) => /\/benchmarks\/[^/]+$/.test(url.pathname) && !url.pathname.endsWith('/new'));
    await expect.poll(async () => (await page.getByTestId('leaderboard').count()) || (await page.reload(), 0), { timeout: 60_000, interval: 2000 }).toBe(1);
    deckId = await addViewToDeck(page, panel(page, /^Leaderboard$/), 'leaderboard', { newTitle: deckTitle });
    const plots = panel(page, /^Plots$/);
    await plots.getByRole('button', { name: 'Add to deck' }).waitFor();
    await addViewToDeck(page, plots, 'parity', { deckId });
    await addViewToDeck(page, panel(page, /^Outliers and excluded pairs/), 'outliers', { deckId });
  });

  it('presents at 1280×720: the parity plot fills its slide, the outlier table continues over slides and fits each', async () => {
    const { page } = session;
    await page.setViewportSize({ width: 1280, height: 720 });
    await page.goto(`${base}/w/${DEMO_SLUG}/decks/${deckId}/present?slide=2`);
    const number = page.getByTestId('slide-number');
    await expect.poll(() => number.textContent()).toMatch(/^2 \/ \d+$/);
    const total = Number((await number.textContent())!.split('/')[1]);
    expect(total, 'the outlier table under the strict rule is longer than one slide').toBeGreaterThan(3);

    const svg = page.getByTestId('presenter').locator('svg.marks').first();
    await svg.waitFor({ timeout: 20_000 });
    const box = (await svg.boundingBox())!;
    expect(box.height, 'plot height on a 720 px screen').toBeGreaterThan(0.6 * 720);
    expect(await page.getByTestId('slide-hint').textContent()).toMatch(/Hover a point/);
    await screenshot(page, 'presenter-parity');

    for (let slide = 3; slide <= total; slide++) {
      await page.keyboard.press('ArrowRight');
      await expect.poll(() => number.textContent()).toBe(`${slide} / ${total}`);
      const heading = page.getByTestId('presenter').getByRole('heading', { level: 2 });
      expect(await heading.textContent()).toContain(`(${slide - 2} of ${total - 2})`);
      await page.getByTestId('slide-outliers').waitFor();
      const body = page.getByTestId('slide-body');
      const fits = await body.evaluate((el) => el.scrollHeight <= el.clientHeight + 1);
      expect(fits, `outlier slide ${slide} is cut off`).toBe(true);
      expect(await page.getByTestId('slide-hint').textContent()).not.toMatch(/Hover/);
    }
    await screenshot(page, 'presenter-outliers-last');
    await page.setViewportSize({ width: 1360, height: 900 });
  });

  it('prints to a PDF of one A4 landscape page per slide, none blank', async () => {
    const { page } = session;
    await page.goto(`${base}/w/${DEMO_SLUG}/decks/${deckId}/print`);
    const root = page.getByTestId('print-deck');
    await page.locator('[data-print-ready="true"]').waitFor({ timeout: 40_000 });
    const slides = Number(await root.getAttribute('data-slides'));
    expect(await root.locator('svg.marks').count()).toBeGreaterThan(0);

    const dir = mkdtempSync(join(tmpdir(), 'ledger-deck-pdf-'));
    const pdf = join(dir, 'deck.pdf');
    await page.pdf({ path: pdf, preferCSSPageSize: true, printBackground: true });
    expect(readFileSync(pdf).subarray(0, 5).toString()).toBe('%PDF-');

    poppler('pdftoppm', ['-r', '30', '-gray', pdf, join(dir, 'page')]);
    const pages = readdirSync(dir).filter((f) => f.endsWith('.pgm')).sort();
    expect(pages.length, 'pages: the title page and one per slide, no slide spilling over').toBe(slides + 1);
    for (const file of pages) {
      const s = pgmStats(join(dir, file));
      expect(s.width, `${file} is landscape`).toBeGreaterThan(s.height);
      expect(s.ink, `${file} is blank`).toBeGreaterThan(0.003);
    }

    const text = poppler('pdftotext', ['-layout', pdf, '-']);
    expect(text).toContain(deckTitle);
    expect(text).toContain('Parity plot');
    expect(text).toMatch(/Rows 1–\d+ of \d+; continued on the next slide/);
    await screenshot(page, 'print-deck');
  });
});
