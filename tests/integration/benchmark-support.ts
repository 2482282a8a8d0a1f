/** Hand-built benchmark data inserted directly with drizzle (invented values, for tests only). */
import { db } from '@/db/client';
import { calculation, material, materialTag, measurement, method, source } from '@/db/schema';

let seq = 0;

export async function addMaterial(workspaceId: string, name: string, tags: string[] = []) {
  const [row] = await db
    .insert(material)
    .values({ workspaceId, name, formula: 'AB', reducedFormula: 'AB', atomsPerFormulaUnit: 2, elementCounts: { A: 1, B: 1 }, atomsInCell: 2 })
    .returning({ id: material.id });
  for (const tag of tags) await db.insert(materialTag).values({ workspaceId, materialId: row.id, tag });
  return row.id;
}

export async function addSource(workspaceId: string, citeKey: string) {
  const [row] = await db
    .insert(source)
    .values({ workspaceId, citeKey, kind: 'journal-article', title: `Invented study ${citeKey}`, authors: 'Doe, J.; Roe, R.', year: 2020, venue: 'Test J.' })
    .returning({ id: source.id });
  return row.id;
}

export async function addMethod(workspaceId: string, label: string) {
  const [row] = await db.insert(method).values({ workspaceId, label, functional: 'PBEsol', kGrid: [30, 30, 30], qGrid: [5, 5, 5] }).returning({ id: method.id });
  return row.id;
}

export async function addMeasurement(
  workspaceId: string,
  v: { materialId: string; sourceId: string; value: number; irrep?: string; uncertainty?: number; technique?: 'raman' | 'ins'; temperatureK?: number; importId?: string },
) {
  const [row] = await db
    .insert(measurement)
    .values({
      workspaceId,
      materialId: v.materialId,
      sourceId: v.sourceId,
      importId: v.importId ?? null,
      quantity: 'frequency',
      value: v.value,
      valueText: String(v.value),
      unit: 'cm-1',
      uncertainty: v.uncertainty ?? null,
      temperatureK: v.temperatureK ?? 295,
      irrep: v.irrep ?? null,
      irrepNormalized: v.irrep ?? null,
      technique: v.technique ?? 'raman',
      rowHash: `m${++seq}`,
    })
    .returning({ id: measurement.id });
  return row.id;
}

export async function addCalculation(
  workspaceId: string,
  v: { materialId: string; sourceId: string; methodId: string; value: number; irrep?: string; activity?: 'raman' | 'acoustic' | 'ir'; importId?: string },
) {
  const [row] = await db
    .insert(calculation)
    .values({
      workspaceId,
      materialId: v.materialId,
      sourceId: v.sourceId,
      methodId: v.methodId,
      importId: v.importId ?? null,
      quantity: 'frequency',
      value: v.value,
      valueText: String(v.value),
      unit: 'cm-1',
      irrep: v.irrep ?? null,
      irrepNormalized: v.irrep ?? null,
      activity: v.activity ?? 'raman',
      rowHash: `c${++seq}`,
    })
    .returning({ id: calculation.id });
  return row.id;
}

/** Acoustic modes plus one Raman-active computed mode per label. */
export async function addModeSet(workspaceId: string, materialId: string, sourceId: string, methodId: string, modes: Record<string, number>) {
  const ids: Record<string, string> = {};
  for (let i = 0; i < 3; i++) await addCalculation(workspaceId, { materialId, sourceId, methodId, value: 0.1 * i, activity: 'acoustic' });
  for (const [irrep, value] of Object.entries(modes)) ids[irrep] = await addCalculation(workspaceId, { materialId, sourceId, methodId, value, irrep });
  return ids;
}

export function formData(values: Record<string, string | string[]>): FormData {
  const fd = new FormData();
  for (const [k, v] of Object.entries(values)) for (const item of Array.isArray(v) ? v : [v]) fd.append(k, item);
  return fd;
}
