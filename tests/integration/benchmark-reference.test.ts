/**
 * Benchmarks against a reference method through the real paths: a method family and its reference
 * imported in one calculations CSV (createMissing: one method label per row), a benchmark created in
 * the form with "Compared with" a reference method, its revision, reproduction and convergence view,
 * the refusals (the reference as a candidate, decisions on a reference benchmark), and the demo's
 * invented family, whose knee must sit near the common high-throughput rule of about 1,500 k-points
 * per reciprocal atom for phonon frequencies (common practice, no source). Values invented for the tests.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { method } from '@/db/schema';
import { createBenchmarkAction, decideAction } from '@/app/(app)/w/[workspace]/benchmarks/actions';
import { getRevision } from '@/db/queries/revisions';
import { whenRecomputeIdle } from '@/lib/services/benchmarks/recompute-queue';
import { importCsvFile } from '@/lib/services/imports/csv-import';
import { benchmarkConvergence } from '@/lib/services/benchmarks/convergence';
import { reproduceRevision } from '@/lib/services/benchmarks/reproduce';
import { convergenceLabels, loadDemoScenario } from '@/db/demo-data';
import { createWorkspaceWith, signInAs } from '../support/users';
import { familyCsv, familyLabel, FAMILY_GRIDS, independentRecommendation, referenceLabel } from '../support/convergence-family';
import { formData } from './benchmark-support';
import { bytesOf, chunksOf, seedCatalogue } from './import-fixtures';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;

async function methodId(workspaceId: string, label: string): Promise<string> {
  const [row] = await db.select({ id: method.id }).from(method).where(and(eq(method.workspaceId, workspaceId), eq(method.label, label)));
  return row.id;
}

async function create(workspaceId: string, fields: Record<string, string | string[]>) {
  await signInAs(ws.members.curator.email);
  return createBenchmarkAction(undefined, formData({ workspaceId, outlierKind: 'modified-z', repeatedMeasurements: 'separate', quantity: 'frequency', ...fields }));
}

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator']);
  await seedCatalogue(ws.workspaceId);
  const outcome = await importCsvFile({
    workspaceId: ws.workspaceId,
    actor: { userId: ws.owner.id, tokenId: null },
    role: 'owner',
    via: 'wizard',
    kind: 'calculations',
    fileName: 'family.csv',
    createMissing: true,
    body: chunksOf(bytesOf(familyCsv()), 4096),
  });
  // 5 methods × (4 materials × (3 acoustic + 1 optical row) + Ba-fam's 3 + 2).
  expect(outcome).toMatchObject({ insertedCount: 5 * (4 * 4 + 5) });
});

describe('a benchmark against a reference method', () => {
  let benchmarkId: string;

  it('refuses the reference method among the candidates', async () => {
    const ref = await methodId(ws.workspaceId, referenceLabel);
    const state = await create(ws.workspaceId, { name: 'Refused', referenceMethodId: ref, methodIds: [ref, await methodId(ws.workspaceId, familyLabel(4))] });
    expect(state.ok).toBe(false);
    expect(state.message).toMatch(/reference method cannot also be a candidate/);
  });

  it('pairs every candidate with the reference by mode index and summarises |Δ| per method', async () => {
    const state = await create(ws.workspaceId, { name: 'k convergence', referenceMethodId: await methodId(ws.workspaceId, referenceLabel) });
    expect(state.ok, state.message).toBe(true);
    benchmarkId = (state.data as { id: string }).id;
    await whenRecomputeIdle(ws.workspaceId, benchmarkId);
    const snap = (await getRevision(ws.workspaceId, benchmarkId))!.statistics;
    // Candidates: the four family members only (the scope names none, the reference and the catalogue's method with no rows here stay out or pair nothing).
    expect(snap.reference!.perMethod.filter((m) => m.n > 0).map((m) => m.label).sort()).toEqual(FAMILY_GRIDS.map(familyLabel).sort());
    expect(snap.reference!.matchedBy).toEqual({ index: 20, pairing: 0 });
    expect(snap.methods.some((m) => m.label === referenceLabel)).toBe(false);
    // k = 10: |Δ| per material 0.2, 0.1, 0.4, 0.5 (and 0.25 on Ba's second line), 1.6 → 4 of 5 within 1 cm⁻¹; max 1.6.
    const k10 = snap.reference!.perMethod.find((m) => m.label === familyLabel(10))!;
    expect(k10).toMatchObject({ materials: 5, withinTolerance: 4, shareWithin: 0.8, n: 6 });
    expect(k10.maxAbsolute).toBeCloseTo(1.6, 9);
    expect(k10.maxRelative).toBeCloseTo(1.6 / 450, 9);
    // N is the same for every member: one pair per optical reference row.
    expect(new Set(snap.reference!.perMethod.filter((m) => m.n > 0).map((m) => m.n))).toEqual(new Set([6]));
    expect(snap.counts.measuredInScope).toBe(6);
  });

  it('gives per class the k-point density an independent reading of the CSV gives', async () => {
    const { view } = await benchmarkConvergence(ws.workspaceId, benchmarkId, 'kppra');
    for (const tag of ['famclass-a', 'famclass-b']) {
      expect(view!.classes.find((c) => c.group === tag)!.value).toBe(independentRecommendation(familyCsv(), tag));
    }
    expect(view!.classes.find((c) => c.group === 'famclass-a')!.value).toBe(1024);
    expect(view!.neverConverged.map((m) => m.material)).toEqual(['Bb-fam']);
    const cutoff = (await benchmarkConvergence(ws.workspaceId, benchmarkId, 'cutoff')).view!;
    expect(cutoff.methodsLacking).toEqual(FAMILY_GRIDS.map(familyLabel).sort());
  });

  it('reproduces its revision from the stored row set', async () => {
    const rev = (await getRevision(ws.workspaceId, benchmarkId))!;
    const again = await reproduceRevision(ws.workspaceId, benchmarkId, rev.number);
    expect(again.matches).toBe(true);
    expect(JSON.stringify(again.snapshot.reference)).toBe(JSON.stringify(rev.statistics.reference));
  });

  it('refuses decisions, since its pairs name no measurement', async () => {
    const rev = (await getRevision(ws.workspaceId, benchmarkId))!;
    const pair = rev.statistics.pairs[0];
    const state = await decideAction(undefined, formData({ workspaceId: ws.workspaceId, benchmarkId, kind: 'exclude-pair', measurementId: pair.measurementIds[0], methodId: pair.methodId, reason: 'testing the refusal' }));
    expect(state.ok).toBe(false);
    expect(state.message).toMatch(/compares with a reference method/);
  });
});

describe('the demo convergence family (invented)', () => {
  it('has its knee between 686 and 1,458 k-points per reciprocal atom, near the ~1,500 rule of thumb (common practice, no source)', async () => {
    const demo = await createWorkspaceWith(['curator']);
    await db.transaction((tx) => loadDemoScenario(tx, demo.workspaceId, demo.owner.id, { convergenceFamily: true }));
    const labels = convergenceLabels();
    await signInAs(demo.members.curator.email);
    const state = await createBenchmarkAction(
      undefined,
      formData({
        workspaceId: demo.workspaceId,
        name: 'demo family',
        quantity: 'frequency',
        outlierKind: 'modified-z',
        repeatedMeasurements: 'separate',
        referenceMethodId: await methodId(demo.workspaceId, labels.reference),
        methodIds: await Promise.all(labels.members.map((l) => methodId(demo.workspaceId, l))),
      }),
    );
    expect(state.ok, state.message).toBe(true);
    const id = (state.data as { id: string }).id;
    await whenRecomputeIdle(demo.workspaceId, id);
    const { view } = await benchmarkConvergence(demo.workspaceId, id, 'kppra');
    const at = (kppra: number) => view!.distribution.find((d) => d.parameter === kppra)!;
    expect(at(686).medianMax).toBeGreaterThan(1);
    expect(at(1458).medianMax).toBeLessThanOrEqual(1);
    expect(view!.neverConverged.map((m) => m.material)).toEqual(['SrTiO3']);
    expect(view!.classes.find((c) => c.group === 'semiconductor')!.value).toBe(1458);
  });
});
