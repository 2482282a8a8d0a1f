/** A small benchmark for the deck and discussion tests (invented values, for tests only). */
import { createBenchmarkAction } from '@/app/(app)/w/[workspace]/benchmarks/actions';
import { getRevision } from '@/db/queries/revisions';
import { whenRecomputeIdle } from '@/lib/services/benchmarks/recompute-queue';
import { signInAs } from '@/tests/support/users';
import { addMaterial, addMeasurement, addMethod, addModeSet, addSource, formData } from './benchmark-support';

const MEASURED = { A: { A1g: 400, Eg: 500 }, B: { A1g: 300, T2g: 150 } } as const;
const COMPUTED = { A: { A1g: 405, Eg: 490 }, B: { A1g: 310, T2g: 149 } } as const;

/** One method, two materials, four labelled Raman pairs; created by the given curator. */
export async function meetingBenchmark(workspaceId: string, curatorEmail: string) {
  const source = await addSource(workspaceId, 'doe2020');
  const calcSource = await addSource(workspaceId, 'calc2024');
  const methodId = await addMethod(workspaceId, 'X-PBEsol');
  const materials: Record<string, string> = {};
  for (const mat of ['A', 'B'] as const) {
    materials[mat] = await addMaterial(workspaceId, mat, ['oxide']);
    for (const [irrep, value] of Object.entries(MEASURED[mat])) await addMeasurement(workspaceId, { materialId: materials[mat], sourceId: source, value, irrep, uncertainty: 1 });
    await addModeSet(workspaceId, materials[mat], calcSource, methodId, COMPUTED[mat]);
  }
  await signInAs(curatorEmail);
  const state = await createBenchmarkAction(
    undefined,
    formData({ workspaceId, name: 'Raman, room temperature', quantity: 'frequency', techniques: ['raman'], outlierKind: 'modified-z', repeatedMeasurements: 'separate' }),
  );
  if (!state.ok) throw new Error(state.message);
  const benchmarkId = (state.data as { id: string }).id;
  await whenRecomputeIdle(workspaceId, benchmarkId);
  const rev = await getRevision(workspaceId, benchmarkId);
  if (!rev) throw new Error('no revision');
  return { benchmarkId, methodId, materials, revision: rev };
}
