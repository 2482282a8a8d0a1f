import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { apiToken, importBatch, measurement } from '@/db/schema';
import { hashApiToken } from '@/lib/api/tokens';
import { createApiToken, revokeApiTokenAction } from '@/app/(app)/w/[workspace]/settings/tokens/actions';
import * as importsRoute from '@/app/api/v1/imports/route';
import * as importRoute from '@/app/api/v1/imports/[id]/route';
import * as materialsRoute from '@/app/api/v1/materials/route';
import * as materialRoute from '@/app/api/v1/materials/[id]/route';
import * as measurementsRoute from '@/app/api/v1/measurements/route';
import * as measurementRoute from '@/app/api/v1/measurements/[id]/route';
import * as sourceRoute from '@/app/api/v1/sources/[id]/route';
import * as methodsRoute from '@/app/api/v1/methods/route';
import * as calculationsRoute from '@/app/api/v1/calculations/route';
import * as openapiRoute from '@/app/api/v1/openapi.json/route';
import { callAction } from '../support/actions';
import { createWorkspaceWith, signInAs } from '../support/users';
import { seedCatalogue } from './import-fixtures';
import { apiRouteFiles, openApiPathOf } from '../support/api-server';

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
const BASE = 'http://localhost:3999/api/v1';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;
let cat: Awaited<ReturnType<typeof seedCatalogue>>;
let otherCat: Awaited<ReturnType<typeof seedCatalogue>>;
const tokens: Record<string, string> = {};

async function makeToken(email: string, workspaceId: string, role: string, name = `${role} pipeline`): Promise<string> {
  await signInAs(email);
  const out = await callAction(createApiToken, { workspaceId, name, role });
  expect(out.state?.ok, out.state?.message).toBe(true);
  return (out.state as unknown as { data: { token: string } }).data.token;
}

function call(handler: unknown, path: string, init: RequestInit & { token?: string } = {}, params: Record<string, string> = {}) {
  const headers = new Headers(init.headers);
  if (init.token) headers.set('authorization', `Bearer ${init.token}`);
  return (handler as Handler)(new Request(`${BASE}${path}`, { ...init, headers, duplex: 'half' } as RequestInit), { params: Promise.resolve(params) });
}

const jsonRows = (rows: unknown[], extra: object = {}) => JSON.stringify({ kind: 'measurements', fileName: 'rows.json', rows, ...extra });

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator', 'contributor', 'reviewer']);
  other = await createWorkspaceWith();
  cat = await seedCatalogue(ws.workspaceId);
  otherCat = await seedCatalogue(other.workspaceId);
  tokens.contributor = await makeToken(ws.members.contributor.email, ws.workspaceId, 'contributor');
  tokens.reviewer = await makeToken(ws.members.curator.email, ws.workspaceId, 'reviewer');
  tokens.other = await makeToken(other.owner.email, other.workspaceId, 'curator');
});

describe('API tokens', () => {
  it('are shown once, in the llt_<prefix>_<secret> format, and stored only as a SHA-256 hash', async () => {
    const token = tokens.contributor;
    expect(token).toMatch(/^llt_[a-z0-9]{8}_[A-Za-z0-9_-]{43}$/);
    const [row] = await db.select().from(apiToken).where(eq(apiToken.prefix, token.slice(4, 12)));
    expect(row.tokenHash).toBe(hashApiToken(token));
    expect(JSON.stringify(row)).not.toContain(token.slice(13));
  });

  it('cannot be created above the creator’s own role', async () => {
    await signInAs(ws.members.contributor.email);
    const out = await callAction(createApiToken, { workspaceId: ws.workspaceId, name: 'too strong', role: 'curator' });
    expect(out.state).toMatchObject({ ok: false, code: 'forbidden' });
  });

  it('are refused when missing, malformed, unknown or revoked (401), and record their last use', async () => {
    expect((await call(materialsRoute.GET, '/materials')).status).toBe(401);
    const anon = await call(materialsRoute.GET, '/materials');
    expect(anon.headers.get('content-type')).toBe('application/problem+json');
    expect(anon.headers.get('www-authenticate')).toMatch(/^Bearer/);
    expect((await call(materialsRoute.GET, '/materials', { token: 'llt_nope' })).status).toBe(401);
    expect((await call(materialsRoute.GET, '/materials', { token: `llt_abcdefgh_${'A'.repeat(43)}` })).status).toBe(401);

    const temp = await makeToken(ws.owner.email, ws.workspaceId, 'reviewer', 'short-lived');
    expect((await call(materialsRoute.GET, '/materials', { token: temp })).status).toBe(200);
    const [row] = await db.select().from(apiToken).where(eq(apiToken.tokenHash, hashApiToken(temp)));
    expect(row.lastUsedAt).toBeInstanceOf(Date);
    await signInAs(ws.owner.email);
    expect((await callAction(revokeApiTokenAction, { workspaceId: ws.workspaceId, tokenId: row.id })).state?.ok).toBe(true);
    expect((await call(materialsRoute.GET, '/materials', { token: temp })).status).toBe(401);
  });
});

