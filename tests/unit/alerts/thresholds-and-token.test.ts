import { describe, expect, it } from 'vitest';
import { effectiveThresholds, hasOverride, readWatchThresholds } from '@/lib/alerts/thresholds';
import { signUnsubscribeToken, verifyUnsubscribeToken } from '@/lib/alerts/unsubscribe-token';

const SECRET = 'unit-test-secret-0123456789abcdef0123';
const WATCH = '1b4e28ba-2fa1-11d2-883f-0016d3cca427';

describe('watch thresholds', () => {
  const benchmark = { maeAbsolute: 0.5, maeRelative: 0.05, nRelative: 0.1 };

  it('takes each override the watcher set and the benchmark value for the rest', () => {
    // maeCm1 is the older name of maeAbsolute and is still accepted
    expect(effectiveThresholds(benchmark, { maeCm1: 2 })).toEqual({ maeAbsolute: 2, maeRelative: 0.05, nRelative: 0.1 });
    expect(effectiveThresholds(benchmark, { maeAbsolute: 3, maeCm1: 2 })).toEqual({ maeAbsolute: 3, maeRelative: 0.05, nRelative: 0.1 });
    expect(effectiveThresholds(benchmark, {})).toEqual(benchmark);
    expect(effectiveThresholds(benchmark, { maeRelative: 0.2, nRelative: 0.5 })).toEqual({ maeAbsolute: 0.5, maeRelative: 0.2, nRelative: 0.5 });
  });

  it('reads stored JSON, treating a broken value as no override', () => {
    expect(readWatchThresholds(null)).toEqual({});
    expect(readWatchThresholds({ maeCm1: 1.5 })).toEqual({ maeCm1: 1.5 });
    expect(readWatchThresholds({ maeCm1: -1 })).toEqual({});
    expect(hasOverride({})).toBe(false);
    expect(hasOverride({ nRelative: 0.3 })).toBe(true);
  });
});

describe('unsubscribe token', () => {
  const now = new Date('2026-03-01T12:00:00Z');

  it('verifies its own signature and names the watch', () => {
    const token = signUnsubscribeToken(WATCH, SECRET, now);
    const check = verifyUnsubscribeToken(token, SECRET, new Date('2026-06-01T00:00:00Z'));
    expect(check).toMatchObject({ ok: true, watchId: WATCH });
  });

  it('expires after 180 days', () => {
    const token = signUnsubscribeToken(WATCH, SECRET, now);
    expect(verifyUnsubscribeToken(token, SECRET, new Date(now.getTime() + 179 * 86_400_000)).ok).toBe(true);
    expect(verifyUnsubscribeToken(token, SECRET, new Date(now.getTime() + 180 * 86_400_000 + 1000))).toEqual({ ok: false, reason: 'expired' });
  });

  it('refuses a token signed with another secret, or with its watch id or expiry changed', () => {
    const token = signUnsubscribeToken(WATCH, SECRET, now);
    const [id, exp, sig] = token.split('.');
    expect(verifyUnsubscribeToken(signUnsubscribeToken(WATCH, 'another-secret-0123456789abcdef0123', now), SECRET, now)).toEqual({ ok: false, reason: 'forged' });
    expect(verifyUnsubscribeToken(`${id.replace(/^1/, '2')}.${exp}.${sig}`, SECRET, now)).toEqual({ ok: false, reason: 'forged' });
    expect(verifyUnsubscribeToken(`${id}.${Number(exp) + 86_400 * 365}.${sig}`, SECRET, now)).toEqual({ ok: false, reason: 'forged' });
    // a forged token with an old expiry is reported as forged, not merely expired
    expect(verifyUnsubscribeToken(`${id}.1.${sig}`, SECRET, now)).toEqual({ ok: false, reason: 'forged' });
  });

  it('refuses malformed input', () => {
    for (const bad of [undefined, null, '', 'abc', `${WATCH}.123`, `${WATCH}.x.${'a'.repeat(43)}`, `${WATCH}.123.${'a'.repeat(42)}`, `bad id.123.${'a'.repeat(43)}`]) {
      expect(verifyUnsubscribeToken(bad, SECRET, now)).toEqual({ ok: false, reason: 'malformed' });
    }
  });
});
