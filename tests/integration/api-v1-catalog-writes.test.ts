import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, material } from '@/db/schema';
import * as materialsRoute from '@/app/api/v1/materials/route';
import * as materialRoute from '@/app/api/v1/materials/[id]/route';
import * as methodsRoute from '@/app/api/v1/methods/route';
import * as methodRoute from '@/app/api/v1/methods/[id]/route';
import * as sourcesRoute from '@/app/api/v1/sources/route';
import * as sourceRoute from '@/app/api/v1/sources/[id]/route';
import { createWorkspaceWith } from '../support/users';
import { makeToken } from './api-workflow-fixtures';

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
const BASE = 'http://localhost:3999/api/v1';

function send(handler: unknown, method: 'POST' | 'PATCH', path: string, token: string, body: unknown, params: Record<string, string> = {}, headers: Record<string, string> = {}) {
  return (handler as Handler)(
    new Request(`${BASE}${path}`, { method, headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json', ...headers }, body: JSON.stringify(body) }),
    { params: Promise.resolve(params) },
  );
}

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;
let token: string;
let reviewer: string;
let otherToken: string;

beforeAll(async () => {
  ws = await createWorkspaceWith(['contributor']);
  other = await createWorkspaceWith();
  token = await makeToken(ws.members.contributor.email, ws.workspaceId, 'contributor');
  reviewer = await makeToken(ws.owner.email, ws.workspaceId, 'reviewer');
  otherToken = await makeToken(other.owner.email, other.workspaceId, 'curator');
});

describe('POST and PATCH /api/v1/materials', () => {
  let id: string;

  it('creates one material (201, Location), derived fields and an audit entry by the token', async () => {
    const res = await send(materialsRoute.POST, 'POST', '/materials', token, { name: 'GaN-wz', formula: 'GaN', spaceGroup: 186, atomsInCell: 4, tags: ['nitride', 'Wurtzite'] });
    expect(res.status).toBe(201);
    const body = await res.json();
    id = body.id;
    expect(res.headers.get('location')).toBe(`/api/v1/materials/${id}`);
    expect(body).toMatchObject({ name: 'GaN-wz', formula: 'GaN', reducedFormula: 'GaN', spaceGroup: 186, crystalSystem: 'hexagonal', atomsInCell: 4, tags: ['nitride', 'wurtzite'] });
    const [audit] = await db.select().from(auditLog).where(and(eq(auditLog.entityId, id), eq(auditLog.action, 'create')));
    expect(audit.workspaceId).toBe(ws.workspaceId);
  });

  it('refuses a taken name with 409 naming the field', async () => {
    const res = await send(materialsRoute.POST, 'POST', '/materials', token, { name: 'GaN-wz', formula: 'GaN' });
    expect(res.status).toBe(409);
    expect(res.headers.get('content-type')).toBe('application/problem+json');
    expect(await res.json()).toMatchObject({ field: 'name' });
  });

  it('refuses invalid fields with 422 and every field path, writing nothing', async () => {
    const before = await db.$count(material, eq(material.workspaceId, ws.workspaceId));
    const res = await send(materialsRoute.POST, 'POST', '/materials', token, { name: 'Bad one', formula: 'Qq2', spaceGroup: 231, colour: 'red' });
    expect(res.status).toBe(422);
    expect(res.headers.get('content-type')).toBe('application/problem+json');
    const problem = await res.json();
    expect(problem.fields.map((f: { path: string }) => f.path).sort()).toEqual(['colour', 'formula', 'name', 'spaceGroup']);
    expect(problem.fields.find((f: { path: string }) => f.path === 'spaceGroup').message).toBe('The space group must be between 1 and 230.');
    expect(await db.$count(material, eq(material.workspaceId, ws.workspaceId))).toBe(before);
  });

  it('PATCH changes only the fields sent, null clears one, and the whole is validated again', async () => {
    const res = await send(materialRoute.PATCH, 'PATCH', `/materials/${id}`, token, { displayName: 'Gallium nitride (wurtzite)', atomsInCell: null }, { id });
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ name: 'GaN-wz', formula: 'GaN', spaceGroup: 186, displayName: 'Gallium nitride (wurtzite)', atomsInCell: null, tags: ['nitride', 'wurtzite'] });
    const bad = await send(materialRoute.PATCH, 'PATCH', `/materials/${id}`, token, { spaceGroup: 0 }, { id });
    expect(bad.status).toBe(422);
    expect((await bad.json()).fields).toEqual([{ path: 'spaceGroup', message: 'The space group must be between 1 and 230.' }]);
  });

  it('PATCH to a taken name is 409; another workspace’s id is 404', async () => {
    await send(materialsRoute.POST, 'POST', '/materials', token, { name: 'Si', formula: 'Si', spaceGroup: 227 });
    expect((await send(materialRoute.PATCH, 'PATCH', `/materials/${id}`, token, { name: 'Si' }, { id })).status).toBe(409);
    const theirs = await send(materialRoute.PATCH, 'PATCH', `/materials/${id}`, otherToken, { displayName: 'mine now' }, { id });
    expect(theirs.status).toBe(404);
    expect(theirs.headers.get('content-type')).toBe('application/problem+json');
  });

  it('a reviewer token may not create or change (403)', async () => {
    const post = await send(materialsRoute.POST, 'POST', '/materials', reviewer, { name: 'AlN', formula: 'AlN' });
    expect(post.status).toBe(403);
    expect(post.headers.get('content-type')).toBe('application/problem+json');
    expect((await send(materialRoute.PATCH, 'PATCH', `/materials/${id}`, reviewer, { displayName: 'x' }, { id })).status).toBe(403);
  });

  it('a retried POST with the same Idempotency-Key creates one material and replays its 201', async () => {
    const body = { name: 'ZnO-wz', formula: 'ZnO', spaceGroup: 186 };
    const first = await send(materialsRoute.POST, 'POST', '/materials', token, body, {}, { 'idempotency-key': 'zno-1' });
    const again = await send(materialsRoute.POST, 'POST', '/materials', token, body, {}, { 'idempotency-key': 'zno-1' });
    expect(first.status).toBe(201);
    expect(again.status).toBe(201);
    expect(again.headers.get('idempotency-replayed')).toBe('true');
    expect((await again.json()).id).toBe((await first.json()).id);
    expect(await db.$count(material, and(eq(material.workspaceId, ws.workspaceId), eq(material.name, 'ZnO-wz')))).toBe(1);
  });

  it('refuses a body that is not a JSON object (400)', async () => {
    const res = await (materialsRoute.POST as Handler)(
      new Request(`${BASE}/materials`, { method: 'POST', headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' }, body: '[1,2' }),
      { params: Promise.resolve({}) },
    );
    expect(res.status).toBe(400);
    expect(res.headers.get('content-type')).toBe('application/problem+json');
  });
});

describe('POST and PATCH /api/v1/methods', () => {
  it('creates a method with grids as arrays or text, and names a bad grid on PATCH', async () => {
    const res = await send(methodsRoute.POST, 'POST', '/methods', token, { label: 'PBEsol-PAW-600', functional: 'PBEsol', cutoffEv: 600, kGrid: [8, 8, 8], qGrid: '4x4x4', approach: 'perturbation' });
    expect(res.status).toBe(201);
    const m = await res.json();
    expect(m).toMatchObject({ label: 'PBEsol-PAW-600', kGrid: [8, 8, 8], qGrid: [4, 4, 4], approach: 'perturbation' });
    const patched = await send(methodRoute.PATCH, 'PATCH', `/methods/${m.id}`, token, { smearing: 'gaussian 0.01' }, { id: m.id });
    expect(patched.status).toBe(200);
    expect(await patched.json()).toMatchObject({ kGrid: [8, 8, 8], cutoffEv: 600, smearing: 'gaussian 0.01' });
    const bad = await send(methodRoute.PATCH, 'PATCH', `/methods/${m.id}`, token, { kGrid: '8x8' }, { id: m.id });
    expect(bad.status).toBe(422);
    expect((await bad.json()).fields.map((f: { path: string }) => f.path)).toEqual(['kGrid']);
    expect((await send(methodsRoute.POST, 'POST', '/methods', token, { label: 'PBEsol-PAW-600', functional: 'PBE' })).status).toBe(409);
  });
});

describe('POST and PATCH /api/v1/sources', () => {
  it('creates a source with its authors, keeps them on PATCH, and refuses a taken cite key', async () => {
    const res = await send(sourcesRoute.POST, 'POST', '/sources', token, {
      kind: 'journal-article',
      citeKey: 'invented2026',
      title: 'An invented study of phonons',
      authors: [{ family: 'Doe', given: 'Jane' }, 'Roe, Richard'],
      year: 2026,
      doi: 'https://doi.org/10.9999/INVENTED.1',
    });
    expect(res.status).toBe(201);
    const s = await res.json();
    expect(s).toMatchObject({ citeKey: 'invented2026', doi: '10.9999/invented.1', year: 2026 });
    expect(s.authorList).toEqual([{ family: 'Doe', given: 'Jane' }, { family: 'Roe', given: 'Richard' }]);
    const patched = await send(sourceRoute.PATCH, 'PATCH', `/sources/${s.id}`, token, { venue: 'J. Invented Phys.', pages: '712--716' }, { id: s.id });
    expect(patched.status).toBe(200);
    expect(await patched.json()).toMatchObject({ venue: 'J. Invented Phys.', pages: '712–716', authorList: s.authorList, title: s.title });
    const taken = await send(sourcesRoute.POST, 'POST', '/sources', token, { kind: 'journal-article', citeKey: 'invented2026', title: 'Another' });
    expect(taken.status).toBe(409);
    const noTitle = await send(sourcesRoute.POST, 'POST', '/sources', token, { kind: 'journal-article', citeKey: 'untitled1' });
    expect(noTitle.status).toBe(422);
    expect((await noTitle.json()).fields.map((f: { path: string }) => f.path)).toEqual(['title']);
  });
});
