/**
 * axe-core (WCAG 2.0, 2.1 and 2.2, levels A and AA) on every page of the app:
 * every route read from the app/ folder, signed out and as the owner, in screen
 * and print media; the pages whose markup depends on the role again as curator,
 * contributor and reviewer. Any violation fails, naming the page, the rule and
 * the element.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { newBrowser } from './support/browser';
import { DEMO_SLUG, signInDemo } from './support/demo';
import { pageRoutes, type SegmentValues } from './support/routes';
import { countsByPage, demoSegmentValues, report, walk } from './support/walk';
import { ensureWalkFixtures } from './support/walk-fixtures';

const base = inject('baseURL');
const databaseURL = inject('databaseURL');

/** Pages whose controls differ by role (forms, decision columns, member tools). */
const ROLE_PAGES = [
  '/w/[workspace]',
  '/w/[workspace]/benchmarks/[id]',
  '/w/[workspace]/materials/[id]',
  '/w/[workspace]/imports/new',
  '/w/[workspace]/imports/[importId]',
  '/w/[workspace]/decks/[id]',
  '/w/[workspace]/settings/members',
];

let browser: BrowserContext;
let page: Page;
let values: SegmentValues;

beforeAll(async () => {
  browser = await newBrowser();
  page = await browser.newPage();
  await signInDemo(page, base, 'owner');
  await ensureWalkFixtures(page, base, databaseURL, DEMO_SLUG);
  values = await demoSegmentValues(databaseURL, DEMO_SLUG);
  await page.context().clearCookies();
});
afterAll(async () => {
  await browser?.close();
});

function expectClean(who: string, results: Awaited<ReturnType<typeof walk>>) {
  console.log(`axe-core, ${who}: ${results.length} page checks; elements failing per page:`, Object.fromEntries(countsByPage(results)));
  const lines = report(who, results);
  expect(lines, `${lines.length} accessibility violations:\n${lines.join('\n')}`).toEqual([]);
}

// A cap, not a target: axe takes several seconds on a large page, and the walk grows with every new route.
const WALK_TIMEOUT_MS = 600_000;

describe('accessibility walk (axe-core, WCAG 2.2 AA)', () => {
  it('finds every page route in the app folder', () => {
    const routes = pageRoutes();
    expect(routes.length).toBeGreaterThan(35);
    for (const r of ['/', '/sign-in', '/w/[workspace]/benchmarks/[id]', '/w/[workspace]/decks/[id]/present']) expect(routes).toContain(r);
    for (const r of ROLE_PAGES) expect(routes).toContain(r);
  });

  it('signed out: every route, screen and print', async () => {
    expectClean('signed out', await walk(page, base, values, { media: ['screen', 'print'] }));
  }, WALK_TIMEOUT_MS);

  it('as the owner: every route, screen and print', async () => {
    await signInDemo(page, base, 'owner');
    const results = await walk(page, base, values, { media: ['screen', 'print'] });
    // each route once, in two media (routes that redirect to a page already checked are not repeated)
    expect(results.length).toBeGreaterThan(pageRoutes().length);
    expectClean('owner', results);
    await page.context().clearCookies();
  }, WALK_TIMEOUT_MS);

  for (const role of ['curator', 'contributor', 'reviewer'] as const) {
    it(`as the ${role}: the pages that change with the role, screen and print`, async () => {
      await signInDemo(page, base, role);
      expectClean(role, await walk(page, base, values, { routes: ROLE_PAGES, media: ['screen', 'print'] }));
      await page.context().clearCookies();
    });
  }
});
