import { beforeAll, describe, expect, it } from 'vitest';
import { createApiToken } from '@/app/(app)/w/[workspace]/settings/tokens/actions';
import * as importsRoute from '@/app/api/v1/imports/route';
import * as materialsRoute from '@/app/api/v1/materials/route';
import * as membersRoute from '@/app/api/workspaces/[workspaceId]/members/route';
import * as wizardImportRoute from '@/app/api/workspaces/[workspaceId]/imports/route';
import * as healthRoute from '@/app/api/health/route';
import { callAction } from '../support/actions';
import { requestContext } from '../support/request-context';
import { createWorkspaceWith, signInAs } from '../support/users';
import { seedCatalogue } from './import-fixtures';

// Small limits for this file (read when the first request is counted).
process.env.API_RATE_LIMIT_MAX = '5';
process.env.API_RATE_LIMIT_WINDOW_SECONDS = '60';
process.env.IMPORT_CONCURRENCY_PER_WORKSPACE = '1';

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
const BASE = 'http://localhost:3999';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;

async function makeToken(email: string, workspaceId: string, name: string): Promise<string> {
  await signInAs(email);
  const out = await callAction(createApiToken, { workspaceId, name, role: 'contributor' });
  expect(out.state?.ok, out.state?.message).toBe(true);
  return (out.state as unknown as { data: { token: string } }).data.token;
}

function api(handler: unknown, path: string, token: string, init: RequestInit = {}) {
  const headers = new Headers(init.headers);
  headers.set('authorization', `Bearer ${token}`);
  return (handler as Handler)(new Request(`${BASE}${path}`, { ...init, headers, duplex: 'half' } as RequestInit), { params: Promise.resolve({}) });
}

/** A CSV body that arrives in two parts; the second only when `release` is called (an upload still in flight). */
function slowCsv(header: string, rows: string) {
  let release!: () => void;
  const gate = new Promise<void>((r) => (release = r));
  const body = new ReadableStream<Uint8Array>({
    async start(controller) {
      controller.enqueue(new TextEncoder().encode(header));
      await gate;
      controller.enqueue(new TextEncoder().encode(rows));
      controller.close();
    },
  });
  return { body, release };
}

beforeAll(async () => {
  ws = await createWorkspaceWith(['contributor']);
  await seedCatalogue(ws.workspaceId);
});

describe('per-token rate limit on /api/v1', () => {
  it('answers 429 problem+json with Retry-After past API_RATE_LIMIT_MAX; another token is not affected', async () => {
    const a = await makeToken(ws.owner.email, ws.workspaceId, 'pipeline a');
    const b = await makeToken(ws.owner.email, ws.workspaceId, 'pipeline b');
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++) statuses.push((await api(materialsRoute.GET, '/api/v1/materials', a)).status);
    expect(statuses).toEqual([200, 200, 200, 200, 200]);
    const refused = await api(materialsRoute.GET, '/api/v1/materials', a);
    expect(refused.status).toBe(429);
    expect(refused.headers.get('content-type')).toBe('application/problem+json');
    const retry = Number(refused.headers.get('retry-after'));
    expect(retry).toBeGreaterThan(0);
    expect(retry).toBeLessThanOrEqual(60);
    expect(((await refused.json()) as { detail: string }).detail).toMatch(/at most 5 per 60 s/);
    expect((await api(materialsRoute.GET, '/api/v1/materials', b)).status).toBe(200);
  });
});

describe('per-caller rate limit on the workspace routes', () => {
  it('counts a signed-in member’s requests and answers 429 with Retry-After', async () => {
    await signInAs(ws.members.contributor.email);
    const call = () =>
      (membersRoute.GET as Handler)(new Request(`${BASE}/api/workspaces/${ws.workspaceId}/members`, { headers: requestContext.headers() }), {
        params: Promise.resolve({ workspaceId: ws.workspaceId }),
      });
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) statuses.push((await call()).status);
    expect(statuses.slice(0, 5).every((s) => s !== 429)).toBe(true);
    expect(statuses[5]).toBe(429);
    expect(Number((await call()).headers.get('retry-after'))).toBeGreaterThan(0);
  });
});

describe('per-workspace import concurrency', () => {
  it('refuses a second import while one runs (429, Retry-After), through the API and the wizard alike', async () => {
    const token = await makeToken(ws.owner.email, ws.workspaceId, 'importer');
    const first = slowCsv('material,quantity,value,unit,irrep,source\n', '');
    const running = api(importsRoute.POST, '/api/v1/imports?kind=measurements&fileName=slow.csv', token, {
      method: 'POST',
      headers: { 'content-type': 'text/csv' },
      body: first.body,
    });
    await new Promise((r) => setTimeout(r, 50));

    const second = await api(importsRoute.POST, '/api/v1/imports?kind=measurements&fileName=other.csv', token, {
      method: 'POST',
      headers: { 'content-type': 'text/csv' },
      body: 'material,quantity,value,unit,irrep,source\n',
    });
    expect(second.status).toBe(429);
    expect(Number(second.headers.get('retry-after'))).toBeGreaterThan(0);
    expect(((await second.json()) as { detail: string }).detail).toMatch(/already has 1 import running \(at most 1 at once\)/);

    await signInAs(ws.owner.email);
    const headers = requestContext.headers();
    headers.set('content-type', 'text/csv');
    const wizard = await (wizardImportRoute.POST as Handler)(
      new Request(`${BASE}/api/workspaces/${ws.workspaceId}/imports?kind=measurements&fileName=w.csv`, { method: 'POST', headers, body: 'material\n' }),
      { params: Promise.resolve({ workspaceId: ws.workspaceId }) },
    );
    expect(wizard.status).toBe(429);

    first.release();
    expect((await running).status).not.toBe(429);
    // the slot is free again
    const after = await api(importsRoute.POST, '/api/v1/imports?kind=measurements&fileName=after.csv', token, {
      method: 'POST',
      headers: { 'content-type': 'text/csv' },
      body: 'material,quantity,value,unit,irrep,source\n',
    });
    expect(after.status).not.toBe(429);
  });
});

describe('GET /api/health', () => {
  it('reports the database and the job queue, and is not rate-limited', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 12; i++) statuses.push((await (healthRoute.GET as () => Promise<Response>)()).status);
    expect(statuses.every((s) => s === 200)).toBe(true);
    const body = (await (await (healthRoute.GET as () => Promise<Response>)()).json()) as Record<string, { status: string }>;
    expect(body).toMatchObject({ status: 'ok', database: { status: 'ok' }, recomputeQueue: { status: 'ok' } });
    // MAIL_WORKER_INTERVAL_MS=0 in these tests: the worker is switched off on purpose, which is not a failure
    expect(body.mailWorker.status).toBe('disabled');
  });
});
