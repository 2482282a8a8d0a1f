// The layers of the code base, from the bottom up, and which may import which.
// One definition, read by the ESLint rule (eslint.config.mjs) and by the import-graph check (scripts/check-layers.mjs).

/** Request gates: session, action and route wrappers, API-token auth. They sit above the services, below the routes. */
export const GATE_FILES = ['lib/auth.ts', 'lib/auth-guard.ts', 'lib/session.ts', 'lib/action.ts', 'lib/route.ts', 'lib/api/auth.ts', 'lib/api/handler.ts', 'lib/api/resources.ts'];

export const LAYERS = [
  { name: 'science', holds: 'lib/science/: pure computation, no I/O', may: [] },
  { name: 'lib', holds: 'lib/ (the rest): pure helpers, schemas, formats, mail templates', may: ['science'] },
  { name: 'db', holds: 'db/: schema and queries, reads and writes only', may: ['science', 'lib'] },
  { name: 'services', holds: 'lib/services/: use cases across queries, science, mail and jobs', may: ['science', 'lib', 'db'] },
  { name: 'gates', holds: `${GATE_FILES.join(', ')}`, may: ['science', 'lib', 'db', 'services'] },
  { name: 'components', holds: 'components/: UI only', may: ['science', 'lib'] },
  { name: 'app', holds: 'app/, proxy.ts, instrumentation.ts: routes, actions, pages and their _components', may: ['science', 'lib', 'db', 'services', 'gates', 'components'] },
];

/** Scripts and tests may import anything; db/seed.ts is a script that lives beside the schema. */
export const OUTSIDE = ['scripts/', 'bench/', 'tests/', 'db/seed.ts', 'drizzle.config.ts', 'vitest.config.ts', 'next.config.mjs', 'eslint.config.mjs', 'postcss.config.mjs'];

/** The layer of a repository-relative path, or null for files outside the layered code. */
export function layerOf(path) {
  if (OUTSIDE.some((p) => (p.endsWith('/') ? path.startsWith(p) : path === p))) return null;
  if (path.startsWith('lib/science/')) return 'science';
  if (path.startsWith('lib/services/')) return 'services';
  if (GATE_FILES.includes(path)) return 'gates';
  if (path.startsWith('lib/')) return 'lib';
  if (path.startsWith('db/')) return 'db';
  if (path.startsWith('components/')) return 'components';
  if (path.startsWith('app/') || path === 'proxy.ts' || path === 'instrumentation.ts') return 'app';
  return null;
}

export function mayImport(from, to) {
  if (from === to) return true;
  return LAYERS.find((l) => l.name === from)?.may.includes(to) ?? false;
}

/** What a client component ('use client') may never import, not even for types: anything that runs only on the server. */
export const CLIENT_FORBIDDEN_LAYERS = ['db', 'services', 'gates'];
