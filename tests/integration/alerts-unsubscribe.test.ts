import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db, getClient } from '@/db/client';
import { auditLog, mailOutbox, watch } from '@/db/schema';
import { POST } from '@/app/api/unsubscribe/route';
import { watchBenchmark } from '@/db/queries/watches';
import { signUnsubscribeToken } from '@/lib/alerts/unsubscribe-token';
import { whenAlertsIdle } from '@/lib/services/alerts/scheduler';
import { requestContext } from '@/tests/support/request-context';
import { alertScenario, outboxTo } from './alerts-support';

let s: Awaited<ReturnType<typeof alertScenario>>;
let watchId: string;
const secret = () => process.env.BETTER_AUTH_SECRET!;

function oneClick(token: string | null, body: string | null = 'List-Unsubscribe=One-Click', type = 'application/x-www-form-urlencoded') {
  const url = `http://localhost:3999/api/unsubscribe${token === null ? '' : `?token=${encodeURIComponent(token)}`}`;
  return POST(new Request(url, { method: 'POST', headers: body === null ? {} : { 'content-type': type }, body: body ?? undefined }));
}

async function counts() {
  const client = getClient();
  const out: Record<string, unknown> = {};
  for (const table of ['watch', 'audit_log', 'mail_outbox']) out[table] = (await client.execute(`SELECT count(*) AS c FROM "${table}"`)).rows[0].c;
  out.watchRow = (await db.select().from(watch).where(eq(watch.id, watchId)))[0];
  return out;
}

beforeAll(async () => {
  process.env.ALERT_DEBOUNCE_MS = '100';
  s = await alertScenario();
  ({ id: watchId } = await watchBenchmark(s.workspaceId, s.benchmarkId, s.ws.members.curator.id, 'immediate'));
  requestContext.anonymous();
});

describe('one-click unsubscribe (RFC 8058)', () => {
  it('refuses a request without a token, or without the one-click body, and changes nothing', async () => {
    const before = await counts();
    const token = signUnsubscribeToken(watchId, secret());
    for (const res of [
      await oneClick(null),
      await oneClick('', 'List-Unsubscribe=One-Click'),
      await oneClick(token, null),
      await oneClick(token, 'List-Unsubscribe=Yes'),
      await oneClick(token, JSON.stringify({ 'List-Unsubscribe': 'One-Click' }), 'application/json'),
      await oneClick(token, `List-Unsubscribe=One-Click&pad=${'x'.repeat(5000)}`),
    ]) {
      expect(res.status).toBeGreaterThanOrEqual(400);
      expect(res.status).toBeLessThan(500);
    }
    expect(await counts()).toEqual(before);
  });

  it('refuses a forged or an expired token with a clear message, and changes nothing', async () => {
    const before = await counts();
    const forged = signUnsubscribeToken(watchId, 'someone-elses-secret-0123456789abcdef');
    const res = await oneClick(forged);
    expect(res.status).toBe(403);
    expect(((await res.json()) as { detail: string }).detail).toMatch(/not valid\. Nothing was changed/);

    const expired = signUnsubscribeToken(watchId, secret(), new Date(Date.now() - 181 * 86_400_000));
    const old = await oneClick(expired);
    expect(old.status).toBe(410);
    expect(((await old.json()) as { detail: string }).detail).toMatch(/expired\. Nothing was changed/);

    const tampered = signUnsubscribeToken(watchId, secret()).replace(/^./, (c) => (c === 'a' ? 'b' : 'a'));
    expect((await oneClick(tampered)).status).toBe(403);
    expect(await counts()).toEqual(before);
  });

  it('unsubscribes with a valid token, without a session, once', async () => {
    const res = await oneClick(signUnsubscribeToken(watchId, secret()));
    expect(res.status).toBe(200);
    const [row] = await db.select().from(watch).where(eq(watch.id, watchId));
    expect(row.unsubscribedAt).toBeInstanceOf(Date);
    const audit = await db.select().from(auditLog).where(eq(auditLog.entityId, watchId));
    expect(audit.map((a) => a.action)).toContain('unsubscribe');
    const again = await oneClick(signUnsubscribeToken(watchId, secret()));
    expect(again.status).toBe(200);
    expect(((await again.json()) as { detail: string }).detail).toMatch(/Already unsubscribed/);
  });

  it('from the confirmation page, answers with a redirect back to it', async () => {
    const token = signUnsubscribeToken(watchId, secret());
    const res = await oneClick(token, 'List-Unsubscribe=One-Click&return=page');
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toBe(`http://localhost:3999/unsubscribe?token=${encodeURIComponent(token)}&done=1`);
  });

  it('stops further alerts', async () => {
    for (const i of [15, 16]) await s.importMode(i);
    await whenAlertsIdle();
    expect(await outboxTo(s.ws.members.curator.email)).toHaveLength(0);
    expect(await db.select().from(mailOutbox)).toHaveLength(0);
  });
});
