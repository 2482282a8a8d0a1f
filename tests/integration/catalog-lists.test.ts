import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '@/db/client';
import { calculation, material, materialTag, measurement, method, source } from '@/db/schema';
import { listMaterials, listMaterialTags } from '@/db/queries/materials';
import { listSources } from '@/db/queries/sources';
import { listMethods } from '@/db/queries/methods';
import { parseListParams } from '@/lib/catalog/list-params';
import { createWorkspaceWith } from '../support/users';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;

const params = (p: Record<string, string>) => parseListParams(p);

// 130 invented materials "M000".."M129": space group cycles 1..130, every third is an oxide, every tenth retracted.
beforeAll(async () => {
  ws = await createWorkspaceWith([]);
  other = await createWorkspaceWith([]);
  const rows = Array.from({ length: 130 }, (_, i) => ({
    id: `m-${i}`,
    workspaceId: ws.workspaceId,
    name: `M${String(i).padStart(3, '0')}`,
    formula: i % 3 === 0 ? 'ZnO' : 'GaN',
    reducedFormula: i % 3 === 0 ? 'ZnO' : 'GaN',
    atomsPerFormulaUnit: 2,
    elementCounts: (i % 3 === 0 ? { Zn: 1, O: 1 } : { Ga: 1, N: 1 }) as Record<string, number>,
    spaceGroup: (i % 130) + 1,
    crystalSystem: i % 2 === 0 ? 'hexagonal' : 'cubic',
    atomsInCell: 130 - i,
    retractedAt: i % 10 === 0 ? new Date() : null,
    retractionReason: i % 10 === 0 ? 'test' : null,
  }));
  await db.insert(material).values(rows);
  await db.insert(materialTag).values(rows.filter((_, i) => i % 3 === 0).map((r) => ({ materialId: r.id, workspaceId: ws.workspaceId, tag: 'oxide' })));
  await db.insert(material).values({ workspaceId: other.workspaceId, name: 'M001', formula: 'Si', reducedFormula: 'Si', atomsPerFormulaUnit: 1, elementCounts: { Si: 1 } });
  await db.insert(source).values([
    { workspaceId: ws.workspaceId, citeKey: 'b2000', kind: 'journal-article', title: 'Beta', year: 2000 },
    { workspaceId: ws.workspaceId, citeKey: 'a1990', kind: 'thesis', title: 'Alpha 100% done_ok', year: 1990 },
    { workspaceId: ws.workspaceId, citeKey: 'c2010', kind: 'data-set', title: 'Gamma', year: 2010, retractedAt: new Date() },
  ]);
  await db.insert(method).values([
    { workspaceId: ws.workspaceId, label: 'LDA-NC', functional: 'LDA', cutoffEv: 800 },
    { workspaceId: ws.workspaceId, label: 'PBE-PAW', functional: 'PBE', cutoffEv: 520 },
  ]);
});

