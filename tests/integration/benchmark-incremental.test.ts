import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { and, eq, isNull } from 'drizzle-orm';
import { db, getClient } from '@/db/client';
import { snapshotOfRow } from '@/db/snapshot-bytes';
import { calculation, importBatch, material, measurement, revision, source } from '@/db/schema';
import { getRevision } from '@/db/queries/revisions';
import { mergeSources } from '@/db/queries/sources';
import { createBenchmark, loadBenchmarkInput, requireBenchmark, updateBenchmark } from '@/db/queries/benchmarks';
import { createDecision, createPin, revertDecision, revokePin } from '@/db/queries/decisions';
import { undoImport } from '@/db/queries/imports';
import { AppError } from '@/lib/errors';
import { computeBenchmark } from '@/lib/benchmark/compute';
import { benchmarkFingerprint } from '@/lib/benchmark/fingerprint';
import { recomputeBenchmark } from '@/lib/services/benchmarks/recompute';
import { forgetMaterialStages } from '@/lib/services/benchmarks/material-stages';
import { createWorkspaceWith } from '@/tests/support/users';
import { addCalculation, addMaterial, addMeasurement, addMethod, addModeSet, addSource } from './benchmark-support';

// Incremental recomputation (lib/services/benchmarks/material-stages.ts): after any sequence of imports, undos,
// decisions, pins, rule changes and material edits, the revision it stores equals a full computation over the same
// rows, byte for byte in the stored statistics, and it re-pairs only the materials a row change touched.
// Values are invented, for tests only.

const MATERIALS = 5;
const LINES = [310, 420, 555, 640, 780];

type Op =
  | { kind: 'import-measurements'; material: number; line: number; shift: number }
  | { kind: 'import-calculations'; material: number; method: number; shift: number }
  | { kind: 'undo'; pick: number }
  | { kind: 'decide'; pick: number; all: boolean }
  | { kind: 'revert-decision'; pick: number }
  | { kind: 'pin'; pick: number; method: number; none: boolean }
  | { kind: 'revoke-pin'; pick: number }
  | { kind: 'rules'; window: number; outlier: 'modified-z' | 'relative'; merge: boolean }
  | { kind: 'atoms'; material: number; atoms: number };

const op: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ kind: fc.constant('import-measurements' as const), material: fc.nat(MATERIALS - 1), line: fc.nat(LINES.length - 1), shift: fc.integer({ min: -8, max: 8 }) }),
  fc.record({ kind: fc.constant('import-calculations' as const), material: fc.nat(MATERIALS - 1), method: fc.nat(1), shift: fc.integer({ min: -20, max: 20 }) }),
  fc.record({ kind: fc.constant('undo' as const), pick: fc.nat() }),
  fc.record({ kind: fc.constant('decide' as const), pick: fc.nat(), all: fc.boolean() }),
  fc.record({ kind: fc.constant('revert-decision' as const), pick: fc.nat() }),
  fc.record({ kind: fc.constant('pin' as const), pick: fc.nat(), method: fc.nat(1), none: fc.boolean() }),
  fc.record({ kind: fc.constant('revoke-pin' as const), pick: fc.nat() }),
  fc.record({ kind: fc.constant('rules' as const), window: fc.constantFrom(0.05, 0.1, 0.2), outlier: fc.constantFrom('modified-z' as const, 'relative' as const), merge: fc.boolean() }),
  fc.record({ kind: fc.constant('atoms' as const), material: fc.nat(MATERIALS - 1), atoms: fc.constantFrom(2, 4, 10) }),
);

