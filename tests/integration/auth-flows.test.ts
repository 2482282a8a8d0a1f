import { describe, expect, it } from 'vitest';
import { desc, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { mailOutbox, session, user } from '@/db/schema';
import { authRequest, cookieHeader } from '../support/auth-http';

async function lastMailTo(email: string) {
  const [row] = await db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, email)).orderBy(desc(mailOutbox.createdAt)).limit(1);
  return row;
}

function linkIn(text: string): string {
  const match = text.match(/https?:\/\/\S+/);
  if (!match) throw new Error(`no link in: ${text}`);
  return match[0];
}

async function signUp(email: string, password = 'a-long-enough-password', ip = '203.0.113.10') {
  return authRequest('/sign-up/email', { body: { name: 'Nadia Ross', email, password, callbackURL: '/w' }, ip });
}

describe('sign-up, verification, sign-in, reset', () => {
  it('sends a verification mail through the outbox and refuses sign-in until it is followed', async () => {
    const email = 'nadia@example.org';
    expect((await signUp(email)).status).toBe(200);
    const mail = await lastMailTo(email);
    expect(mail.kind).toBe('verify-email');
    expect(mail.status).toBe('pending');

    const early = await authRequest('/sign-in/email', { body: { email, password: 'a-long-enough-password' } });
    expect(early.status).toBe(403);

    const link = new URL(linkIn(mail.textBody));
    const verified = await authRequest(`${link.pathname.replace('/api/auth', '')}${link.search}`, { method: 'GET' });
    expect([200, 302]).toContain(verified.status);
    const [u] = await db.select().from(user).where(eq(user.email, email));
    expect(u.emailVerified).toBe(true);

    const ok = await authRequest('/sign-in/email', { body: { email, password: 'a-long-enough-password' } });
    expect(ok.status).toBe(200);
  });

  it('refuses a used e-mail, a short password and a wrong password, changing nothing', async () => {
    const email = 'dup@example.org';
    await signUp(email, 'a-long-enough-password', '203.0.113.11');
    const before = (await db.select().from(user)).length;
    // A used address answers like a new one (no account enumeration); its owner is told by e-mail.
    const again = await signUp(email, 'another-long-password', '203.0.113.11');
    expect(again.status).toBe(200);
    expect((await lastMailTo(email)).kind).toBe('existing-account');
    const short = await signUp('short@example.org', 'short', '203.0.113.11');
    expect(short.status).toBe(400);
    expect((await db.select().from(user)).length).toBe(before);

    await db.update(user).set({ emailVerified: true }).where(eq(user.email, email));
    // the first password still stands
    expect((await authRequest('/sign-in/email', { body: { email, password: 'a-long-enough-password' }, ip: '203.0.113.12' })).status).toBe(200);
    const wrong = await authRequest('/sign-in/email', { body: { email, password: 'not-the-password' }, ip: '203.0.113.12' });
    expect(wrong.status).toBe(401);
  });

  it('resets a password by e-mail and revokes every session', async () => {
    const email = 'reset@example.org';
    await signUp(email, 'first-password-123', '203.0.113.13');
    await db.update(user).set({ emailVerified: true }).where(eq(user.email, email));
    const signedIn = await authRequest('/sign-in/email', { body: { email, password: 'first-password-123' }, ip: '203.0.113.13' });
    const cookie = cookieHeader(signedIn);
    const [u] = await db.select().from(user).where(eq(user.email, email));
    expect((await db.select().from(session).where(eq(session.userId, u.id))).length).toBe(1);

    expect((await authRequest('/request-password-reset', { body: { email, redirectTo: '/reset-password' }, ip: '203.0.113.13' })).status).toBe(200);
    const mail = await lastMailTo(email);
    expect(mail.kind).toBe('reset-password');
    const link = new URL(linkIn(mail.textBody));
    const landing = await authRequest(`${link.pathname.replace('/api/auth', '')}${link.search}`, { method: 'GET' });
    const token = new URL(landing.headers.get('location')!, 'http://x').searchParams.get('token');
    expect(token).toBeTruthy();

    const reset = await authRequest('/reset-password', { body: { newPassword: 'second-password-456', token }, ip: '203.0.113.13' });
    expect(reset.status).toBe(200);
    expect(await db.select().from(session).where(eq(session.userId, u.id))).toHaveLength(0);
    const stale = await authRequest('/get-session', { method: 'GET', cookie });
    expect(await stale.json()).toBeNull();
    expect((await authRequest('/sign-in/email', { body: { email, password: 'first-password-123' }, ip: '203.0.113.14' })).status).toBe(401);
    expect((await authRequest('/sign-in/email', { body: { email, password: 'second-password-456' }, ip: '203.0.113.14' })).status).toBe(200);
  });
});
