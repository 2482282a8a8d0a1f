import 'server-only';
/** Creating, editing and re-running a benchmark: each asks for its next revision at once. */
import type { Actor } from '@/db/queries/audit';
import * as benchmarks from '@/db/queries/benchmarks';
import type { BenchmarkDefinitionInput } from '@/lib/benchmark/schemas';
import { dataChanged } from '../data-changed';

export async function createBenchmark(workspaceId: string, actor: Actor, input: BenchmarkDefinitionInput): Promise<{ id: string }> {
  const { id } = await benchmarks.createBenchmark(workspaceId, actor, input);
  await dataChanged(workspaceId, { cause: { trigger: 'benchmark-created', userId: actor.userId }, benchmarkIds: [id], immediate: true });
  return { id };
}

export async function updateBenchmark(workspaceId: string, actor: Actor, benchmarkId: string, input: BenchmarkDefinitionInput): Promise<void> {
  await benchmarks.updateBenchmark(workspaceId, actor, benchmarkId, input);
  await dataChanged(workspaceId, { cause: { trigger: 'benchmark-updated', userId: actor.userId }, benchmarkIds: [benchmarkId], immediate: true });
}

/** A revision is stored only if something changed since the latest. */
export async function requestRecompute(workspaceId: string, actor: Actor, benchmarkId: string): Promise<void> {
  await benchmarks.requireBenchmark(workspaceId, benchmarkId);
  await dataChanged(workspaceId, { cause: { trigger: 'manual', userId: actor.userId }, benchmarkIds: [benchmarkId], immediate: true });
}
