import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db, getClient } from '@/db/client';
import { calculation, measurement, revision } from '@/db/schema';
import { getRevision } from '@/db/queries/revisions';
import { backfillRevisionRowSets } from '@/db/revision-backfill';
import { unpackRowSet } from '@/db/row-set-bytes';
import { undoImport } from '@/lib/services/imports/undo';
import { diffRevisionRows, reproduceRevision } from '@/lib/services/benchmarks/reproduce';
import { alertScenario } from './alerts-support';

// Revisions store their rows as a compact set of sequence numbers (lib/benchmark/row-set.ts). An old revision is
// reproduced from it after rows were added and others retracted, and two revisions are diffed by it.
let s: Awaited<ReturnType<typeof alertScenario>>;
const importIds: Record<number, string> = {};

beforeAll(async () => {
  s = await alertScenario();
  for (const i of [13, 14, 15]) {
    const r = await s.importMode(i);
    expect(r.created).toBe(true);
    const [row] = await db.select({ importId: measurement.importId }).from(measurement).where(eq(measurement.materialId, s.materials[i]));
    importIds[i] = row.importId!;
  }
  // Revision 5: the import of mode 14 is undone (its row is retracted, not deleted).
  await undoImport(s.workspaceId, importIds[14], s.ws.members.curator.id, 'wrong crystal (test)');
  const { recomputeBenchmark } = await import('@/lib/services/benchmarks/recompute');
  expect((await recomputeBenchmark(s.workspaceId, s.benchmarkId, [{ trigger: 'import-undone' }])).created).toBe(true);
}, 60_000);

describe('revision row sets', () => {
  it('reproduces an old revision from its row set after later imports and an undo: same fingerprint, same statistics', async () => {
    const latest = (await getRevision(s.workspaceId, s.benchmarkId))!;
    expect(latest.number).toBe(5);
    for (const n of [1, 3, 4, 5]) {
      const again = await reproduceRevision(s.workspaceId, s.benchmarkId, n);
      expect(again.matches, `revision ${n}`).toBe(true);
      expect(JSON.parse(JSON.stringify(again.snapshot.methods))).toEqual(JSON.parse(JSON.stringify(again.revision.statistics.methods)));
    }
    // Revision 3 holds the measurement of mode 14, retracted since: the reproduction still counts it.
    const third = await reproduceRevision(s.workspaceId, s.benchmarkId, 3);
    expect(third.rows.measurements).toHaveLength(14);
    expect(third.snapshot.methods.find((m) => m.methodId === s.methods.X)!.n).toBe(14);
  });

  it('diffs two revisions by their rows: 3 → 5 adds mode 15 and its computed modes, and removes mode 14 and its computed modes', async () => {
    const diff = await diffRevisionRows(s.workspaceId, s.benchmarkId, 3, 5);
    const seqs = async (table: typeof measurement | typeof calculation, i: number) =>
      (await db.select({ seq: table.seq }).from(table).where(eq(table.materialId, s.materials[i]))).map((r) => r.seq!).sort((a, b) => a - b);
    expect(diff.measurements).toEqual({ added: await seqs(measurement, 15), removed: await seqs(measurement, 14) });
    // A material is in scope through its measurements, so its computed modes enter and leave with them.
    expect(diff.calculations).toEqual({ added: await seqs(calculation, 15), removed: await seqs(calculation, 14) });
    expect(diff.calculations.added).toHaveLength(8);
  });

  it('stores a few bytes per revision, not a list of ids', async () => {
    const rows = await db.select({ number: revision.number, rowIds: revision.rowIds, rowSet: revision.rowSet }).from(revision).where(eq(revision.benchmarkId, s.benchmarkId));
    for (const r of rows) {
      expect(r.rowIds).toBeNull();
      expect(r.rowSet!.byteLength).toBeLessThan(64);
    }
  });

  it('converts a revision stored with row ids (before row sets) into the row set of the same rows', async () => {
    const first = (await getRevision(s.workspaceId, s.benchmarkId, 1))!;
    const [stored] = await db.select({ rowSet: revision.rowSet }).from(revision).where(eq(revision.id, first.id));
    const expected = unpackRowSet(stored.rowSet!);
    // Put it back as the old shape: the ids of its rows as JSON, no row set.
    const ids = async (table: 'measurement' | 'calculation', seqs: number[]) =>
      (await getClient().execute(`SELECT id FROM ${table} WHERE seq IN (${seqs.join(',')})`)).rows.map((r) => String(r[0]));
    const legacy = { measurements: await ids('measurement', expected.measurements), calculations: await ids('calculation', expected.calculations) };
    await db.update(revision).set({ rowSet: null, rowIds: legacy }).where(eq(revision.id, first.id));
    expect(await backfillRevisionRowSets(getClient())).toBe(1);
    const [after] = await db.select({ rowSet: revision.rowSet, rowIds: revision.rowIds }).from(revision).where(eq(revision.id, first.id));
    expect(after.rowIds).toBeNull();
    expect(unpackRowSet(after.rowSet!)).toEqual(expected);
    expect(await backfillRevisionRowSets(getClient())).toBe(0);
    expect((await reproduceRevision(s.workspaceId, s.benchmarkId, 1)).matches).toBe(true);
  });
});
