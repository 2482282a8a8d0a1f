/**
 * The convergence view of a benchmark against a reference method: the candidates form a family
 * that differs in one recipe parameter, read from the stored method fields —
 *   'kppra'    k-points per reciprocal atom, k1·k2·k3 × atoms in the cell (per material);
 *   'q-grid'   q-points of the phonon grid, q1·q2·q3;
 *   'cutoff'   plane-wave cutoff, eV;
 *   'smearing' the first number of the stored smearing text (one family should state it in one
 *              unit); it converges as it decreases.
 * Per material × member: max |Δ| and mean |Δ| of the revision's per-material rows (included pairs).
 * Then lib/science/convergence.ts: each material's convergence point, the recommendation per
 * material class (tags; a material with several tags counts in each; every material together as
 * well), the distribution per member (its x is the median of the member's parameter over the
 * materials, since k-points per reciprocal atom differ by cell), and the materials that never
 * converge within the family.
 */
import { convergencePoint, deviationDistribution, recommendedParameter, type ConvergenceDirection, type DistributionRow, type Recommendation } from '@/lib/science';
import { quantile } from '@/lib/science';
import { kPointDensity } from '@/lib/catalog/k-point-density';
import type { BenchmarkSnapshot } from './types';

export const CONVERGENCE_PARAMETERS = ['kppra', 'q-grid', 'cutoff', 'smearing'] as const;
export type ConvergenceParameter = (typeof CONVERGENCE_PARAMETERS)[number];

export const PARAMETER_NAMES: Record<ConvergenceParameter, { name: string; unit: string; direction: ConvergenceDirection }> = {
  kppra: { name: 'k-points per reciprocal atom', unit: '', direction: 'increasing' },
  'q-grid': { name: 'q-points in the phonon grid', unit: '', direction: 'increasing' },
  cutoff: { name: 'plane-wave cutoff', unit: 'eV', direction: 'increasing' },
  smearing: { name: 'smearing width (as stored)', unit: '', direction: 'decreasing' },
};

export interface RecipeMethod {
  id: string;
  label: string;
  kGrid: [number, number, number] | null;
  qGrid: [number, number, number] | null;
  cutoffEv: number | null;
  smearing: string | null;
}

export interface CellMaterial {
  id: string;
  name: string;
  atomsInCell: number | null;
  tags: string[];
}

export interface ConvergencePointRow {
  materialId: string;
  material: string;
  methodId: string;
  method: string;
  parameter: number;
  maxAbsolute: number;
  meanAbsolute: number;
}

export interface ConvergenceView {
  parameter: ConvergenceParameter;
  tolerance: number;
  share: number;
  unit: string;
  /** Candidate methods whose field the parameter needs is empty (they are left out). */
  methodsLacking: string[];
  /** k-points per reciprocal atom: materials without atoms in the cell (left out). */
  materialsLacking: string[];
  points: ConvergencePointRow[];
  distribution: Array<DistributionRow & { method: string; parameter: number }>;
  classes: Array<Recommendation & { group: string }>;
  neverConverged: Array<{ materialId: string; material: string; bestMaxAbsolute: number }>;
}

export const ALL_MATERIALS = 'all materials';

function smearingValue(text: string | null): number | null {
  const match = text?.match(/[-+]?\d*\.?\d+(?:[eE][-+]?\d+)?/);
  return match ? Number(match[0]) : null;
}

export function parameterOf(kind: ConvergenceParameter, method: RecipeMethod, material: CellMaterial): number | null {
  switch (kind) {
    case 'kppra':
      return kPointDensity(method.kGrid, material.atomsInCell);
    case 'q-grid':
      return method.qGrid ? method.qGrid[0] * method.qGrid[1] * method.qGrid[2] : null;
    case 'cutoff':
      return method.cutoffEv;
    case 'smearing':
      return smearingValue(method.smearing);
  }
}

