import 'server-only';
import type { MaterialValues } from '@/db/queries/material-values';
import { getMethodGrids, getQualityThresholds } from '@/db/queries/settings';
import { materialQualityFlags, type MethodQuality } from '@/lib/benchmark/material-quality';

/** The material page's quality flags: each method's modes with its grids and the workspace's thresholds. */
export async function loadMaterialQuality(workspaceId: string, material: { id: string; atomsInCell: number | null }, values: MaterialValues): Promise<MethodQuality[]> {
  const methods = values.methods.filter((m) => m.modes.length > 0);
  if (methods.length === 0) return [];
  const [thresholds, grids] = await Promise.all([getQualityThresholds(workspaceId), getMethodGrids(workspaceId, methods.map((m) => m.methodId))]);
  return materialQualityFlags({
    materialId: material.id,
    atomsInCell: material.atomsInCell,
    thresholds,
    methods: methods.map((m) => ({
      methodId: m.methodId,
      methodLabel: m.methodLabel,
      kGrid: grids.get(m.methodId)?.kGrid ?? null,
      qGrid: grids.get(m.methodId)?.qGrid ?? null,
      modes: m.modes,
    })),
  });
}
