/**
 * Time to the first frame of the parity plot in Debian's Chromium (playwright-core,
 * headless), on a static page served with the app's strict script policy (a nonce,
 * no 'unsafe-eval': Vega runs through vega-interpreter, as on the benchmark page).
 * The spec is the page's own (parityPlotSpec) with invented points: 1,000 points
 * (one mark per pair, the floor) and 30,000 points (a density above
 * DENSITY_THRESHOLD, with the outliers as points), plus 30,000 drawn one mark per
 * pair for comparison. Each is drawn 5 times after one warm-up; the median is printed.
 * Target: 30,000 points under 1.5 s. Run with `npm run bench:plot`.
 */
import { createServer } from 'node:http';
import { performance } from 'node:perf_hooks';
import { build } from 'esbuild';
import { DENSITY_THRESHOLD, parityPlotSpec, rendererFor, type ParityPoint } from '../components/charts/benchmark/specs';
import { newBrowser } from '../tests/e2e/support/browser';

const RUNS = 5;
const TARGET_MS = 1500;
const METHODS = ['method-0', 'method-1', 'method-2', 'method-3', 'method-4'];

function points(n: number): ParityPoint[] {
  let seed = 2024;
  const random = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
  return Array.from({ length: n }, (_, i) => {
    const measured = 40 + 1100 * random();
    const far = random() < 0.0015;
    const calculated = measured * (1 + (i % 5) * 0.01 - 0.02) + 6 * (random() - 0.5) + (far ? 150 : 0);
    return {
      key: `m${i % 5}|${i}`,
      method: METHODS[i % 5],
      material: `mat-${i % 1500}`,
      label: 'A1g',
      measured,
      calculated,
      error: calculated - measured,
      mean: (measured + calculated) / 2,
      uMeasured: 1 + random(),
      excluded: false,
      outlier: far,
      citation: `Invented study ${i % 20} (invented data)`,
    };
  });
}

const bundle = await build({ entryPoints: ['bench/plot-page/entry.ts'], bundle: true, write: false, format: 'iife', platform: 'browser', minify: true, logLevel: 'error' });
const script = bundle.outputFiles[0].contents;
const NONCE = 'benchplot';
const server = createServer((req, res) => {
  if (req.url === '/plot.js') {
    res.writeHead(200, { 'content-type': 'text/javascript' });
    res.end(script);
    return;
  }
  res.writeHead(200, {
    'content-type': 'text/html; charset=utf-8',
    'content-security-policy': `default-src 'self'; script-src 'nonce-${NONCE}' 'strict-dynamic'; style-src 'self' 'unsafe-inline'; img-src 'self' data: blob:`,
  });
  res.end(`<!doctype html><meta charset="utf-8"><title>bench:plot</title><div id="plot"></div><script nonce="${NONCE}" src="/plot.js"></script>`);
});
await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
const port = (server.address() as { port: number }).port;

const context = await newBrowser();
const page = await context.newPage();
const violations: string[] = [];
page.on('console', (m) => {
  if (m.type() === 'error') violations.push(m.text());
});
await page.goto(`http://127.0.0.1:${port}/`);
await page.waitForFunction(() => 'drawSpec' in window);

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

const specMs: Record<number, number> = {};
async function time(n: number, density?: boolean): Promise<number> {
  const data = points(n);
  const built = performance.now();
  const spec = parityPlotSpec(data, { unit: 'cm⁻¹', methods: METHODS, density });
  specMs[n] = performance.now() - built;
  const renderer = rendererFor(n);
  const draw = () => page.evaluate(([s, r]) => (window as unknown as { drawSpec: (s: unknown, r: string) => Promise<number> }).drawSpec(s, r), [spec, renderer] as const);
  await draw(); // warm-up
  const times: number[] = [];
  for (let i = 0; i < RUNS; i++) times.push(await draw());
  return median(times);
}

const small = await time(1000);
const big = await time(30_000);
const bigMarks = await time(30_000, false);
await context.close();
server.close();

console.log(`parity plot, time to first frame in Chromium (headless, canvas above ${DENSITY_THRESHOLD.toLocaleString('en')} points; median of ${RUNS} after a warm-up; spec built beforehand):`);
console.log(`1,000 points (floor)               ${small.toFixed(0)} ms`);
console.log(`30,000 points as a density         ${big.toFixed(0)} ms (target < ${TARGET_MS} ms) ${big < TARGET_MS ? 'PASS' : 'MISS'}`);
console.log(`30,000 points one mark each        ${bigMarks.toFixed(0)} ms (for comparison: what the density replaces)`);
console.log(`ratio 30,000 density / 1,000       ${(big / small).toFixed(2)}`);
console.log(`(building the spec itself, in Node: ${specMs[1000].toFixed(0)} ms for 1,000, ${specMs[30_000].toFixed(0)} ms for 30,000 points, not in the times above)`);
if (violations.length) {
  console.log(`console errors (CSP?): ${violations.join(' | ')}`);
  process.exitCode = 1;
}