describe('POST /api/v1/imports', () => {
  it('imports JSON rows (201) with counts, attributed to the token', async () => {
    const res = await call(importsRoute.POST, '/imports', {
      method: 'POST',
      token: tokens.contributor,
      headers: { 'content-type': 'application/json' },
      body: jsonRows([
        { material: 'GaN-wz', quantity: 'frequency', value: '569.0', unit: 'cm-1', irrep: 'E2(high)', source: 'azuhata1995' },
        { material: 'GaN-wz', quantity: 'frequency', value: 735, unit: 'cm-1', irrep: 'A1(LO)', source: 'azuhata1995' },
      ]),
    });
    expect(res.status).toBe(201);
    const body = await res.json();
    expect(body).toMatchObject({ rowCount: 2, insertedCount: 2, duplicateCount: 0 });
    expect(res.headers.get('location')).toBe(`/api/v1/imports/${body.importId}`);
    const [batch] = await db.select().from(importBatch).where(eq(importBatch.id, body.importId));
    expect(batch).toMatchObject({ via: 'api', createdBy: ws.members.contributor.id });
    expect(batch.createdByToken).toBeTruthy();
    const rows = await db.select().from(measurement).where(eq(measurement.importId, body.importId));
    expect(rows.map((r) => r.valueText).sort()).toEqual(['569.0', '735']);

    const got = await call(importRoute.GET, `/imports/${body.importId}`, { token: tokens.reviewer }, { id: body.importId });
    expect(await got.json()).toMatchObject({ id: body.importId, insertedCount: 2, status: 'committed', via: 'api' });
  });

  it('imports a CSV upload and refuses the same file again (409 with the first import)', async () => {
    const csv = 'material,quantity,value,unit,temperature_K,source\nSi,frequency,520.2,cm-1,300,azuhata1995\n';
    const post = () =>
      call(importsRoute.POST, '/imports?kind=measurements&fileName=si.csv', { method: 'POST', token: tokens.contributor, headers: { 'content-type': 'text/csv' }, body: csv });
    const first = await post();
    expect(first.status).toBe(201);
    const { importId } = await first.json();
    const again = await post();
    expect(again.status).toBe(409);
    expect(again.headers.get('content-type')).toBe('application/problem+json');
    expect(await again.json()).toMatchObject({ status: 409, firstImportId: importId });
  });

  it('answers 422 with every row error and writes nothing', async () => {
    const before = await db.$count(importBatch);
    const res = await call(importsRoute.POST, '/imports', {
      method: 'POST',
      token: tokens.contributor,
      headers: { 'content-type': 'application/json' },
      body: jsonRows([
        { material: 'GaN-wz', quantity: 'frequency', value: '-1', unit: 'cm-1', source: 'azuhata1995' },
        { material: 'Nope', quantity: 'frequency', value: '100', unit: 'furlongs', source: 'azuhata1995' },
        { material: 'GaN-wz', quantity: 'frequency', value: '100', unit: 'cm-1', source: 'azuhata1995', colour: 'red' },
      ]),
    });
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.errors).toEqual([{ row: 3, column: 'colour', reason: expect.stringMatching(/colour/i) }]);
    const res2 = await call(importsRoute.POST, '/imports', {
      method: 'POST',
      token: tokens.contributor,
      headers: { 'content-type': 'application/json' },
      body: jsonRows([
        { material: 'GaN-wz', quantity: 'frequency', value: '-1', unit: 'cm-1', source: 'azuhata1995' },
        { material: 'Nope', quantity: 'frequency', value: '100', unit: 'furlongs', source: 'azuhata1995' },
      ]),
    });
    const body2 = await res2.json();
    expect(res2.status).toBe(422);
    expect(body2.errorCount).toBe(3);
    expect(body2.errors.map((e: { row: number; column: string }) => [e.row, e.column])).toEqual([
      [1, 'value'],
      [2, 'material'],
      [2, 'unit'],
    ]);
    expect(await db.$count(importBatch)).toBe(before);
  });

  it('refuses a reviewer token (403)', async () => {
    const res = await call(importsRoute.POST, '/imports', {
      method: 'POST',
      token: tokens.reviewer,
      headers: { 'content-type': 'application/json' },
      body: jsonRows([{ material: 'Si', quantity: 'frequency', value: '1', unit: 'cm-1', source: 'azuhata1995' }]),
    });
    expect(res.status).toBe(403);
  });

  it('answers 413 for a body over IMPORT_MAX_BYTES, even when Content-Length lies', async () => {
    process.env.IMPORT_MAX_BYTES = '1000';
    try {
      let pulled = 0;
      const body = new ReadableStream<Uint8Array>({
        pull(controller) {
          pulled++;
          if (pulled > 1000) controller.close();
          else controller.enqueue(new TextEncoder().encode('Si,frequency,520,cm-1,300,azuhata1995\n'.repeat(10)));
        },
      });
      const before = await db.$count(importBatch);
      const res = await call(importsRoute.POST, '/imports?kind=measurements', {
        method: 'POST',
        token: tokens.contributor,
        headers: { 'content-type': 'text/csv', 'content-length': '10' },
        body,
      });
      expect(res.status).toBe(413);
      expect(res.headers.get('content-type')).toBe('application/problem+json');
      // Reading stopped right after the limit: a few chunks, not the whole stream.
      expect(pulled).toBeLessThan(10);
      expect(await db.$count(importBatch)).toBe(before);

      const declared = await call(importsRoute.POST, '/imports', {
        method: 'POST',
        token: tokens.contributor,
        headers: { 'content-type': 'application/json', 'content-length': '5000' },
        body: 'x'.repeat(5000),
      });
      expect(declared.status).toBe(413);
    } finally {
      delete process.env.IMPORT_MAX_BYTES;
    }
  });
});

