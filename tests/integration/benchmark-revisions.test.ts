import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, decision, revision } from '@/db/schema';
import { createVerifiedUser, createWorkspaceWith, signInAs } from '@/tests/support/users';
import { createBenchmarkAction, decideAction, pinAction, revertDecisionAction } from '@/app/(app)/w/[workspace]/benchmarks/actions';
import { getBenchmark, loadBenchmarkInput } from '@/db/queries/benchmarks';
import { getRevision, listRevisionHistory } from '@/db/queries/revisions';
import { recomputeBenchmark } from '@/lib/services/benchmarks/recompute';
import { whenRecomputeIdle } from '@/lib/services/benchmarks/recompute-queue';
import { benchmarkFingerprint } from '@/lib/benchmark/fingerprint';
import { computeBenchmark } from '@/lib/benchmark/compute';
import { addMaterial, addMeasurement, addMethod, addModeSet, addSource, formData } from './benchmark-support';

/**
 * Invented data: three materials, two methods, labelled Raman peaks so each pair
 * is fixed by its label. The expected leaderboard is recomputed here with plain loops.
 */
const MEASURED = { A: { A1g: 400, Eg: 500 }, B: { A1g: 300, T2g: 150 }, C: { Eg: 700, A1g: 800 } } as const;
const COMPUTED = {
  X: { A: { A1g: 405, Eg: 490 }, B: { A1g: 310, T2g: 149 }, C: { Eg: 680, A1g: 830 } },
  Y: { A: { A1g: 398, Eg: 510 }, B: { A1g: 296, T2g: 152 }, C: { Eg: 705, A1g: 790 } },
} as const;

function expected(pairs: Array<[number, number]>) {
  const n = pairs.length;
  let sum = 0;
  let sumAbs = 0;
  let sumSq = 0;
  let maxAbs = 0;
  let sumCm = 0;
  let sumCc = 0;
  let mx = 0;
  let my = 0;
  for (const [m, c] of pairs) {
    const e = c - m;
    sum += e;
    sumAbs += Math.abs(e);
    sumSq += e * e;
    if (Math.abs(e) > maxAbs) maxAbs = Math.abs(e);
    sumCm += c * m;
    sumCc += c * c;
    mx += m / n;
    my += c / n;
  }
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  for (const [m, c] of pairs) {
    sxx += (m - mx) ** 2 / n;
    syy += (c - my) ** 2 / n;
    sxy += ((m - mx) * (c - my)) / n;
  }
  const lambda = sumCm / sumCc;
  let scaledSq = 0;
  for (const [m, c] of pairs) scaledSq += (lambda * c - m) ** 2;
  return {
    n,
    mse: sum / n,
    mae: sumAbs / n,
    rmse: Math.sqrt(sumSq / n),
    maxAbs,
    scale: lambda,
    rmseScaled: Math.sqrt(scaledSq / n),
    // Lin (1989), 1/N moments
    ccc: (2 * sxy) / (sxx + syy + (mx - my) ** 2),
  };
}

function pairsOf(methodKey: 'X' | 'Y', skip: string[] = []): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  for (const mat of ['A', 'B', 'C'] as const) {
    for (const [irrep, m] of Object.entries(MEASURED[mat])) {
      if (skip.includes(`${mat}-${irrep}`)) continue;
      out.push([m, (COMPUTED[methodKey][mat] as Record<string, number>)[irrep]]);
    }
  }
  return out;
}

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let benchmarkId: string;
const ids: { methods: Record<string, string>; meas: Record<string, string>; calcs: Record<string, Record<string, string>>; materials: Record<string, string>; source: string } = {
  methods: {},
  meas: {},
  calcs: {},
  materials: {},
  source: '',
};

