import { beforeAll, describe, expect, it } from 'vitest';
import * as importsRoute from '@/app/api/v1/imports/route';
import * as benchmarksRoute from '@/app/api/v1/benchmarks/route';
import * as benchmarkRoute from '@/app/api/v1/benchmarks/[id]/route';
import * as statusRoute from '@/app/api/v1/benchmarks/[id]/status/route';
import * as revisionsRoute from '@/app/api/v1/benchmarks/[id]/revisions/route';
import * as revisionRoute from '@/app/api/v1/benchmarks/[id]/revisions/[number]/route';
import * as statisticsRoute from '@/app/api/v1/benchmarks/[id]/methods/[methodId]/statistics/route';
import * as verdictRoute from '@/app/api/v1/benchmarks/[id]/methods/[methodId]/verdict/route';
import * as pairsRoute from '@/app/api/v1/benchmarks/[id]/pairs/route';
import * as flagsRoute from '@/app/api/v1/benchmarks/[id]/flags/route';
import { getRevision } from '@/db/queries/revisions';
import { scheduleRecompute, whenRecomputeIdle } from '@/lib/services/benchmarks/recompute-queue';
import { createWorkspaceWith } from '../support/users';
import { calculationsCsv, MEASURED, makeToken, seedWorkflow } from './api-workflow-fixtures';

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
const BASE = 'http://localhost:3999/api/v1';

function get(handler: unknown, path: string, token: string, params: Record<string, string> = {}) {
  return (handler as Handler)(new Request(`${BASE}${path}`, { headers: { authorization: `Bearer ${token}` } }), { params: Promise.resolve(params) });
}

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;
let seeded: Awaited<ReturnType<typeof seedWorkflow>>;
let otherSeeded: Awaited<ReturnType<typeof seedWorkflow>>;
let token: string;
let reviewer: string;
let otherToken: string;
let importId: string;

// Computed = measured ± offsets (cm⁻¹), so the expected numbers follow by hand: see each test.
const OFFSETS: Record<string, Record<string, number>> = { 'Inv-A': { A1g: 2, Eg: -4 }, 'Inv-B': { A1g: 6, Eg: 0 }, 'Inv-C': { A1g: -3, Eg: 5 } };

beforeAll(async () => {
  process.env.RECOMPUTE_DEBOUNCE_MS = '20';
  ws = await createWorkspaceWith(['contributor']);
  other = await createWorkspaceWith();
  seeded = await seedWorkflow(ws.workspaceId, ws.owner.id);
  otherSeeded = await seedWorkflow(other.workspaceId, other.owner.id);
  token = await makeToken(ws.members.contributor.email, ws.workspaceId, 'contributor');
  reviewer = await makeToken(ws.owner.email, ws.workspaceId, 'reviewer');
  otherToken = await makeToken(other.owner.email, other.workspaceId, 'curator');
  const csv = calculationsCsv(Object.keys(OFFSETS), (n, irrep) => OFFSETS[n][irrep]);
  const res = await (importsRoute.POST as Handler)(
    new Request(`${BASE}/imports?kind=calculations&fileName=run.csv`, { method: 'POST', headers: { authorization: `Bearer ${token}`, 'content-type': 'text/csv' }, body: csv }),
    { params: Promise.resolve({}) },
  );
  expect(res.status).toBe(201);
  importId = (await res.json()).importId;
  await whenRecomputeIdle(ws.workspaceId, seeded.benchmarkId);
});

const errors = Object.values(OFFSETS).flatMap((o) => Object.values(o));
const MAE = errors.reduce((s, e) => s + Math.abs(e), 0) / errors.length; // 20/6
const RMSE = Math.sqrt(errors.reduce((s, e) => s + e * e, 0) / errors.length);
const BIAS = errors.reduce((s, e) => s + e, 0) / errors.length; // 6/6 = 1

