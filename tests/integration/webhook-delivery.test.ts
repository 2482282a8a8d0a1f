/**
 * Webhook alerts end to end: a watch with a URL, real alerts from imports, and a
 * receiver on loopback (lib/webhooks/fake-receiver.ts) that verifies signatures
 * and dedupes by Ledger-Webhook-Id. Through injected faults every alert event is
 * processed exactly once and delivered at least once.
 */
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { mailOutbox, watch, workspaceSettings } from '@/db/schema';
import { claimDue, enqueueMail, enqueueWebhook, listWebhookDeliveries } from '@/db/queries/mail';
import { listMyWatches } from '@/db/queries/watches';
import { deliverDueMail, deliverDueWebhooks, sendOneWebhook, type WebhookDeliveryConfig } from '@/lib/services/mail/deliver';
import { webhookSecretKey } from '@/lib/services/mail/worker';
import { whenAlertsIdle } from '@/lib/services/alerts/scheduler';
import { sendDueDigests } from '@/lib/services/alerts/announce';
import { startFakeReceiver, type FakeReceiver } from '@/lib/webhooks/fake-receiver';
import { startFakeResend, type FakeResend } from '@/lib/mail/fake-resend-server';
import { rotateWatchWebhookSecretAction, saveWatchWebhookAction, updateWatchAction, watchAction } from '@/app/(app)/w/[workspace]/watches/actions';
import { updateWebhookNetworkAction } from '@/app/(app)/w/[workspace]/settings/webhooks/actions';
import * as healthRoute from '@/app/api/health/route';
import { callAction } from '@/tests/support/actions';
import { signInAs } from '@/tests/support/users';
import { alertScenario } from './alerts-support';

let s: Awaited<ReturnType<typeof alertScenario>>;
let receiver: FakeReceiver;
let mailFake: FakeResend;
let watchId: string;
let secret: string;
let clock = Date.now();
const hookUrl = () => `${receiver.url}/hook`;

const config = (over: Partial<WebhookDeliveryConfig> = {}): WebhookDeliveryConfig => ({
  timeoutMs: 500,
  maxAttempts: 8,
  allowLoopback: true,
  secretKey: webhookSecretKey(),
  leaseMs: 1_500,
  now: () => new Date(clock),
  ...over,
});

/** The secret an action showed once (its state's data). */
function shownSecret(state: unknown): string {
  const value = (state as { data?: { secret?: unknown } } | undefined)?.data?.secret;
  if (typeof value !== 'string') throw new Error('no secret in the action state');
  return value;
}

const webhookRows = () => db.select().from(mailOutbox).where(eq(mailOutbox.channel, 'webhook'));

/** Delivery passes, moving the outbox clock past every back-off, until nothing is pending or sending. */
async function drain(c: WebhookDeliveryConfig = config(), maxPasses = 60) {
  for (let pass = 0; pass < maxPasses; pass++) {
    await deliverDueWebhooks(c);
    const open = (await webhookRows()).filter((r) => r.status === 'pending' || r.status === 'sending');
    if (open.length === 0) return;
    clock += 61 * 60_000;
  }
  throw new Error('webhook deliveries did not drain');
}

/** A delivery written the way the alert service writes one (used where the alert itself is not the point). */
async function enqueueProbe(url: string, label: string) {
  const id = crypto.randomUUID();
  await enqueueWebhook({ id, kind: 'benchmark.shifted', url, watchId, summary: label, body: JSON.stringify({ id, probe: label }), dedupeKey: `probe:${label}:${id}` }, s.workspaceId);
  return id;
}

