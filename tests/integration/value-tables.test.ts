import { beforeAll, describe, expect, it } from 'vitest';
import { db, getClient } from '@/db/client';
import { calculation, importBatch, material, measurement, method, source } from '@/db/schema';
import { listCalculationRows, listMeasurementRows } from '@/db/queries/values';
import { parseValueListParams } from '@/lib/catalog/value-list-params';
import { createVerifiedUser, createWorkspaceWith } from '../support/users';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;
const ids = { mat: [] as string[], src: [] as string[], pbe: '', lda: '', imp: '' };
const params = (p: Record<string, string>) => parseValueListParams(p);

// All values are invented for these tests.
// 4 materials (Zeta, Alpha, Mu, Beta), sources "smith2001" and "jones2010", methods PBE and LDA.
// 300 calculations: value = i, material i % 4, method PBE for even i, source smith for i < 100,
// rows 0..49 in the import, every 25th retracted; 200 measurements: raman for even i.
beforeAll(async () => {
  ws = await createWorkspaceWith([]);
  other = await createWorkspaceWith([]);
  const contributor = await createVerifiedUser('Ada Contributor');
  const w = ws.workspaceId;
  for (const name of ['Zeta', 'Alpha', 'Mu', 'Beta']) {
    const [r] = await db
      .insert(material)
      .values({ workspaceId: w, name, formula: 'Si', reducedFormula: 'Si', atomsPerFormulaUnit: 1, elementCounts: { Si: 1 }, atomsInCell: 2 })
      .returning({ id: material.id });
    ids.mat.push(r.id);
  }
  for (const citeKey of ['smith2001', 'jones2010']) {
    const [r] = await db.insert(source).values({ workspaceId: w, citeKey, kind: 'journal-article' }).returning({ id: source.id });
    ids.src.push(r.id);
  }
  [{ id: ids.pbe }] = await db.insert(method).values({ workspaceId: w, label: 'PBE', functional: 'PBE' }).returning({ id: method.id });
  [{ id: ids.lda }] = await db.insert(method).values({ workspaceId: w, label: 'LDA', functional: 'LDA' }).returning({ id: method.id });
  [{ id: ids.imp }] = await db
    .insert(importBatch)
    .values({ workspaceId: w, kind: 'calculations', sha256: 'f'.repeat(64), byteCount: 10, rowCount: 50, insertedCount: 50, via: 'api' })
    .returning({ id: importBatch.id });
  const t0 = Date.UTC(2024, 0, 1);
  await db.insert(calculation).values(
    Array.from({ length: 300 }, (_, i) => ({
      workspaceId: w,
      materialId: ids.mat[i % 4],
      sourceId: ids.src[i < 100 ? 0 : 1],
      methodId: i % 2 === 0 ? ids.pbe : ids.lda,
      importId: i < 50 ? ids.imp : null,
      quantity: 'frequency' as const,
      value: i,
      valueText: i.toFixed(2),
      unit: 'cm-1',
      temperatureK: i % 3 === 0 ? null : 300 - i,
      modeIndex: i,
      rowHash: `c${i}`,
      contributorId: contributor.id,
      createdAt: new Date(t0 + i * 1000),
      retractedAt: i % 25 === 0 ? new Date() : null,
    })),
  );
  await db.insert(measurement).values(
    Array.from({ length: 200 }, (_, i) => ({
      workspaceId: w,
      materialId: ids.mat[i % 4],
      sourceId: ids.src[i % 2],
      quantity: (i < 190 ? 'frequency' : 'entropy') as 'frequency' | 'entropy',
      value: 1000 - i,
      valueText: String(1000 - i),
      unit: 'cm-1',
      technique: i % 2 === 0 ? ('raman' as const) : ('ins' as const),
      sampleForm: 'powder' as const,
      rowHash: `m${i}`,
      createdAt: new Date(t0 + i * 1000),
    })),
  );
  // The other workspace has a material, source and values of the same names.
  const o = other.workspaceId;
  const [om] = await db.insert(material).values({ workspaceId: o, name: 'Alpha', formula: 'Si', reducedFormula: 'Si', atomsPerFormulaUnit: 1, elementCounts: { Si: 1 } }).returning({ id: material.id });
  const [os] = await db.insert(source).values({ workspaceId: o, citeKey: 'smith2001', kind: 'journal-article' }).returning({ id: source.id });
  const [oMethod] = await db.insert(method).values({ workspaceId: o, label: 'PBE', functional: 'PBE' }).returning({ id: method.id });
  await db.insert(calculation).values({ workspaceId: o, materialId: om.id, sourceId: os.id, methodId: oMethod.id, quantity: 'frequency', value: -5, valueText: '-5', unit: 'cm-1', rowHash: 'x' });
  await db.insert(measurement).values({ workspaceId: o, materialId: om.id, sourceId: os.id, quantity: 'frequency', value: 5000, valueText: '5000', unit: 'cm-1', rowHash: 'y' });
});