describe('reads', () => {
  it('page materials, methods, measurements and calculations of the token’s workspace', async () => {
    const res = await call(materialsRoute.GET, '/materials?page=1&size=1', { token: tokens.reviewer });
    expect(res.status).toBe(200);
    const page = await res.json();
    expect(page).toMatchObject({ page: 1, size: 1, total: 2 });
    expect(page.items).toHaveLength(1);
    const methods = await (await call(methodsRoute.GET, '/methods', { token: tokens.reviewer })).json();
    expect(methods.items.map((m: { label: string }) => m.label)).toEqual(['PBEsol-PAW-600']);
    const ms = await (await call(measurementsRoute.GET, `/measurements?material=${cat.gan.id}&size=50`, { token: tokens.reviewer })).json();
    expect(ms.items.every((m: { materialId: string }) => m.materialId === cat.gan.id)).toBe(true);
    expect(ms.total).toBeGreaterThan(0);
    const one = await call(measurementRoute.GET, `/measurements/${ms.items[0].id}`, { token: tokens.reviewer }, { id: ms.items[0].id });
    expect((await one.json()).valueText).toBe(ms.items[0].valueText);
    expect((await call(calculationsRoute.GET, '/calculations?size=5000', { token: tokens.reviewer })).status).toBe(400);
  });

  it('answer 404 for another workspace’s ids', async () => {
    const m = await call(materialRoute.GET, `/materials/${otherCat.gan.id}`, { token: tokens.reviewer }, { id: otherCat.gan.id });
    expect(m.status).toBe(404);
    expect(m.headers.get('content-type')).toBe('application/problem+json');
    expect((await call(sourceRoute.GET, `/sources/${otherCat.src.id}`, { token: tokens.reviewer }, { id: otherCat.src.id })).status).toBe(404);
    const own = await call(materialRoute.GET, `/materials/${otherCat.gan.id}`, { token: tokens.other }, { id: otherCat.gan.id });
    expect(own.status).toBe(200);
    expect((await own.json()).name).toBe('GaN-wz');
  });
});