describe('list queries', () => {
  it('pages with LIMIT/OFFSET and counts the whole filter, retracted rows hidden by default', async () => {
    const page1 = await listMaterials(ws.workspaceId, params({ size: '50' }));
    expect(page1.total).toBe(117);
    expect(page1.rows).toHaveLength(50);
    expect(page1.rows[0].name).toBe('M001');
    const page3 = await listMaterials(ws.workspaceId, params({ size: '50', page: '3' }));
    expect(page3.rows).toHaveLength(17);
    expect(page3.rows.at(-1)?.name).toBe('M129');
    const all = await listMaterials(ws.workspaceId, params({ size: '200', retracted: '1' }));
    expect(all.total).toBe(130);
    expect(all.rows.find((r) => r.name === 'M000')?.retractedAt).toBeInstanceOf(Date);
  });

  it('sorts by whitelisted columns only, falling back to the name', async () => {
    const bySize = await listMaterials(ws.workspaceId, params({ sort: 'atomsInCell', dir: 'asc' }));
    expect(bySize.sort).toBe('atomsInCell');
    expect(bySize.rows.slice(0, 3).map((r) => r.atomsInCell)).toEqual([1, 2, 3]);
    const desc = await listMaterials(ws.workspaceId, params({ sort: 'spaceGroup', dir: 'desc' }));
    expect(desc.rows[0].spaceGroup).toBe(130);
    const injected = await listMaterials(ws.workspaceId, params({ sort: 'name; drop table material', dir: 'desc' }));
    expect(injected.sort).toBe('name');
    expect(injected.rows[0].name).toBe('M129');
    const unknown = await listMaterials(ws.workspaceId, params({ sort: 'elementCounts' }));
    expect(unknown.sort).toBe('name');
  });

  it('treats inherited property names (__proto__, constructor, toString) as unknown sort keys, not a 500', async () => {
    for (const sort of ['__proto__', 'constructor', 'toString', 'hasOwnProperty']) {
      const materials = await listMaterials(ws.workspaceId, params({ sort, dir: 'desc' }));
      expect(materials.sort).toBe('name');
      expect(materials.rows[0].name).toBe('M129');
      expect((await listSources(ws.workspaceId, params({ sort }))).sort).toBe('citeKey');
      expect((await listMethods(ws.workspaceId, params({ sort }))).sort).toBe('label');
    }
  });

  it('filters by text, tag and crystal system, and never across workspaces', async () => {
    const text = await listMaterials(ws.workspaceId, params({ q: 'M01' }));
    expect(text.rows.map((r) => r.name)).toEqual(['M011', 'M012', 'M013', 'M014', 'M015', 'M016', 'M017', 'M018', 'M019']);
    const oxide = await listMaterials(ws.workspaceId, params({ tag: 'oxide', size: '200' }));
    expect(oxide.rows.every((r) => r.tags.includes('oxide') && r.reducedFormula === 'ZnO')).toBe(true);
    expect(oxide.total).toBe(44 - 5); // 44 multiples of 3 below 130, minus the 5 that are also multiples of 10 (retracted): 0, 30, 60, 90, 120
    const cubic = await listMaterials(ws.workspaceId, params({ system: 'cubic', q: 'ZnO', size: '200' }));
    expect(cubic.rows.every((r) => r.crystalSystem === 'cubic' && r.reducedFormula === 'ZnO')).toBe(true);
    expect(cubic.total).toBe(22);
    expect(await listMaterialTags(ws.workspaceId)).toEqual(['oxide']);
    const otherList = await listMaterials(other.workspaceId, params({}));
    expect(otherList.rows.map((r) => r.name)).toEqual(['M001']);
  });

  it('treats % and _ in the text filter literally', async () => {
    const r = await listSources(ws.workspaceId, params({ q: '100%' }));
    expect(r.rows.map((s) => s.citeKey)).toEqual(['a1990']);
    expect((await listSources(ws.workspaceId, params({ q: '_' }))).rows.map((s) => s.citeKey)).toEqual(['a1990']);
  });

  it('counts the unretracted measurements and calculations of each row on the page', async () => {
    const [src] = await listSources(ws.workspaceId, params({ q: 'b2000' })).then((r) => r.rows);
    const [pbe] = await listMethods(ws.workspaceId, params({ q: 'PBE-PAW' })).then((r) => r.rows);
    // Invented values: two computed modes and one measured peak of M001, one computed mode retracted.
    const common = { workspaceId: ws.workspaceId, materialId: 'm-1', sourceId: src.id, quantity: 'frequency' as const, unit: 'cm-1' };
    await db.insert(calculation).values([
      { ...common, methodId: pbe.id, value: 100, valueText: '100', rowHash: 'c1', modeIndex: 4 },
      { ...common, methodId: pbe.id, value: 200, valueText: '200', rowHash: 'c2', modeIndex: 5 },
      { ...common, methodId: pbe.id, value: 300, valueText: '300', rowHash: 'c3', modeIndex: 6, retractedAt: new Date() },
    ]);
    await db.insert(measurement).values({ ...common, value: 205, valueText: '205', rowHash: 'm1' });
    const [m1] = (await listMaterials(ws.workspaceId, params({ q: 'M001' }))).rows;
    expect(m1).toMatchObject({ name: 'M001', calculationCount: 2, measurementCount: 1 });
    expect((await listSources(ws.workspaceId, params({ q: 'b2000' }))).rows[0].valueCount).toBe(3);
    expect((await listMethods(ws.workspaceId, params({ q: 'PBE-PAW' }))).rows[0].calculationCount).toBe(2);
  });

  it('lists sources and methods sorted by whitelisted columns', async () => {
    expect((await listSources(ws.workspaceId, params({ sort: 'year', dir: 'desc' }))).rows.map((s) => s.citeKey)).toEqual(['b2000', 'a1990']);
    expect((await listSources(ws.workspaceId, params({ retracted: '1' }))).total).toBe(3);
    expect((await listMethods(ws.workspaceId, params({ sort: 'cutoffEv' }))).rows.map((m) => m.label)).toEqual(['PBE-PAW', 'LDA-NC']);
    expect((await listMethods(ws.workspaceId, params({ q: 'pbe' }))).rows.map((m) => m.label)).toEqual(['PBE-PAW']);
  });
});