beforeAll(async () => {
  process.env.ALERT_DEBOUNCE_MS = '100';
  receiver = await startFakeReceiver();
  mailFake = await startFakeResend();
  process.env.RESEND_BASE_URL = mailFake.url;
  s = await alertScenario();
  await whenAlertsIdle();
  await signInAs(s.ws.members.curator.email);
  expect((await callAction(watchAction, { workspaceId: s.workspaceId, benchmarkId: s.benchmarkId })).state).toMatchObject({ ok: true });
  const [w] = await db.select().from(watch).where(and(eq(watch.benchmarkId, s.benchmarkId), eq(watch.userId, s.ws.members.curator.id)));
  watchId = w.id;
  // tiny personal thresholds: every import that moves method X's MAE is an alert
  const tuned = await callAction(updateWatchAction, { workspaceId: s.workspaceId, watchId, mode: 'immediate', maeCm1: '0.0001', maeRelativePercent: '0.0001' });
  expect(tuned.state).toMatchObject({ ok: true });
});
afterAll(async () => {
  await receiver.close();
  await mailFake.close();
});
beforeEach(() => {
  receiver.setFaults([]);
  receiver.setDelayMs(0);
});

describe('setting a webhook on a watch', () => {
  it('refuses URLs the policy does not allow, beside the field, writing nothing', async () => {
    for (const [url, reason] of [
      ['ftp://hooks.example.org/x', /not allowed: use https/],
      ['http://hooks.example.org/x', /https/],
      ['https://user:pw@hooks.example.org/x', /password/],
      ['https://10.0.0.1/hook', /private-network.*owner/],
      ['https://169.254.169.254/latest/meta-data/', /metadata/],
      ['https://[::ffff:192.168.0.1]/', /IPv4-mapped/],
      ['https://0.0.0.0/', /unspecified/],
      ['not a url', /Not a URL/],
      // resolved when saved: .invalid never resolves (RFC 6761 §6.4)
      ['https://hooks.ledger-test.invalid/x', /does not resolve/],
    ] as const) {
      const res = await callAction(saveWatchWebhookAction, { workspaceId: s.workspaceId, watchId, webhookUrl: url });
      expect(res.state?.ok, url).toBe(false);
      expect(res.state?.fieldErrors?.webhookUrl?.[0], url).toMatch(reason);
    }
    const [w] = await db.select().from(watch).where(eq(watch.id, watchId));
    expect(w.webhookUrl).toBeNull();
    expect(w.webhookSecret).toBeNull();
  });

  it('makes the signing secret on the first URL and shows it once; it is stored encrypted and never read back for display', async () => {
    const res = await callAction(saveWatchWebhookAction, { workspaceId: s.workspaceId, watchId, webhookUrl: hookUrl() });
    expect(res.state).toMatchObject({ ok: true });
    secret = shownSecret(res.state);
    expect(secret).toMatch(/^whsec_/);
    receiver.setSecret(secret);
    const [w] = await db.select().from(watch).where(eq(watch.id, watchId));
    expect(w.webhookUrl).toBe(hookUrl());
    expect(w.webhookSecret).toMatch(/^v1\./);
    expect(w.webhookSecret).not.toContain(secret.slice(6));
    const listed = (await listMyWatches(s.workspaceId, s.ws.members.curator.id)).find((x) => x.id === watchId)!;
    expect(JSON.stringify(listed)).not.toContain(secret);
    expect(listed.webhookUrl).toBe(hookUrl());
    // saving the URL again keeps the secret and does not show it
    const again = await callAction(saveWatchWebhookAction, { workspaceId: s.workspaceId, watchId, webhookUrl: hookUrl() });
    expect(again.state).toMatchObject({ ok: true });
    expect((again.state as { data?: unknown }).data).toBeUndefined();
    expect((await db.select().from(watch).where(eq(watch.id, watchId)))[0].webhookSecret).toBe(w.webhookSecret);
  });

  it("another member cannot set a webhook on someone else's watch", async () => {
    await signInAs(s.ws.members.reviewer.email);
    const res = await callAction(saveWatchWebhookAction, { workspaceId: s.workspaceId, watchId, webhookUrl: 'http://127.0.0.1:1/steal' });
    expect(res.state).toMatchObject({ ok: false, code: 'not-found' });
    expect((await callAction(rotateWatchWebhookSecretAction, { workspaceId: s.workspaceId, watchId })).state).toMatchObject({ ok: false, code: 'not-found' });
    expect((await db.select().from(watch).where(eq(watch.id, watchId)))[0].webhookUrl).toBe(hookUrl());
    await signInAs(s.ws.members.curator.email);
  });

  it('private-network targets: a curator cannot allow them, the owner can', async () => {
    const denied = await callAction(updateWebhookNetworkAction, { workspaceId: s.workspaceId, allowPrivate: 'on' });
    expect(denied.state).toMatchObject({ ok: false, code: 'forbidden' });
    expect(await db.select().from(workspaceSettings).where(eq(workspaceSettings.workspaceId, s.workspaceId))).toEqual([]);

    await signInAs(s.ws.owner.email);
    expect((await callAction(updateWebhookNetworkAction, { workspaceId: s.workspaceId, allowPrivate: 'on' })).state).toMatchObject({ ok: true });
    await signInAs(s.ws.members.curator.email);
    // now a private address saves (nothing is delivered to it here; the URL is put back below)...
    expect((await callAction(saveWatchWebhookAction, { workspaceId: s.workspaceId, watchId, webhookUrl: 'https://10.0.0.1/hook' })).state).toMatchObject({ ok: true });
    // ...but never the metadata address, nor loopback by the owner's setting alone
    expect((await callAction(saveWatchWebhookAction, { workspaceId: s.workspaceId, watchId, webhookUrl: 'https://169.254.169.254/' })).state?.ok).toBe(false);
    expect((await callAction(saveWatchWebhookAction, { workspaceId: s.workspaceId, watchId, webhookUrl: hookUrl() })).state).toMatchObject({ ok: true });

    await signInAs(s.ws.owner.email);
    expect((await callAction(updateWebhookNetworkAction, { workspaceId: s.workspaceId })).state).toMatchObject({ ok: true });
    await signInAs(s.ws.members.curator.email);
    expect((await callAction(saveWatchWebhookAction, { workspaceId: s.workspaceId, watchId, webhookUrl: 'https://10.0.0.1/hook' })).state?.ok).toBe(false);
    expect((await db.select().from(watch).where(eq(watch.id, watchId)))[0].webhookUrl).toBe(hookUrl());
  });
});

