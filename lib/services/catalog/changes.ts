import 'server-only';
/**
 * Catalogue and settings writes that can change a benchmark's result: each
 * reports a data change once it has committed. Creating a record changes no
 * benchmark (nothing refers to it yet), so creation stays a plain query.
 */
import type { Actor } from '@/db/queries/audit';
import * as materials from '@/db/queries/materials';
import * as methods from '@/db/queries/methods';
import * as settings from '@/db/queries/settings';
import * as sources from '@/db/queries/sources';
import { dataChanged, reportingChange } from '../data-changed';

export const updateMaterial = reportingChange(materials.updateMaterial);
export const retractMaterial = reportingChange(materials.retractMaterial);
export const restoreMaterial = reportingChange(materials.restoreMaterial);

export const updateMethod = reportingChange(methods.updateMethod);
export const retractMethod = reportingChange(methods.retractMethod);
export const restoreMethod = reportingChange(methods.restoreMethod);

export const updateSource = reportingChange(sources.updateSource);
export const retractSource = reportingChange(sources.retractSource);
export const restoreSource = reportingChange(sources.restoreSource);
export const mergeSources = reportingChange(sources.mergeSources);

/** Saves the quality thresholds; recomputes only when a threshold actually changed. */
export async function updateQualityThresholds(
  workspaceId: string,
  actor: Actor,
  next: Parameters<typeof settings.updateQualityThresholds>[2],
): Promise<{ changed: boolean }> {
  const result = await settings.updateQualityThresholds(workspaceId, actor, next);
  if (result.changed) await dataChanged(workspaceId, { cause: { trigger: 'data-change', userId: actor.userId } });
  return result;
}
