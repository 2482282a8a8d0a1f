import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { mailOutbox } from '@/db/schema';
import { claimDueMail, enqueueMail } from '@/db/queries/mail';
import { deliverDueMail, sendOne, type DeliveryConfig } from '@/lib/services/mail/deliver';
import { startFakeResend, type FakeResend } from '@/lib/mail/fake-resend-server';

let fake: FakeResend;
let clock = Date.now();
const config = (): DeliveryConfig => ({
  apiKey: 're_test',
  from: 'Ledger <ledger@example.org>',
  timeoutMs: 300,
  maxAttempts: 8,
  leaseMs: 1_000,
  now: () => new Date(clock),
});

async function enqueue(n: number, prefix: string) {
  for (let i = 0; i < n; i++) {
    await enqueueMail({ kind: 'test', toAddress: `${prefix}${i}@example.org`, subject: `${prefix} ${i}`, textBody: 'hello', htmlBody: '<p>hello</p>' });
  }
}

/** Runs delivery passes, moving the clock past every back-off, until nothing is pending. */
async function drain(maxPasses = 40) {
  for (let pass = 0; pass < maxPasses; pass++) {
    await deliverDueMail(config());
    const open = await db.select().from(mailOutbox).where(eq(mailOutbox.status, 'pending'));
    const sending = await db.select().from(mailOutbox).where(eq(mailOutbox.status, 'sending'));
    if (open.length === 0 && sending.length === 0) return;
    clock += 11 * 60_000;
  }
  throw new Error('outbox did not drain');
}

beforeAll(async () => {
  fake = await startFakeResend();
  process.env.RESEND_BASE_URL = fake.url;
});
afterAll(async () => {
  await fake.close();
});
beforeEach(async () => {
  fake.clear();
  fake.setFaults([]);
  await db.delete(mailOutbox);
});

describe('mail outbox delivery', () => {
  it('delivers every message exactly once through 500, 429, a time-out and a dropped connection', async () => {
    await enqueue(5, 'rough');
    fake.setFaults(['500', '429', 'timeout', 'store-then-drop', '500']);
    await drain();
    const rows = await db.select().from(mailOutbox);
    expect(rows.every((r) => r.status === 'sent')).toBe(true);
    expect(fake.messages).toHaveLength(5);
    expect(new Set(fake.messages.map((m) => m.to[0])).size).toBe(5);
    // the message whose connection dropped after it was stored was retried with the same key, not stored twice
    expect(fake.requestCount()).toBeGreaterThan(5);
    for (const row of rows) expect(fake.messages.find((m) => m.id === row.providerMessageId)?.idempotencyKey).toBe(row.id);
  });

  it('recovers a message whose worker died mid-send, without a second copy', async () => {
    await enqueue(1, 'crash');
    // a worker claims the message and reaches the provider, then dies before recording the result
    const [claimed] = await claimDueMail(new Date(clock), 1_000, 10, db);
    expect((await sendOne(claimed, config())).kind).toBe('sent');
    expect((await db.select().from(mailOutbox))[0].status).toBe('sending');
    // while the lease holds, another pass leaves it alone
    expect((await deliverDueMail(config())).sent).toBe(0);
    clock += 2_000;
    expect((await deliverDueMail(config())).sent).toBe(1);
    expect(fake.messages).toHaveLength(1);
    const [row] = await db.select().from(mailOutbox);
    expect(row.status).toBe('sent');
    expect(row.attempts).toBe(2);
  });

  it('marks a message failed, visibly, after the last attempt', async () => {
    await enqueue(1, 'doomed');
    fake.setFaults(Array.from({ length: 20 }, () => '500' as const));
    await drain();
    const [row] = await db.select().from(mailOutbox);
    expect(row.status).toBe('failed');
    expect(row.attempts).toBe(8);
    expect(row.lastError).toMatch(/500/);
    expect(fake.messages).toHaveLength(0);
  });

  it('fails at once on a permanent error (422) instead of retrying', async () => {
    await db.insert(mailOutbox).values({ kind: 'test', toAddress: 'x@example.org', subject: '', textBody: 't', htmlBody: 'h' });
    const original = config();
    await deliverDueMail({ ...original, from: '' });
    const [row] = await db.select().from(mailOutbox);
    expect(row.status).toBe('failed');
    expect(row.attempts).toBe(1);
  });

  it('writes a mail with a dedupe key only once', async () => {
    const mail = { kind: 'alert', toAddress: 'w@example.org', subject: 's', textBody: 't', htmlBody: 'h', dedupeKey: 'watch-1:rev-2' };
    await enqueueMail(mail);
    await enqueueMail(mail);
    expect(await db.select().from(mailOutbox)).toHaveLength(1);
  });

  it('rolls the mail back with the change that caused it', async () => {
    await expect(
      db.transaction(async (tx) => {
        await enqueueMail({ kind: 'test', toAddress: 'r@example.org', subject: 's', textBody: 't', htmlBody: 'h' }, null, tx);
        throw new Error('the change failed');
      }),
    ).rejects.toThrow('the change failed');
    expect(await db.select().from(mailOutbox)).toHaveLength(0);
  });
});
