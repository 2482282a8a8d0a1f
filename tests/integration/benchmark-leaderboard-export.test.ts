/**
 * The leaderboard export (CSV and LaTeX) and the status route the page polls, through
 * their route handlers on a real SQLite file. Values are invented for the test.
 */
import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { createWorkspaceWith, signInAs } from '@/tests/support/users';
import { GET as getLeaderboard } from '@/app/api/workspaces/[workspaceId]/benchmarks/[benchmarkId]/leaderboard/route';
import { GET as getStatus } from '@/app/api/workspaces/[workspaceId]/benchmarks/[benchmarkId]/status/route';
import { createBenchmark } from '@/db/queries/benchmarks';
import { getRevision } from '@/db/queries/revisions';
import { recomputeBenchmark } from '@/lib/services/benchmarks/recompute';
import { LEADERBOARD_CSV_COLUMNS } from '@/lib/benchmark/leaderboard-export';
import { addMaterial, addMeasurement, addMethod, addModeSet, addSource } from './benchmark-support';

let a: Awaited<ReturnType<typeof createWorkspaceWith>>;
let b: Awaited<ReturnType<typeof createWorkspaceWith>>;
let benchmarkId: string;

function call(handler: typeof getLeaderboard, workspaceId: string, id: string, query = '') {
  const url = `http://localhost:3999/api/workspaces/${workspaceId}/benchmarks/${id}/x${query}`;
  return handler(new Request(url), { params: Promise.resolve({ workspaceId, benchmarkId: id }) });
}

// Measured A1g / Eg lines of three invented materials; "low" computes every line 4 cm⁻¹ low
// (mean signed error −4), "high" computes them 1–2 cm⁻¹ high.
const MEASURED = [
  { A1g: 400, Eg: 500 },
  { A1g: 300, Eg: 350 },
  { A1g: 610, Eg: 720 },
];

beforeAll(async () => {
  a = await createWorkspaceWith(['reviewer']);
  b = await createWorkspaceWith(['curator']);
  const w = a.workspaceId;
  const src = await addSource(w, 'doe2020');
  const low = await addMethod(w, 'PBE_sol & 50% {k}');
  const high = await addMethod(w, 'LDA');
  for (const [i, lines] of MEASURED.entries()) {
    const m = await addMaterial(w, `Invented-${i}`, ['oxide']);
    for (const [irrep, value] of Object.entries(lines)) await addMeasurement(w, { materialId: m, sourceId: src, value, irrep });
    await addModeSet(w, m, src, low, { A1g: lines.A1g - 4, Eg: lines.Eg - 4 });
    await addModeSet(w, m, src, high, { A1g: lines.A1g + 1, Eg: lines.Eg + 2 });
  }
  benchmarkId = (await createBenchmark(w, { userId: a.owner.id }, { name: 'Export & check', scope: { methodIds: [low, high] }, rules: { ranking: { minN: 3 } } })).id;
  await recomputeBenchmark(w, benchmarkId);
});

describe('leaderboard export', () => {
  it('CSV: one line per method with N, coverage, common-pair MAE, interval and exclusions, numbers with an ASCII minus', async () => {
    await signInAs(a.members.reviewer.email);
    const res = await call(getLeaderboard, a.workspaceId, benchmarkId, '?format=csv');
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toContain('text/csv');
    expect(res.headers.get('content-disposition')).toMatch(/filename="export-check-r1-leaderboard\.csv"/);
    const text = await res.text();
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
    expect(parsed.meta.fields).toEqual([...LEADERBOARD_CSV_COLUMNS]);
    expect(parsed.data).toHaveLength(2);
    const [first, second] = parsed.data;
    // LDA is closer (MAE 1.5) and ranks first; errors −4 on all six pairs for the other
    expect(first).toMatchObject({ rank: '1', method: 'LDA', n: '6', coverage_percent: '100', common_n: '6', common_mae: '1.5', mae: '1.5', mean_signed_error: '1.5', outliers: '0', excluded: '0', unit: 'cm⁻¹' });
    expect(second).toMatchObject({ rank: '2', method: 'PBE_sol & 50% {k}', mae: '4', mean_signed_error: '-4', interval_resampled: 'clusters' });
    expect(Number(second.mae_interval_lower)).toBeLessThanOrEqual(4);
    expect(Number(second.mae_interval_upper)).toBeGreaterThanOrEqual(4);
    expect(text).not.toContain('\u2212');
  });

  it('LaTeX: a booktabs table with the special characters escaped and the minus as $-$', async () => {
    await signInAs(a.members.reviewer.email);
    const res = await call(getLeaderboard, a.workspaceId, benchmarkId, '?format=latex');
    expect(res.status).toBe(200);
    expect(res.headers.get('content-disposition')).toMatch(/\.tex"/);
    const tex = await res.text();
    const rev = await getRevision(a.workspaceId, benchmarkId);
    expect(tex).toContain('\\begin{tabular}{rlrrrrrrrrrr}');
    expect(tex).toContain('Rank & Method & $N$ & Coverage (\\%) & MAE, common pairs (cm$^{-1}$) & Common $N$ & MAE (cm$^{-1}$) & 95\\,\\% interval & MSE (cm$^{-1}$) & RMSE (cm$^{-1}$) & Outliers & Excluded \\\\');
    expect(tex).toContain('2 & PBE\\_sol \\& 50\\% \\{k\\} & 6 & 100 & 4.00 & 6 & 4.00 & [4.00, 4.00] & $-$4.00 & 4.00 & 0 & 0 \\\\');
    expect(tex).toMatch(/^1 & LDA & 6 & 100 & 1\.50 & 6 & 1\.50 & \[\d\.\d\d, \d\.\d\d\] & \+1\.50 & /m);
    expect(tex).toContain(`\\caption{Export \\& check, revision 1 (sha256:${rev!.fingerprint.slice(0, 16)}).`);
    // no unescaped specials or Unicode minus left in the table
    expect(tex).not.toContain('\u2212');
    expect(tex.split('\n').filter((l) => l.includes(' & ')).every((l) => !/[^\\]_|[^\\]%/.test(l.replace(/\\,\\%/g, '')))).toBe(true);
  });

  it('refuses an unknown format (400) and another workspace (404)', async () => {
    await signInAs(a.members.reviewer.email);
    const bad = await call(getLeaderboard, a.workspaceId, benchmarkId, '?format=xlsx');
    expect(bad.status).toBe(400);
    expect((await bad.json()).detail).toBe('Query parameter "format" must be csv or latex.');
    await signInAs(b.members.curator.email);
    expect((await call(getLeaderboard, b.workspaceId, benchmarkId, '?format=csv')).status).toBe(404);
    expect((await call(getStatus, b.workspaceId, benchmarkId)).status).toBe(404);
  });
});

describe('benchmark status', () => {
  it('reports the recomputation state and the latest revision, without the statistics', async () => {
    await signInAs(a.members.reviewer.email);
    const res = await call(getStatus, a.workspaceId, benchmarkId);
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body).toEqual({ state: 'idle', computing: false, error: null, attempts: 0, retryAt: null, latestRevision: { number: 1, createdAt: expect.any(String) } });
  });
});