describe('GET /api/v1/openapi.json', () => {
  it('is public and an OpenAPI 3.1 document built from the zod schemas', async () => {
    const res = await openapiRoute.GET(new Request(`${BASE}/openapi.json`));
    expect(res.status).toBe(200);
    const doc = await res.json();
    expect(doc.openapi).toBe('3.1.0');
    expect(doc.paths['/imports'].post.responses).toHaveProperty('422');
    const rowProps = doc.components.schemas.ImportRequest.oneOf[0].properties.rows.items;
    expect(rowProps.additionalProperties).toBe(false);
    expect(Object.keys(rowProps.properties)).toContain('laser_nm');
  });

  it('lists every route file under app/api/v1 with each method it exports, and the Idempotency-Key on every POST', async () => {
    const doc = await (await openapiRoute.GET(new Request(`${BASE}/openapi.json`))).json();
    const files = apiRouteFiles();
    expect(files.length).toBeGreaterThan(20);
    const missing: string[] = [];
    for (const file of files) {
      const path = openApiPathOf(file);
      const mod = (await import(file)) as Record<string, unknown>;
      for (const method of ['GET', 'POST', 'PATCH', 'PUT', 'DELETE'].filter((m) => typeof mod[m] === 'function')) {
        const op = doc.paths[path]?.[method.toLowerCase()];
        if (!op) {
          missing.push(`${method} ${path}`);
          continue;
        }
        if (method === 'POST') expect(op.parameters.map((p: { name: string }) => p.name), path).toContain('Idempotency-Key');
      }
    }
    expect(missing).toEqual([]);
    // Every $ref points at a component that exists.
    const refs = [...JSON.stringify(doc).matchAll(/"#\/components\/schemas\/([A-Za-z]+)"/g)].map((m) => m[1]);
    for (const name of new Set(refs)) expect(doc.components.schemas, name).toHaveProperty(name);
    expect(doc.components.schemas.Verdict.properties.verdict.enum).toEqual(['pass', 'fail']);
  });
});

describe('Born charges through the API', () => {
  it('takes a tensor as nested arrays, stores its nine components with the diagonal mean, reads them back, and refuses a non-neutral cell', async () => {
    const rows = (zN: number) => [
      { material: 'GaN-wz', method: 'PBEsol-PAW-600', quantity: 'born-charge', site: 'Ga', tensor: [[2.6, 0, 0], [0, 2.6, 0], [0, 0, 2.74]], source: 'inhouse-2026' },
      { material: 'GaN-wz', method: 'PBEsol-PAW-600', quantity: 'born-charge', site: 'N', tensor: [zN, 0, 0, 0, zN, 0, 0, 0, -2.74], source: 'inhouse-2026' },
    ];
    const post = (zN: number, fileName: string) =>
      call(importsRoute.POST, '/imports', { method: 'POST', token: tokens.contributor, headers: { 'content-type': 'application/json' }, body: JSON.stringify({ kind: 'calculations', fileName, rows: rows(zN) }) });

    // N with +2.6 instead of −2.6 in xx and yy: diagonal means 2.64667 (Ga) + 0.82 (N) = 3.467 e per formula unit, far from neutral
    const refused = await post(2.6, 'born-wrong.json');
    expect(refused.status).toBe(422);
    expect(JSON.stringify(await refused.json())).toMatch(/sum to 3\.467 e in the diagonal mean per formula unit/);

    const res = await post(-2.6, 'born.json');
    expect(res.status).toBe(201);
    const body = await res.json();
    const list = await call(calculationsRoute.GET, `/calculations?quantity=born-charge`, { token: tokens.reviewer });
    const items = (await list.json()).items as Array<{ site: string; value: number; components: number[]; importId: string }>;
    const ga = items.find((c) => c.site === 'Ga' && c.importId === body.importId)!;
    expect(ga.components).toEqual([2.6, 0, 0, 0, 2.6, 0, 0, 0, 2.74]);
    expect(ga.value).toBeCloseTo(7.94 / 3, 10);
  });
});
