import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { mailOutbox, member, watch } from '@/db/schema';
import { announceBenchmark } from '@/lib/services/alerts/announce';
import { whenAlertsIdle } from '@/lib/services/alerts/scheduler';
import { deliverDueMail, type DeliveryConfig } from '@/lib/services/mail/deliver';
import type { FakeResend } from '@/lib/mail/fake-resend-server';
import { alertScenario, alertSetup, outboxTo } from './alerts-support';

let s: Awaited<ReturnType<typeof alertScenario>>;
let fake: FakeResend;
let clock = Date.now();
const curator = () => s.ws.members.curator;
const reviewer = () => s.ws.members.reviewer;

async function watchOf(userId: string) {
  const [row] = await db.select().from(watch).where(and(eq(watch.benchmarkId, s.benchmarkId), eq(watch.userId, userId)));
  return row;
}

beforeAll(async () => {
  ({ s, fake } = await alertSetup(['curator', 'reviewer']));
});
afterAll(async () => {
  await fake.close();
});

describe('alerts after new revisions', () => {
  it('starts a watch at the latest revision', async () => {
    const w = await watchOf(curator().id);
    expect(w.mode).toBe('immediate');
    expect(w.lastAnnouncedRevisionId).not.toBeNull();
    expect((await s.mae(undefined, 'X')).number).toBe(1);
  });

  it('sends nothing when no change crosses a threshold, and keeps the baseline', async () => {
    const before = await watchOf(curator().id);
    const result = await s.importMode(13);
    expect(result.created).toBe(true);
    await whenAlertsIdle();
    expect(await db.select().from(mailOutbox)).toHaveLength(0);
    expect((await watchOf(curator().id)).lastAnnouncedRevisionId).toBe(before.lastAnnouncedRevisionId);
  });

  it('debounces a burst: three revisions within the window give one alert with the first-to-last numbers', async () => {
    // the reviewer leaves the workspace before the burst: no alert for them any more
    await db.delete(member).where(and(eq(member.organizationId, s.workspaceId), eq(member.userId, reviewer().id)));
    process.env.ALERT_DEBOUNCE_MS = '2500';
    for (const i of [14, 15, 16]) expect((await s.importMode(i)).created).toBe(true);
    await whenAlertsIdle();

    const mails = await outboxTo(curator().email);
    expect(mails).toHaveLength(1);
    const [mail] = mails;
    const first = await s.mae(1, 'X');
    const last = await s.mae(5, 'X');
    expect(last.number).toBe(5);
    expect(mail.kind).toBe('alert');
    expect(mail.subject).toBe('Benchmark shifted: Oxides <Raman> & IR (revision 5)');
    expect(mail.textBody).toContain('revision 1 → 5');
    const change = last.mae - first.mae;
    const row = mail.textBody.split('\n').find((l) => l.includes('X-PBEsol'))!;
    expect(row).toContain(`${first.mae.toFixed(2)} → ${last.mae.toFixed(2)}`);
    expect(row).toContain(`+${change.toFixed(2)} cm⁻¹ (+${((change / first.mae) * 100).toFixed(1)} %)`);
    expect(row).toContain(`${first.n} → ${last.n}`);
    // the quiet import of mode 13 did not move the baseline, so it counts in this alert
    for (const i of [13, 14, 15, 16]) expect(mail.textBody).toContain(`Import “raman-mode-${i}.csv” by contributor: 1 row entered the scope`);
    expect(mail.textBody).toContain('New outliers:');
    expect(mail.textBody).toContain(`/w/${s.ws.slug}/benchmarks/${s.benchmarkId}/revisions/5`);
    expect(mail.htmlBody).toContain('Oxides &lt;Raman&gt; &amp; IR');
    expect(mail.headers?.['List-Unsubscribe']).toMatch(/^<http:\/\/localhost:3999\/api\/unsubscribe\?token=[^>]+>$/);
    expect(mail.headers?.['List-Unsubscribe-Post']).toBe('List-Unsubscribe=One-Click');
    expect(mail.dedupeKey).toBe(`alert:${(await watchOf(curator().id)).id}:${(await watchOf(curator().id)).lastAnnouncedRevisionId}`);

    expect(await outboxTo(reviewer().email)).toHaveLength(0);
  });

  it('announcing again (a repeated pass, a restart) writes no second alert', async () => {
    expect(await announceBenchmark(s.workspaceId, s.benchmarkId)).toEqual({ alerts: 0 });
    expect(await db.select().from(mailOutbox)).toHaveLength(1);
  });

  it('delivers the alert exactly once while the provider fails with 500, 429 and a dropped connection', async () => {
    const config: DeliveryConfig = { apiKey: 're_test', from: 'Ledger <ledger@example.org>', timeoutMs: 500, maxAttempts: 8, leaseMs: 1_000, now: () => new Date(clock) };
    fake.setFaults(['500', '429', 'store-then-drop']);
    for (let pass = 0; pass < 10; pass++) {
      await deliverDueMail(config);
      const [row] = await db.select().from(mailOutbox);
      if (row.status === 'sent') break;
      clock += 11 * 60_000;
    }
    const [row] = await db.select().from(mailOutbox);
    expect(row.status).toBe('sent');
    expect(row.attempts).toBe(4);
    const delivered = fake.messages.filter((m) => m.to.includes(curator().email));
    expect(delivered).toHaveLength(1);
    expect(delivered[0].subject).toContain('Benchmark shifted');
    expect(delivered[0].headers).toMatchObject({ 'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click' });
    expect(delivered[0].idempotencyKey).toBe(row.id);
    expect(fake.requestCount()).toBe(4);
  });

  it('compares the next alert with the revision last announced, not with the first one', async () => {
    process.env.ALERT_DEBOUNCE_MS = '200';
    await s.importMode(17);
    await whenAlertsIdle();
    const mails = await outboxTo(curator().email);
    expect(mails).toHaveLength(2);
    const latest = mails.find((m) => m.subject.endsWith('(revision 6)'))!;
    // mode 17 adds a new outlier, which always counts; the comparison starts at the revision last announced
    expect(latest.textBody).toContain('revision 5 → 6');
    expect(latest.textBody).toContain('Crystal-17 A1g');
    expect(latest.textBody).not.toContain('Crystal-15 A1g');
    expect(latest.textBody).not.toContain('raman-mode-16.csv');
  });
});
