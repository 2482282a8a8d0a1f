import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { calculation, idempotencyKey, importBatch } from '@/db/schema';
import * as importsRoute from '@/app/api/v1/imports/route';
import * as verdictRoute from '@/app/api/v1/benchmarks/[id]/methods/[methodId]/verdict/route';
import { pruneIdempotencyKeys } from '@/db/queries/idempotency';
import { createWorkspaceWith } from '../support/users';
import { calculationsCsv, makeToken, seedWorkflow } from './api-workflow-fixtures';

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
const BASE = 'http://localhost:3999/api/v1';

function post(token: string, body: string, key: string | null, query = '?kind=calculations&fileName=runs.csv') {
  const headers = new Headers({ authorization: `Bearer ${token}`, 'content-type': 'text/csv' });
  if (key !== null) headers.set('idempotency-key', key);
  return (importsRoute.POST as Handler)(new Request(`${BASE}/imports${query}`, { method: 'POST', headers, body }), { params: Promise.resolve({}) });
}

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;
let token: string;
let token2: string;
let otherToken: string;
const countBatches = (workspaceId: string) => db.$count(importBatch, eq(importBatch.workspaceId, workspaceId));

beforeAll(async () => {
  process.env.RECOMPUTE_DEBOUNCE_MS = '50';
  ws = await createWorkspaceWith(['contributor']);
  other = await createWorkspaceWith();
  await seedWorkflow(ws.workspaceId, ws.owner.id);
  await seedWorkflow(other.workspaceId, other.owner.id);
  token = await makeToken(ws.members.contributor.email, ws.workspaceId, 'contributor');
  token2 = await makeToken(ws.members.contributor.email, ws.workspaceId, 'contributor', 'second pipeline');
  otherToken = await makeToken(other.owner.email, other.workspaceId, 'contributor');
});

