import { describe, expect, it, vi } from 'vitest';

vi.mock('server-only', () => ({}));
const { backoffMs } = await import('@/lib/services/mail/deliver');

describe('mail back-off', () => {
  it('doubles from 2 s and caps at 10 minutes', () => {
    expect([1, 2, 3, 4].map(backoffMs)).toEqual([2000, 4000, 8000, 16000]);
    expect(backoffMs(20)).toBe(600_000);
  });
});
