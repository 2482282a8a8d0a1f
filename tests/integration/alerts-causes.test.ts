/**
 * An alert names what caused it: a curator's exclusion that moved the MAE is named with
 * its reason and its share, beside the import that hardly mattered (end to end through
 * the outbox).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { measurement } from '@/db/schema';
import { createDecision } from '@/db/queries/decisions';
import { recomputeBenchmark } from '@/lib/services/benchmarks/recompute';
import { whenAlertsIdle } from '@/lib/services/alerts/scheduler';
import type { FakeResend } from '@/lib/mail/fake-resend-server';
import { alertScenario, alertSetup, outboxTo } from './alerts-support';

let s: Awaited<ReturnType<typeof alertScenario>>;
let fake: FakeResend;

beforeAll(async () => {
  ({ s, fake } = await alertSetup(['curator']));
});
afterAll(async () => {
  await fake.close();
});

describe('alert causes', () => {
  it('an alert caused by a decision names the decision, its reason and its share', async () => {
    // Mode 15 of method X is 15 cm⁻¹ off: importing it raises X's MAE and is announced.
    await s.importMode(15);
    await whenAlertsIdle();
    expect(await outboxTo(s.ws.members.curator.email)).toHaveLength(1);

    process.env.ALERT_DEBOUNCE_MS = '2500';
    const [m15] = await db
      .select({ id: measurement.id })
      .from(measurement)
      .where(and(eq(measurement.workspaceId, s.workspaceId), eq(measurement.materialId, s.materials[15])));
    const curator = { userId: s.ws.members.curator.id };
    const decision = await createDecision(s.workspaceId, curator, {
      benchmarkId: s.benchmarkId,
      kind: 'exclude-pair',
      measurementId: m15.id,
      methodId: s.methods.X,
      reason: 'sample was a twinned crystal',
    });
    await recomputeBenchmark(s.workspaceId, s.benchmarkId, [{ trigger: 'decision', decisionId: decision.id, userId: curator.userId }]);
    await s.importMode(13, 'quiet-mode-13.csv');
    await whenAlertsIdle();

    const mails = await outboxTo(s.ws.members.curator.email);
    expect(mails).toHaveLength(2);
    const mail = mails.find((m) => m.textBody.includes('What changed since revision 2'))!;
    expect(mail).toBeDefined();
    const lines = mail.textBody.split('\n').filter((l) => l.startsWith('- '));
    const decisionLine = lines.findIndex((l) => l.includes('Decision by curator: excluded a pair of X-PBEsol — “sample was a twinned crystal”'));
    const importLine = lines.findIndex((l) => l.includes('Import “quiet-mode-13.csv” by contributor'));
    expect(decisionLine).toBeGreaterThanOrEqual(0);
    expect(importLine).toBeGreaterThan(decisionLine);
    // X: 12 pairs at 1.5 + mode 15 (15) → MAE 2.538; excluding it → 1.5; mode 13 (1.5) keeps 1.5.
    expect(lines[decisionLine]).toContain("100 % of X-PBEsol's MAE change");
    expect(lines[importLine]).toContain("0 % of X-PBEsol's MAE change");
    expect(mail.htmlBody).toContain('sample was a twinned crystal');
    expect(mail.textBody).not.toContain('No import caused it');
  });
});