describe('Idempotency-Key on POST /api/v1/imports', () => {
  it('a retried import never imports twice: the stored 201 is replayed', async () => {
    const csv = calculationsCsv(['Inv-A'], () => 3);
    const first = await post(token, csv, 'retry-1');
    expect(first.status).toBe(201);
    const body = await first.json();
    expect(first.headers.get('idempotency-replayed')).toBeNull();
    const before = await countBatches(ws.workspaceId);

    const retry = await post(token, csv, 'retry-1');
    expect(retry.status).toBe(201);
    expect(retry.headers.get('idempotency-replayed')).toBe('true');
    expect(retry.headers.get('location')).toBe(`/api/v1/imports/${body.importId}`);
    expect(await retry.json()).toEqual(body);
    expect(await countBatches(ws.workspaceId)).toBe(before);
    expect(await db.$count(calculation, eq(calculation.importId, body.importId))).toBe(2);

    // Without the key the same file is the existing "already imported" refusal, not a second import.
    const noKey = await post(token, csv, null);
    expect(noKey.status).toBe(409);
    expect(await countBatches(ws.workspaceId)).toBe(before);
  });

  it('the same key with a different body (or query) is 422 problem+json, and nothing runs', async () => {
    const csv = calculationsCsv(['Inv-B'], () => 3);
    expect((await post(token, csv, 'reused')).status).toBe(201);
    const before = await countBatches(ws.workspaceId);
    const changed = await post(token, calculationsCsv(['Inv-C'], () => 3), 'reused');
    expect(changed.status).toBe(422);
    expect(changed.headers.get('content-type')).toBe('application/problem+json');
    const problem = await changed.json();
    expect(problem).toMatchObject({ status: 422, title: 'unprocessable', idempotencyKey: 'reused' });
    expect(problem.detail).toMatch(/already used for a different request/);
    expect((await post(token, csv, 'reused', '?kind=calculations&fileName=other.csv')).status).toBe(422);
    expect(await countBatches(ws.workspaceId)).toBe(before);
  });

  it('a second request with the key while the first still runs is 409', async () => {
    // A large import, so the first request is still committing when the second arrives.
    const lines = ['material,method,quantity,value,unit,mode_index,source'];
    for (let i = 1; i <= 20000; i++) lines.push(`Inv-D,Recipe-R1,frequency,${(100 + i * 0.01).toFixed(2)},cm-1,${i},pipeline-runs`);
    const csv = lines.join('\n') + '\n';
    const firstPromise = post(token, csv, 'slow');
    // Wait until the first request has claimed the key (its row exists with no response yet).
    for (let i = 0; i < 500; i++) {
      const [row] = await db.select().from(idempotencyKey).where(and(eq(idempotencyKey.workspaceId, ws.workspaceId), eq(idempotencyKey.key, 'slow')));
      if (row) {
        expect(row.status).toBeNull();
        break;
      }
      await new Promise((r) => setTimeout(r, 5));
    }
    const second = await post(token, csv, 'slow');
    expect(second.status).toBe(409);
    expect(second.headers.get('content-type')).toBe('application/problem+json');
    expect((await second.json()).detail).toMatch(/still running/);
    const first = await firstPromise;
    expect(first.status).toBe(201);
    // Once it finished, the same key replays its answer.
    const third = await post(token, csv, 'slow');
    expect(third.status).toBe(201);
    expect(third.headers.get('idempotency-replayed')).toBe('true');
  }, 60_000);

  it('keys are scoped per workspace and per token: the same key elsewhere is independent', async () => {
    const csv = calculationsCsv(['Inv-A'], () => 5);
    const mine = await post(token, csv, 'shared-key');
    expect(mine.status).toBe(201);
    const theirs = await post(otherToken, csv, 'shared-key');
    expect(theirs.status).toBe(201);
    expect(theirs.headers.get('idempotency-replayed')).toBeNull();
    const theirBody = await theirs.json();
    const [batch] = await db.select().from(importBatch).where(eq(importBatch.id, theirBody.importId));
    expect(batch.workspaceId).toBe(other.workspaceId);
    // Another token of the same workspace: its own key space (the file itself is then a duplicate: 409).
    const sibling = await post(token2, csv, 'shared-key');
    expect(sibling.status).toBe(409);
    expect(sibling.headers.get('idempotency-replayed')).toBeNull();
  });

  it('stores refusals (422) too and replays them as problem+json', async () => {
    const bad = 'material,method,quantity,value,unit,source\nInv-A,Recipe-R1,frequency,12x,cm-1,pipeline-runs\n';
    const first = await post(token, bad, 'bad-rows');
    expect(first.status).toBe(422);
    const again = await post(token, bad, 'bad-rows');
    expect(again.status).toBe(422);
    expect(again.headers.get('idempotency-replayed')).toBe('true');
    expect(again.headers.get('content-type')).toBe('application/problem+json');
    expect(await again.json()).toEqual(await first.json());
  });

  it('refuses a malformed key with 400 and ignores GETs', async () => {
    const res = await post(token, 'x', 'has space');
    expect(res.status).toBe(400);
    expect(res.headers.get('content-type')).toBe('application/problem+json');
    const get = await (verdictRoute.GET as Handler)(
      new Request(`${BASE}/benchmarks/x/methods/y/verdict?maxMae=1`, { headers: { authorization: `Bearer ${token}`, 'idempotency-key': 'has space' } }),
      { params: Promise.resolve({ id: 'x', methodId: 'y' }) },
    );
    expect(get.status).toBe(404);
  });

  it('prunes keys whose window has ended, after which the key is new again', async () => {
    const csv = calculationsCsv(['Inv-C'], () => 7);
    expect((await post(token, csv, 'short-lived')).status).toBe(201);
    await db.update(idempotencyKey).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(idempotencyKey.key, 'short-lived'));
    expect(await pruneIdempotencyKeys(new Date())).toBeGreaterThanOrEqual(1);
    expect(await db.$count(idempotencyKey, eq(idempotencyKey.key, 'short-lived'))).toBe(0);
    // The window is over: the same key and body run again (and meet the duplicate-file check).
    expect((await post(token, csv, 'short-lived')).status).toBe(409);
  });

  it('keeps rows for IDEMPOTENCY_WINDOW_HOURS', async () => {
    process.env.IDEMPOTENCY_WINDOW_HOURS = '2';
    try {
      const t0 = Date.now();
      expect((await post(token, calculationsCsv(['Inv-B'], () => 9), 'windowed')).status).toBe(201);
      const [row] = await db.select().from(idempotencyKey).where(eq(idempotencyKey.key, 'windowed'));
      const hours = (row.expiresAt.getTime() - t0) / 3_600_000;
      expect(hours).toBeGreaterThan(1.99);
      expect(hours).toBeLessThan(2.01);
    } finally {
      delete process.env.IDEMPOTENCY_WINDOW_HOURS;
    }
  });
});
