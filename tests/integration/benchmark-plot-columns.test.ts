/**
 * The pairs endpoint sends plot points in columns with lookup tables; decoded, they
 * must be exactly the rows the old endpoint sent (built here with plotPoints from the
 * same revision), for a benchmark with several methods, materials and sources, with
 * excluded and flagged pairs and pairs with and without an uncertainty. Invented data.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { createWorkspaceWith, signInAs } from '@/tests/support/users';
import { GET as getPairs } from '@/app/api/workspaces/[workspaceId]/benchmarks/[benchmarkId]/pairs/route';
import { createBenchmark } from '@/db/queries/benchmarks';
import { createDecision } from '@/db/queries/decisions';
import { getRevision, pairLookups } from '@/db/queries/revisions';
import { recomputeBenchmark } from '@/lib/services/benchmarks/recompute';
import { plotPoints } from '@/lib/benchmark/pairs-export';
import { decodePlotColumns, type PlotColumns } from '@/lib/benchmark/plot-columns';
import { addMaterial, addMeasurement, addMethod, addModeSet, addSource } from './benchmark-support';

let a: Awaited<ReturnType<typeof createWorkspaceWith>>;
let b: Awaited<ReturnType<typeof createWorkspaceWith>>;
let benchmarkId: string;

function call(workspaceId: string, id: string, query = '') {
  const url = `http://localhost:3999/api/workspaces/${workspaceId}/benchmarks/${id}/pairs${query}`;
  return getPairs(new Request(url), { params: Promise.resolve({ workspaceId, benchmarkId: id }) });
}

const IRREPS = ['A1g', 'Eg', 'T2g', 'A2u', 'Eu', 'B1g', 'B2g', 'E2g'];

beforeAll(async () => {
  a = await createWorkspaceWith(['reviewer']);
  b = await createWorkspaceWith(['curator']);
  const w = a.workspaceId;
  const sources = [await addSource(w, 'doe2019'), await addSource(w, 'roe2021'), await addSource(w, 'poe2023')];
  const methods = [await addMethod(w, 'PBEsol'), await addMethod(w, 'LDA'), await addMethod(w, 'SCAN')];
  const bias = [0, -8, 5];
  let firstMeasurement = '';
  for (let m = 0; m < 4; m++) {
    const materialId = await addMaterial(w, `Invented-${m}`, ['oxide']);
    const truth: Record<string, number> = {};
    for (let k = 0; k < IRREPS.length; k++) {
      const value = 150 + 97 * m + 41.3 * k;
      truth[IRREPS[k]] = value;
      const id = await addMeasurement(w, { materialId, sourceId: sources[(m + k) % sources.length], value, irrep: IRREPS[k], uncertainty: k % 3 === 0 ? undefined : 0.5 + k / 10 });
      firstMeasurement ||= id;
    }
    for (let i = 0; i < methods.length; i++) {
      // small, uneven errors; one far-off mode per method so the outlier rule flags it
      const modes = Object.fromEntries(Object.entries(truth).map(([irrep, v], k) => [irrep, v + bias[i] + ((k * 7 + m * 3) % 5) - 2 + (m === 2 && k === 3 ? 180 : 0)]));
      await addModeSet(w, materialId, sources[2], methods[i], modes);
    }
  }
  benchmarkId = (await createBenchmark(w, { userId: a.owner.id }, { name: 'Columns', scope: { methodIds: methods } })).id;
  await createDecision(w, { userId: a.owner.id }, { benchmarkId, kind: 'exclude-pair', measurementId: firstMeasurement, methodId: methods[1], reason: 'invented: suspected mix-up' });
  await recomputeBenchmark(w, benchmarkId);
});

describe('columnar plot payload', () => {
  it('decodes to exactly the rows the old endpoint sent', async () => {
    await signInAs(a.members.reviewer.email);
    const res = await call(a.workspaceId, benchmarkId);
    expect(res.status).toBe(200);
    const payload = (await res.json()) as PlotColumns;
    const revision = (await getRevision(a.workspaceId, benchmarkId))!;
    const old = plotPoints(revision.statistics, await pairLookups(a.workspaceId, revision.statistics));
    // the data is varied enough to exercise every table and flag
    expect(old.length).toBe(4 * 8 * 3);
    expect(new Set(old.map((p) => p.methodId)).size).toBe(3);
    expect(new Set(old.map((p) => p.material)).size).toBe(4);
    expect(new Set(old.map((p) => p.citation)).size).toBe(3);
    expect(old.some((p) => p.excluded)).toBe(true);
    expect(old.some((p) => p.outlier)).toBe(true);
    expect(old.some((p) => p.uMeasured === null) && old.some((p) => p.uMeasured !== null)).toBe(true);
    // text is sent once per distinct value, not once per point
    expect(payload.citations).toHaveLength(3);
    expect(payload.materials).toHaveLength(4);
    expect(payload.methods).toHaveLength(3);
    expect(payload.keys).toHaveLength(4 * 8);
    expect(payload.revision).toBe(revision.number);
    expect(payload.unit).toBe(revision.statistics.unit);
    // the same rows, in the same order, field for field (through JSON, as the browser gets them)
    expect(decodePlotColumns(payload)).toStrictEqual(JSON.parse(JSON.stringify(old)));
    expect(JSON.stringify(payload).length).toBeLessThan(JSON.stringify(old).length);
  });

  it('keeps the CSV export in rows', async () => {
    await signInAs(a.members.reviewer.email);
    const res = await call(a.workspaceId, benchmarkId, '?format=csv');
    expect(res.headers.get('content-type')).toContain('text/csv');
    const lines = (await res.text()).trim().split('\r\n');
    expect(lines).toHaveLength(1 + 4 * 8 * 3);
    expect(lines[0]).toMatch(/^pair,method,material,/);
  });

  it('does not let another workspace read it', async () => {
    await signInAs(b.members.curator.email);
    // not a member of A
    const direct = await call(a.workspaceId, benchmarkId);
    expect(direct.status).toBe(404);
    // A's benchmark named through B
    const through = await call(b.workspaceId, benchmarkId);
    expect(through.status).toBe(404);
    const body = await through.text();
    expect(body).not.toContain('Invented-');
    expect(body).not.toContain('columns');
  });
});
