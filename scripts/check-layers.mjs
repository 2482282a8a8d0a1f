// npm test's layer check: lists the imports between the layers (scripts/layers.mjs), and fails on an import
// that runs up or sideways, on a client component that imports server code, and on any import cycle.
import { existsSync, readFileSync, readdirSync, statSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { CLIENT_FORBIDDEN_LAYERS, LAYERS, layerOf, mayImport } from './layers.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const SOURCE = /\.(ts|tsx|mjs|js)$/;
const SKIP = new Set(['node_modules', '.next', '.git', '.data', 'drizzle', 'data', 'test-results']);

function walk(dir, out = []) {
  for (const name of readdirSync(dir)) {
    if (SKIP.has(name)) continue;
    const full = join(dir, name);
    if (statSync(full).isDirectory()) walk(full, out);
    else if (SOURCE.test(name) && !name.endsWith('.d.ts')) out.push(relative(root, full));
  }
  return out;
}

const IMPORT = /(?:^|[\s;])(?:import|export)\s+(?:type\s+)?(?:[^'"`;]*?\s+from\s+)?['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)/g;

function resolve(fromFile, spec) {
  let base;
  if (spec.startsWith('@/')) base = spec.slice(2);
  else if (spec.startsWith('.')) base = join(dirname(fromFile), spec);
  else return null;
  for (const candidate of [base, `${base}.ts`, `${base}.tsx`, `${base}.mjs`, `${base}.js`, `${base}/index.ts`]) {
    if (existsSync(join(root, candidate)) && statSync(join(root, candidate)).isFile()) return candidate;
  }
  return null;
}

export function readGraph(files = walk(root)) {
  const graph = new Map();
  const text = new Map();
  for (const file of files) {
    const source = readFileSync(join(root, file), 'utf8').replace(/\/\*[\s\S]*?\*\//g, '').replace(/(^|[^:'"`])\/\/.*$/gm, '$1');
    text.set(file, source);
    const targets = new Set();
    for (const m of source.matchAll(IMPORT)) {
      const target = resolve(file, m[1] ?? m[2]);
      if (target) targets.add(target);
    }
    graph.set(file, targets);
  }
  return { graph, text };
}

const isClient = (source) => /^\s*['"]use client['"]/.test(source);
const isServerOnly = (source) => /import\s+['"]server-only['"]/.test(source);

export function checkLayers({ graph, text }) {
  const problems = [];
  const counts = new Map();
  for (const [from, targets] of graph) {
    const a = layerOf(from);
    if (!a) continue;
    for (const to of targets) {
      const b = layerOf(to);
      if (!b) continue;
      const k = `${a} → ${b}`;
      counts.set(k, (counts.get(k) ?? 0) + 1);
      if (!mayImport(a, b)) problems.push(`${from} (${a}) imports ${to} (${b}): ${a} may import only ${[a, ...LAYERS.find((l) => l.name === a).may].join(', ')}.`);
      if (isClient(text.get(from) ?? '') && (CLIENT_FORBIDDEN_LAYERS.includes(b) || isServerOnly(text.get(to) ?? ''))) {
        problems.push(`${from} is a client component and imports server code ${to}.`);
      }
    }
  }
  return { problems, counts, cycles: cyclesOf(graph) };
}

/** Strongly connected components with more than one file (Tarjan), or a file importing itself. */
function cyclesOf(graph) {
  let index = 0;
  const stack = [];
  const on = new Set();
  const idx = new Map();
  const low = new Map();
  const out = [];
  const visit = (v) => {
    idx.set(v, index);
    low.set(v, index++);
    stack.push(v);
    on.add(v);
    for (const w of graph.get(v) ?? []) {
      if (!graph.has(w)) continue;
      if (!idx.has(w)) {
        visit(w);
        low.set(v, Math.min(low.get(v), low.get(w)));
      } else if (on.has(w)) low.set(v, Math.min(low.get(v), idx.get(w)));
    }
    if (low.get(v) === idx.get(v)) {
      const scc = [];
      let w;
      do {
        w = stack.pop();
        on.delete(w);
        scc.push(w);
      } while (w !== v);
      if (scc.length > 1 || graph.get(v)?.has(v)) out.push(scc.sort());
    }
  };
  for (const v of graph.keys()) if (!idx.has(v)) visit(v);
  return out;
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const result = checkLayers(readGraph());
  console.log('Imports between layers (importer → imported: count):');
  for (const [k, n] of [...result.counts].sort()) console.log(`  ${k}: ${n}`);
  for (const c of result.cycles) console.error(`cycle: ${c.join(' → ')}`);
  for (const p of result.problems) console.error(`forbidden: ${p}`);
  const bad = result.problems.length + result.cycles.length;
  console.log(bad ? `\n${result.problems.length} forbidden import(s), ${result.cycles.length} cycle(s).` : '\nNo forbidden import, no cycle.');
  process.exit(bad ? 1 : 0);
}
