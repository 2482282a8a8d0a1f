/**
 * A workspace ready for the workflow API tests (invented data, for tests only): four materials with two
 * labelled Raman peaks each, one method with no calculations yet, and a frequency benchmark that ranks a
 * method from 3 pairs and 50 % coverage. Calculations arrive through the API, as a pipeline sends them.
 */
import { expect } from 'vitest';
import { createApiToken } from '@/app/(app)/w/[workspace]/settings/tokens/actions';
import { createBenchmark } from '@/db/queries/benchmarks';
import { recomputeBenchmark } from '@/lib/services/benchmarks/recompute';
import { callAction } from '../support/actions';
import { signInAs } from '../support/users';
import { db } from '@/db/client';
import { material } from '@/db/schema';
import { addMeasurement, addMethod, addSource } from './benchmark-support';

/** Measured Raman peaks, cm⁻¹ (invented). */
/** Real formulas so the import can read them; the names and peaks are invented. */
const FORMULAS: Record<string, [string, Record<string, number>]> = {
  'Inv-A': ['MgO', { Mg: 1, O: 1 }],
  'Inv-B': ['CaO', { Ca: 1, O: 1 }],
  'Inv-C': ['SrO', { Sr: 1, O: 1 }],
  'Inv-D': ['BaO', { Ba: 1, O: 1 }],
};

export const MEASURED: Record<string, Record<string, number>> = {
  'Inv-A': { A1g: 400, Eg: 520 },
  'Inv-B': { A1g: 300, Eg: 610 },
  'Inv-C': { A1g: 700, Eg: 240 },
  'Inv-D': { A1g: 450, Eg: 380 },
};

export async function makeToken(email: string, workspaceId: string, role: string, name = `${role} pipeline`): Promise<string> {
  await signInAs(email);
  const out = await callAction(createApiToken, { workspaceId, name, role });
  expect(out.state?.ok, out.state?.message).toBe(true);
  return (out.state as unknown as { data: { token: string } }).data.token;
}

export async function seedWorkflow(workspaceId: string, ownerId: string) {
  const materials: Record<string, string> = {};
  const measured = await addSource(workspaceId, 'invented-raman-2026');
  await addSource(workspaceId, 'pipeline-runs');
  for (const [name, peaks] of Object.entries(MEASURED)) {
    const [formula, elementCounts] = FORMULAS[name];
    const [row] = await db
      .insert(material)
      .values({ workspaceId, name, formula, reducedFormula: formula, atomsPerFormulaUnit: 2, elementCounts, atomsInCell: 2 })
      .returning({ id: material.id });
    materials[name] = row.id;
    for (const [irrep, value] of Object.entries(peaks)) await addMeasurement(workspaceId, { materialId: materials[name], sourceId: measured, value, irrep });
  }
  const methodId = await addMethod(workspaceId, 'Recipe-R1');
  const { id: benchmarkId } = await createBenchmark(
    workspaceId,
    { userId: ownerId },
    { name: 'Invented Raman peaks', scope: { quantity: 'frequency' }, rules: { ranking: { minN: 3, minCoverage: 0.5 }, bootstrapSamples: 0 } },
  );
  await recomputeBenchmark(workspaceId, benchmarkId, [{ trigger: 'benchmark-created' }]);
  return { materials, methodId, benchmarkId };
}

/** A calculations CSV of these materials' peaks, each computed value = measured + offset (cm⁻¹). */
export function calculationsCsv(names: string[], offset: (name: string, irrep: string) => number): string {
  const lines = ['material,method,quantity,value,unit,irrep,activity,source'];
  for (const name of names) {
    for (const [irrep, value] of Object.entries(MEASURED[name])) {
      lines.push(`${name},Recipe-R1,frequency,${(value + offset(name, irrep)).toFixed(1)},cm-1,${irrep},raman,pipeline-runs`);
    }
  }
  return lines.join('\n') + '\n';
}
