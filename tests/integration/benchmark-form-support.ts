/** Creating a benchmark through the form's server action as a workspace's curator, and reading the revision it stores. */
import { expect } from 'vitest';
import { createBenchmarkAction } from '@/app/(app)/w/[workspace]/benchmarks/actions';
import { getRevision } from '@/db/queries/revisions';
import { whenRecomputeIdle } from '@/lib/services/benchmarks/recompute-queue';
import { signInAs } from '../support/users';
import { formData } from './benchmark-support';

export async function createBenchmarkAsCurator(ws: { workspaceId: string; members: Record<string, { email: string }> }, fields: Record<string, string>) {
  await signInAs(ws.members.curator.email);
  const state = await createBenchmarkAction(undefined, formData({ workspaceId: ws.workspaceId, outlierKind: 'modified-z', repeatedMeasurements: 'separate', ...fields }));
  expect(state.ok, state.message).toBe(true);
  const id = (state.data as { id: string }).id;
  await whenRecomputeIdle(ws.workspaceId, id);
  return { id, snap: (await getRevision(ws.workspaceId, id))!.statistics };
}
