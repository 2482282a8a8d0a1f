'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { scheduleRecomputeForWorkspace } from '@/lib/services/benchmarks/recompute-queue';
import { updateQualityThresholds } from '@/db/queries/settings';
import { qualityThresholdsSchema } from './schemas';

/** Saves the workspace's quality thresholds (audited) and recomputes its benchmarks with them. */
export const updateQualityThresholdsAction = workspaceAction('settings:update', qualityThresholdsSchema, async (input, ctx) => {
  const { workspaceId: _, ...thresholds } = input;
  const { changed } = await updateQualityThresholds(ctx.workspace.id, { userId: ctx.user.id }, thresholds);
  if (!changed) return { ok: true, message: 'Nothing changed.' };
  scheduleRecomputeForWorkspace(ctx.workspace.id, { trigger: 'data-change', userId: ctx.user.id });
  revalidatePath(`/w/${ctx.workspace.slug}`, 'layout');
  return { ok: true, message: 'Thresholds saved. The workspace’s benchmarks are being recomputed with them.' };
});
