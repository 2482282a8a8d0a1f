import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, calculation, importBatch, measurement } from '@/db/schema';
import { undoImport } from '@/db/queries/imports';
import { importCsvFile } from '@/lib/services/imports/csv-import';
import { isImportRefusal, type ImportRefusalError } from '@/lib/import/errors';
import { AppError } from '@/lib/errors';
import { createWorkspaceWith } from '../support/users';
import { bytesOf, chunksOf, seedCatalogue } from './import-fixtures';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;

const MEAS_HEADER = 'material,quantity,value,unit,uncertainty,temperature_K,irrep,technique,source';

function importText(text: string, kind: 'measurements' | 'calculations' = 'measurements', extra: Partial<Parameters<typeof importCsvFile>[0]> = {}) {
  return importCsvFile({
    workspaceId: ws.workspaceId,
    actor: { userId: ws.owner.id, tokenId: null },
    via: 'wizard',
    kind,
    fileName: 'test.csv',
    body: chunksOf(bytesOf(text), 11),
    ...extra,
  });
}

async function refusal(p: Promise<unknown>): Promise<ImportRefusalError> {
  const e = await p.then(
    () => null,
    (err: unknown) => err,
  );
  expect(isImportRefusal(e)).toBe(true);
  return e as ImportRefusalError;
}

async function counts() {
  const [b, m, c, a] = await Promise.all([
    db.$count(importBatch, eq(importBatch.workspaceId, ws.workspaceId)),
    db.$count(measurement, eq(measurement.workspaceId, ws.workspaceId)),
    db.$count(calculation, eq(calculation.workspaceId, ws.workspaceId)),
    db.$count(auditLog, and(eq(auditLog.workspaceId, ws.workspaceId), eq(auditLog.action, 'import'))),
  ]);
  return { batches: b, measurements: m, calculations: c, importAudits: a };
}

beforeAll(async () => {
  ws = await createWorkspaceWith();
  await seedCatalogue(ws.workspaceId);
});