describe('calculation table', () => {
  it('pages live rows by creation time, counting the whole filter', async () => {
    const page1 = await listCalculationRows(ws.workspaceId, params({ size: '50' }));
    expect(page1.total).toBe(288); // 300 minus 12 retracted (0, 25, …, 275)
    expect(page1.sort).toBe('created');
    expect(page1.rows).toHaveLength(50);
    expect(page1.rows[0]).toMatchObject({ value: 1, valueText: '1.00', materialName: 'Alpha', methodLabel: 'LDA', citeKey: 'smith2001', importId: ids.imp, contributorName: 'Ada Contributor' });
    const last = await listCalculationRows(ws.workspaceId, params({ size: '200', page: '2' }));
    expect(last.rows).toHaveLength(88);
    expect(last.rows.at(-1)?.value).toBe(299);
    expect((await listCalculationRows(ws.workspaceId, params({ retracted: '1', size: '1000' }))).rows).toHaveLength(300);
  });

  it('sorts by value, material, method and temperature, and ignores keys off the whitelist', async () => {
    const byValue = await listCalculationRows(ws.workspaceId, params({ sort: 'value', dir: 'desc' }));
    expect(byValue.rows.slice(0, 3).map((r) => r.value)).toEqual([299, 298, 297]);
    const byMaterial = await listCalculationRows(ws.workspaceId, params({ sort: 'material', size: '1000' }));
    const names = byMaterial.rows.map((r) => r.materialName);
    expect(names).toEqual([...names].sort());
    expect(names[0]).toBe('Alpha');
    const byMethod = await listCalculationRows(ws.workspaceId, params({ sort: 'method', dir: 'desc' }));
    expect(byMethod.rows[0].methodLabel).toBe('PBE');
    const byT = await listCalculationRows(ws.workspaceId, params({ sort: 'temperature', dir: 'desc', size: '50' }));
    expect(byT.rows[0].temperatureK).toBe(299);
    const injected = await listCalculationRows(ws.workspaceId, params({ sort: 'value; drop table calculation' }));
    expect(injected.sort).toBe('created');
    expect(injected.rows[0].value).toBe(1);
  });

  it('filters by material name, method, source cite key, import and quantity', async () => {
    const alpha = await listCalculationRows(ws.workspaceId, params({ q: 'alph', size: '1000' }));
    expect(alpha.total).toBe(72); // i ≡ 1 (mod 4): 75 rows, minus 25, 125, 225 retracted
    expect(new Set(alpha.rows.map((r) => r.materialName))).toEqual(new Set(['Alpha']));
    const pbe = await listCalculationRows(ws.workspaceId, params({ method: ids.pbe, size: '1000' }));
    expect(pbe.rows.every((r) => r.methodLabel === 'PBE' && r.value % 2 === 0)).toBe(true);
    expect(pbe.total).toBe(144);
    const smith = await listCalculationRows(ws.workspaceId, params({ source: 'smith', size: '1000' }));
    expect(smith.total).toBe(96);
    const fromImport = await listCalculationRows(ws.workspaceId, params({ import: ids.imp, size: '1000' }));
    expect(fromImport.total).toBe(48);
    expect(fromImport.rows.every((r) => r.importId === ids.imp)).toBe(true);
    expect((await listCalculationRows(ws.workspaceId, params({ quantity: 'entropy' }))).total).toBe(0);
    const combined = await listCalculationRows(ws.workspaceId, params({ q: 'Alpha', method: ids.lda, source: 'jones' }));
    expect(combined.rows.every((r) => r.materialName === 'Alpha' && r.methodLabel === 'LDA' && r.citeKey === 'jones2010')).toBe(true);
  });

  it('never shows another workspace’s rows, even when filtered by its names or ids', async () => {
    const all = await listCalculationRows(ws.workspaceId, params({ size: '1000', retracted: '1' }));
    expect(all.rows.some((r) => r.value === -5)).toBe(false);
    const otherRows = await listCalculationRows(other.workspaceId, params({ size: '1000' }));
    expect(otherRows.rows.map((r) => r.value)).toEqual([-5]);
    expect((await listCalculationRows(other.workspaceId, params({ method: ids.pbe }))).total).toBe(0);
    expect((await listCalculationRows(other.workspaceId, params({ import: ids.imp }))).total).toBe(0);
  });
});

