import 'server-only';
import { cache } from 'react';
import type { MaterialValues } from '@/db/queries/material-values';
import { getMethodGrids, getQualityThresholds } from '@/db/queries/settings';

/** One read of the workspace's thresholds per request, for the quality flags and the Born-charge sets alike. */
const thresholdsOf = cache(getQualityThresholds);
import { bornChargeSets, materialQualityFlags, type BornChargeSet, type MethodQuality } from '@/lib/benchmark/material-quality';
import { elementCountsOrUndefined } from '@/lib/science';

/** A method's ε∞ and ε₀ of the material (the first row of each by id), when both are stored. */
function dielectricOf(rows: MaterialValues['methods'][number]['dielectric']): { epsInf: number; eps0: number } | undefined {
  const first = (q: string) => rows.filter((r) => r.quantity === q).sort((a, b) => (a.id < b.id ? -1 : 1))[0]?.value;
  const epsInf = first('eps-inf');
  const eps0 = first('eps-static');
  return epsInf !== undefined && eps0 !== undefined ? { epsInf, eps0 } : undefined;
}

/** The material page's quality flags: each method's modes with its grids and the workspace's thresholds. */
export async function loadMaterialQuality(workspaceId: string, material: { id: string; atomsInCell: number | null; spaceGroup: number | null }, values: MaterialValues): Promise<MethodQuality[]> {
  const methods = values.methods.filter((m) => m.modes.length > 0);
  if (methods.length === 0) return [];
  const [thresholds, grids] = await Promise.all([thresholdsOf(workspaceId), getMethodGrids(workspaceId, methods.map((m) => m.methodId))]);
  return materialQualityFlags({
    materialId: material.id,
    atomsInCell: material.atomsInCell,
    spaceGroup: material.spaceGroup,
    thresholds,
    methods: methods.map((m) => ({
      methodId: m.methodId,
      methodLabel: m.methodLabel,
      kGrid: grids.get(m.methodId)?.kGrid ?? null,
      qGrid: grids.get(m.methodId)?.qGrid ?? null,
      modes: m.modes,
      dielectric: dielectricOf(m.dielectric),
    })),
  });
}

/** The material's Born charges per measured source and per method, each with its neutrality (the workspace's limit). */
export async function loadBornChargeSets(workspaceId: string, material: { atomsInCell: number | null; reducedFormula: string }, values: MaterialValues): Promise<BornChargeSet[]> {
  const measuredBySource = new Map<string, MaterialValues['born']>();
  for (const r of values.born) measuredBySource.set(r.citeKey, [...(measuredBySource.get(r.citeKey) ?? []), r]);
  const methods = values.methods.filter((m) => m.born.length > 0);
  if (measuredBySource.size === 0 && methods.length === 0) return [];
  const thresholds = await thresholdsOf(workspaceId);
  return bornChargeSets({
    atomsInCell: material.atomsInCell,
    elements: elementCountsOrUndefined(material.reducedFormula),
    limitE: thresholds?.bornNeutrality,
    series: [
      ...[...measuredBySource].map(([citeKey, rows]) => ({ series: `Measured (${citeKey})`, rows })),
      ...methods.map((m) => ({ series: m.methodLabel, rows: m.born })),
    ],
  });
}
