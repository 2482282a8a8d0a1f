import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { benchmark, calculation, decision, measurement, pairPin } from '@/db/schema';
import { createWorkspaceWith, signInAs } from '@/tests/support/users';
import { createBenchmarkAction, decideAction, pinAction } from '@/app/(app)/w/[workspace]/benchmarks/actions';
import { GET as getStatistics } from '@/app/api/workspaces/[workspaceId]/benchmarks/[benchmarkId]/statistics/route';
import { GET as getPairs } from '@/app/api/workspaces/[workspaceId]/benchmarks/[benchmarkId]/pairs/route';
import { GET as getBibtex } from '@/app/api/workspaces/[workspaceId]/benchmarks/[benchmarkId]/bibtex/route';
import { createBenchmark } from '@/db/queries/benchmarks';
import { getRevision } from '@/db/queries/revisions';
import { recomputeBenchmark } from '@/lib/services/benchmarks/recompute';
import { decodePlotColumns } from '@/lib/benchmark/plot-columns';
import { addMaterial, addMeasurement, addMethod, addModeSet, addSource, formData } from './benchmark-support';

let a: Awaited<ReturnType<typeof createWorkspaceWith>>;
let b: Awaited<ReturnType<typeof createWorkspaceWith>>;
let benchmarkId: string;
let methodId: string;
let measurementId: string;
let otherMethodId: string;

function call(handler: typeof getPairs, workspaceId: string, id: string, query = '') {
  const url = `http://localhost:3999/api/workspaces/${workspaceId}/benchmarks/${id}/x${query}`;
  return handler(new Request(url), { params: Promise.resolve({ workspaceId, benchmarkId: id }) });
}

beforeAll(async () => {
  a = await createWorkspaceWith(['curator', 'reviewer']);
  b = await createWorkspaceWith(['curator']);
  const w = a.workspaceId;
  const src = await addSource(w, 'doe2020');
  methodId = await addMethod(w, 'PBEsol');
  // a material name that a spreadsheet would run as a formula (invented test value)
  const evil = await addMaterial(w, '=HYPERLINK("http://example.org","x")', ['oxide']);
  const plain = await addMaterial(w, '-plain', ['oxide']);
  measurementId = await addMeasurement(w, { materialId: evil, sourceId: src, value: 400, irrep: 'A1g' });
  await addMeasurement(w, { materialId: evil, sourceId: src, value: 500, irrep: 'Eg' });
  await addMeasurement(w, { materialId: plain, sourceId: src, value: 300, irrep: 'A1g' });
  await addModeSet(w, evil, src, methodId, { A1g: 390, Eg: 505 });
  await addModeSet(w, plain, src, methodId, { A1g: 310 });
  benchmarkId = (await createBenchmark(w, { userId: a.owner.id }, { name: 'Small', scope: { methodIds: [methodId] } })).id;
  await recomputeBenchmark(w, benchmarkId);
  otherMethodId = await addMethod(b.workspaceId, 'Elsewhere');
});