describe('measurement table', () => {
  it('pages, sorts, filters by technique and keeps workspaces apart', async () => {
    const first = await listMeasurementRows(ws.workspaceId, params({ sort: 'value', size: '50' }));
    expect(first.total).toBe(200);
    expect(first.rows[0]).toMatchObject({ value: 801, technique: 'ins', sampleForm: 'powder', citeKey: 'jones2010' });
    const raman = await listMeasurementRows(ws.workspaceId, params({ technique: 'raman', size: '200' }));
    expect(raman.total).toBe(100);
    expect(raman.rows.every((r) => r.technique === 'raman')).toBe(true);
    expect((await listMeasurementRows(ws.workspaceId, params({ quantity: 'entropy' }))).total).toBe(10);
    // "method" is not a measurement sort key.
    expect((await listMeasurementRows(ws.workspaceId, params({ sort: 'method' }))).sort).toBe('created');
    const byMaterial = await listMeasurementRows(ws.workspaceId, params({ sort: 'material', dir: 'desc' }));
    expect(byMaterial.rows[0].materialName).toBe('Zeta');
    expect((await listMeasurementRows(ws.workspaceId, params({ size: '1000' }))).rows.some((r) => r.value === 5000)).toBe(false);
    expect((await listMeasurementRows(other.workspaceId, params({ source: 'smith' }))).rows.map((r) => r.value)).toEqual([5000]);
  });
});

describe('a table of 100,000 calculations', () => {
  it('serves a page of 1000 with LIMIT/OFFSET', async () => {
    const big = await createWorkspaceWith([]);
    const w = big.workspaceId;
    const [m] = await db.insert(material).values({ workspaceId: w, name: 'Big', formula: 'Si', reducedFormula: 'Si', atomsPerFormulaUnit: 1, elementCounts: { Si: 1 } }).returning({ id: material.id });
    const [s] = await db.insert(source).values({ workspaceId: w, citeKey: 'bulk', kind: 'computed-data-set' }).returning({ id: source.id });
    const [me] = await db.insert(method).values({ workspaceId: w, label: 'Bulk', functional: 'PBE' }).returning({ id: method.id });
    const N = 100_000;
    const CHUNK = 500;
    const columns = ['id', 'workspace_id', 'material_id', 'source_id', 'method_id', 'quantity', 'value', 'value_text', 'unit', 'row_hash', 'created_at'];
    const client = getClient();
    const tInsert = performance.now();
    const tx = await client.transaction('write');
    try {
      for (let i = 0; i < N; i += CHUNK) {
        const args: Array<string | number> = [];
        const n = Math.min(CHUNK, N - i);
        for (let j = i; j < i + n; j++) {
          // value: a permutation of 0..N-1 so that a sort by value has a known answer.
          const v = (j * 7919) % N;
          args.push(`big-${j}`, w, m.id, s.id, me.id, 'frequency', v, String(v), 'cm-1', `h${j}`, 1_700_000_000_000 + j);
        }
        const placeholders = Array.from({ length: n }, () => `(${columns.map(() => '?').join(',')})`).join(',');
        await tx.execute({ sql: `insert into calculation (${columns.join(',')}) values ${placeholders}`, args });
        await new Promise(setImmediate);
      }
      await tx.commit();
    } finally {
      tx.close();
    }
    const insertMs = performance.now() - tInsert;

    const timings: string[] = [];
    const timed = async (label: string, p: Record<string, string>) => {
      const t = performance.now();
      const r = await listCalculationRows(w, params(p));
      timings.push(`${label}: ${(performance.now() - t).toFixed(1)} ms`);
      return r;
    };
    const byValue = await timed('page 50 of 1000 by value', { size: '1000', page: '50', sort: 'value' });
    expect(byValue.total).toBe(N);
    expect(byValue.rows).toHaveLength(1000);
    expect(byValue.rows[0].value).toBe(49_000);
    expect(byValue.rows.at(-1)?.value).toBe(49_999);
    const byCreated = await timed('last page of 1000 by created', { size: '1000', page: '100', sort: 'created', dir: 'asc' });
    expect(byCreated.rows.at(-1)?.id).toBe(`big-${N - 1}`);
    await timed('page 1 of 1000 by material (correlated name)', { size: '1000', sort: 'material' });
    const filtered = await timed('page 1 of 1000, material name filter', { size: '1000', q: 'Big', source: 'bul' });
    expect(filtered.total).toBe(N);

    const plan = await client.execute({
      sql: 'explain query plan select id from calculation where workspace_id = ? and retracted_at is null order by value limit 1000 offset 49000',
      args: [w],
    });
    console.log(
      `100,000 calculations inserted in ${insertMs.toFixed(0)} ms; ${timings.join('; ')}; plan: ${plan.rows.map((r) => String(r.detail)).join(' | ')}`,
    );
  }, 120_000);
});