describe('benchmark reads', () => {
  it('lists the workspace’s benchmarks only', async () => {
    const res = await get(benchmarksRoute.GET, '/benchmarks', token);
    expect(res.status).toBe(200);
    const page = await res.json();
    expect(page.items.map((b: { id: string }) => b.id)).toEqual([seeded.benchmarkId]);
    expect(page.items[0]).toMatchObject({ name: 'Invented Raman peaks', revisionNumber: 2, methodCount: 1, pairCount: 6 });
  });

  it('reads one benchmark: its definition and a summary of the latest revision', async () => {
    const res = await get(benchmarkRoute.GET, `/benchmarks/${seeded.benchmarkId}`, token, { id: seeded.benchmarkId });
    const body = await res.json();
    expect(res.status).toBe(200);
    expect(body.rules.ranking).toEqual({ minN: 3, minCoverage: 0.5 });
    expect(body.latestRevision).toMatchObject({ number: 2, unit: 'cm⁻¹', ranking: { commonN: 6, rankedMethods: 1 } });
    expect(body.latestRevision.methods[0].common.meanAbsoluteError).toBeCloseTo(MAE, 12);
  });

  it('pages the revisions newest first, each with the imports that entered it', async () => {
    const res = await get(revisionsRoute.GET, `/benchmarks/${seeded.benchmarkId}/revisions?size=1`, token, { id: seeded.benchmarkId });
    const body = await res.json();
    expect(body).toMatchObject({ page: 1, size: 1, total: 2 });
    expect(body.items).toHaveLength(1);
    expect(body.items[0].number).toBe(2);
    expect(body.items[0].cause.imports).toEqual([{ id: importId, rows: 6 }]);
    const second = await (await get(revisionsRoute.GET, `/benchmarks/${seeded.benchmarkId}/revisions?size=1&page=2`, token, { id: seeded.benchmarkId })).json();
    expect(second.items[0].number).toBe(1);
  });

  it('reads any revision by number; unknown numbers are 404 and bad ones 400, as problem+json', async () => {
    const one = await get(revisionRoute.GET, `/benchmarks/${seeded.benchmarkId}/revisions/1`, token, { id: seeded.benchmarkId, number: '1' });
    expect(one.status).toBe(200);
    const first = await one.json();
    expect(first).toMatchObject({ number: 1, isLatest: false, pairCount: 0 });
    expect(first.methods.map((m: { n: number; statistics: unknown }) => [m.n, m.statistics])).toEqual([[0, null]]);
    const missing = await get(revisionRoute.GET, `/benchmarks/${seeded.benchmarkId}/revisions/9`, token, { id: seeded.benchmarkId, number: '9' });
    expect(missing.status).toBe(404);
    expect(missing.headers.get('content-type')).toBe('application/problem+json');
    const bad = await get(revisionRoute.GET, `/benchmarks/${seeded.benchmarkId}/revisions/x`, token, { id: seeded.benchmarkId, number: 'x' });
    expect(bad.status).toBe(400);
  });

  it('gives a method’s statistics exactly as the stored revision (the benchmark page) holds them', async () => {
    const params = { id: seeded.benchmarkId, methodId: seeded.methodId };
    const res = await get(statisticsRoute.GET, `/benchmarks/${seeded.benchmarkId}/methods/${seeded.methodId}/statistics`, token, params);
    const body = await res.json();
    expect(res.status).toBe(200);
    // By hand from OFFSETS (MAE = 20/6, bias = 1) and the stored revision the page renders.
    expect(body.method.n).toBe(6);
    expect(body.method.statistics.meanAbsoluteError).toBeCloseTo(MAE, 12);
    expect(body.method.statistics.rootMeanSquareError).toBeCloseTo(RMSE, 12);
    expect(body.method.statistics.meanSignedError).toBeCloseTo(BIAS, 12);
    expect(body.method.coverage).toBe(0.75);
    const stored = await getRevision(ws.workspaceId, seeded.benchmarkId);
    expect(body.method.statistics.p95AbsoluteError).toBe(stored!.statistics.methods[0].statistics!.p95AbsoluteError);
    const old = await get(statisticsRoute.GET, `/benchmarks/${seeded.benchmarkId}/methods/${seeded.methodId}/statistics?revision=1`, token, params);
    expect(old.status).toBe(200);
    expect((await old.json()).method).toMatchObject({ n: 0, statistics: null, rank: null, common: null });
  });

  it('pages the pairs, filtered by material and method', async () => {
    const a = seeded.materials['Inv-A'];
    const res = await get(pairsRoute.GET, `/benchmarks/${seeded.benchmarkId}/pairs?material=${a}&method=${seeded.methodId}`, token, { id: seeded.benchmarkId });
    const body = await res.json();
    expect(body.total).toBe(2);
    expect(body.items.map((p: { measured: number; error: number }) => [p.measured, p.error]).sort()).toEqual([
      [MEASURED['Inv-A'].A1g, 2],
      [MEASURED['Inv-A'].Eg, -4],
    ].sort());
    const paged = await (await get(pairsRoute.GET, `/benchmarks/${seeded.benchmarkId}/pairs?size=4&page=2`, token, { id: seeded.benchmarkId })).json();
    expect(paged).toMatchObject({ total: 6, page: 2, size: 4, revision: 2 });
    expect(paged.items).toHaveLength(2);
    const bad = await get(pairsRoute.GET, `/benchmarks/${seeded.benchmarkId}/pairs?size=0`, token, { id: seeded.benchmarkId });
    expect(bad.status).toBe(400);
    expect((await bad.json()).detail).toContain('"size"');
  });

  it('lists the revision’s flags and names a bad filter', async () => {
    const res = await get(flagsRoute.GET, `/benchmarks/${seeded.benchmarkId}/flags`, token, { id: seeded.benchmarkId });
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.revision).toBe(2);
    expect(body.total).toBe(body.items.length);
    const bad = await get(flagsRoute.GET, `/benchmarks/${seeded.benchmarkId}/flags?kind=nope`, token, { id: seeded.benchmarkId });
    expect(bad.status).toBe(400);
    expect((await bad.json()).detail).toContain('"kind"');
  });
});

