import { describe, expect, inject, it } from 'vitest';

// Issue 11, item 6: the headers of a page, an API route and a static file of the built app.

const base = inject('baseURL');

async function get(path: string, headers: Record<string, string> = {}) {
  const res = await fetch(`${base}${path}`, { headers, redirect: 'manual' });
  return { res, text: await res.text() };
}

describe('security headers', () => {
  it('a page: a nonce-based policy whose nonce is on every script, fresh per request, no eval or inline script allowed', async () => {
    const { res, text } = await get('/sign-in');
    expect(res.status).toBe(200);
    const policy = res.headers.get('content-security-policy')!;
    const nonce = /'nonce-([A-Za-z0-9+/=]+)'/.exec(policy)?.[1];
    expect(nonce).toBeDefined();
    const scriptSrc = policy.split(';').find((d) => d.trim().startsWith('script-src'))!;
    expect(scriptSrc).not.toMatch(/unsafe-inline|unsafe-eval/);
    expect(policy).toMatch(/object-src 'none'/);
    expect(policy).toMatch(/frame-ancestors 'none'/);
    const scripts = [...text.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
    expect(scripts.length).toBeGreaterThan(2);
    for (const tag of scripts) expect(tag, tag).toContain(`nonce="${nonce}"`);
    const again = await get('/sign-in');
    expect(again.res.headers.get('content-security-policy')).not.toContain(nonce);
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    // Plain http here: no HSTS, and the session cookie cannot be Secure.
    expect(res.headers.get('strict-transport-security')).toBeNull();

    // A workspace page without a session redirects with the policy too.
    const redirect = await get('/w/anything');
    expect(redirect.res.status).toBe(307);
    expect(redirect.res.headers.get('content-security-policy')).toMatch(/'nonce-/);
  });

  it('an API route: a policy that loads nothing', async () => {
    const { res } = await get('/api/v1/openapi.json');
    expect(res.status).toBe(200);
    expect(res.headers.get('content-security-policy')).toBe("default-src 'none'; frame-ancestors 'none'");
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
  });

  it('HSTS on a page, an API route and a static file when the request came over https', async () => {
    const page = await get('/sign-in');
    const asset = /src="(\/_next\/static\/[^"]+\.js)"/.exec(page.text)?.[1];
    expect(asset).toBeDefined();
    const staticFile = await get(asset!);
    expect(staticFile.res.status).toBe(200);
    expect(staticFile.res.headers.get('x-content-type-options')).toBe('nosniff');
    expect(staticFile.res.headers.get('strict-transport-security')).toBeNull();
    for (const path of ['/sign-in', '/api/v1/openapi.json', asset!]) {
      const { res } = await get(path, { 'x-forwarded-proto': 'https' });
      expect(res.headers.get('strict-transport-security'), path).toBe('max-age=63072000; includeSubDomains');
    }
  });
});