describe('delivering alerts', () => {
  it('processes every alert event exactly once through 500, 429 with Retry-After, a time-out and a dropped connection', async () => {
    // real alerts: each import moves X's MAE past the curator's tiny thresholds
    for (const i of [13, 14, 15, 16, 17]) {
      expect((await s.importMode(i)).created).toBe(true);
      await whenAlertsIdle();
    }
    const rows = await webhookRows();
    expect(rows.length).toBeGreaterThanOrEqual(4);
    // one beside each alert mail, written in its transaction; nothing was sent from the import's path
    const mails = await db.select().from(mailOutbox).where(and(eq(mailOutbox.channel, 'email'), eq(mailOutbox.toAddress, s.ws.members.curator.email)));
    expect(mails).toHaveLength(rows.length);
    for (const m of mails) expect(rows.some((r) => r.dedupeKey === `webhook:${m.dedupeKey}`)).toBe(true);
    expect(receiver.requestCount()).toBe(0);

    receiver.setFaults(['500', '429', 'timeout', 'store-then-drop', '500', 'timeout']);
    await drain();

    const after = await webhookRows();
    expect(after.every((r) => r.status === 'sent')).toBe(true);
    // exactly once: one processed event per outbox row, no id twice
    const processedIds = receiver.processed.map((e) => e.id);
    expect(new Set(processedIds).size).toBe(processedIds.length);
    expect(processedIds.sort()).toEqual(after.map((r) => r.id).sort());
    // at least once, and more for the faulted ones: the dropped one came back with the same id and was not processed again
    for (const r of after) expect(receiver.deliveriesOf(r.id)).toBeGreaterThanOrEqual(1);
    expect(receiver.requestCount()).toBe(rows.length + 6);
    expect(after.filter((r) => r.attempts > 1).length).toBeGreaterThanOrEqual(3);
    expect(receiver.refusedCount()).toBe(0);

    // the body is the alert: workspace, watch, benchmark, revision, causes
    const first = JSON.parse(receiver.processed.find((e) => e.id === after.sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime())[0].id)!.body);
    expect(first).toMatchObject({
      type: 'benchmark.shifted',
      version: 1,
      workspace: { id: s.workspaceId, slug: s.ws.slug },
      watch: { id: watchId, mode: 'immediate' },
      benchmark: { id: s.benchmarkId, name: 'Oxides <Raman> & IR', unit: 'cm⁻¹' },
      // import 13 leaves X's MAE at exactly 1.5 cm⁻¹ (no alert); import 14 moves it: revision 1 → 3
      revision: { from: { number: 1 }, to: { number: 3 } },
    });
    expect(first.id).toBe(after[0].id);
    expect(first.changes.some((c: { methodId: string; reasons: string[] }) => c.methodId === s.methods.X && c.reasons.includes('mae'))).toBe(true);
    expect(first.causes.every((c: { kind: string }) => c.kind === 'import')).toBe(true);
    expect(first.causes.map((c: { text: string }) => c.text).join(' ')).toContain('raman-mode-14.csv');
  });

  it("honours a receiver's Retry-After when it is longer than the back-off", async () => {
    receiver.setFaults(['429']);
    const id = await enqueueProbe(hookUrl(), 'retry-after');
    await deliverDueWebhooks(config());
    const [row] = (await webhookRows()).filter((r) => r.id === id);
    expect(row.status).toBe('pending');
    expect(row.lastError).toMatch(/^429/);
    expect(row.nextAttemptAt.getTime() - clock).toBe(120_000);
    await drain();
    expect(receiver.processed.filter((e) => e.id === id)).toHaveLength(1);
  });

  it('recovers a delivery whose worker died mid-send, processed once', async () => {
    const id = await enqueueProbe(hookUrl(), 'crash');
    // a worker claims it and reaches the receiver, then dies before recording the answer
    const [claimed] = await claimDue('webhook', new Date(clock), 1_500, 10);
    expect(claimed.id).toBe(id);
    expect((await sendOneWebhook(claimed, config())).kind).toBe('sent');
    expect((await webhookRows()).find((r) => r.id === id)!.status).toBe('sending');
    // while the lease holds, another pass leaves it alone
    expect((await deliverDueWebhooks(config())).sent).toBe(0);
    clock += 2_000;
    expect((await deliverDueWebhooks(config())).sent).toBe(1);
    const row = (await webhookRows()).find((r) => r.id === id)!;
    expect(row).toMatchObject({ status: 'sent', attempts: 2 });
    expect(receiver.deliveriesOf(id)).toBe(2);
    expect(receiver.processed.filter((e) => e.id === id)).toHaveLength(1);
    expect(receiver.processed.find((e) => e.id === id)!.attempt).toBe('1');
  });

  it('ends in a visible failed state after the last attempt, at once on a 4xx, and never follows a redirect', async () => {
    receiver.setFaults(Array.from({ length: 8 }, () => '500' as const));
    const doomed = await enqueueProbe(hookUrl(), 'doomed');
    await drain();
    receiver.setFaults(['400']);
    const refused = await enqueueProbe(hookUrl(), 'refused');
    await drain();
    receiver.setFaults(['redirect']);
    const redirected = await enqueueProbe(hookUrl(), 'redirected');
    await drain();

    const list = await listWebhookDeliveries(s.workspaceId);
    expect(list.find((r) => r.id === doomed)).toMatchObject({ status: 'failed', attempts: 8, lastError: expect.stringMatching(/^500 injected failure/) });
    expect(list.find((r) => r.id === refused)).toMatchObject({ status: 'failed', attempts: 1, lastError: '400 unknown event' });
    expect(list.find((r) => r.id === redirected)).toMatchObject({ status: 'failed', attempts: 1, lastError: expect.stringMatching(/307: redirects are not followed/) });
    expect(receiver.deliveriesOf(redirected)).toBe(1);
    for (const id of [doomed, refused, redirected]) expect(receiver.processed.some((e) => e.id === id)).toBe(false);
  });

  it('a rotated secret signs from then on; the old one no longer verifies', async () => {
    const res = await callAction(rotateWatchWebhookSecretAction, { workspaceId: s.workspaceId, watchId });
    const next = shownSecret(res.state);
    expect(next).toMatch(/^whsec_/);
    expect(next).not.toBe(secret);
    // the receiver still holds the old secret: refused (401, final)
    const stale = await enqueueProbe(hookUrl(), 'stale-secret');
    await drain();
    expect((await webhookRows()).find((r) => r.id === stale)).toMatchObject({ status: 'failed', lastError: expect.stringMatching(/^401 signature refused: bad-signature/) });
    receiver.setSecret(next);
    secret = next;
    const fresh = await enqueueProbe(hookUrl(), 'new-secret');
    await drain();
    expect(receiver.processed.some((e) => e.id === fresh)).toBe(true);
  });
});