describe('GET /benchmarks/{id}/status', () => {
  it('says idle and that the latest revision includes the import', async () => {
    const res = await get(statusRoute.GET, `/benchmarks/${seeded.benchmarkId}/status?import=${importId}`, token, { id: seeded.benchmarkId });
    expect(await res.json()).toMatchObject({
      state: 'idle',
      computing: false,
      error: null,
      latestRevision: { number: 2 },
      import: { id: importId, settled: true, revision: 2, rowsInRevision: 6, importedRows: 6, status: 'committed' },
    });
  });

  it('says queued, not settled, while a recomputation waits; the verdict then says a newer revision is pending', async () => {
    await scheduleRecompute(ws.workspaceId, [seeded.benchmarkId], { trigger: 'manual' }, 60_000);
    try {
      const res = await get(statusRoute.GET, `/benchmarks/${seeded.benchmarkId}/status?import=${importId}`, token, { id: seeded.benchmarkId });
      expect(await res.json()).toMatchObject({ state: 'queued', computing: true, import: { settled: false, revision: null } });
      const v = await (
        await get(verdictRoute.GET, `/benchmarks/${seeded.benchmarkId}/methods/${seeded.methodId}/verdict?maxMae=5`, token, { id: seeded.benchmarkId, methodId: seeded.methodId })
      ).json();
      expect(v.recomputation).toEqual({ state: 'queued', pending: true });
      expect(v.warnings).toContain('This verdict is of revision 2; a newer revision is being computed (state queued). Poll /status and ask again.');
    } finally {
      await scheduleRecompute(ws.workspaceId, [seeded.benchmarkId], { trigger: 'manual' }, 0);
      await whenRecomputeIdle(ws.workspaceId, seeded.benchmarkId);
    }
  });

  it('refuses another workspace’s import (404)', async () => {
    const res = await get(statusRoute.GET, `/benchmarks/${seeded.benchmarkId}/status?import=${importId}`, token, { id: seeded.benchmarkId });
    expect(res.status).toBe(200);
    const theirs = await get(statusRoute.GET, `/benchmarks/${otherSeeded.benchmarkId}/status?import=${importId}`, otherToken, { id: otherSeeded.benchmarkId });
    expect(theirs.status).toBe(404);
    expect(theirs.headers.get('content-type')).toBe('application/problem+json');
  });
});

