import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';

/** WCAG 2.0, 2.1 and 2.2, levels A and AA: the rules the walk holds every page to. */
export const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22a', 'wcag22aa'];

const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

export interface Violation {
  rule: string;
  impact: string | null;
  help: string;
  /** One CSS selector per offending element, with axe's short explanation. */
  nodes: Array<{ target: string; summary: string }>;
}

/**
 * Runs axe-core in the page. The source is evaluated over the DevTools protocol,
 * not added as a <script>, so the page's Content-Security-Policy stays in force.
 */
export async function runAxe(page: Page): Promise<Violation[]> {
  const loaded = await page.evaluate(() => typeof (window as unknown as { axe?: unknown }).axe === 'object');
  if (!loaded) await page.evaluate(axeSource);
  return page.evaluate(async (tags) => {
    const axe = (window as unknown as { axe: typeof import('axe-core') }).axe;
    const result = await axe.run(document, { runOnly: { type: 'tag', values: tags }, resultTypes: ['violations'] });
    return result.violations.map((v) => ({
      rule: v.id,
      impact: v.impact ?? null,
      help: v.help,
      nodes: v.nodes.map((n) => ({ target: n.target.join(' '), summary: (n.failureSummary ?? '').replace(/\s+/g, ' ').slice(0, 300) })),
    }));
  }, WCAG_TAGS);
}

/** Plain-text report: one line per element, naming the page, the rule and the element. */
export function describeViolations(where: string, violations: readonly Violation[]): string[] {
  return violations.flatMap((v) => v.nodes.map((n) => `${where} · ${v.rule} (${v.impact ?? 'n/a'}): ${v.help} · ${n.target} · ${n.summary}`));
}
