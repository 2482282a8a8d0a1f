import { readdirSync } from 'node:fs';
import { join } from 'node:path';

/**
 * Every page route of the app, read from the app/ folder tree (route groups and
 * private folders dropped, api/ skipped), as patterns such as
 * "/w/[workspace]/materials/[id]". New pages join the walk by existing.
 */
export function pageRoutes(appDir = join(process.cwd(), 'app')): string[] {
  const routes: string[] = [];
  const visit = (dir: string, segments: string[]) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      if (entry.isFile() && /^page\.(tsx|ts|jsx|js|mdx)$/.test(entry.name)) routes.push(`/${segments.join('/')}`);
      if (!entry.isDirectory()) continue;
      const name = entry.name;
      if (name.startsWith('_') || name.startsWith('@') || (segments.length === 0 && name === 'api')) continue;
      visit(join(dir, name), /^\(.*\)$/.test(name) ? segments : [...segments, name]);
    }
  };
  visit(appDir, []);
  return [...new Set(routes)].sort();
}

/** Values for the dynamic segments, keyed by the route pattern up to and including the segment. */
export type SegmentValues = Record<string, string>;

/**
 * Fills a route pattern's dynamic segments. A segment with no value throws, naming
 * the route, so a new dynamic page cannot silently drop out of the walk.
 */
export function fillRoute(pattern: string, values: SegmentValues): string {
  const parts = pattern.split('/');
  return parts
    .map((part, i) => {
      if (!/^\[.+\]$/.test(part)) return part;
      const key = parts.slice(0, i + 1).join('/');
      const value = values[key];
      if (value === undefined) throw new Error(`the accessibility walk has no value for ${part} in ${pattern}: add "${key}" to its segment values`);
      return encodeURIComponent(value);
    })
    .join('/');
}
