/**
 * Enumerates every server action (each actions.ts under app/) and route handler (each route.ts under app/)
 * and checks that an anonymous call and a call from a member of another workspace
 * are refused and write nothing. New files are covered automatically.
 */
import { readdirSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { getClient } from '@/db/client';
import { actionScope } from '@/lib/action';
import { requirePageMember } from '@/lib/session';
import { requestContext } from '../support/request-context';
import { createWorkspaceWith, signInAs } from '../support/users';

const appDir = join(process.cwd(), 'app');
const files = readdirSync(appDir, { recursive: true, encoding: 'utf8' }).map((f) => join(appDir, f));
const componentsDir = join(process.cwd(), 'components');
const componentFiles = readdirSync(componentsDir, { recursive: true, encoding: 'utf8' }).map((f) => join(componentsDir, f));
// Server actions: every actions.ts under app/ and components/ (feature components may carry their own).
const actionFiles = [...files, ...componentFiles].filter((f) => f.endsWith(`${sep}actions.ts`));
const routeFiles = files.filter((f) => f.endsWith(`${sep}route.ts`) && !relative(appDir, f).startsWith(join('api', 'auth')));

/** Routes that are public on purpose (no data of any workspace), with the reason. */
const PUBLIC_ROUTES: Record<string, string> = {
  'GET /api/v1/openapi.json': 'the API description, the same for everyone',
  'POST /api/unsubscribe': 'one-click unsubscribe authenticated by its signed token (RFC 8058)',
  'GET /api/health': 'liveness for operators and load balancers: counts and statuses, no workspace data',
};

const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;

// Tables whose rows change on sign-in or rate limiting, not on data writes.
const IGNORED_TABLES = new Set(['session', 'rate_limit', 'verification', '__drizzle_migrations']);

async function snapshot(): Promise<Record<string, number>> {
  const client = getClient();
  const { rows } = await client.execute("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%'");
  const counts: Record<string, number> = {};
  for (const r of rows) {
    const name = String(r.name);
    if (IGNORED_TABLES.has(name)) continue;
    counts[name] = Number((await client.execute(`SELECT count(*) AS c FROM "${name}"`)).rows[0].c);
  }
  return counts;
}

function urlPath(file: string): string {
  return '/' + relative(appDir, file).split(sep).slice(0, -1).filter((s) => !s.startsWith('(')).join('/');
}

let victim: Awaited<ReturnType<typeof createWorkspaceWith>>;
let attacker: Awaited<ReturnType<typeof createWorkspaceWith>>;

beforeAll(async () => {
  victim = await createWorkspaceWith(['curator']);
  attacker = await createWorkspaceWith();
});

function formFor(workspaceId: string): FormData {
  const form = new FormData();
  // plausible values for common fields, so a refusal cannot be a mere validation error
  const fields: Record<string, string> = { workspaceId, id: 'x', memberId: 'x', invitationId: 'x', reason: 'test', name: 'Probe', slug: 'probe-slug', email: 'probe@example.org', role: 'reviewer' };
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  return form;
}

describe('every server action', () => {
  it('exists at all (the enumeration found the app)', () => {
    expect(actionFiles.length).toBeGreaterThan(0);
  });

  for (const file of actionFiles) {
    const name = relative(process.cwd(), file);
    it(`${name}: every export is gated, refuses anonymous and cross-workspace calls, writes nothing`, async () => {
      const mod = (await import(file)) as Record<string, unknown>;
      const actions = Object.entries(mod).filter(([, v]) => typeof v === 'function') as Array<[string, (p: unknown, f: FormData) => Promise<{ ok: boolean; code?: string }>]>;
      expect(actions.length).toBeGreaterThan(0);
      for (const [exportName, action] of actions) {
        const scope = actionScope(action);
        expect(scope, `${name} → ${exportName} must be built with workspaceAction or userAction`).toBeDefined();

        requestContext.anonymous();
        let before = await snapshot();
        const anon = await action(undefined, formFor(victim.workspaceId));
        expect(anon, `${exportName} anonymous`).toMatchObject({ ok: false, code: 'unauthorized' });
        expect(await snapshot(), `${exportName} anonymous wrote something`).toEqual(before);

        if (scope === 'workspace') {
          await signInAs(attacker.owner.email);
          before = await snapshot();
          const cross = await action(undefined, formFor(victim.workspaceId));
          expect(cross, `${exportName} cross-workspace`).toMatchObject({ ok: false, code: 'not-found' });
          expect(await snapshot(), `${exportName} cross-workspace wrote something`).toEqual(before);
        }
      }
    });
  }
});

describe('every route handler', () => {
  for (const file of routeFiles) {
    const path = urlPath(file);
    it(`${path}: refuses anonymous and cross-workspace requests, writes nothing`, async () => {
      const mod = (await import(file)) as Record<string, unknown>;
      const handlers = METHODS.filter((m) => typeof mod[m] === 'function');
      expect(handlers.length).toBeGreaterThan(0);
      for (const method of handlers) {
        if (PUBLIC_ROUTES[`${method} ${path}`]) continue;
        const handler = mod[method] as (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
        const params: Record<string, string> = {};
        for (const seg of path.split('/')) {
          const m = seg.match(/^\[(?:\.\.\.)?(\w+)\]$/);
          if (m) params[m[1]] = m[1] === 'workspaceId' ? victim.workspaceId : `probe-${m[1]}`;
        }
        const concrete = path.replace(/\[(?:\.\.\.)?(\w+)\]/g, (_, k: string) => params[k]);
        const makeRequest = () => {
          const headers = requestContext.headers();
          const init: RequestInit = { method, headers };
          if (method !== 'GET' && method !== 'DELETE') {
            headers.set('content-type', 'application/json');
            init.body = JSON.stringify({ workspaceId: victim.workspaceId, rows: [] });
          }
          return new Request(`http://localhost:3999${concrete}`, init);
        };

        requestContext.anonymous();
        let before = await snapshot();
        const anon = await handler(makeRequest(), { params: Promise.resolve(params) });
        expect(anon.status, `${method} ${path} anonymous`).toBe(401);
        expect(await snapshot()).toEqual(before);

        await signInAs(attacker.owner.email);
        before = await snapshot();
        const cross = await handler(makeRequest(), { params: Promise.resolve(params) });
        expect([401, 403, 404], `${method} ${path} cross-workspace answered ${cross.status}`).toContain(cross.status);
        expect(await snapshot()).toEqual(before);
      }
    });
  }
});

/** Bearer-token routes: a cookie is never read there, so a foreign page cannot borrow one. */
const BEARER_PREFIX = '/api/v1/';
const STATE_CHANGING = ['POST', 'PUT', 'PATCH', 'DELETE'] as const;

const changingCookieRoutes: string[] = [];
for (const file of routeFiles) {
  if (urlPath(file).startsWith(BEARER_PREFIX)) continue;
  const mod = (await import(file)) as Record<string, unknown>;
  if (STATE_CHANGING.some((m) => typeof mod[m] === 'function' && !PUBLIC_ROUTES[`${m} ${urlPath(file)}`])) changingCookieRoutes.push(file);
}

describe('every state-changing cookie-authenticated route handler', () => {
  const cookieRoutes = changingCookieRoutes;

  it('includes the import upload (the enumeration found them)', () => {
    expect(cookieRoutes.map(urlPath)).toContain('/api/workspaces/[workspaceId]/imports');
  });

  for (const file of cookieRoutes) {
    const path = urlPath(file);
    it(`${path}: refuses a signed-in member's request from another origin (403 problem+json), writes nothing`, async () => {
      const mod = (await import(file)) as Record<string, unknown>;
      for (const method of STATE_CHANGING) {
        if (typeof mod[method] !== 'function' || PUBLIC_ROUTES[`${method} ${path}`]) continue;
        const handler = mod[method] as (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
        const params: Record<string, string> = {};
        for (const seg of path.split('/')) {
          const m = seg.match(/^\[(?:\.\.\.)?(\w+)\]$/);
          if (m) params[m[1]] = m[1] === 'workspaceId' ? victim.workspaceId : `probe-${m[1]}`;
        }
        const concrete = path.replace(/\[(?:\.\.\.)?(\w+)\]/g, (_, k: string) => params[k]);
        // A member of the workspace, signed in: only the origin is wrong.
        await signInAs(victim.owner.email);
        const attempts: Array<[string, Record<string, string>]> = [
          ['a page on another port of the same host, text/plain body', { origin: 'http://localhost:4000', 'content-type': 'text/plain' }],
          ['a form on another site', { origin: 'https://evil.example', 'content-type': 'application/x-www-form-urlencoded' }],
          ['an opaque origin', { origin: 'null', 'content-type': 'text/plain' }],
          ['no Origin, Sec-Fetch-Site cross-site', { 'sec-fetch-site': 'cross-site', 'content-type': 'text/plain' }],
          ['no Origin, Sec-Fetch-Site same-site', { 'sec-fetch-site': 'same-site', 'content-type': 'text/plain' }],
          ['neither header', { 'content-type': 'text/plain' }],
        ];
        for (const [what, extra] of attempts) {
          const headers = requestContext.headers();
          headers.delete('origin');
          for (const [k, v] of Object.entries(extra)) headers.set(k, v);
          const before = await snapshot();
          const res = await handler(new Request(`http://localhost:3999${concrete}?kind=measurements&fileName=x.csv`, { method, headers, body: 'material,quantity\nGaN,frequency\n' }), {
            params: Promise.resolve(params),
          });
          expect(res.status, `${method} ${path}: ${what}`).toBe(403);
          expect(res.headers.get('content-type')).toBe('application/problem+json');
          expect(((await res.json()) as { detail: string }).detail).toMatch(/Cross-site request refused/);
          expect(await snapshot(), `${method} ${path}: ${what} wrote something`).toEqual(before);
        }
        // The same request from the app's own origin is not refused for its origin.
        const headers = requestContext.headers();
        headers.set('content-type', 'text/plain');
        const own = await handler(new Request(`http://localhost:3999${concrete}?kind=measurements&fileName=x.csv`, { method, headers, body: 'material\n' }), {
          params: Promise.resolve(params),
        });
        expect(own.status).not.toBe(403);
      }
    });
  }
});

describe('workspace pages', () => {
  it("send a member of another workspace to 404, an anonymous visitor to sign-in", async () => {
    await signInAs(attacker.owner.email);
    await expect(requirePageMember(victim.slug, 'materials:read')).rejects.toMatchObject({ digest: expect.stringMatching(/^NEXT_HTTP_ERROR_FALLBACK;404/) });
    requestContext.anonymous();
    await expect(requirePageMember(victim.slug, 'materials:read')).rejects.toMatchObject({ digest: expect.stringMatching(/^NEXT_REDIRECT/) });
  });
});
