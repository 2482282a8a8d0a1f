import { expect } from 'vitest';
import type { Page } from 'playwright-core';

/** What has focus, as the test reads it: tag, accessible name parts, and whether it is the page itself. */
export async function focused(page: Page) {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    return {
      tag: el?.tagName ?? '',
      label: el?.getAttribute('aria-label') ?? '',
      text: (el?.textContent ?? '').trim().slice(0, 200),
      id: el?.id ?? '',
      lost: !el || el === document.body || el === document.documentElement,
    };
  });
}

/**
 * Presses Tab (Shift+Tab with `back`) until the focused element matches, and fails
 * if it is not reached within `max` presses: proof that the keyboard gets there.
 */
export async function tabTo(page: Page, matches: (f: Awaited<ReturnType<typeof focused>>) => boolean, what: string, { max = 250, back = false } = {}) {
  for (let i = 0; i < max; i++) {
    await page.keyboard.press(back ? 'Shift+Tab' : 'Tab');
    if (matches(await focused(page))) return;
  }
  expect.fail(`the keyboard did not reach ${what} within ${max} presses of Tab`);
}

export async function expectFocusKept(page: Page, after: string) {
  const f = await focused(page);
  expect(f.lost, `focus fell back to the page after ${after}`).toBe(false);
  return f;
}
