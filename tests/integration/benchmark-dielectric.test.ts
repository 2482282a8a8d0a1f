/**
 * Dielectric constants through the real paths: ε∞ and ε₀ rows imported from CSV (measured and
 * computed), an ε∞ benchmark created in the form pairs them per material, and the same imported
 * ε∞, ε₀ switch on the Lyddane–Sachs–Teller check of a frequency benchmark. Values invented for
 * the test, modelled on rock-salt NaCl (TO 164, LO 264 cm⁻¹, ε∞ 2.34, ε₀ 5.9; textbook values
 * from memory).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '@/db/client';
import { material, measurement } from '@/db/schema';
import { and, eq } from 'drizzle-orm';
import { importCsvFile } from '@/lib/services/imports/csv-import';
import { isImportRefusal, type ImportRefusalError } from '@/lib/import/errors';
import { getMaterialValues } from '@/db/queries/material-values';
import { loadMaterialQuality } from '@/app/(app)/w/[workspace]/materials/_components/load-material-quality';
import { createWorkspaceWith } from '../support/users';
import { createBenchmarkAsCurator } from './benchmark-form-support';
import { bytesOf, chunksOf, seedCatalogue } from './import-fixtures';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;

function importText(text: string, kind: 'measurements' | 'calculations', fileName: string) {
  return importCsvFile({ workspaceId: ws.workspaceId, actor: { userId: ws.owner.id, tokenId: null }, via: 'wizard', kind, fileName, body: chunksOf(bytesOf(text), 17) });
}

const createBenchmark = async (fields: Record<string, string>) => (await createBenchmarkAsCurator(ws, fields)).snap;

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator']);
  await seedCatalogue(ws.workspaceId);
  await db.insert(material).values({ workspaceId: ws.workspaceId, name: 'NaCl', formula: 'NaCl', reducedFormula: 'NaCl', atomsPerFormulaUnit: 2, elementCounts: { Na: 1, Cl: 1 }, spaceGroup: 225, atomsInCell: 2 });
});

describe('dielectric constants', () => {
  it('refuses ε < 1 and a unit, and stores an empty unit as dimensionless', async () => {
    const e = await importText(
      ['material,quantity,value,unit,source', 'NaCl,eps-inf,0.9,,azuhata1995', 'NaCl,eps-static,5.9,cm-1,azuhata1995'].join('\n'),
      'measurements',
      'bad-eps.csv',
    ).then(
      () => null,
      (err: unknown) => err,
    );
    expect(isImportRefusal(e)).toBe(true);
    expect((e as ImportRefusalError).errors).toEqual([
      { row: 2, column: 'value', reason: 'A dielectric constant is ≥ 1 (got 0.9); write ε itself, not χ = ε − 1.', value: '0.9' },
      { row: 3, column: 'unit', reason: 'A dielectric constant has no unit, got "cm-1"; leave the unit cell empty or write 1.', value: 'cm-1' },
    ]);
  });

  it('pairs measured and computed ε∞ per material in an ε∞ benchmark, with the caution', async () => {
    const measured = await importText(['material,quantity,value,unit,temperature_K,source', 'NaCl,eps-inf,2.34,,295,azuhata1995', 'NaCl,eps-static,5.90,1,295,azuhata1995', 'Si,eps-inf,11.90,,295,azuhata1995'].join('\n'), 'measurements', 'eps.csv');
    expect(measured).toMatchObject({ rowCount: 3, insertedCount: 3 });
    const [row] = await db.select().from(measurement).where(and(eq(measurement.importId, measured.importId), eq(measurement.quantity, 'eps-inf'), eq(measurement.valueText, '2.34')));
    expect(row).toMatchObject({ unit: '1', value: 2.34, temperatureK: 295 });

    // ε∞ 2.45 (NaCl) and 12.60 (Si): errors +0.11 and +0.70. NaCl modes: 3 acoustic, TO 164 (×2), LO 264.
    const computed = await importText(
      [
        'material,method,quantity,value,unit,mode_index,irrep,degeneracy,activity,source',
        'NaCl,PBEsol-PAW-600,eps-inf,2.45,,,,,,inhouse-2026',
        'NaCl,PBEsol-PAW-600,eps-static,4.00,,,,,,inhouse-2026',
        'Si,PBEsol-PAW-600,eps-inf,12.60,,,,,,inhouse-2026',
        'NaCl,PBEsol-PAW-600,frequency,0.01,cm-1,1,,1,acoustic,inhouse-2026',
        'NaCl,PBEsol-PAW-600,frequency,0.01,cm-1,2,,1,acoustic,inhouse-2026',
        'NaCl,PBEsol-PAW-600,frequency,0.01,cm-1,3,,1,acoustic,inhouse-2026',
        'NaCl,PBEsol-PAW-600,frequency,164,cm-1,4,T1u(TO),2,ir,inhouse-2026',
        'NaCl,PBEsol-PAW-600,frequency,264,cm-1,6,T1u(LO),1,ir,inhouse-2026',
      ].join('\n'),
      'calculations',
      'eps-calc.csv',
    );
    expect(computed).toMatchObject({ rowCount: 8, insertedCount: 8 });

    const snap = await createBenchmark({ name: 'ε∞', quantity: 'eps-inf' });
    expect(snap.quantity).toBe('eps-inf');
    expect(snap.unit).toBe('');
    expect(snap.caution).toMatch(/orientational average/);
    expect(snap.pairs.map((p) => [p.measured, p.calculated, p.basis])).toEqual(
      expect.arrayContaining([
        [2.34, 2.45, 'material'],
        [11.9, 12.6, 'material'],
      ]),
    );
    expect(snap.pairs).toHaveLength(2);
    expect(snap.pairs.find((p) => p.measured === 2.34)!.error).toBeCloseTo(0.11, 12);
  });

  it('switches on the Lyddane–Sachs–Teller check of a frequency benchmark: Π(ω_LO/ω_TO)² = 2.591 against ε₀/ε∞ = 1.633', async () => {
    await importText(['material,quantity,value,unit,irrep,technique,source', 'NaCl,frequency,164,cm-1,T1u(TO),ir-reflectance,azuhata1995'].join('\n'), 'measurements', 'nacl-to.csv');
    const snap = await createBenchmark({ name: 'NaCl modes', quantity: 'frequency' });
    const lst = snap.quality.filter((q) => q.code === 'lyddane-sachs-teller');
    expect(lst).toHaveLength(1);
    // (264/164)² = 2.59131; ε₀/ε∞ = 4.00/2.45 = 1.63265; 2.59131/1.63265 − 1 = +58.7 %
    expect(lst[0].value).toBeCloseTo((264 / 164) ** 2 / (4 / 2.45) - 1, 10);
    expect(lst[0].message).toMatch(/2\.591 but ε₀\/ε∞ = 1\.633/);

    // the material page runs the same check on the same rows
    const [nacl] = await db.select().from(material).where(and(eq(material.workspaceId, ws.workspaceId), eq(material.name, 'NaCl')));
    const page = await loadMaterialQuality(ws.workspaceId, nacl, await getMaterialValues(ws.workspaceId, nacl.id));
    expect(page).toHaveLength(1);
    expect(page[0].flags.map((f) => f.code)).toContain('lyddane-sachs-teller');
    expect(page[0].skipped.join(' ')).not.toMatch(/Lyddane/);
  });
});
