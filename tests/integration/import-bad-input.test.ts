import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { importBatch, measurement } from '@/db/schema';
import { importCsvFile } from '@/lib/services/imports/csv-import';
import { type RowError, isImportRefusal, type ImportRefusalError } from '@/lib/import/errors';
import { createWorkspaceWith } from '../support/users';
import { bytesOf, chunksOf, seedCatalogue } from './import-fixtures';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;

beforeAll(async () => {
  ws = await createWorkspaceWith();
  await seedCatalogue(ws.workspaceId);
});

async function errorsOf(file: string | Uint8Array, kind: 'measurements' | 'calculations' = 'measurements', mapping?: Record<string, string | null>): Promise<RowError[]> {
  const bytes = typeof file === 'string' ? bytesOf(file) : file;
  const before = [await db.$count(importBatch, eq(importBatch.workspaceId, ws.workspaceId)), await db.$count(measurement, eq(measurement.workspaceId, ws.workspaceId))];
  const e = await importCsvFile({
    workspaceId: ws.workspaceId,
    actor: { userId: ws.owner.id, tokenId: null },
    via: 'wizard',
    kind,
    fileName: 'bad.csv',
    body: chunksOf(bytes, 5),
    mapping,
  }).catch((err: unknown) => err);
  expect(isImportRefusal(e)).toBe(true);
  // Nothing written, whatever the problem.
  expect([await db.$count(importBatch, eq(importBatch.workspaceId, ws.workspaceId)), await db.$count(measurement, eq(measurement.workspaceId, ws.workspaceId))]).toEqual(before);
  return (e as ImportRefusalError).errors;
}

const H = 'material,quantity,value,unit,uncertainty,temperature_K,source';

