import { describe, expect, it } from 'vitest';
import { countRateLimitRows, pruneRateLimits } from '@/db/queries/rate-limit';
import { getClient } from '@/db/client';
import { clientAddress, PEER_HEADER, peerStamp } from '@/lib/client-address';
import { authRequest } from '../support/auth-http';

// This file's auth instance gets small limits; the windows are explicit.
process.env.AUTH_RATE_LIMIT_MAX = '3';
process.env.AUTH_RATE_LIMIT_WINDOW_SECONDS = '60';
process.env.AUTH_ACCOUNT_RATE_LIMIT_MAX = '5';
process.env.AUTH_ACCOUNT_RATE_LIMIT_WINDOW_SECONDS = '900';
process.env.RATE_LIMIT_TABLE_MAX_ROWS = '100';
process.env.TRUSTED_PROXIES = '10.9.0.1';

describe('rate limits on sign-in, sign-up and reset', () => {
  it.each([
    ['/sign-in/email', { email: 'nobody@example.org', password: 'whatever-password' }],
    ['/sign-up/email', { name: 'X', email: 'rl@example.org', password: 'short' }],
    ['/request-password-reset', { email: 'nobody-reset@example.org', redirectTo: '/reset-password' }],
  ])('%s allows 3 requests per 60 s per client, then answers 429', async (path, body) => {
    const ip = `198.51.100.${path.length}`;
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) statuses.push((await authRequest(path, { body, ip })).status);
    expect(statuses.slice(0, 3).every((s) => s !== 429)).toBe(true);
    expect(statuses[3]).toBe(429);
    // another client is not affected
    expect((await authRequest(path, { body: { ...body, email: `other-${path.length}@example.org` }, ip: '198.51.100.200' })).status).not.toBe(429);
  });

  it('a spoofed X-Forwarded-For neither resets the limit nor adds rows', async () => {
    const body = { email: 'victim-xff@example.org', password: 'guess-number-n' };
    const ip = '192.0.2.44';
    for (let i = 0; i < 3; i++) expect((await authRequest('/sign-in/email', { body, ip })).status).not.toBe(429);
    const rowsBefore = await countRateLimitRows();
    const spoofed: number[] = [];
    for (let i = 0; i < 14; i++) {
      const res = await authRequest('/sign-in/email', { body, ip, headers: { 'x-forwarded-for': `203.0.113.${100 + i}` } });
      spoofed.push(res.status);
    }
    expect(spoofed.every((s) => s === 429)).toBe(true);
    expect(await countRateLimitRows()).toBe(rowsBefore);
  });

  it('limits guesses at one account across many addresses', async () => {
    const body = { email: 'victim-spread@example.org', password: 'guess-number-n' };
    const statuses: number[] = [];
    for (let i = 0; i < 7; i++) statuses.push((await authRequest('/sign-in/email', { body, ip: `192.0.2.${120 + i}` })).status);
    expect(statuses.slice(0, 5).every((s) => s !== 429)).toBe(true);
    expect(statuses.slice(5)).toEqual([429, 429]);
    const refused = await authRequest('/sign-in/email', { body: { ...body, email: 'VICTIM-spread@example.org' }, ip: '192.0.2.200' });
    expect(refused.status).toBe(429);
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0);
  });

  it('a trusted proxy is believed about the client; anyone else is not', () => {
    const h = (peer: string, xff?: string) => {
      const headers = new Headers({ [PEER_HEADER]: peerStamp(peer, xff !== undefined) });
      if (xff) headers.set('x-forwarded-for', xff);
      return headers;
    };
    expect(clientAddress(h('10.9.0.1', '6.6.6.6, 198.51.100.9'))).toBe('198.51.100.9');
    expect(clientAddress(h('10.9.0.1', '198.51.100.9, 10.9.0.1'))).toBe('198.51.100.9');
    expect(clientAddress(h('198.51.100.9', '10.1.1.1'))).toBe('198.51.100.9');
    expect(clientAddress(h('::ffff:192.0.2.5'))).toBe('192.0.2.5');
    // a stamp without the server's key is the client's own invention
    expect(clientAddress(new Headers({ [PEER_HEADER]: 'guessed-key 192.0.2.5 direct' }))).toBeNull();
  });

  it('keeps the rate_limit table bounded', async () => {
    // each request adds two keys (the address and the account): 130 requests would make 260 rows unbounded
    const ips = Array.from({ length: 130 }, (_, i) => `100.64.0.${i}`);
    for (const ip of ips) await authRequest('/request-password-reset', { body: { email: `flood-${ip}@example.org`, redirectTo: '/reset-password' }, ip });
    expect(await countRateLimitRows()).toBeLessThanOrEqual(100);
    // the newest windows survive a prune
    await pruneRateLimits(50, 0);
    const { rows } = await getClient().execute('SELECT key FROM rate_limit');
    expect(rows.length).toBe(50);
    expect(rows.some((r) => String(r.key).includes('100.64.0.129|'))).toBe(true);
  });
});