async function scenario() {
  const ws = await createWorkspaceWith(['curator']);
  const w = ws.workspaceId;
  const actor = { userId: ws.members.curator.id };
  const lab = await addSource(w, 'lab');
  const calc = await addSource(w, 'calc');
  const methods = [await addMethod(w, 'A-PBEsol'), await addMethod(w, 'B-LDA')];
  const materials: string[] = [];
  for (let k = 0; k < MATERIALS; k++) {
    materials.push(await addMaterial(w, `Crystal-${k}`, [k % 2 ? 'oxide' : 'halide']));
    for (const [i, methodId] of methods.entries()) {
      await addModeSet(w, materials[k], calc, methodId, Object.fromEntries(LINES.map((v, j) => [`A${j}g`, v + k + (i ? 6 : 2) + ((j * 7 + k) % 5)])));
    }
    for (const [j, v] of LINES.entries()) if ((j + k) % 2 === 0) await addMeasurement(w, { materialId: materials[k], sourceId: lab, value: v + k, irrep: `A${j}g`, uncertainty: 1 });
  }
  const { id: benchmarkId } = await createBenchmark(w, actor, { name: 'Incremental check', rules: { bootstrapSamples: 50 } });
  return { w, actor, lab, calc, methods, materials, benchmarkId, imports: [] as string[], decisions: [] as string[], pins: [] as string[] };
}

type Scenario = Awaited<ReturnType<typeof scenario>>;

async function newImport(s: Scenario, kind: 'measurements' | 'calculations') {
  const [batch] = await db
    .insert(importBatch)
    .values({ workspaceId: s.w, kind, fileName: `${kind}.csv`, sha256: `sha-${Math.random()}`, byteCount: 40, rowCount: 1, insertedCount: 1, via: 'wizard', createdBy: s.actor.userId })
    .returning({ id: importBatch.id });
  s.imports.push(batch.id);
  return batch.id;
}

async function liveMeasurements(s: Scenario) {
  return db.select({ id: measurement.id, materialId: measurement.materialId }).from(measurement).where(and(eq(measurement.workspaceId, s.w), isNull(measurement.retractedAt))).orderBy(measurement.seq);
}

/** Applies one change; returns the materials whose rows it changed (null: a change that is not about rows). */
async function apply(s: Scenario, o: Op): Promise<Set<string> | null> {
  switch (o.kind) {
    case 'import-measurements': {
      const importId = await newImport(s, 'measurements');
      await addMeasurement(s.w, { materialId: s.materials[o.material], sourceId: s.lab, value: LINES[o.line] + o.material + o.shift, irrep: o.shift % 3 ? `A${o.line}g` : undefined, uncertainty: 1 + Math.abs(o.shift) / 4, importId });
      return new Set([s.materials[o.material]]);
    }
    case 'import-calculations': {
      const importId = await newImport(s, 'calculations');
      await addCalculation(s.w, { materialId: s.materials[o.material], sourceId: s.calc, methodId: s.methods[o.method], value: 500 + o.shift, irrep: 'A2g', importId });
      return new Set([s.materials[o.material]]);
    }
    case 'undo': {
      const open = s.imports;
      if (!open.length) return new Set();
      const importId = open.splice(o.pick % open.length, 1)[0];
      const rows = [
        ...(await db.select({ m: measurement.materialId }).from(measurement).where(eq(measurement.importId, importId))),
        ...(await db.select({ m: calculation.materialId }).from(calculation).where(eq(calculation.importId, importId))),
      ];
      await undoImport(s.w, importId, s.actor.userId, 'wrong file (test)');
      return new Set(rows.map((r) => r.m));
    }
    case 'decide': {
      const live = await liveMeasurements(s);
      const m = live[o.pick % live.length];
      const decision = {
        benchmarkId: s.benchmarkId,
        kind: o.all ? ('exclude-measurement' as const) : ('exclude-pair' as const),
        measurementId: m.id,
        methodId: o.all ? null : s.methods[o.pick % 2],
        reason: 'sample degraded (test)',
      };
      const { id } = await createDecision(s.w, s.actor, decision).catch((e: unknown) => {
        // the same decision twice is refused (409): the sequence goes on without it
        if (e instanceof AppError && e.code === 'conflict') return { id: null };
        throw e;
      });
      if (id) s.decisions.push(id);
      return null;
    }
    case 'revert-decision': {
      if (!s.decisions.length) return null;
      const id = s.decisions.splice(o.pick % s.decisions.length, 1)[0];
      await revertDecision(s.w, s.actor, id, 'reviewed again (test)');
      return null;
    }
    case 'pin': {
      const live = await liveMeasurements(s);
      const m = live[o.pick % live.length];
      const calcs = await db
        .select({ id: calculation.id })
        .from(calculation)
        .where(and(eq(calculation.materialId, m.materialId), eq(calculation.methodId, s.methods[o.method]), isNull(calculation.retractedAt), eq(calculation.activity, 'raman')))
        .orderBy(calculation.seq);
      const { id } = await createPin(s.w, s.actor, { methodId: s.methods[o.method], measurementId: m.id, calculationId: o.none || !calcs.length ? null : calcs[o.pick % calcs.length].id, reason: 'assigned by polarisation (test)' });
      s.pins.push(id);
      return null;
    }
    case 'revoke-pin': {
      if (!s.pins.length) return null;
      const id = s.pins.splice(o.pick % s.pins.length, 1)[0];
      try {
        await revokePin(s.w, s.actor, id, 'wrong line (test)');
      } catch {
        // replaced by a later pin of the same measurement and method: already revoked
      }
      return null;
    }
    case 'rules':
      await updateBenchmark(s.w, s.actor, s.benchmarkId, {
        name: 'Incremental check',
        rules: { bootstrapSamples: 50, maxRelativeDeviation: o.window, outlierRule: { kind: o.outlier, threshold: o.outlier === 'relative' ? 0.01 : 3.5 }, repeatedMeasurements: o.merge ? 'weighted-mean' : 'separate' },
      });
      return null;
    case 'atoms':
      await db.update(material).set({ atomsInCell: o.atoms }).where(eq(material.id, s.materials[o.material]));
      return null;
  }
}

