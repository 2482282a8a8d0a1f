import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '@/db/client';
import { calculation, material, measurement, method, source } from '@/db/schema';
import { getMaterialValues } from '@/db/queries/material-values';
import { listMaterialsOfMethod } from '@/db/queries/methods';
import { kPointDensity } from '@/lib/catalog/k-point-density';
import { createWorkspaceWith } from '../support/users';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;
const ids = { gan: '', azuhata: '', pbe: '', lda: '' };

// Measured GaN modes: Azuhata et al., J. Phys.: Condens. Matter 7, L129 (1995). Computed values are invented.
beforeAll(async () => {
  ws = await createWorkspaceWith([]);
  other = await createWorkspaceWith([]);
  const w = ws.workspaceId;
  [{ id: ids.gan }] = await db
    .insert(material)
    .values({ workspaceId: w, name: 'GaN-wz', formula: 'GaN', reducedFormula: 'GaN', atomsPerFormulaUnit: 2, elementCounts: { Ga: 1, N: 1 }, spaceGroup: 186, crystalSystem: 'hexagonal', atomsInCell: 4 })
    .returning({ id: material.id });
  [{ id: ids.azuhata }] = await db.insert(source).values({ workspaceId: w, citeKey: 'azuhata1995', kind: 'journal-article', doi: '10.1088/0953-8984/7/10/002' }).returning({ id: source.id });
  [{ id: ids.pbe }] = await db.insert(method).values({ workspaceId: w, label: 'PBE', functional: 'PBE', kGrid: [8, 8, 6] }).returning({ id: method.id });
  [{ id: ids.lda }] = await db.insert(method).values({ workspaceId: w, label: 'LDA', functional: 'LDA' }).returning({ id: method.id });
  const base = { workspaceId: w, materialId: ids.gan, sourceId: ids.azuhata };
  await db.insert(measurement).values([
    { ...base, quantity: 'frequency', value: 569, valueText: '569', unit: 'cm-1', irrep: 'E2(high)', technique: 'raman', temperatureK: 295, rowHash: 'a' },
    { ...base, quantity: 'frequency', value: 533, valueText: '533', unit: 'cm-1', irrep: 'A1(TO)', branch: 'TO', technique: 'raman', temperatureK: 295, rowHash: 'b' },
    { ...base, quantity: 'frequency', value: 144, valueText: '144', unit: 'cm-1', irrep: 'E2(low)', technique: 'raman', rowHash: 'c', retractedAt: new Date() },
  ]);
  await db.insert(calculation).values([
    { ...base, methodId: ids.pbe, quantity: 'frequency', value: 556.1, valueText: '556.1', unit: 'cm-1', irrep: 'E2', modeIndex: 11, rowHash: 'd' },
    { ...base, methodId: ids.pbe, quantity: 'frequency', value: 521.3, valueText: '521.3', unit: 'cm-1', irrep: 'A1', modeIndex: 9, rowHash: 'e' },
    { ...base, methodId: ids.pbe, quantity: 'entropy', value: 30.1, valueText: '30.1', unit: 'J/(mol*K)', temperatureK: 298.15, rowHash: 'f' },
    { ...base, methodId: ids.lda, quantity: 'frequency', value: 570.4, valueText: '570.4', unit: 'cm-1', irrep: 'E2', modeIndex: 11, rowHash: 'g' },
  ]);
});

describe('material values', () => {
  it('returns the unretracted measured peaks with their source, and modes grouped per method', async () => {
    const v = await getMaterialValues(ws.workspaceId, ids.gan);
    expect(v.peaks.map((p) => [p.value, p.irrep, p.citeKey])).toEqual([
      [533, 'A1(TO)', 'azuhata1995'],
      [569, 'E2(high)', 'azuhata1995'],
    ]);
    expect(v.methods.map((m) => m.methodLabel)).toEqual(['LDA', 'PBE']);
    const pbe = v.methods.find((m) => m.methodLabel === 'PBE')!;
    expect(pbe.modes.map((m) => m.modeIndex)).toEqual([9, 11]);
    expect(pbe.entropies.map((e) => e.value)).toEqual([30.1]);
    expect(v.entropies).toEqual([]);
  });

  it('shows nothing of a material to another workspace', async () => {
    const v = await getMaterialValues(other.workspaceId, ids.gan);
    expect(v).toEqual({ peaks: [], entropies: [], heatCapacities: [], dielectric: [], born: [], methods: [] });
  });

  it('lists the materials of a method with the k-point density inputs', async () => {
    const { rows, more } = await listMaterialsOfMethod(ws.workspaceId, ids.pbe);
    expect(more).toBe(false);
    expect(rows).toEqual([{ id: ids.gan, name: 'GaN-wz', reducedFormula: 'GaN', atomsInCell: 4, calculationCount: 3 }]);
    expect(kPointDensity([8, 8, 6], rows[0].atomsInCell)).toBe(1536);
    expect((await listMaterialsOfMethod(other.workspaceId, ids.pbe)).rows).toEqual([]);
  });
});