describe('GET /benchmarks/{id}/methods/{methodId}/verdict', () => {
  const path = (q: string) => `/benchmarks/${seeded.benchmarkId}/methods/${seeded.methodId}/verdict${q}`;
  const verdict = (q: string, t = token) => get(verdictRoute.GET, path(q), t, { id: seeded.benchmarkId, methodId: seeded.methodId });

  it('passes when the common-ground MAE is within maxMae and coverage reaches minCoverage, with the numbers', async () => {
    const res = await verdict('?maxMae=3.5&minCoverage=0.75');
    const body = await res.json();
    expect(res.status).toBe(200);
    expect(body.verdict).toBe('pass');
    expect(body.reasons).toEqual([]);
    expect(body.numbers.meanAbsoluteError).toBeCloseTo(MAE, 12);
    expect(body.numbers).toMatchObject({ n: 6, coverage: 0.75, paired: 6, measuredInScope: 8 });
    expect(body.ground).toMatchObject({ kind: 'common', commonN: 6, rankedMethods: 1, rank: 1 });
    expect(body.unit).toBe('cm⁻¹');
    expect(body.revision).toMatchObject({ number: 2, isLatest: true });
    expect(body.warnings).toContain('N = 6 common pairs is small (under 20): one pair more or less moves the MAE noticeably.');
  });

  it('fails on MAE above maxMae or coverage below minCoverage, saying which', async () => {
    const mae = await (await verdict('?maxMae=3')).json();
    expect(mae.verdict).toBe('fail');
    expect(mae.reasons).toEqual(['MAE 3.333 cm⁻¹ on 6 common pairs is above maxMae 3 cm⁻¹.']);
    const cov = await (await verdict('?maxMae=10&minCoverage=0.8')).json();
    expect(cov.verdict).toBe('fail');
    expect(cov.reasons).toEqual(['Coverage 75 % is below minCoverage 80 %.']);
    const old = await (await verdict('?maxMae=10&revision=1')).json();
    expect(old.verdict).toBe('fail');
    expect(old.revision).toMatchObject({ number: 1, isLatest: false });
  });

  it('validates its query with the parameter named (400 problem+json)', async () => {
    for (const [q, name] of [
      ['', 'maxMae'],
      ['?maxMae=abc', 'maxMae'],
      ['?maxMae=-1', 'maxMae'],
      ['?maxMae=2&minCoverage=1.5', 'minCoverage'],
      ['?maxMae=2&revision=0', 'revision'],
    ]) {
      const res = await verdict(q);
      expect(res.status, q).toBe(400);
      expect(res.headers.get('content-type')).toBe('application/problem+json');
      expect((await res.json()).detail, q).toContain(`"${name}"`);
    }
  });

  it('is 404 for another workspace’s benchmark or method, with the same token', async () => {
    const theirBenchmark = await get(verdictRoute.GET, `/benchmarks/${otherSeeded.benchmarkId}/methods/${seeded.methodId}/verdict?maxMae=5`, token, {
      id: otherSeeded.benchmarkId,
      methodId: seeded.methodId,
    });
    expect(theirBenchmark.status).toBe(404);
    const theirMethod = await get(verdictRoute.GET, `/benchmarks/${seeded.benchmarkId}/methods/${otherSeeded.methodId}/verdict?maxMae=5`, token, {
      id: seeded.benchmarkId,
      methodId: otherSeeded.methodId,
    });
    expect(theirMethod.status).toBe(404);
    expect(theirMethod.headers.get('content-type')).toBe('application/problem+json');
  });
});

describe('permissions and workspaces on the new routes', () => {
  it('every benchmark route answers 404 problem+json for another workspace’s benchmark', async () => {
    const id = otherSeeded.benchmarkId;
    for (const [handler, path, extra] of [
      [benchmarkRoute.GET, `/benchmarks/${id}`, {}],
      [statusRoute.GET, `/benchmarks/${id}/status`, {}],
      [revisionsRoute.GET, `/benchmarks/${id}/revisions`, {}],
      [revisionRoute.GET, `/benchmarks/${id}/revisions/1`, { number: '1' }],
      [statisticsRoute.GET, `/benchmarks/${id}/methods/${seeded.methodId}/statistics`, { methodId: seeded.methodId }],
      [pairsRoute.GET, `/benchmarks/${id}/pairs`, {}],
      [flagsRoute.GET, `/benchmarks/${id}/flags`, {}],
    ] as const) {
      const res = await get(handler, path, token, { id, ...extra });
      expect(res.status, path).toBe(404);
      expect(res.headers.get('content-type'), path).toBe('application/problem+json');
    }
  });

  it('a reviewer token may read benchmarks but not import (403 problem+json)', async () => {
    expect((await verdict403()).status).toBe(403);
    const read = await get(benchmarksRoute.GET, '/benchmarks', reviewer);
    expect(read.status).toBe(200);
  });

  async function verdict403() {
    const res = await (importsRoute.POST as Handler)(
      new Request(`${BASE}/imports?kind=calculations`, { method: 'POST', headers: { authorization: `Bearer ${reviewer}`, 'content-type': 'text/csv', 'idempotency-key': 'k1' }, body: 'x' }),
      { params: Promise.resolve({}) },
    );
    expect(res.headers.get('content-type')).toBe('application/problem+json');
    return res;
  }

  it('without a token every new route is 401 problem+json', async () => {
    const res = await (verdictRoute.GET as Handler)(new Request(`${BASE}/benchmarks/x/methods/y/verdict?maxMae=1`), { params: Promise.resolve({ id: 'x', methodId: 'y' }) });
    expect(res.status).toBe(401);
    expect(res.headers.get('content-type')).toBe('application/problem+json');
  });
});
