/**
 * The group meeting, end to end on the demo: a deck of three views from the demo
 * benchmark, presented with the keyboard, printed; a comment on an outlier that
 * mentions a member (the mail reaches the local fake); an exclusion recorded from
 * the thread, and N of that method lower in the next revision.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Locator, Page } from 'playwright-core';
import { newBrowser, screenshot } from './support/browser';
import { waitForMail } from './support/mailbox';
import { addViewToDeck, panel as sectionUnder } from './support/decks';

const base = inject('baseURL');
const mailURL = inject('mailURL');
const slug = 'halden-phonons';
const curator = { email: 'tomas.ferreira@example.org', password: 'ledger-demo-2026' };
const BENCHMARK = 'Γ-point frequencies — all methods (demo)';
const deckTitle = `Group meeting ${Date.now()}`;

let browser: BrowserContext;
let page: Page;
let benchmarkUrl = '';
let deckId = '';

beforeAll(async () => {
  browser = await newBrowser();
  page = await browser.newPage();
});
afterAll(async () => {
  await browser?.close();
});

const panel = (heading: RegExp) => sectionUnder(page, heading);

async function addToDeck(section: Locator, kind: string) {
  deckId = await addViewToDeck(page, section, kind, deckId ? { deckId } : { newTitle: deckTitle });
}

async function methodN(label: string): Promise<number> {
  const text = await page.locator(`[data-testid="leaderboard"] tr[data-method="${label}"] [data-stat="n"]`).textContent();
  return Number(text?.trim());
}

describe('group meeting', () => {
  it('signs in as the demo curator and opens the demo benchmark', async () => {
    await page.goto(`${base}/sign-in`);
    await page.getByLabel('E-mail').fill(curator.email);
    await page.getByLabel('Password').fill(curator.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/w(\/|$)/);
    await page.goto(`${base}/w/${slug}/benchmarks`);
    await page.getByRole('link', { name: BENCHMARK }).click();
    await page.waitForURL(/\/benchmarks\/[^/]+$/);
    benchmarkUrl = page.url();
    await expect.poll(async () => (await page.getByTestId('leaderboard').count()) || (await page.reload(), 0), { timeout: 60_000, interval: 2000 }).toBe(1);
  });

  it('builds a deck of three views: leaderboard, parity plot, outlier table', async () => {
    await addToDeck(panel(/^Leaderboard$/), 'leaderboard');
    const plots = panel(/^Plots$/);
    await plots.getByRole('button', { name: 'Add to deck' }).waitFor();
    await addToDeck(plots, 'parity');
    await addToDeck(panel(/^Outliers and excluded pairs/), 'outliers');
    expect(deckId).not.toBe('');

    await page.goto(`${base}/w/${slug}/decks/${deckId}`);
    await page.getByRole('heading', { name: deckTitle }).waitFor();
    expect(await page.getByTestId('deck-view').count()).toBe(3);
  });

  it('presents the deck at 1280×720 and moves through it with the keyboard', async () => {
    await page.setViewportSize({ width: 1280, height: 720 });
    await page.getByRole('link', { name: 'Present' }).click();
    await page.waitForURL(/\/present/);
    const number = page.getByTestId('slide-number');
    await expect.poll(() => number.textContent()).toMatch(/^1 \/ \d+$/);
    // three views; the outlier table may continue over several slides (deck-pdf.e2e.test.ts checks how)
    const total = Number((await number.textContent())!.split('/')[1]);
    expect(total).toBeGreaterThanOrEqual(3);
    await page.getByTestId('leaderboard').waitFor();

    await page.keyboard.press('ArrowRight');
    await expect.poll(() => number.textContent()).toBe(`2 / ${total}`);
    const plot = page.getByTestId('presenter').locator('svg.marks');
    await plot.waitFor({ timeout: 20_000 });
    // hovering a point shows its values and its source
    await page.getByTestId('presenter').locator('g.mark-symbol.role-mark path').nth(5).hover({ force: true });
    const tooltip = page.locator('#vg-tooltip-element');
    await expect.poll(async () => ((await tooltip.count()) ? await tooltip.textContent() : ''), { timeout: 10_000 }).toMatch(/Source/);
    await screenshot(page, 'presenter');

    await page.keyboard.press('PageDown');
    await expect.poll(() => number.textContent()).toBe(`3 / ${total}`);
    await page.getByTestId('slide-outliers').waitFor();
    await page.keyboard.press('End');
    await expect.poll(() => number.textContent()).toBe(`${total} / ${total}`);
    await page.keyboard.press('ArrowRight');
    await expect.poll(() => number.textContent()).toBe(`${total} / ${total}`);
    await page.keyboard.press('Home');
    await expect.poll(() => number.textContent()).toBe(`1 / ${total}`);
    await page.keyboard.press('End');
    await expect.poll(() => number.textContent()).toBe(`${total} / ${total}`);
    await page.keyboard.press('Home');
    await page.keyboard.press('PageDown');
    await page.keyboard.press('PageDown');
    await page.keyboard.press('PageUp');
    await expect.poll(() => number.textContent()).toBe(`2 / ${total}`);
    await page.keyboard.press('ArrowLeft');
    await expect.poll(() => number.textContent()).toBe(`1 / ${total}`);
    await page.keyboard.press('Escape');
    await page.waitForURL(`${base}/w/${slug}/decks/${deckId}`);
    await page.setViewportSize({ width: 1360, height: 900 });
  });

  it('prints one slide per page with vector plots and the citations', async () => {
    await page.goto(`${base}/w/${slug}/decks/${deckId}/print`);
    const slides = Number(await page.getByTestId('print-deck').getAttribute('data-slides'));
    expect(slides).toBeGreaterThanOrEqual(3);
    await expect.poll(() => page.getByTestId('slide').count()).toBe(slides);
    await page.getByTestId('print-deck').locator('svg.marks').first().waitFor({ timeout: 20_000 });
    expect(await page.getByTestId('slide-citations').count()).toBeGreaterThan(0);
    await page.emulateMedia({ media: 'print' });
    const breaks = await page.locator('.print-slide').evaluateAll((els) => els.map((e) => getComputedStyle(e).breakAfter));
    expect(breaks.slice(0, -1).every((b) => b === 'page')).toBe(true);
    await screenshot(page, 'print');
    await page.emulateMedia({ media: 'screen' });
  });

  it('comments on an outlier with an @mention; the mail reaches the mentioned member', async () => {
    await page.goto(benchmarkUrl);
    // a flagged pair of one measurement that is not excluded yet (those carry the curator's "Exclude / keep…")
    const row = page
      .locator('[data-testid="outliers"] tbody tr')
      .filter({ hasNotText: 'Excluded:' })
      .filter({ has: page.getByRole('button', { name: 'Exclude / keep…' }) })
      .first();
    const rowId = (await row.getAttribute('id'))!;
    const method = (await row.locator('td').nth(1).textContent())!.trim();
    const target = page.locator(`tr[id="${rowId}"]`);
    await target.getByTestId('discuss').click();
    const thread = target.getByTestId('thread-panel');
    await thread.getByRole('textbox', { name: 'Comment' }).fill('That peak was measured on a strained film, @lena.okafor can you check the sample notes?');
    await thread.getByRole('button', { name: 'Post comment' }).click();
    await thread.getByTestId('comment-body').filter({ hasText: 'strained film, @lena.okafor' }).waitFor();
    await expect.poll(() => target.getByTestId('discuss').getAttribute('data-open-threads')).toBe('1');
    const mail = await waitForMail(mailURL, 'lena.okafor@example.org', /mentioned you/);
    expect(mail.text).toContain('@lena.okafor can you check');

    // the exclusion, from the thread
    const before = await methodN(method);
    const revisionLine = await page.getByText(/^Revision \d+ ·/).first().textContent();
    await thread.getByRole('combobox', { name: 'Decision' }).selectOption('exclude-pair');
    await thread.getByRole('textbox', { name: 'Reason for the decision' }).fill('strained thin film (discussed at the group meeting)');
    await thread.getByRole('button', { name: 'Record decision' }).click();
    await thread.getByTestId('thread-decisions').filter({ hasText: 'strained thin film' }).waitFor();

    await expect
      .poll(
        async () => {
          await page.reload();
          await page.getByTestId('leaderboard').waitFor();
          return methodN(method);
        },
        { timeout: 60_000, interval: 1500 },
      )
      .toBe(before - 1);
    expect(await page.getByText(/^Revision \d+ ·/).first().textContent()).not.toBe(revisionLine);
    await page.locator(`tr[id="${rowId}"]`).getByText('Excluded: strained thin film').waitFor();
  });
});
