import { describe, expect, it } from 'vitest';
import { authRequest } from '../support/auth-http';

// This file's auth instance gets a small limit; the window is explicit.
process.env.AUTH_RATE_LIMIT_MAX = '3';
process.env.AUTH_RATE_LIMIT_WINDOW_SECONDS = '60';

describe('rate limits on sign-in, sign-up and reset', () => {
  it.each([
    ['/sign-in/email', { email: 'nobody@example.org', password: 'whatever-password' }],
    ['/sign-up/email', { name: 'X', email: 'rl@example.org', password: 'short' }],
    ['/request-password-reset', { email: 'nobody@example.org', redirectTo: '/reset-password' }],
  ])('%s allows 3 requests per 60 s per client, then answers 429', async (path, body) => {
    const ip = `198.51.100.${path.length}`;
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) statuses.push((await authRequest(path, { body, ip })).status);
    expect(statuses.slice(0, 3).every((s) => s !== 429)).toBe(true);
    expect(statuses[3]).toBe(429);
    // another client is not affected
    expect((await authRequest(path, { body, ip: '198.51.100.200' })).status).not.toBe(429);
  });
});