describe('benchmark access', () => {
  it('refuses a reviewer creating a benchmark, deciding or pinning (403) and writes nothing', async () => {
    await signInAs(a.members.reviewer.email);
    const before = (await db.select().from(benchmark)).length;
    const created = await createBenchmarkAction(
      undefined,
      formData({ workspaceId: a.workspaceId, name: 'Nope', quantity: 'frequency', outlierKind: 'tukey', repeatedMeasurements: 'separate' }),
    );
    expect(created).toMatchObject({ ok: false, code: 'forbidden' });
    expect((await db.select().from(benchmark)).length).toBe(before);
    const decided = await decideAction(
      undefined,
      formData({ workspaceId: a.workspaceId, benchmarkId, kind: 'exclude-pair', measurementId, methodId, reason: 'looks odd' }),
    );
    expect(decided).toMatchObject({ ok: false, code: 'forbidden' });
    const pinned = await pinAction(undefined, formData({ workspaceId: a.workspaceId, benchmarkId, methodId, measurementId, reason: 'no counterpart' }));
    expect(pinned).toMatchObject({ ok: false, code: 'forbidden' });
    expect(await db.select().from(decision)).toHaveLength(0);
    expect(await db.select().from(pairPin)).toHaveLength(0);
    // a reviewer still reads the statistics
    const res = await call(getStatistics, a.workspaceId, benchmarkId);
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.revision.number).toBe(1);
    expect(body.statistics.methods[0].n).toBe(3);
    expect(body.statistics.methods[0].statistics.meanAbsoluteError).toBeCloseTo((10 + 5 + 10) / 3, 10);
    expect(body.statistics).not.toHaveProperty('pairs');
  });

  it('refuses ids of another workspace with 404 and writes nothing', async () => {
    await signInAs(b.members.curator.email);
    // not a member of A
    expect((await call(getStatistics, a.workspaceId, benchmarkId)).status).toBe(404);
    // a member of B naming A's benchmark through B
    expect((await call(getStatistics, b.workspaceId, benchmarkId)).status).toBe(404);
    expect((await call(getPairs, b.workspaceId, benchmarkId, '?format=csv')).status).toBe(404);
    expect((await call(getBibtex, b.workspaceId, benchmarkId)).status).toBe(404);
    const decided = await decideAction(
      undefined,
      formData({ workspaceId: b.workspaceId, benchmarkId, kind: 'exclude-pair', measurementId, methodId, reason: 'cross-workspace attempt' }),
    );
    expect(decided).toMatchObject({ ok: false, code: 'not-found' });
    const foreignScope = await createBenchmarkAction(
      undefined,
      formData({ workspaceId: b.workspaceId, name: 'Borrowed', quantity: 'frequency', methodIds: [methodId], outlierKind: 'modified-z', repeatedMeasurements: 'separate' }),
    );
    expect(foreignScope).toMatchObject({ ok: false, code: 'not-found' });
    const [bm] = await db.select({ id: benchmark.id }).from(benchmark).where(eq(benchmark.workspaceId, b.workspaceId));
    expect(bm).toBeUndefined();
    expect(await db.select().from(decision)).toHaveLength(0);
    // B's own method in A's workspace id is refused too
    await signInAs(a.members.curator.email);
    const pin = await pinAction(
      undefined,
      formData({ workspaceId: a.workspaceId, benchmarkId, methodId: otherMethodId, measurementId, reason: 'foreign method' }),
    );
    expect(pin).toMatchObject({ ok: false, code: 'not-found' });
    expect(await db.select().from(pairPin)).toHaveLength(0);
  });

  it('answers a bad revision number with 400 and a missing one with 404', async () => {
    await signInAs(a.members.curator.email);
    expect((await call(getStatistics, a.workspaceId, benchmarkId, '?revision=abc')).status).toBe(400);
    expect((await call(getStatistics, a.workspaceId, benchmarkId, '?revision=99')).status).toBe(404);
  });

  it('downloads the pairs as CSV a spreadsheet cannot execute, numbers staying numbers', async () => {
    await signInAs(a.members.reviewer.email);
    const res = await call(getPairs, a.workspaceId, benchmarkId, '?format=csv');
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toContain('text/csv');
    const text = await res.text();
    const lines = text.trim().split('\r\n');
    expect(lines).toHaveLength(4);
    expect(text).toContain(`"'=HYPERLINK(""http://example.org"",""x"")"`);
    expect(text).toContain(`,'-plain,`);
    expect(text).not.toMatch(/(^|,)=HYPERLINK/m);
    // the pair 400 → 390 has error -10, written as a bare negative number
    const row = lines.find((l) => l.includes(',400,'))!;
    expect(row).toContain(',390,-10,');
  });

  it('exports the sources as BibTeX and the plot points as JSON', async () => {
    const bib = await (await call(getBibtex, a.workspaceId, benchmarkId)).text();
    expect(bib).toContain('@article{doe2020');
    const points = decodePlotColumns(await (await call(getPairs, a.workspaceId, benchmarkId)).json());
    expect(points).toHaveLength(3);
    expect(points[0]).toMatchObject({ method: 'PBEsol' });
    expect(points[0].citation).toContain('Test J.');
  });

  it('compares entropies at the benchmark temperature without pairing modes', async () => {
    const w = a.workspaceId;
    const src = await addSource(w, 'codata1989');
    const mat = await addMaterial(w, 'ZnO', ['oxide']);
    const values: Array<[number, number]> = [
      [43.65, 41.0],
      [50.92, 49.5],
      [28.3, 27.1],
    ];
    const mats = [mat, await addMaterial(w, 'Al2O3'), await addMaterial(w, 'Al')];
    for (const [i, [measured, computed]] of values.entries()) {
      // published S°(298.15 K) from CODATA Key Values (1989) as the measured side; invented computed side
      await db.insert(measurement).values({
        workspaceId: w, materialId: mats[i], sourceId: src, quantity: 'entropy', value: measured, valueText: String(measured),
        unit: 'J/(mol K)', temperatureK: 298.15, technique: 'calorimetry', rowHash: `s${i}`,
      });
      await db.insert(calculation).values({
        workspaceId: w, materialId: mats[i], sourceId: src, methodId, quantity: 'entropy', value: computed, valueText: String(computed),
        unit: 'J/(mol K)', temperatureK: 298, rowHash: `sc${i}`,
      });
    }
    const { id } = await createBenchmark(w, { userId: a.owner.id }, { name: 'Entropy', scope: { quantity: 'entropy', methodIds: [methodId] } });
    await recomputeBenchmark(w, id);
    const rev = (await getRevision(w, id))!;
    expect(rev.statistics.unit).toBe('J mol⁻¹ K⁻¹');
    expect(rev.statistics.methods[0].n).toBe(3);
    const mae = values.reduce((s, [m, c]) => s + Math.abs(c - m), 0) / 3;
    expect(rev.statistics.methods[0].statistics!.meanAbsoluteError).toBeCloseTo(mae, 10);
  });

  it('says why an empty scope is empty', async () => {
    const { id } = await createBenchmark(a.workspaceId, { userId: a.owner.id }, { name: 'INS only', scope: { techniques: ['ins'] } });
    await recomputeBenchmark(a.workspaceId, id);
    const rev = (await getRevision(a.workspaceId, id))!;
    expect(rev.statistics.pairs).toHaveLength(0);
    expect(rev.statistics.empty).toBe('No measured frequencies match the scope.');
  });
});
