import { afterAll, describe, expect, it, vi } from 'vitest';
import { createVerifiedUser, TEST_PASSWORD } from '../support/users';

// Issue 11, item 6: behind https the session cookie is Secure (and __Secure- prefixed); over plain http it cannot be.

// The auth instance is kept on globalThis (one per process); each case builds its own from the URL.
const holder = globalThis as unknown as { ledgerAuth?: unknown };
const original = { url: process.env.BETTER_AUTH_URL, auth: holder.ledgerAuth };
afterAll(() => {
  process.env.BETTER_AUTH_URL = original.url;
  holder.ledgerAuth = original.auth;
  vi.resetModules();
});

async function signInCookies(origin: string): Promise<string[]> {
  const user = await createVerifiedUser();
  vi.resetModules();
  delete holder.ledgerAuth;
  process.env.BETTER_AUTH_URL = origin;
  const { getAuth } = await import('@/lib/auth');
  const res = await getAuth().api.signInEmail({ body: { email: user.email, password: TEST_PASSWORD }, asResponse: true });
  expect(res.status).toBe(200);
  return res.headers.getSetCookie();
}

describe('session cookies', () => {
  it('are Secure and __Secure- prefixed when BETTER_AUTH_URL is https', async () => {
    const cookies = await signInCookies('https://ledger.example.org');
    const session = cookies.find((c) => c.includes('session_token='))!;
    expect(session).toMatch(/^__Secure-/);
    expect(session).toMatch(/;\s*Secure/i);
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
  });

  it('are not Secure over plain http (a local run), so the browser sends them back', async () => {
    const cookies = await signInCookies('http://localhost:3999');
    const session = cookies.find((c) => c.includes('session_token='))!;
    expect(session).not.toMatch(/^__Secure-/);
    expect(session).not.toMatch(/;\s*Secure/i);
  });
});