describe('where a delivery may connect', () => {
  it('connects to the address it checked, not to one looked up again (the Host header keeps the name)', async () => {
    const url = `http://hooks.pinned.localhost:${receiver.port}/hook`;
    const id = await enqueueProbe(url, 'pinned');
    const looked: string[] = [];
    await drain(config({ resolve: async (host) => (looked.push(host), [{ address: '127.0.0.1', family: 4 }]) }));
    expect(looked).toEqual(['hooks.pinned.localhost']);
    const got = receiver.processed.find((e) => e.id === id)!;
    expect(got.host).toBe(`hooks.pinned.localhost:${receiver.port}`);
  });

  it('refuses, at send time, a name that now resolves to a private or metadata address (DNS rebinding), sending nothing', async () => {
    const before = receiver.requestCount();
    const rebound = await enqueueProbe(`https://rebind.example.org:${receiver.port}/hook`, 'rebind');
    await drain(config({ resolve: async () => [{ address: '10.0.0.7', family: 4 }] }));
    const mixed = await enqueueProbe(`https://mixed.example.org:${receiver.port}/hook`, 'mixed');
    await drain(config({ resolve: async () => [{ address: '93.184.215.14', family: 4 }, { address: '169.254.169.254', family: 4 }] }));
    const rows = await webhookRows();
    expect(rows.find((r) => r.id === rebound)).toMatchObject({ status: 'failed', attempts: 1, lastError: expect.stringMatching(/refused: rebind\.example\.org resolves to 10\.0\.0\.7 is a private-network address/) });
    expect(rows.find((r) => r.id === mixed)).toMatchObject({ status: 'failed', lastError: expect.stringMatching(/169\.254\.169\.254 is a cloud metadata address/) });
    expect(receiver.requestCount()).toBe(before);
  });

  it('refuses loopback at send time outside development and tests', async () => {
    const id = await enqueueProbe(hookUrl(), 'production-loopback');
    const before = receiver.requestCount();
    await drain(config({ allowLoopback: false }));
    expect((await webhookRows()).find((r) => r.id === id)).toMatchObject({ status: 'failed', lastError: expect.stringMatching(/^refused: Use https/) });
    expect(receiver.requestCount()).toBe(before);
  });
});

