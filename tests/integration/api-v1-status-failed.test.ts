import { beforeAll, describe, expect, it, vi } from 'vitest';
import * as statusRoute from '@/app/api/v1/benchmarks/[id]/status/route';
import * as verdictRoute from '@/app/api/v1/benchmarks/[id]/methods/[methodId]/verdict/route';
import { scheduleRecompute, whenRecomputeIdle } from '@/lib/services/benchmarks/recompute-queue';
import { createWorkspaceWith } from '../support/users';
import { makeToken, seedWorkflow } from './api-workflow-fixtures';

// The recomputation fails on demand (after the seed's first revision), so the status can be seen failing and recovering.
const failing = vi.hoisted(() => ({ on: false, calls: 0 }));
vi.mock('@/lib/services/benchmarks/recompute', async (original) => {
  const real = await original<typeof import('@/lib/services/benchmarks/recompute')>();
  return {
    ...real,
    recomputeBenchmark: (...args: Parameters<typeof real.recomputeBenchmark>) => {
      if (failing.on) {
        failing.calls++;
        return Promise.reject(new Error('disk full (simulated)'));
      }
      return real.recomputeBenchmark(...args);
    },
  };
});

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
const get = (handler: unknown, path: string, token: string, params: Record<string, string>) =>
  (handler as Handler)(new Request(`http://localhost:3999/api/v1${path}`, { headers: { authorization: `Bearer ${token}` } }), { params: Promise.resolve(params) });

let seeded: Awaited<ReturnType<typeof seedWorkflow>>;
let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let token: string;

beforeAll(async () => {
  ws = await createWorkspaceWith(['contributor']);
  seeded = await seedWorkflow(ws.workspaceId, ws.owner.id);
  token = await makeToken(ws.members.contributor.email, ws.workspaceId, 'contributor');
});

describe('GET /benchmarks/{id}/status when a recomputation fails', () => {
  it('retries, then says failed with the error until a later recomputation succeeds', async () => {
    vi.spyOn(console, 'error').mockImplementation(() => undefined);
    process.env.JOB_MAX_ATTEMPTS = '3';
    process.env.JOB_RETRY_BASE_MS = '20';
    failing.on = true;
    await scheduleRecompute(ws.workspaceId, [seeded.benchmarkId], { trigger: 'manual' }, 0);
    await whenRecomputeIdle(ws.workspaceId, seeded.benchmarkId);
    const params = { id: seeded.benchmarkId };
    const failed = await (await get(statusRoute.GET, `/benchmarks/${seeded.benchmarkId}/status`, token, params)).json();
    expect(failed).toMatchObject({ state: 'failed', computing: false, error: 'disk full (simulated)', latestRevision: { number: 1 } });
    expect(failing.calls).toBe(3);
    const verdict = await (
      await get(verdictRoute.GET, `/benchmarks/${seeded.benchmarkId}/methods/${seeded.methodId}/verdict?maxMae=5`, token, { ...params, methodId: seeded.methodId })
    ).json();
    expect(verdict.recomputation).toEqual({ state: 'failed', pending: false });
    expect(verdict.warnings).toContain('The last recomputation of this benchmark failed; the verdict is of the latest stored revision.');

    failing.on = false;
    await scheduleRecompute(ws.workspaceId, [seeded.benchmarkId], { trigger: 'manual' }, 0);
    await whenRecomputeIdle(ws.workspaceId, seeded.benchmarkId);
    expect(await (await get(statusRoute.GET, `/benchmarks/${seeded.benchmarkId}/status`, token, params)).json()).toMatchObject({ state: 'idle', error: null });
  });
});