function methodLacks(kind: ConvergenceParameter, m: RecipeMethod): boolean {
  return kind === 'kppra' ? m.kGrid === null : parameterOf(kind, m, { id: '', name: '', atomsInCell: 1, tags: [] }) === null;
}

/** The view of one revision for one parameter (module header); null when the revision is not against a reference method. */
export function convergenceView(snapshot: BenchmarkSnapshot, kind: ConvergenceParameter, methods: readonly RecipeMethod[], materials: readonly CellMaterial[]): ConvergenceView | null {
  const reference = snapshot.reference;
  if (!reference) return null;
  const { direction } = PARAMETER_NAMES[kind];
  const candidates = new Map(methods.filter((m) => m.id !== reference.methodId).map((m) => [m.id, m]));
  const byId = new Map(materials.map((m) => [m.id, m]));
  // The family: candidates with at least one pair (a method in scope with no rows on these materials is not a member).
  const inFamily = [...candidates.values()].filter((m) => snapshot.methods.some((r) => r.methodId === m.id && r.n > 0));
  const methodsLacking = inFamily.filter((m) => methodLacks(kind, m)).map((m) => m.label).sort();
  const materialsLacking = new Set<string>();
  const points: ConvergencePointRow[] = [];
  for (const row of snapshot.materialRows ?? []) {
    const method = candidates.get(row.methodId);
    const material = byId.get(row.materialId);
    if (!method || !material || row.maxAbsoluteError === null || row.meanAbsoluteError === null) continue;
    const parameter = parameterOf(kind, method, material);
    if (parameter === null) {
      if (kind === 'kppra' && method.kGrid !== null) materialsLacking.add(material.name);
      continue;
    }
    points.push({ materialId: material.id, material: material.name, methodId: method.id, method: method.label, parameter, maxAbsolute: row.maxAbsoluteError, meanAbsolute: row.meanAbsoluteError });
  }
  points.sort((a, b) => a.material.localeCompare(b.material) || a.parameter - b.parameter || a.method.localeCompare(b.method));

  const pointsOf = new Map<string, ConvergencePointRow[]>();
  for (const p of points) (pointsOf.get(p.materialId) ?? pointsOf.set(p.materialId, []).get(p.materialId)!).push(p);
  const reached = new Map<string, number | null>();
  for (const [materialId, list] of pointsOf) reached.set(materialId, convergencePoint(list, reference.tolerance, direction));

  const groups = new Map<string, string[]>([[ALL_MATERIALS, [...pointsOf.keys()]]]);
  for (const materialId of pointsOf.keys()) {
    const tags = byId.get(materialId)!.tags;
    for (const tag of tags.length ? tags : ['untagged']) (groups.get(tag) ?? groups.set(tag, []).get(tag)!).push(materialId);
  }
  const classes = [...groups]
    .map(([group, ids]) => ({ group, ...recommendedParameter(ids.map((id) => reached.get(id)!), reference.share, direction) }))
    .sort((a, b) => (a.group === ALL_MATERIALS ? -1 : b.group === ALL_MATERIALS ? 1 : a.group.localeCompare(b.group)));

  const distribution = [...new Map(points.map((p) => [p.methodId, p.method])).entries()]
    .map(([methodId, label]) => {
      const rows = points.filter((p) => p.methodId === methodId);
      return { method: label, parameter: quantile(rows.map((r) => r.parameter), 0.5), ...deviationDistribution(rows)! };
    })
    .sort((a, b) => a.parameter - b.parameter);

  const neverConverged = [...reached]
    .filter(([, point]) => point === null)
    .map(([materialId]) => {
      const list = pointsOf.get(materialId)!;
      return { materialId, material: list[0].material, bestMaxAbsolute: Math.min(...list.map((p) => p.maxAbsolute)) };
    })
    .sort((a, b) => a.material.localeCompare(b.material));

  return { parameter: kind, tolerance: reference.tolerance, share: reference.share, unit: snapshot.unit, methodsLacking, materialsLacking: [...materialsLacking].sort(), points, distribution, classes, neverConverged };
}