describe('a slow receiver', () => {
  it('does not delay requests or e-mail: a 30 s receiver is cut off by the time-out while the app answers at once', async () => {
    receiver.setDelayMs(30_000);
    const id = await enqueueProbe(hookUrl(), 'slow');
    await enqueueMail({ kind: 'test', toAddress: 'slow-test@example.org', subject: 'beside a slow webhook', textBody: 't', htmlBody: '<p>t</p>' }, s.workspaceId);
    const started = Date.now();
    const pass = deliverDueWebhooks(config({ timeoutMs: 3_000 }));
    await new Promise((r) => setTimeout(r, 100));
    expect(receiver.deliveriesOf(id)).toBe(1); // the request is in flight

    const t0 = Date.now();
    const health = await (healthRoute.GET as () => Promise<Response>)();
    expect(health.status).toBeLessThan(600);
    const saved = await callAction(updateWatchAction, { workspaceId: s.workspaceId, watchId, mode: 'immediate', maeCm1: '0.0001', maeRelativePercent: '0.0001' });
    expect(saved.state).toMatchObject({ ok: true });
    const mail = await deliverDueMail({ apiKey: 're_test', from: 'Ledger <ledger@example.org>', timeoutMs: 2_000, maxAttempts: 3, now: () => new Date(clock) });
    const requestMs = Date.now() - t0;
    expect(mail.sent).toBeGreaterThanOrEqual(1);
    expect(requestMs).toBeLessThan(1_500);

    const report = await pass;
    const elapsed = Date.now() - started;
    expect(report.retried).toBe(1);
    expect(elapsed).toBeGreaterThanOrEqual(2_900);
    expect(elapsed).toBeLessThan(10_000);
    const row = (await webhookRows()).find((r) => r.id === id)!;
    expect(row).toMatchObject({ status: 'pending', lastError: expect.stringMatching(/no complete answer within 3000 ms/) });
    receiver.setDelayMs(0);
    await drain();
    expect(receiver.processed.filter((e) => e.id === id)).toHaveLength(1);
  });
});

