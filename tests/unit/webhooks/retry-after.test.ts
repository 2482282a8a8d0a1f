import { describe, expect, it, vi } from 'vitest';

vi.mock('server-only', () => ({}));
const { retryAfterMs, MAX_RETRY_AFTER_MS } = await import('@/lib/services/mail/webhook-send');

describe('Retry-After (RFC 9110 §10.2.3)', () => {
  const now = new Date('2026-03-01T12:00:00Z');
  it('reads delay-seconds and HTTP dates', () => {
    expect(retryAfterMs('120', now)).toBe(120_000);
    expect(retryAfterMs(' 0 ', now)).toBe(0);
    expect(retryAfterMs('Sun, 01 Mar 2026 12:05:00 GMT', now)).toBe(300_000);
  });
  it('caps a long wait at an hour and a date in the past at zero', () => {
    expect(retryAfterMs('86400', now)).toBe(MAX_RETRY_AFTER_MS);
    expect(retryAfterMs('Sun, 01 Mar 2026 11:00:00 GMT', now)).toBe(0);
  });
  it('ignores what it cannot read', () => {
    expect(retryAfterMs(undefined, now)).toBeUndefined();
    expect(retryAfterMs('soon', now)).toBeUndefined();
    expect(retryAfterMs('-5', now)).toBeUndefined();
  });
});
