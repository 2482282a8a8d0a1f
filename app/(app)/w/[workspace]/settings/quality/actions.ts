'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { updateQualityThresholds } from '@/lib/services/catalog/changes';
import { qualityThresholdsSchema } from './schemas';

/** Saves the workspace's quality thresholds (audited) and recomputes its benchmarks with them. */
export const updateQualityThresholdsAction = workspaceAction('settings:update', qualityThresholdsSchema, async (input, ctx) => {
  const { workspaceId: _, ...thresholds } = input;
  const { changed } = await updateQualityThresholds(ctx.workspace.id, { userId: ctx.user.id }, thresholds);
  if (!changed) return { ok: true, message: 'Nothing changed.' };
  revalidatePath(`/w/${ctx.workspace.slug}`, 'layout');
  return { ok: true, message: 'Thresholds saved. The workspace’s benchmarks are being recomputed with them.' };
});
