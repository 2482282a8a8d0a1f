/**
 * The Cp − Cv rule of a heat-capacity benchmark through the real paths: computed Cv and measured
 * Cp imported from CSV, the benchmark created in the form with the rule on, the stored revision
 * corrected where a material records α, B and V_m and leaving out the one that does not; a later
 * change of α re-pairs that material. Cp − Cv of MgO at 298.15 K is the worked case of
 * tests/unit/science/heat-capacity.test.ts (α_V = 3.12e-5 K⁻¹, B = 160 GPa, V_m = 11.25 cm³/mol,
 * handbook values from memory): 0.522416 J mol⁻¹ K⁻¹. The Cp and Cv values are invented.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { material } from '@/db/schema';
import { getRevision } from '@/db/queries/revisions';
import { scheduleRecompute, whenRecomputeIdle } from '@/lib/services/benchmarks/recompute-queue';
import { importCsvFile } from '@/lib/services/imports/csv-import';
import { createWorkspaceWith } from '../support/users';
import { createBenchmarkAsCurator } from './benchmark-form-support';
import { bytesOf, chunksOf, seedCatalogue } from './import-fixtures';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
const MGO_GAP = 0.522416;

function importText(lines: string[], kind: 'measurements' | 'calculations', fileName: string) {
  return importCsvFile({ workspaceId: ws.workspaceId, actor: { userId: ws.owner.id, tokenId: null }, via: 'wizard', kind, fileName, body: chunksOf(bytesOf(lines.join('\n')), 19) });
}

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator']);
  await seedCatalogue(ws.workspaceId);
  await db.insert(material).values([
    { workspaceId: ws.workspaceId, name: 'MgO', formula: 'MgO', reducedFormula: 'MgO', atomsPerFormulaUnit: 2, elementCounts: { Mg: 1, O: 1 }, spaceGroup: 225, atomsInCell: 2, thermalExpansionPerK: 3.12e-5, bulkModulusGpa: 160, molarVolumeCm3: 11.25 },
    { workspaceId: ws.workspaceId, name: 'NaCl', formula: 'NaCl', reducedFormula: 'NaCl', atomsPerFormulaUnit: 2, elementCounts: { Na: 1, Cl: 1 }, spaceGroup: 225, atomsInCell: 2 },
  ]);
  await importText(['material,quantity,value,unit,temperature_K,technique,source', 'MgO,heat-capacity,37.20,J/mol/K,298.15,calorimetry,azuhata1995', 'NaCl,heat-capacity,50.50,J/mol/K,298.15,calorimetry,azuhata1995'], 'measurements', 'cp.csv');
  await importText(['material,method,quantity,value,unit,temperature_K,source', 'MgO,PBEsol-PAW-600,heat-capacity,36.00,J/mol/K,298.15,inhouse-2026', 'NaCl,PBEsol-PAW-600,heat-capacity,47.00,J/mol/K,298.15,inhouse-2026'], 'calculations', 'cv.csv');
});

const create = (fields: Record<string, string>) => createBenchmarkAsCurator(ws, { quantity: 'heat-capacity', ...fields });

describe('Cp − Cv correction', () => {
  it('is off by default: both materials compared as stored, with the uncorrected caution', async () => {
    const { snap } = await create({ name: 'As stored' });
    expect(snap.rules.heatCapacityCorrection).toBeUndefined();
    expect(snap.pairs.map((p) => p.calculated).sort()).toEqual([36, 47]);
    expect(snap.caution).toMatch(/without that correction/);
    expect(snap.cpCorrection).toBeUndefined();
  });

  it('adds α² B V_m T to the computed Cv of a material with all three, and leaves out the one without', async () => {
    const { id, snap } = await create({ name: 'Corrected', heatCapacityCorrection: 'cp-minus-cv' });
    expect(snap.rules.heatCapacityCorrection).toBe('cp-minus-cv');
    expect(snap.pairs).toHaveLength(1);
    expect(snap.pairs[0].calculated).toBeCloseTo(36 + MGO_GAP, 5);
    expect(snap.pairs[0].error).toBeCloseTo(36 + MGO_GAP - 37.2, 5);
    expect(snap.cpCorrection).toEqual({ corrected: 1, lacking: ['NaCl'] });
    expect(snap.caution).toMatch(/materials without all three are left out/);
    expect(snap.methods[0].unpairedMeasurements).toBe(1);

    // doubling α quadruples the gap; the material is re-paired on the next recomputation
    await db.update(material).set({ thermalExpansionPerK: 6.24e-5 }).where(and(eq(material.workspaceId, ws.workspaceId), eq(material.name, 'MgO')));
    await scheduleRecompute(ws.workspaceId, [id], { trigger: 'data-change' }, 0);
    await whenRecomputeIdle(ws.workspaceId, id);
    const after = (await getRevision(ws.workspaceId, id))!.statistics;
    expect(after.pairs[0].calculated).toBeCloseTo(36 + 4 * MGO_GAP, 5);
  });
});
