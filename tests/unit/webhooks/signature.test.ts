import { describe, expect, it } from 'vitest';
import { hmacSha256Hex, signedHeaders, verifyWebhook, webhookSignature, generateWebhookSecret, WEBHOOK_HEADERS } from '@/lib/webhooks/signature';
import { openSecret, sealSecret, secretBoxKey } from '@/lib/webhooks/secret-box';

const BODY = '{"id":"d3b07384-0000-4000-8000-000000000001","type":"benchmark.shifted"}';
const SECRET = 'whsec_example-secret-for-the-readme';
const TS = 1767225600; // 2026-01-01T00:00:00Z

describe('webhook signature', () => {
  it('is HMAC-SHA256 itself: RFC 4231 test case 2 (key "Jefe")', () => {
    // RFC 4231 §4.3, HMAC-SHA-256 of "what do ya want for nothing?"; the same value from
    // `printf '%s' 'what do ya want for nothing?' | openssl dgst -sha256 -hmac 'Jefe'`
    expect(hmacSha256Hex('Jefe', 'what do ya want for nothing?')).toBe('5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843');
    // and fed in parts, as webhookSignature feeds the timestamp and the body
    expect(hmacSha256Hex(Buffer.from('Jefe'), 'what do ya ', Buffer.from('want for nothing?'))).toBe('5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843');
  });

  it('signs `<timestamp>.<body>`: a worked example computed with openssl', () => {
    // printf '%s' '1767225600.{"id":"d3b07384-0000-4000-8000-000000000001","type":"benchmark.shifted"}' \
    //   | openssl dgst -sha256 -hmac 'whsec_example-secret-for-the-readme'
    expect(webhookSignature(SECRET, TS, BODY)).toBe('853c1e81f254dd53deab8b4c55ecb5218e0b7068bc6c795621eac09e04b16937');
    expect(webhookSignature(SECRET, String(TS), Buffer.from(BODY))).toBe('853c1e81f254dd53deab8b4c55ecb5218e0b7068bc6c795621eac09e04b16937');
  });

  it('puts id, timestamp, signature and attempt in the headers', () => {
    const h = signedHeaders({ id: 'row-1', secret: SECRET, body: BODY, now: new Date(TS * 1000 + 999), attempt: 3 });
    expect(h).toEqual({
      'Ledger-Webhook-Id': 'row-1',
      'Ledger-Webhook-Timestamp': String(TS),
      'Ledger-Webhook-Signature': 'sha256=853c1e81f254dd53deab8b4c55ecb5218e0b7068bc6c795621eac09e04b16937',
      'Ledger-Webhook-Attempt': '3',
    });
  });

  it('verifies a good delivery, with headers in any case, and refuses altered ones', () => {
    const h = signedHeaders({ id: 'row-1', secret: SECRET, body: BODY, now: new Date(TS * 1000), attempt: 1 });
    const lower = Object.fromEntries(Object.entries(h).map(([k, v]) => [k.toLowerCase(), v]));
    const now = new Date((TS + 60) * 1000);
    expect(verifyWebhook({ secret: SECRET, headers: lower, body: BODY, now })).toEqual({ ok: true, id: 'row-1', timestamp: TS });
    expect(verifyWebhook({ secret: SECRET, headers: new Headers(h), body: BODY, now }).ok).toBe(true);
    expect(verifyWebhook({ secret: SECRET, headers: h, body: BODY + ' ', now })).toEqual({ ok: false, reason: 'bad-signature' });
    expect(verifyWebhook({ secret: 'whsec_other', headers: h, body: BODY, now })).toEqual({ ok: false, reason: 'bad-signature' });
    // a replayed timestamp with the old signature does not match a new timestamp
    expect(verifyWebhook({ secret: SECRET, headers: { ...h, [WEBHOOK_HEADERS.timestamp]: String(TS + 1) }, body: BODY, now }).ok).toBe(false);
  });

  it('refuses a timestamp outside the tolerance, either way', () => {
    const h = signedHeaders({ id: 'row-1', secret: SECRET, body: BODY, now: new Date(TS * 1000), attempt: 1 });
    expect(verifyWebhook({ secret: SECRET, headers: h, body: BODY, now: new Date((TS + 301) * 1000) })).toEqual({ ok: false, reason: 'stale' });
    expect(verifyWebhook({ secret: SECRET, headers: h, body: BODY, now: new Date((TS - 301) * 1000) })).toEqual({ ok: false, reason: 'stale' });
    expect(verifyWebhook({ secret: SECRET, headers: h, body: BODY, now: new Date((TS + 300) * 1000) }).ok).toBe(true);
    expect(verifyWebhook({ secret: SECRET, headers: h, body: BODY, now: new Date((TS + 30) * 1000), toleranceSeconds: 10 }).ok).toBe(false);
  });

  it('refuses missing and malformed headers', () => {
    const h = signedHeaders({ id: 'row-1', secret: SECRET, body: BODY, now: new Date(TS * 1000), attempt: 1 });
    const now = new Date(TS * 1000);
    const without = (k: string) => Object.fromEntries(Object.entries(h).filter(([key]) => key !== k));
    expect(verifyWebhook({ secret: SECRET, headers: without(WEBHOOK_HEADERS.signature), body: BODY, now }).ok).toBe(false);
    expect(verifyWebhook({ secret: SECRET, headers: without(WEBHOOK_HEADERS.id), body: BODY, now })).toEqual({ ok: false, reason: 'missing-header' });
    expect(verifyWebhook({ secret: SECRET, headers: { ...h, [WEBHOOK_HEADERS.signature]: 'sha1=abc' }, body: BODY, now })).toEqual({ ok: false, reason: 'malformed' });
    expect(verifyWebhook({ secret: SECRET, headers: { ...h, [WEBHOOK_HEADERS.timestamp]: '12e3' }, body: BODY, now })).toEqual({ ok: false, reason: 'malformed' });
  });

  it('makes distinct, prefixed secrets of 32 random bytes', () => {
    const a = generateWebhookSecret();
    const b = generateWebhookSecret();
    expect(a).toMatch(/^whsec_[\w-]{43}$/);
    expect(a).not.toBe(b);
  });
});

describe('signing secrets at rest', () => {
  const key = secretBoxKey('a-key-of-at-least-thirty-two-characters!');
  it('opens what it sealed, for the same watch and key only', () => {
    const sealed = sealSecret('whsec_abc', key, 'watch-1');
    expect(sealed).toMatch(/^v1\./);
    expect(sealed).not.toContain('whsec_abc');
    expect(openSecret(sealed, key, 'watch-1')).toBe('whsec_abc');
    expect(openSecret(sealed, key, 'watch-2')).toBeNull();
    expect(openSecret(sealed, secretBoxKey('another-key-of-at-least-thirty-two-chars'), 'watch-1')).toBeNull();
    const parts = sealed.split('.');
    parts[3] = Buffer.from('tampered').toString('base64url');
    expect(openSecret(parts.join('.'), key, 'watch-1')).toBeNull();
    expect(openSecret('garbage', key, 'watch-1')).toBeNull();
  });
  it('uses a fresh nonce each time', () => {
    expect(sealSecret('s', key, 'w')).not.toBe(sealSecret('s', key, 'w'));
  });
});