async function rawRevision(number: number) {
  const rows = await db.select().from(revision).where(eq(revision.benchmarkId, benchmarkId));
  return rows.find((r) => r.number === number)!;
}

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator', 'reviewer']);
  const w = ws.workspaceId;
  ids.source = await addSource(w, 'doe2020');
  const calcSource = await addSource(w, 'calc2024');
  ids.methods.X = await addMethod(w, 'X-PBEsol');
  ids.methods.Y = await addMethod(w, 'Y-r2SCAN');
  ids.materials.A = await addMaterial(w, 'A', ['oxide']);
  ids.materials.B = await addMaterial(w, 'B', ['halide']);
  ids.materials.C = await addMaterial(w, 'C', ['oxide']);
  for (const mat of ['A', 'B', 'C'] as const) {
    for (const [irrep, value] of Object.entries(MEASURED[mat])) {
      ids.meas[`${mat}-${irrep}`] = await addMeasurement(w, { materialId: ids.materials[mat], sourceId: ids.source, value, irrep, uncertainty: 1 });
    }
    for (const mk of ['X', 'Y'] as const) {
      const set = await addModeSet(w, ids.materials[mat], calcSource, ids.methods[mk], COMPUTED[mk][mat]);
      for (const [irrep, id] of Object.entries(set)) (ids.calcs[mk] ??= {})[`${mat}-${irrep}`] = id;
    }
  }
  await signInAs(ws.members.curator.email);
  const state = await createBenchmarkAction(
    undefined,
    formData({
      workspaceId: w,
      name: 'Raman, room temperature',
      quantity: 'frequency',
      techniques: ['raman'],
      temperatureMinK: '250',
      temperatureMaxK: '320',
      outlierKind: 'modified-z',
      repeatedMeasurements: 'separate',
    }),
  );
  expect(state.ok, state.message).toBe(true);
  benchmarkId = (state.data as { id: string }).id;
  await whenRecomputeIdle(w, benchmarkId);
});

