import 'server-only';
/**
 * Curators' decisions on outliers and pins. A decision belongs to one benchmark;
 * a pin belongs to the workspace, so every benchmark pairing its method may change.
 */
import type { Actor } from '@/db/queries/audit';
import { requireBenchmark } from '@/db/queries/benchmarks';
import * as decisions from '@/db/queries/decisions';
import { AppError } from '@/lib/errors';
import { dataChanged } from '../data-changed';

type DecisionInput = Parameters<typeof decisions.createDecision>[2];
type PinInput = Parameters<typeof decisions.createPin>[2];

/** Decisions and pins name measurements; a benchmark against a reference method pairs calculations only. */
async function refuseOnReference(workspaceId: string, benchmarkId: string): Promise<void> {
  const bm = await requireBenchmark(workspaceId, benchmarkId);
  if (bm.scope.referenceMethodId !== undefined) {
    throw new AppError('bad-request', 'This benchmark compares with a reference method, not with measurements: decisions and pins apply to benchmarks against experiment only.');
  }
}

export async function decide(workspaceId: string, actor: Actor, input: DecisionInput): Promise<{ id: string }> {
  await refuseOnReference(workspaceId, input.benchmarkId);
  const { id } = await decisions.createDecision(workspaceId, actor, input);
  await dataChanged(workspaceId, { cause: { trigger: 'decision', decisionId: id, userId: actor.userId }, benchmarkIds: [input.benchmarkId], immediate: true });
  return { id };
}

export async function revertDecision(workspaceId: string, actor: Actor, decisionId: string, reason: string): Promise<{ benchmarkId: string | null }> {
  const { benchmarkId } = await decisions.revertDecision(workspaceId, actor, decisionId, reason);
  await dataChanged(workspaceId, { cause: { trigger: 'decision', decisionId, userId: actor.userId }, benchmarkIds: benchmarkId ? [benchmarkId] : undefined, immediate: true });
  return { benchmarkId };
}

/** `benchmarkId`: the benchmark the pin was made from, refused when it compares with a reference method. */
export async function pin(workspaceId: string, actor: Actor, input: PinInput, benchmarkId?: string): Promise<{ id: string }> {
  if (benchmarkId !== undefined) await refuseOnReference(workspaceId, benchmarkId);
  const { id } = await decisions.createPin(workspaceId, actor, input);
  await dataChanged(workspaceId, { cause: { trigger: 'pin', pinId: id, userId: actor.userId }, immediate: true });
  return { id };
}

export async function revokePin(workspaceId: string, actor: Actor, pinId: string, reason: string): Promise<void> {
  await decisions.revokePin(workspaceId, actor, pinId, reason);
  await dataChanged(workspaceId, { cause: { trigger: 'pin', pinId, userId: actor.userId }, immediate: true });
}