describe('bad input is refused with row, column and reason, and writes nothing', () => {
  it('a file that is not UTF-8 (Latin-1 "µ")', async () => {
    // "µm" written in Latin-1 in the unit cell of the second data row: the error names that row and column.
    const latin1 = new Uint8Array([...bytesOf(`${H}\nSi,frequency,520,cm-1,,300,azuhata1995\nSi,frequency,0.5,`), 0xb5, ...bytesOf('m,,300,azuhata1995\n')]);
    const [e] = await errorsOf(latin1);
    expect(e).toMatchObject({ row: 3, column: 'unit' });
    expect(e.reason).toMatch(/not valid UTF-8: the first invalid byte \(0xB5 at byte 119\) is in this cell/);
  });

  it('an empty file, and a header without rows', async () => {
    expect((await errorsOf(''))[0].reason).toBe('The file is empty.');
    expect((await errorsOf('\uFEFF\n\n'))[0].reason).toBe('The file is empty.');
    expect((await errorsOf(`${H}\n`))[0].reason).toMatch(/no data rows/);
  });

  it('a header missing a required column', async () => {
    const errors = await errorsOf('material,quantity,value,unit\nSi,frequency,520,cm-1\n');
    expect(errors).toEqual([{ row: 1, column: 'source', reason: 'Required column "source" is missing from the header.' }]);
  });

  it('duplicate headers (papaparse would rename them silently)', async () => {
    const errors = await errorsOf('material,quantity,value,unit,value,source\nSi,frequency,520,cm-1,521,azuhata1995\n');
    expect(errors[0]).toMatchObject({ row: 1, column: 'value' });
    expect(errors[0].reason).toMatch(/columns 3 and 5/);
    const caseOnly = await errorsOf('Material,material,quantity,value,unit,source\nSi,Si,frequency,520,cm-1,azuhata1995\n');
    expect(caseOnly[0].reason).toMatch(/Duplicate header/);
  });

  it('a mapping to a column the file does not have', async () => {
    const errors = await errorsOf(`${H}\nSi,frequency,520,cm-1,,300,azuhata1995\n`, 'measurements', { material: 'Compound', quantity: 'quantity', value: 'value', unit: 'unit', source: 'source' });
    expect(errors).toContainEqual({ row: 1, column: 'material', reason: 'Column "material" is mapped to "Compound", which is not in the file\'s header.' });
  });

  it('text in a number column, a decimal comma, an unknown unit, a negative temperature and uncertainty', async () => {
    const errors = await errorsOf(
      [
        H,
        'Si,frequency,abc,cm-1,,300,azuhata1995',
        'Si,frequency,"520,5",cm-1,,300,azuhata1995',
        'Si,frequency,520,cm^-2,,300,azuhata1995',
        'Si,frequency,520,cm-1,,-4,azuhata1995',
        'Si,frequency,520,cm-1,-1,300,azuhata1995',
        'Si,entropy,20,J/mol/K,,,azuhata1995',
        'Si,heat-capacity,20,J/mol/K,,,azuhata1995',
        'Si,heat-capacity,-2,J/mol/K,,298.15,azuhata1995',
        'Si,heat-capacity,20,cm-1,,298.15,azuhata1995',
      ].join('\n'),
    );
    expect(errors).toEqual([
      { row: 2, column: 'value', reason: '"abc" is not a number.', value: 'abc' },
      { row: 3, column: 'value', reason: '"520,5" uses a decimal comma; write numbers with a decimal point (e.g. 520.5).', value: '520,5' },
      { row: 4, column: 'unit', reason: 'Unknown frequency unit "cm^-2"; use one of cm-1, THz, meV.', value: 'cm^-2' },
      { row: 5, column: 'temperature_K', reason: 'A temperature cannot be below 0 K (got -4).', value: '-4' },
      { row: 6, column: 'uncertainty', reason: 'An uncertainty must be ≥ 0.', value: '-1' },
      { row: 7, column: 'temperature_K', reason: 'An entropy needs its temperature (temperature_K).' },
      { row: 8, column: 'temperature_K', reason: 'A heat capacity needs its temperature (temperature_K).' },
      { row: 9, column: 'value', reason: 'A heat capacity cannot be negative (got -2).', value: '-2' },
      { row: 10, column: 'unit', reason: 'Unknown heat-capacity unit "cm-1"; use one of J/mol/K, J/mol-atom/K, kB/atom, kB/fu, cal/mol/K.', value: 'cm-1' },
    ]);
  });

  it('unknown material, source and method references (with a hint for a case slip)', async () => {
    const errors = await errorsOf('material,method,quantity,value,unit,source\ngan-wz,PBE-none,frequency,500,cm-1,nobody2020\n', 'calculations');
    expect(errors).toEqual([
      { row: 2, column: 'material', reason: 'Unknown material "gan-wz". Did you mean "GaN-wz"?', value: 'gan-wz' },
      { row: 2, column: 'source', reason: 'Unknown source "nobody2020".', value: 'nobody2020' },
      { row: 2, column: 'method', reason: 'Unknown method "PBE-none".', value: 'PBE-none' },
    ]);
  });

  it('a row with the wrong number of cells, and broken quoting', async () => {
    const errors = await errorsOf(`${H}\nSi,frequency,520,cm-1,,300\nSi,frequency,"52"0,cm-1,,300,azuhata1995\n`);
    expect(errors[0]).toMatchObject({ row: 2, column: null, reason: expect.stringMatching(/6 cells; the header has 7/) });
    expect(errors[1]).toMatchObject({ row: 3, column: null, reason: expect.stringMatching(/Broken quoting/) });
  });

  it('reports every error of a file, not only the first', async () => {
    const lines = [H];
    for (let i = 0; i < 1500; i++) lines.push(`Si,frequency,${i % 2 ? 'x' : '520'},cm-1,,300,azuhata1995`);
    const errors = await errorsOf(lines.join('\n'));
    expect(errors).toHaveLength(750);
    expect(errors.at(-1)).toMatchObject({ row: 1501, column: 'value' });
  });
});