describe('an endless answer', () => {
  it('reads at most 4 KiB of it: an error body that never ends is cut, and the attempt ends before the time-out', async () => {
    let written = 0;
    const flood = createServer((req, res) => {
      req.resume();
      res.writeHead(503, { 'content-type': 'text/plain' });
      const chunk = 'x'.repeat(64 * 1024);
      const pump = () => {
        while (!res.destroyed) {
          written += chunk.length;
          if (!res.write(chunk)) break;
        }
        if (!res.destroyed) res.once('drain', pump);
      };
      pump();
    });
    await new Promise<void>((r) => flood.listen(0, '127.0.0.1', r));
    try {
      const id = await enqueueProbe(`http://127.0.0.1:${(flood.address() as AddressInfo).port}/hook`, 'flood');
      const t0 = Date.now();
      await deliverDueWebhooks(config({ timeoutMs: 5_000 }));
      const tookMs = Date.now() - t0;
      const row = (await webhookRows()).find((r) => r.id === id)!;
      expect(row.status).toBe('pending');
      expect(row.lastError).toMatch(/^503 x+$/);
      expect(row.lastError!.length).toBeLessThanOrEqual(304);
      expect(tookMs).toBeLessThan(5_000);
      await db.update(mailOutbox).set({ status: 'failed' }).where(eq(mailOutbox.id, id));
    } finally {
      flood.closeAllConnections();
      await new Promise((r) => flood.close(r));
    }
    expect(written).toBeGreaterThan(0);
  });
});

describe('digests', () => {
  it('a digest watch posts one benchmark.digest per day beside its digest mail', async () => {
    expect((await callAction(updateWatchAction, { workspaceId: s.workspaceId, watchId, mode: 'digest', maeCm1: '0.0001', maeRelativePercent: '0.0001' })).state).toMatchObject({ ok: true });
    expect((await s.importMode(18)).created).toBe(true);
    await whenAlertsIdle();
    const tomorrow = new Date(Date.now() + 86_400_000);
    const day = new Date(Date.UTC(tomorrow.getUTCFullYear(), tomorrow.getUTCMonth(), tomorrow.getUTCDate()) - 86_400_000).toISOString().slice(0, 10);
    expect((await sendDueDigests(tomorrow)).digests).toBe(1);
    expect((await sendDueDigests(tomorrow)).digests).toBe(0);
    const rows = (await webhookRows()).filter((r) => r.kind === 'benchmark.digest');
    expect(rows).toHaveLength(1);
    expect(rows[0].dedupeKey).toBe(`webhook:digest:${watchId}:${day}`);
    await drain();
    const got = receiver.processed.find((e) => e.id === rows[0].id);
    expect(got).toBeDefined();
    expect(JSON.parse(got!.body)).toMatchObject({ id: rows[0].id, type: 'benchmark.digest', day, watch: { id: watchId, mode: 'digest' } });
  });
});