describe('committing an import', () => {
  it('stores every row with canonical values, the original text, the batch record and one audit row', async () => {
    const text = `\uFEFF${MEAS_HEADER}\r\nGaN-wz,frequency,569.0,cm-1,1.50,295,E2(high),raman,azuhata1995\r\nGaN-wz,frequency,17.07,THz,,295,A1(LO),Raman,azuhata1995\r\n`;
    const before = await counts();
    const out = await importText(text);
    expect(out).toMatchObject({ rowCount: 2, insertedCount: 2, duplicateCount: 0 });
    const rows = await db.select().from(measurement).where(eq(measurement.importId, out.importId));
    const e2 = rows.find((r) => r.irrep === 'E2(high)')!;
    expect(e2).toMatchObject({ valueText: '569.0', value: 569, uncertaintyText: '1.50', uncertainty: 1.5, temperatureK: 295, technique: 'raman', contributorId: ws.owner.id });
    const lo = rows.find((r) => r.irrepNormalized === 'A1(LO)')!;
    // 1 THz = 33.35640952 cm⁻¹ (CODATA 2018 exact c; reference/check-values.md).
    expect(lo.value).toBeCloseTo(17.07 * 33.35640952, 5);
    expect(lo).toMatchObject({ unit: 'THz', valueText: '17.07', branch: 'LO' });
    const [batch] = await db.select().from(importBatch).where(eq(importBatch.id, out.importId));
    expect(batch).toMatchObject({ kind: 'measurements', fileName: 'test.csv', rowCount: 2, insertedCount: 2, byteCount: bytesOf(text).byteLength, via: 'wizard', status: 'committed' });
    expect(batch.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(await counts()).toEqual({ ...before, batches: before.batches + 1, measurements: before.measurements + 2, importAudits: before.importAudits + 1 });
  });

  it('refuses the same file twice (409) and names the first import', async () => {
    const text = `${MEAS_HEADER}\nSi,frequency,520.2,cm-1,0.5,300,F2g,raman,azuhata1995\n`;
    const first = await importText(text);
    const before = await counts();
    const e = await importText(text).catch((err: unknown) => err);
    expect(e).toBeInstanceOf(AppError);
    expect((e as AppError).status).toBe(409);
    expect((e as AppError).details).toEqual({ firstImportId: first.importId });
    expect(await counts()).toEqual(before);
  });

  it('reports and skips rows identical to existing rows and to earlier rows of the file', async () => {
    const text = `${MEAS_HEADER}\nSi,frequency,520.2,cm-1,0.5,300,F2g,raman,azuhata1995\nSi,frequency,521.0,cm-1,,300,F2g,raman,azuhata1995\nSi,frequency,521.0,cm-1,,300,F2g,raman,azuhata1995\n`;
    // The first row equals a row of the previous test's import (only the trailing newline differs).
    const out = await importText(text + '\n');
    expect(out).toMatchObject({ rowCount: 3, insertedCount: 1, duplicateCount: 2 });
    expect(out.duplicates).toEqual([
      { row: 4, reason: 'Identical to an earlier row of this file; skipped.' },
      { row: 2, reason: 'Identical to a row already in the workspace; skipped.' },
    ]);
  });

  it('is atomic: an error on the last of 1,201 rows leaves nothing (no batch, no rows, no audit)', async () => {
    const lines = [ 'material,method,quantity,value,unit,mode_index,source' ];
    for (let i = 1; i <= 1200; i++) lines.push(`GaN-wz,PBEsol-PAW-600,frequency,${(100 + i * 0.37).toFixed(2)},cm-1,${i},inhouse-2026`);
    lines.push('GaN-wz,PBEsol-PAW-600,frequency,12x,cm-1,1201,inhouse-2026');
    const before = await counts();
    const e = await refusal(importText(lines.join('\n'), 'calculations'));
    expect(e.errors).toEqual([{ row: 1202, column: 'value', reason: '"12x" is not a number.', value: '12x' }]);
    expect(await counts()).toEqual(before);
  });

  it('accepts zero and negative (imaginary) frequencies in calculations, refuses them in measurements', async () => {
    const out = await importText('material,method,quantity,value,unit,source\nGaN-wz,PBEsol-PAW-600,frequency,-35.2,cm-1,inhouse-2026\nGaN-wz,PBEsol-PAW-600,frequency,0,cm-1,inhouse-2026\n', 'calculations');
    expect(out.insertedCount).toBe(2);
    const e = await refusal(importText(`${MEAS_HEADER}\nSi,frequency,-3,cm-1,,300,,raman,azuhata1995\nSi,frequency,0,cm-1,,300,,raman,azuhata1995\n`));
    expect(e.errors.map((x) => [x.row, x.column])).toEqual([
      [2, 'value'],
      [3, 'value'],
    ]);
    expect(e.errors[0].reason).toMatch(/must be > 0/);
  });

  it('converts entropies per atom to per formula unit with the material’s atom count', async () => {
    const out = await importText('material,quantity,value,unit,temperature_K,source\nGaN-wz,entropy,1.5,kB/atom,300,azuhata1995\n');
    const [row] = await db.select().from(measurement).where(eq(measurement.importId, out.importId));
    // R = N_A k_B = 8.314462618 J/(mol K) exactly (2019 SI); GaN has 2 atoms per formula unit.
    expect(row.value).toBeCloseTo(1.5 * 2 * 8.314462618, 6);
    expect(row).toMatchObject({ unit: 'kB/atom', valueText: '1.5' });
  });

  it('uses the unit chosen for the whole file when the file has no unit column', async () => {
    const out = await importText('material,quantity,value,temperature_K,source\nSi,frequency,15.6,10,azuhata1995\n', 'measurements', { units: { frequency: 'THz' } });
    const [row] = await db.select().from(measurement).where(eq(measurement.importId, out.importId));
    expect(row.unit).toBe('THz');
    const e = await refusal(importText('material,quantity,value,temperature_K,source\nSi,frequency,15.7,10,azuhata1995\n'));
    expect(e.errors[0]).toMatchObject({ row: 2, column: 'unit' });
  });

  it('reads semicolon- and tab-separated files and quoted line breaks', async () => {
    const semi = await importText('material;quantity;value;unit;source;notes\nSi;frequency;519.9;cm-1;azuhata1995;"two\nlines; one cell"\n');
    expect(semi.insertedCount).toBe(1);
    const [row] = await db.select().from(measurement).where(eq(measurement.importId, semi.importId));
    expect(row.notes).toBe('two\nlines; one cell');
    const tab = await importText('material\tquantity\tvalue\tunit\tsource\nSi\tfrequency\t519.8\tcm-1\tazuhata1995\n');
    expect(tab.insertedCount).toBe(1);
  });

  it('undo retracts the rows with the reason, marks the import undone and audits it, in one go', async () => {
    const out = await importText('material,quantity,value,unit,source\nSi,frequency,518.1,cm-1,azuhata1995\nSi,frequency,518.2,cm-1,azuhata1995\n');
    const result = await undoImport(ws.workspaceId, out.importId, ws.owner.id, 'wrong sample');
    expect(result.retracted).toBe(2);
    const rows = await db.select().from(measurement).where(eq(measurement.importId, out.importId));
    expect(rows.every((r) => r.retractedAt && r.retractedBy === ws.owner.id && r.retractionReason === 'Import undone: wrong sample')).toBe(true);
    const [batch] = await db.select().from(importBatch).where(eq(importBatch.id, out.importId));
    expect(batch).toMatchObject({ status: 'undone', undoneBy: ws.owner.id, undoReason: 'wrong sample' });
    const audits = await db.select().from(auditLog).where(and(eq(auditLog.entityId, out.importId), eq(auditLog.action, 'undo-import')));
    expect(audits).toHaveLength(1);
    expect(audits[0].reason).toBe('wrong sample');
    await expect(undoImport(ws.workspaceId, out.importId, ws.owner.id, 'again')).rejects.toMatchObject({ code: 'conflict' });
    // Undone rows no longer count as identical rows.
    const again = await importText('material,quantity,value,unit,source\nSi,frequency,518.1,cm-1,azuhata1995\n');
    expect(again.insertedCount).toBe(1);
  });

  it('undo of another workspace’s import is not found and changes nothing', async () => {
    const other = await createWorkspaceWith();
    const out = await importText('material,quantity,value,unit,source\nSi,frequency,517.5,cm-1,azuhata1995\n');
    await expect(undoImport(other.workspaceId, out.importId, other.owner.id, 'probe')).rejects.toMatchObject({ code: 'not-found' });
    const [batch] = await db.select().from(importBatch).where(eq(importBatch.id, out.importId));
    expect(batch.status).toBe('committed');
  });
});