describe('benchmark computation and revisions', () => {
  it('stores the definition with the rule defaults filled', async () => {
    const bm = await getBenchmark(ws.workspaceId, benchmarkId);
    expect(bm?.rules.outlierRule).toEqual({ kind: 'modified-z', threshold: 3.5, minN: 10 });
    expect(bm?.rules.maxRelativeDeviation).toBe(0.25);
    expect(bm?.scope.techniques).toEqual(['raman']);
  });

  it('computes the leaderboard that plain loops compute from the same pairs', async () => {
    const rev = await getRevision(ws.workspaceId, benchmarkId);
    expect(rev?.number).toBe(1);
    for (const mk of ['X', 'Y'] as const) {
      const row = rev!.statistics.methods.find((m) => m.methodId === ids.methods[mk])!;
      const want = expected(pairsOf(mk));
      expect(row.n).toBe(6);
      expect(row.excluded).toBe(0);
      const s = row.statistics!;
      expect(s.meanSignedError).toBeCloseTo(want.mse, 10);
      expect(s.meanAbsoluteError).toBeCloseTo(want.mae, 10);
      expect(s.rootMeanSquareError).toBeCloseTo(want.rmse, 10);
      expect(s.maxAbsoluteError).toBeCloseTo(want.maxAbs, 10);
      expect(s.scaleFactor).toBeCloseTo(want.scale, 12);
      expect(s.rmseAfterScaling).toBeCloseTo(want.rmseScaled, 10);
      expect(s.concordance).toBeCloseTo(want.ccc, 10);
      expect(s.bootstrap!.meanAbsoluteError[0]).toBeLessThanOrEqual(want.mae);
      expect(s.bootstrap!.meanAbsoluteError[1]).toBeGreaterThanOrEqual(want.mae);
    }
    // X: MAE 11, Y: MAE 5.1667, but N = 6 is below the default ranking minimum of 10: both listed, neither ranked
    expect(rev!.statistics.methods.map((m) => m.rank)).toEqual([null, null]);
    expect(rev!.statistics.methods.map((m) => m.unranked)).toEqual(["N = 6 is below the benchmark's minimum of 10", "N = 6 is below the benchmark's minimum of 10"]);
    expect(rev!.statistics.methods.map((m) => m.coverage)).toEqual([1, 1]);
    // per material class: oxide = A and C, 4 pairs per method
    const oxideX = rev!.statistics.classes.find((c) => c.group === 'oxide' && c.methodId === ids.methods.X)!;
    expect(oxideX.n).toBe(4);
    expect(oxideX.statistics!.meanAbsoluteError).toBeCloseTo(expected(pairsOf('X', ['B-A1g', 'B-T2g'])).mae, 10);
    const halideX = rev!.statistics.classes.find((c) => c.group === 'halide' && c.methodId === ids.methods.X)!;
    expect(halideX.n).toBe(2);
    expect(halideX.statistics).toBeNull();
    // both methods compared on their 6 common pairs
    const cmp = rev!.statistics.comparisons[0];
    expect(cmp.n).toBe(6);
    expect(cmp.wins + cmp.losses + cmp.ties).toBe(6);
    // 2 atoms per cell but 5 modes per set: the mode-count check flags every set
    expect(rev!.statistics.quality.filter((q) => q.code === 'mode-count')).toHaveLength(6);
  });

  it('stores a revision only when the fingerprint changes', async () => {
    const again = await recomputeBenchmark(ws.workspaceId, benchmarkId);
    expect(again.created).toBe(false);
    expect(again.revision?.number).toBe(1);
    expect(await db.select({ id: revision.id }).from(revision).where(eq(revision.benchmarkId, benchmarkId))).toHaveLength(1);
  });

  it('gives the same fingerprint and statistics whatever the order of the rows', async () => {
    const bm = (await getBenchmark(ws.workspaceId, benchmarkId))!;
    const input = await loadBenchmarkInput(ws.workspaceId, bm);
    const shuffled = {
      ...input,
      measurements: [...input.measurements].reverse(),
      calculations: [...input.calculations].sort(() => 0.5 - Math.random()),
      materials: [...input.materials].reverse(),
      methods: [...input.methods].reverse(),
    };
    expect(benchmarkFingerprint(shuffled, bm.scope)).toBe(benchmarkFingerprint(input, bm.scope));
    expect(benchmarkFingerprint(shuffled, bm.scope)).toBe((await rawRevision(1)).fingerprint);
    expect(JSON.stringify(computeBenchmark(shuffled))).toBe(JSON.stringify(computeBenchmark(input)));
  });

  it('an excluded pair changes N and MAE in the next revision, leaves the earlier one untouched, and can be reverted', async () => {
    const before = await rawRevision(1);
    const beforeJson = JSON.stringify(before);
    const state = await decideAction(
      undefined,
      formData({
        workspaceId: ws.workspaceId,
        benchmarkId,
        kind: 'exclude-pair',
        measurementId: ids.meas['C-A1g'],
        methodId: ids.methods.X,
        reason: 'strained thin film',
      }),
    );
    expect(state.ok, state.message).toBe(true);
    const decisionId = (state.data as { id: string }).id;
    await whenRecomputeIdle(ws.workspaceId, benchmarkId);

    const rev2 = (await getRevision(ws.workspaceId, benchmarkId))!;
    expect(rev2.number).toBe(2);
    const x = rev2.statistics.methods.find((m) => m.methodId === ids.methods.X)!;
    expect(x.n).toBe(5);
    expect(x.excluded).toBe(1);
    expect(x.excludedReasons).toEqual([{ reason: 'strained thin film', count: 1 }]);
    expect(x.statistics!.meanAbsoluteError).toBeCloseTo(expected(pairsOf('X', ['C-A1g'])).mae, 10);
    const y = rev2.statistics.methods.find((m) => m.methodId === ids.methods.Y)!;
    expect(y.n).toBe(6);
    expect(rev2.cause?.decisions.added).toEqual([decisionId]);
    const audit = await db.select().from(auditLog).where(eq(auditLog.entityId, decisionId));
    expect(audit.map((a) => a.action)).toEqual(['decide']);
    expect(JSON.stringify(await rawRevision(1))).toBe(beforeJson);

    const reverted = await revertDecisionAction(
      undefined,
      formData({ workspaceId: ws.workspaceId, benchmarkId, decisionId, reason: 'film was relaxed after all' }),
    );
    expect(reverted.ok, reverted.message).toBe(true);
    await whenRecomputeIdle(ws.workspaceId, benchmarkId);
    const rev3 = (await getRevision(ws.workspaceId, benchmarkId))!;
    expect(rev3.number).toBe(3);
    expect(rev3.statistics.methods.find((m) => m.methodId === ids.methods.X)!.n).toBe(6);
    expect(rev3.cause?.decisions.reverted).toEqual([decisionId]);
    const [row] = await db.select().from(decision).where(eq(decision.id, decisionId));
    expect(row.revertedAt).not.toBeNull();
    expect(row.revertReason).toBe('film was relaxed after all');
    const history = await listRevisionHistory(ws.workspaceId, benchmarkId);
    expect(history.map((h) => h.number)).toEqual([3, 2, 1]);
    expect(history[1].methods.find((m) => m.methodId === ids.methods.X)!.n).toBe(5);
  });

  it('pins survive recomputation after new data arrives', async () => {
    const state = await pinAction(
      undefined,
      formData({
        workspaceId: ws.workspaceId,
        benchmarkId,
        methodId: ids.methods.Y,
        measurementId: ids.meas['A-A1g'],
        calculationId: ids.calcs.Y['A-Eg'],
        reason: 'polarisation data show this peak is the Eg mode',
      }),
    );
    expect(state.ok, state.message).toBe(true);
    await whenRecomputeIdle(ws.workspaceId, benchmarkId);
    const pinned = (await getRevision(ws.workspaceId, benchmarkId))!;
    const pair = pinned.statistics.pairs.find((p) => p.key === `${ids.methods.Y}|${ids.meas['A-A1g']}`)!;
    expect(pair.basis).toBe('pinned');
    expect(pair.calculated).toBe(510);

    // new measurement from another spectrum, then a data-change recomputation
    const other = await addSource(ws.workspaceId, 'roe2023');
    await addMeasurement(ws.workspaceId, { materialId: ids.materials.B, sourceId: other, value: 302, irrep: 'A1g', uncertainty: 2 });
    const result = await recomputeBenchmark(ws.workspaceId, benchmarkId, [{ trigger: 'data-change' }]);
    expect(result.created).toBe(true);
    const after = (await getRevision(ws.workspaceId, benchmarkId))!;
    expect(after.cause?.rows.measurementsAdded).toBe(1);
    const still = after.statistics.pairs.find((p) => p.key === `${ids.methods.Y}|${ids.meas['A-A1g']}`)!;
    expect(still.basis).toBe('pinned');
    expect(still.calculated).toBe(510);
    expect(after.statistics.methods.find((m) => m.methodId === ids.methods.X)!.n).toBe(7);
  });

  it('merges several measurements of one mode into their uncertainty-weighted mean when the rules say so', async () => {
    const bm = (await getBenchmark(ws.workspaceId, benchmarkId))!;
    const input = await loadBenchmarkInput(ws.workspaceId, bm);
    const merged = computeBenchmark({ ...input, rules: { ...input.rules, repeatedMeasurements: 'weighted-mean' } });
    const x = merged.pairs.filter((p) => p.methodId === ids.methods.X && p.measurementIds.length === 2);
    expect(x).toHaveLength(1);
    // B-A1g: 300 ± 1 and 302 ± 2 → (300/1 + 302/4) / (1 + 1/4) = 300.4
    expect(x[0].measured).toBeCloseTo(300.4, 10);
    expect(x[0].measuredUncertainty).toBeCloseTo(1 / Math.sqrt(1.25), 10);
  });

  it('a user outside the workspace gets nothing and writes nothing', async () => {
    const stranger = await createVerifiedUser('Stranger');
    await signInAs(stranger.email);
    const count = (await db.select({ id: decision.id }).from(decision)).length;
    const state = await decideAction(
      undefined,
      formData({ workspaceId: ws.workspaceId, benchmarkId, kind: 'exclude-measurement', measurementId: ids.meas['A-Eg'], reason: 'not mine to judge' }),
    );
    expect(state.ok).toBe(false);
    expect(state.code).toBe('not-found');
    expect((await db.select({ id: decision.id }).from(decision)).length).toBe(count);
  });
});
