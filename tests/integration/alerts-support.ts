/**
 * An invented benchmark for the alert tests: one Raman A1g line per material,
 * method X close to the measurements (errors +1/+2 cm⁻¹), method Y further off
 * (+3/+4). Modes 1–12 are measured at the start; later modes are "imported"
 * one by one to move the statistics. Values are invented, for tests only.
 */
import { eq } from 'drizzle-orm';
import { expect } from 'vitest';
import { watchAction } from '@/app/(app)/w/[workspace]/watches/actions';
import { whenAlertsIdle } from '@/lib/services/alerts/scheduler';
import { startFakeResend } from '@/lib/mail/fake-resend-server';
import { callAction } from '@/tests/support/actions';
import { db } from '@/db/client';
import { importBatch, mailOutbox } from '@/db/schema';
import { createBenchmark } from '@/db/queries/benchmarks';
import { getRevision } from '@/db/queries/revisions';
import { recomputeBenchmark } from '@/lib/services/benchmarks/recompute';
import { createWorkspaceWith, signInAs } from '@/tests/support/users';
import { addMaterial, addMeasurement, addMethod, addModeSet, addSource } from './benchmark-support';

/** Error of each method at mode i, cm⁻¹ (calculated − measured). */
export const ERRORS: Record<number, { X: number; Y: number }> = {
  ...Object.fromEntries(Array.from({ length: 12 }, (_, k) => [k + 1, { X: k % 2 ? 2 : 1, Y: k % 2 ? 4 : 3 }])),
  13: { X: 1.5, Y: 3.5 },
  14: { X: 1.4, Y: 3.6 },
  15: { X: 15, Y: 3.5 },
  16: { X: 16, Y: 3.5 },
  17: { X: 17, Y: 3.5 },
  18: { X: 1.5, Y: 3.5 },
  19: { X: 1.5, Y: 3.5 },
};

export const measured = (i: number) => 300 + 20 * i;

export async function alertScenario() {
  const ws = await createWorkspaceWith(['curator', 'contributor', 'reviewer']);
  const w = ws.workspaceId;
  const source = await addSource(w, 'lab2026');
  const calcSource = await addSource(w, 'calc2026');
  const methods = { X: await addMethod(w, 'X-PBEsol'), Y: await addMethod(w, 'Y-LDA') };
  const materials: Record<number, string> = {};
  for (const i of Object.keys(ERRORS).map(Number)) {
    materials[i] = await addMaterial(w, `Crystal-${i}`, ['oxide']);
    for (const m of ['X', 'Y'] as const) await addModeSet(w, materials[i], calcSource, methods[m], { A1g: measured(i) + ERRORS[i][m] });
  }
  for (let i = 1; i <= 12; i++) await addMeasurement(w, { materialId: materials[i], sourceId: source, value: measured(i), irrep: 'A1g', uncertainty: 1 });
  const { id: benchmarkId } = await createBenchmark(w, { userId: ws.members.curator.id }, { name: 'Oxides <Raman> & IR', rules: { bootstrapSamples: 0 } });
  await recomputeBenchmark(w, benchmarkId, [{ trigger: 'benchmark-created' }]);

  /** Imports the measurement of mode i as a one-row import by the contributor, then recomputes (as the queue would). */
  async function importMode(i: number, fileName = `raman-mode-${i}.csv`) {
    const [batch] = await db
      .insert(importBatch)
      .values({ workspaceId: w, kind: 'measurements', fileName, sha256: `sha-${i}-${Math.random()}`, byteCount: 40, rowCount: 1, insertedCount: 1, via: 'wizard', createdBy: ws.members.contributor.id })
      .returning({ id: importBatch.id });
    await addMeasurement(w, { materialId: materials[i], sourceId: source, value: measured(i), irrep: 'A1g', uncertainty: 1, importId: batch.id });
    return recomputeBenchmark(w, benchmarkId, [{ trigger: 'import', importId: batch.id, userId: ws.members.contributor.id }]);
  }

  async function mae(number: number | undefined, method: 'X' | 'Y') {
    const rev = await getRevision(w, benchmarkId, number);
    const row = rev!.statistics.methods.find((m) => m.methodId === methods[method])!;
    return { mae: row.statistics!.meanAbsoluteError, n: row.n, number: rev!.number };
  }

  return { ws, workspaceId: w, benchmarkId, methods, materials, importMode, mae };
}

export async function outboxTo(email: string) {
  return db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, email));
}

/** The fake mail provider, the scenario, and an immediate watch for each of the given members (signed in in turn). */
export async function alertSetup(watchers: Array<'curator' | 'reviewer'>) {
  process.env.ALERT_DEBOUNCE_MS = '200';
  const fake = await startFakeResend();
  process.env.RESEND_BASE_URL = fake.url;
  const s = await alertScenario();
  await whenAlertsIdle();
  for (const role of watchers) {
    await signInAs(s.ws.members[role].email);
    expect((await callAction(watchAction, { workspaceId: s.workspaceId, benchmarkId: s.benchmarkId })).state).toMatchObject({ ok: true });
  }
  return { s, fake };
}