/** The latest revision's stored statistics (the head and packed body in the database, decoded) and fingerprint, next to a full computation's. */
async function compareWithFull(s: Scenario) {
  const bm = await requireBenchmark(s.w, s.benchmarkId);
  const input = await loadBenchmarkInput(s.w, bm);
  const stored = await getClient().execute({ sql: 'select fingerprint, statistics, snapshot from revision where benchmark_id = ? order by number desc limit 1', args: [s.benchmarkId] });
  const { fingerprint, statistics: head, snapshot: packed } = stored.rows[0];
  return {
    fingerprint: String(fingerprint),
    // what the database holds, decoded as a page reads it (db/snapshot-bytes.ts)
    statistics: JSON.stringify(snapshotOfRow(JSON.parse(String(head)), packed as ArrayBuffer)),
    expectedFingerprint: benchmarkFingerprint(input, bm.scope),
    expectedStatistics: JSON.stringify(computeBenchmark(input)),
  };
}

describe('incremental recomputation', () => {
  it('equals a full computation after random imports, undos, decisions, pins, rule changes and material edits', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(op, { minLength: 4, maxLength: 9 }), async (ops) => {
        const s = await scenario();
        forgetMaterialStages();
        // The first revision is a full computation; every later one starts from the stages kept since.
        expect((await recomputeBenchmark(s.w, s.benchmarkId)).created).toBe(true);
        for (const o of ops) {
          const touched = await apply(s, o);
          const result = await recomputeBenchmark(s.w, s.benchmarkId, [{ trigger: 'data-change' }]);
          const c = await compareWithFull(s);
          expect(c.fingerprint, JSON.stringify(o)).toBe(c.expectedFingerprint);
          expect(c.statistics, JSON.stringify(o)).toBe(c.expectedStatistics);
          // Cost follows the change: a row change re-pairs the materials it touched and no other.
          if (touched && result.repaired) expect(result.repaired.materials, JSON.stringify(o)).toBeLessThanOrEqual(touched.size);
        }
      }),
      { numRuns: 12 },
    );
  }, 240_000);

  it('stores no revision when nothing changed, and re-pairs nothing to find that out', async () => {
    const s = await scenario();
    expect((await recomputeBenchmark(s.w, s.benchmarkId)).created).toBe(true);
    const again = await recomputeBenchmark(s.w, s.benchmarkId);
    expect(again.created).toBe(false);
    expect(again.repaired).toBeUndefined();
    const count = await db.select({ id: revision.id }).from(revision).where(eq(revision.benchmarkId, s.benchmarkId));
    expect(count).toHaveLength(1);
  });

  it('re-pairs one material of five after a one-row import, and every material after a rule change', async () => {
    const s = await scenario();
    await recomputeBenchmark(s.w, s.benchmarkId);
    await apply(s, { kind: 'import-measurements', material: 2, line: 1, shift: 1 });
    expect((await recomputeBenchmark(s.w, s.benchmarkId)).repaired).toEqual({ materials: 1, of: MATERIALS });
    await apply(s, { kind: 'rules', window: 0.2, outlier: 'relative', merge: false });
    expect((await recomputeBenchmark(s.w, s.benchmarkId)).repaired).toEqual({ materials: MATERIALS, of: MATERIALS });
    // A process that kept nothing (a restart) computes in full and stores nothing new: the result is the same.
    forgetMaterialStages();
    expect((await recomputeBenchmark(s.w, s.benchmarkId)).created).toBe(false);
    const c = await compareWithFull(s);
    expect(c.statistics).toBe(c.expectedStatistics);
  });

  it('follows a source merge, the one edit of stored rows: a new revision whose pairs cite the kept source', async () => {
    const s = await scenario();
    await db.update(source).set({ doi: '10.1000/invented.lab' }).where(eq(source.id, s.lab));
    const [twin] = await db
      .insert(source)
      .values({ workspaceId: s.w, citeKey: 'lab-twin', kind: 'journal-article', title: 'Invented study lab (entered twice)', authors: 'Doe, J.', year: 2020, venue: 'Test J.', doi: '10.1000/invented.lab' })
      .returning({ id: source.id });
    await addMeasurement(s.w, { materialId: s.materials[0], sourceId: twin.id, value: LINES[1] + 0.5, irrep: 'A1g', uncertainty: 1 });
    await recomputeBenchmark(s.w, s.benchmarkId);
    const cited = async () => new Set((await getRevision(s.w, s.benchmarkId))!.statistics.pairs.flatMap((p) => p.sourceIds));
    expect(await cited()).toContain(twin.id);
    await mergeSources(s.w, s.actor, s.lab, twin.id, 'the same paper (test)');
    expect((await recomputeBenchmark(s.w, s.benchmarkId)).created).toBe(true);
    expect(await cited()).not.toContain(twin.id);
    const c = await compareWithFull(s);
    expect(c.statistics).toBe(c.expectedStatistics);
    expect(c.fingerprint).toBe(c.expectedFingerprint);
  });

  it('rests on rows that are never edited: the database refuses an edit, a new sequence number and an un-retraction', async () => {
    const s = await scenario();
    const [m] = await liveMeasurements(s);
    const client = getClient();
    await expect(client.execute({ sql: 'update measurement set value = value + 1 where id = ?', args: [m.id] })).rejects.toThrow(/never edited/);
    await expect(client.execute({ sql: 'update measurement set seq = seq + 1000000 where id = ?', args: [m.id] })).rejects.toThrow(/keeps its sequence number/);
    const [c] = await db.select({ id: calculation.id }).from(calculation).where(eq(calculation.workspaceId, s.w)).limit(1);
    await expect(client.execute({ sql: 'update calculation set method_id = method_id, value = 1 where id = ?', args: [c.id] })).rejects.toThrow(/never edited/);
    // Retraction is the one change allowed, and it is final.
    await client.execute({ sql: 'update measurement set retracted_at = ?, retraction_reason = ? where id = ?', args: [Date.now(), 'test', m.id] });
    await expect(client.execute({ sql: 'update measurement set retracted_at = null where id = ?', args: [m.id] })).rejects.toThrow(/stays retracted/);
    const [after] = await db.select({ value: measurement.value, retractedAt: measurement.retractedAt }).from(measurement).where(eq(measurement.id, m.id));
    expect(after.retractedAt).not.toBeNull();
  });
});
