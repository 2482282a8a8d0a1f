import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { db } from '@/db/client';
import { material, measurement, source } from '@/db/schema';
import { GET } from '@/app/api/workspaces/[workspaceId]/values/[kind]/export/route';
import { importCsvFile } from '@/lib/services/imports/csv-import';
import { bytesOf, chunksOf, seedCatalogue } from './import-fixtures';
import { createWorkspaceWith, signInAs } from '../support/users';

async function seed(workspaceId: string) {
  const [m] = await db
    .insert(material)
    .values({ workspaceId, name: '=HYPERLINK("http://x")', formula: 'Si', reducedFormula: 'Si', atomsPerFormulaUnit: 1, elementCounts: { Si: 1 } })
    .returning();
  const [s] = await db.insert(source).values({ workspaceId, citeKey: 'parker1967', kind: 'journal-article' }).returning();
  const rows = Array.from({ length: 1205 }, (_, i) => ({
    workspaceId,
    materialId: m.id,
    sourceId: s.id,
    quantity: 'frequency' as const,
    value: 520 + i / 100,
    valueText: i === 0 ? '1.50' : (520 + i / 100).toFixed(2),
    unit: 'cm-1',
    rowHash: `h${i}`,
  }));
  for (let i = 0; i < rows.length; i += 400) await db.insert(measurement).values(rows.slice(i, i + 400));
}

async function exportCsv(workspaceId: string, kind: string, query = '') {
  const res = await GET(new Request(`http://localhost:3999/api/workspaces/${workspaceId}/values/${kind}/export${query}`), {
    params: Promise.resolve({ workspaceId, kind }),
  });
  return { res, text: res.ok ? await res.text() : '' };
}

describe('value CSV export', () => {
  it('streams every row (all pages) with numbers as entered and formula-like text neutralised', async () => {
    const ws = await createWorkspaceWith(['reviewer']);
    await seed(ws.workspaceId);
    await signInAs(ws.members.reviewer.email);
    const { res, text } = await exportCsv(ws.workspaceId, 'measurements');
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/text\/csv/);
    const rows = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true }).data;
    expect(rows).toHaveLength(1205);
    expect(rows.map((r) => r.value)).toContain('1.50');
    expect(rows[0].material.startsWith("'=")).toBe(true);
    expect(rows.every((r) => r.source === 'parker1967')).toBe(true);
  });

  it('refuses another workspace and an unknown kind', async () => {
    const a = await createWorkspaceWith();
    const b = await createWorkspaceWith();
    await seed(a.workspaceId);
    await signInAs(b.owner.email);
    expect((await exportCsv(a.workspaceId, 'measurements')).res.status).toBe(404);
    await signInAs(a.owner.email);
    expect((await exportCsv(a.workspaceId, 'pairs')).res.status).toBe(400);
  });

  it('writes the temperature as entered ("298.150" stays "298.150"), and the number for rows stored before the text was kept', async () => {
    const ws = await createWorkspaceWith();
    const cat = await seedCatalogue(ws.workspaceId);
    await signInAs(ws.owner.email);
    const file = 'material,quantity,value,unit,temperature_K,source\nSi,entropy,18.80,J/mol/K,298.150,azuhata1995\nSi,entropy,37.2,J/mol/K,1.0e3,azuhata1995\n';
    await importCsvFile({ workspaceId: ws.workspaceId, actor: { userId: ws.owner.id, tokenId: null }, via: 'wizard', kind: 'measurements', fileName: 't.csv', body: chunksOf(bytesOf(file), 64) });
    // A row from before the migration: temperature_text is NULL.
    await db.insert(measurement).values({ workspaceId: ws.workspaceId, materialId: cat.si.id, sourceId: cat.src.id, quantity: 'entropy', value: 20, valueText: '20.0', unit: 'J/mol/K', temperatureK: 298.15, rowHash: 'old' });
    const rows = Papa.parse<Record<string, string>>((await exportCsv(ws.workspaceId, 'measurements')).text, { header: true, skipEmptyLines: true }).data;
    expect(rows.map((r) => [r.value, r.temperature_K]).sort()).toEqual([
      ['18.80', '298.150'],
      ['20.0', '298.15'],
      ['37.2', '1.0e3'],
    ]);
  });
});
