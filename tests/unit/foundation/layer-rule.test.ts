import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';
// @ts-expect-error: plain ES module without types
import { checkLayers } from '../../../scripts/check-layers.mjs';

const root = join(__dirname, '../../..');
const fixture = readFileSync(join(root, 'tests/fixtures/lint/upward-imports.ts'), 'utf8');
const eslint = new ESLint({ cwd: root });

async function restricted(asFile: string): Promise<string[]> {
  const [result] = await eslint.lintText(fixture, { filePath: join(root, asFile) });
  return result.messages.filter((m) => m.ruleId === 'no-restricted-imports').map((m) => fixture.split('\n')[m.line - 1].match(/'([^']+)'/)![1]);
}

describe('the layering lint rule', () => {
  it('refuses science code that imports the database, a service or another helper', async () => {
    expect(await restricted('lib/science/fixture.ts')).toEqual(['@/db/client', '@/lib/services/data-changed', '@/lib/format']);
  }, 60_000);

  it('refuses a pure helper that imports the database or a service, and allows another helper', async () => {
    expect(await restricted('lib/catalog/fixture.ts')).toEqual(['@/db/client', '@/lib/services/data-changed']);
  }, 60_000);

  it('refuses a query module that calls up into a service', async () => {
    expect(await restricted('db/queries/fixture.ts')).toEqual(['@/lib/services/data-changed']);
  }, 60_000);

  it('refuses a component that loads data', async () => {
    expect(await restricted('components/ui/fixture.tsx')).toEqual(['@/db/client', '@/lib/services/data-changed']);
  }, 60_000);

  it('lets a route use every layer below it', async () => {
    expect(await restricted('app/(app)/w/[workspace]/fixture/page.tsx')).toEqual([]);
  }, 60_000);
});

describe('the import-graph check', () => {
  const text = (entries: Record<string, string>) => new Map(Object.entries(entries));
  const graph = (edges: Record<string, string[]>) => new Map(Object.entries(edges).map(([k, v]) => [k, new Set(v)]));

  it('reports an upward import, a client component that imports server code, and a cycle', () => {
    const result = checkLayers({
      graph: graph({
        'db/queries/a.ts': ['lib/services/b.ts'],
        'lib/services/b.ts': ['db/queries/a.ts'],
        'app/x/_components/form.tsx': ['db/queries/a.ts'],
        'lib/format.ts': [],
      }),
      text: text({ 'app/x/_components/form.tsx': "'use client';\nimport type { A } from '@/db/queries/a';" }),
    });
    expect(result.problems).toEqual([
      'db/queries/a.ts (db) imports lib/services/b.ts (services): db may import only db, science, lib.',
      'app/x/_components/form.tsx is a client component and imports server code db/queries/a.ts.',
    ]);
    expect(result.cycles).toEqual([['db/queries/a.ts', 'lib/services/b.ts']]);
  });

  it('accepts imports that run down the layers', () => {
    const result = checkLayers({
      graph: graph({ 'app/p/page.tsx': ['lib/services/s.ts'], 'lib/services/s.ts': ['db/queries/q.ts'], 'db/queries/q.ts': ['lib/science/x.ts'], 'lib/science/x.ts': [] }),
      text: text({}),
    });
    expect(result.problems).toEqual([]);
    expect(result.cycles).toEqual([]);
  });
});
