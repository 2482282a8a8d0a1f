import { createClient } from '@libsql/client';
import type { Page } from 'playwright-core';
import { describeViolations, runAxe, type Violation } from './axe';
import { fillRoute, pageRoutes, type SegmentValues } from './routes';

export type Media = 'screen' | 'print';

export interface PageResult {
  route: string;
  url: string;
  media: Media;
  violations: Violation[];
}

/**
 * Values for every dynamic segment of the app's routes, read from the demo data in
 * the e2e database. Records the demo does not hold (a deck, an import, an
 * invitation) must exist before this is called; a missing one is an error.
 */
export async function demoSegmentValues(databaseURL: string, slug: string): Promise<SegmentValues> {
  const db = createClient({ url: databaseURL });
  try {
    const one = async (what: string, sql: string, args: string[] = []) => {
      const row = (await db.execute({ sql, args })).rows[0];
      if (!row) throw new Error(`the accessibility walk found no ${what} in the e2e database`);
      return String(row[0]);
    };
    const ws = await one('workspace', 'select id from organization where slug = ?', [slug]);
    const benchmark = await one('frequency benchmark', "select id from benchmark where workspace_id = ? and quantity = 'frequency' and retracted_at is null order by created_at limit 1", [ws]);
    const revision = await one('revision', 'select max(number) from revision where benchmark_id = ?', [benchmark]);
    const material = await one('material', "select id from material where workspace_id = ? and name = 'ZnO' ", [ws]).catch(() => one('material', 'select id from material where workspace_id = ? limit 1', [ws]));
    const w = '/w/[workspace]';
    return {
      [w]: slug,
      [`${w}/benchmarks/[id]`]: benchmark,
      [`${w}/benchmarks/[id]/revisions/[number]`]: revision,
      [`${w}/materials/[id]`]: material,
      [`${w}/methods/[id]`]: await one('method', 'select id from method where workspace_id = ? order by label limit 1', [ws]),
      [`${w}/sources/[id]`]: await one('source', 'select id from source where workspace_id = ? order by cite_key limit 1', [ws]),
      [`${w}/decks/[id]`]: await one('deck with views', 'select d.id from deck d join deck_view v on v.deck_id = d.id where d.workspace_id = ? group by d.id order by count(*) desc limit 1', [ws]),
      [`${w}/imports/[importId]`]: await one('import', 'select id from import_batch where workspace_id = ? order by created_at desc limit 1', [ws]),
      [`${w}/history/[entityType]`]: 'material',
      [`${w}/history/[entityType]/[entityId]`]: material,
      '/invitations/[id]': await one('invitation', 'select id from invitation where organization_id = ? order by created_at desc limit 1', [ws]),
    };
  } finally {
    db.close();
  }
}

/** Waits until the page has settled: loaded, network quiet, plots drawn. */
export async function settle(page: Page) {
  await page.waitForLoadState('load');
  await page.waitForLoadState('networkidle', { timeout: 8000 }).catch(() => undefined);
  await page
    .waitForFunction(() => [...document.querySelectorAll('[data-plot]')].every((el) => el.querySelector('svg, canvas') || el.textContent?.includes('could not be drawn')), null, { timeout: 8000 })
    .catch(() => undefined);
}

/**
 * Opens every route (filled from `values`) and runs axe-core in each media type.
 * Routes that land on an address already checked (a redirect to sign-in, say) are
 * checked once.
 */
export async function walk(page: Page, base: string, values: SegmentValues, opts: { routes?: string[]; media: Media[]; seen?: Set<string> }): Promise<PageResult[]> {
  const results: PageResult[] = [];
  const seen = opts.seen ?? new Set<string>();
  for (const route of opts.routes ?? pageRoutes()) {
    const path = fillRoute(route, values);
    const response = await page.goto(`${base}${path}`);
    await settle(page);
    const landed = new URL(page.url());
    const key = `${landed.pathname}${landed.search}`;
    if (seen.has(key)) continue;
    seen.add(key);
    if (response && response.status() >= 500) {
      results.push({ route, url: key, media: 'screen', violations: [{ rule: 'http-status', impact: 'critical', help: `the page answered ${response.status()}`, nodes: [] }] });
      continue;
    }
    for (const media of opts.media) {
      await page.emulateMedia({ media });
      results.push({ route, url: key, media, violations: await runAxe(page) });
    }
    await page.emulateMedia({ media: 'screen' });
  }
  return results;
}

export function report(who: string, results: readonly PageResult[]): string[] {
  return results.flatMap((r) => {
    const lines = describeViolations(`[${who}, ${r.media}] ${r.url}`, r.violations);
    return lines.length || !r.violations.length ? lines : [`[${who}, ${r.media}] ${r.url} · ${r.violations.map((v) => v.rule).join(', ')}`];
  });
}

/** Per page: how many elements fail, for the before/after table. */
export function countsByPage(results: readonly PageResult[]): Map<string, number> {
  const counts = new Map<string, number>();
  for (const r of results) {
    const n = r.violations.reduce((s, v) => s + Math.max(1, v.nodes.length), 0);
    const key = `${r.route} (${r.media})`;
    counts.set(key, (counts.get(key) ?? 0) + n);
  }
  return counts;
}
