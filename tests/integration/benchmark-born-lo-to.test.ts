/**
 * Born effective charges and LO–TO splittings through the real paths: CSV imports (tensors,
 * sites, neutrality refusals), benchmarks created in the form against experiment and against a
 * reference method, and the material page's neutrality line.
 *
 * Frequencies: GaN (wurtzite) A1(TO) 533, E1(TO) 561, A1(LO) 735, E1(LO) 743 cm⁻¹, Azuhata et al.,
 * J. Phys.: Condens. Matter 7, L129 (1995) (published; ../shared/reference/check-values.md), so the
 * measured splittings are 202 (A1) and 182 (E1). The computed frequencies and every Born charge
 * below are invented for the test (near the published magnitudes, about 2.1 e for GaAs and 2.6 e
 * for GaN, recalled from memory).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { and, count, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { calculation, material, method } from '@/db/schema';
import { importCsvFile } from '@/lib/services/imports/csv-import';
import { isImportRefusal, type ImportRefusalError } from '@/lib/import/errors';
import { getMaterialValues } from '@/db/queries/material-values';
import { loadBornChargeSets } from '@/app/(app)/w/[workspace]/materials/_components/load-material-quality';
import { createWorkspaceWith } from '../support/users';
import { createBenchmarkAsCurator } from './benchmark-form-support';
import { bytesOf, chunksOf, seedCatalogue } from './import-fixtures';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let referenceId: string;

function importText(lines: string[], kind: 'measurements' | 'calculations', fileName: string) {
  return importCsvFile({ workspaceId: ws.workspaceId, actor: { userId: ws.owner.id, tokenId: null }, via: 'wizard', kind, fileName, body: chunksOf(bytesOf(lines.join('\n')), 23) });
}

const createBenchmark = async (fields: Record<string, string>) => (await createBenchmarkAsCurator(ws, fields)).snap;

const diag = (x: number, y: number, z: number) => `${x} 0 0; 0 ${y} 0; 0 0 ${z}`;
const CALC = 'material,method,quantity,value,unit,site,tensor,mode_index,irrep,degeneracy,activity,source';

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator']);
  await seedCatalogue(ws.workspaceId);
  await db.update(material).set({ atomsInCell: 4 }).where(and(eq(material.workspaceId, ws.workspaceId), eq(material.name, 'GaN-wz')));
  await db.insert(material).values({ workspaceId: ws.workspaceId, name: 'GaAs', formula: 'GaAs', reducedFormula: 'GaAs', atomsPerFormulaUnit: 2, elementCounts: { Ga: 1, As: 1 }, spaceGroup: 216, atomsInCell: 2 });
  [{ id: referenceId }] = await db.insert(method).values({ workspaceId: ws.workspaceId, label: 'PBEsol-dense', functional: 'PBEsol' }).returning();
});

describe('Born effective charges', () => {
  it('refuses a cell far from neutral and writes nothing', async () => {
    const before = (await db.select({ n: count() }).from(calculation).where(eq(calculation.workspaceId, ws.workspaceId)))[0].n;
    const e = await importText([CALC, 'GaAs,PBEsol-PAW-600,born-charge,2.20,,Ga,,,,,,inhouse-2026', 'GaAs,PBEsol-PAW-600,born-charge,2.20,,As,,,,,,inhouse-2026'], 'calculations', 'wrong-sign.csv').then(
      () => null,
      (err: unknown) => err,
    );
    expect(isImportRefusal(e)).toBe(true);
    expect((e as ImportRefusalError).errors[0]).toMatchObject({ row: 2, column: 'tensor' });
    expect((e as ImportRefusalError).errors[0].reason).toMatch(/GaAs \(PBEsol-PAW-600\) sum to 4\.4 e in the xx component over the 2 atoms of the cell/);
    expect((await db.select({ n: count() }).from(calculation).where(eq(calculation.workspaceId, ws.workspaceId)))[0].n).toBe(before);
  });

  it('pairs per site, a bare element site standing for its atoms; the material page shows the neutrality', async () => {
    await importText(
      ['material,quantity,value,unit,site,source', 'GaAs,born-charge,2.07,e,Ga,azuhata1995', 'GaAs,born-charge,-2.07,e,As,azuhata1995', 'GaN-wz,born-charge,2.65,,Ga,azuhata1995', 'GaN-wz,born-charge,-2.65,,N,azuhata1995'],
      'measurements',
      'born-measured.csv',
    );
    const computed = await importText(
      [
        CALC,
        `GaAs,PBEsol-PAW-600,born-charge,,,Ga,${diag(2.2, 2.2, 2.2)},,,,,inhouse-2026`,
        `GaAs,PBEsol-PAW-600,born-charge,,,As,${diag(-2.2, -2.2, -2.2)},,,,,inhouse-2026`,
        `GaN-wz,PBEsol-PAW-600,born-charge,,,Ga1,${diag(2.6, 2.6, 2.74)},,,,,inhouse-2026`,
        `GaN-wz,PBEsol-PAW-600,born-charge,,,Ga2,${diag(2.6, 2.6, 2.74)},,,,,inhouse-2026`,
        `GaN-wz,PBEsol-PAW-600,born-charge,,,N1,${diag(-2.58, -2.58, -2.67)},,,,,inhouse-2026`,
        `GaN-wz,PBEsol-PAW-600,born-charge,,,N2,${diag(-2.58, -2.58, -2.67)},,,,,inhouse-2026`,
      ],
      'calculations',
      'born-computed.csv',
    );
    expect(computed.insertedCount).toBe(6);
    // Σ zz over GaN's cell = 2 × 2.74 − 2 × 2.67 = 0.14 e: a warning, imported all the same
    expect(computed.warnings?.map((w) => w.message)).toEqual([expect.stringMatching(/sum to 0\.14 e in the zz component over the 4 atoms of the cell/)]);
    const [stored] = await db.select().from(calculation).where(and(eq(calculation.importId, computed.importId), eq(calculation.site, 'Ga1')));
    expect(stored.components).toEqual([2.6, 0, 0, 0, 2.6, 0, 0, 0, 2.74]);
    expect(stored.value).toBeCloseTo(7.94 / 3, 9);

    const snap = await createBenchmark({ name: 'Born', quantity: 'born-charge' });
    expect(snap.unit).toBe('e');
    expect(snap.caution).toMatch(/mean of the diagonal/);
    const errors = Object.fromEntries(snap.pairs.map((p) => [`${p.materialId === stored.materialId ? 'GaN' : 'GaAs'} ${p.label}`, p.error]));
    // Oriented by the sign of the measured charge (magnitudes): GaAs Ga 2.20 − 2.07 = +0.13 and As 2.20 − 2.07 = +0.13
    // (not −0.13, which would cancel in the mean signed error); GaN Ga mean(Ga1, Ga2) = 2.64667 − 2.65; N 2.61 − 2.65 = −0.04
    expect(errors['GaAs Ga']).toBeCloseTo(0.13, 10);
    expect(errors['GaAs As']).toBeCloseTo(0.13, 10);
    expect(errors['GaN Ga']).toBeCloseTo(7.94 / 3 - 2.65, 10);
    expect(errors['GaN N']).toBeCloseTo(7.83 / 3 - 2.65, 10);
    expect(snap.pairs.find((p) => p.label === 'As')!.measured).toBeCloseTo(2.07, 12);
    expect(snap.methods[0].statistics!.meanSignedError).toBeCloseTo((0.13 + 0.13 + (7.94 / 3 - 2.65) + (7.83 / 3 - 2.65)) / 4, 10);
    const gaN = snap.pairs.find((p) => p.label === 'Ga' && p.materialId === stored.materialId)!;
    expect(gaN.calculationIds).toHaveLength(2);
    const mae = [0.13, 0.13, Math.abs(7.94 / 3 - 2.65), Math.abs(-7.83 / 3 + 2.65)].reduce((a, b) => a + b) / 4;
    expect(snap.methods[0].statistics!.meanAbsoluteError).toBeCloseTo(mae, 10);
    expect(snap.tensors).toBeUndefined(); // measured charges are scalars: no full-tensor comparison

    const [gan] = await db.select().from(material).where(and(eq(material.workspaceId, ws.workspaceId), eq(material.name, 'GaN-wz')));
    const sets = await loadBornChargeSets(ws.workspaceId, gan, await getMaterialValues(ws.workspaceId, gan.id));
    expect(sets.map((s) => [s.series, s.neutrality.status])).toEqual([
      ['Measured (azuhata1995)', 'neutral'],
      ['PBEsol-PAW-600', 'residue'],
    ]);
    expect(sets[0].neutrality.text).toMatch(/Σ Z\* = 0 e in the diagonal mean per formula unit/);
  });

  it('against a reference method compares full tensors by ‖ΔZ‖_F', async () => {
    await importText(
      [
        CALC,
        `GaAs,PBEsol-dense,born-charge,,,Ga,2.10 0.1 0; 0.1 2.10 0; 0 0 2.10,,,,,inhouse-2026`,
        `GaAs,PBEsol-dense,born-charge,,,As,-2.10 -0.1 0; -0.1 -2.10 0; 0 0 -2.10,,,,,inhouse-2026`,
      ],
      'calculations',
      'born-reference.csv',
    );
    const snap = await createBenchmark({ name: 'Born vs dense', quantity: 'born-charge', referenceMethodId: referenceId });
    expect(snap.pairs).toHaveLength(2);
    // diag 2.2 against [[2.1, 0.1, 0], [0.1, 2.1, 0], [0, 0, 2.1]]: √(3 × 0.1² + 2 × 0.1²) = √0.05 = 0.22361
    expect(snap.tensors).toEqual([{ methodId: expect.any(String), label: 'PBEsol-PAW-600', n: 2, meanFrobenius: expect.closeTo(Math.sqrt(0.05), 10), maxFrobenius: expect.closeTo(Math.sqrt(0.05), 10) }]);
    expect(snap.reference!.perMethod[0].meanAbsolute).toBeCloseTo(0.1, 10);
  });
});

describe('LO–TO splittings', () => {
  it('pairs the measured ω_LO − ω_TO of each polar species with the computed one; non-polar modes are left out', async () => {
    await importText(
      [
        'material,quantity,value,unit,irrep,technique,source',
        'GaN-wz,frequency,533,cm-1,A1(TO),raman,azuhata1995',
        'GaN-wz,frequency,561,cm-1,E1(TO),raman,azuhata1995',
        'GaN-wz,frequency,569,cm-1,E2(high),raman,azuhata1995',
        'GaN-wz,frequency,735,cm-1,A1(LO),raman,azuhata1995',
        'GaN-wz,frequency,743,cm-1,E1(LO),raman,azuhata1995',
      ],
      'measurements',
      'gan-modes.csv',
    );
    await importText(
      [
        CALC,
        'GaN-wz,PBEsol-PAW-600,frequency,530,cm-1,,,7,A1(TO),1,raman+ir,inhouse-2026',
        'GaN-wz,PBEsol-PAW-600,frequency,556,cm-1,,,8,E1(TO),1,raman+ir,inhouse-2026',
        'GaN-wz,PBEsol-PAW-600,frequency,556,cm-1,,,9,E1(TO),1,raman+ir,inhouse-2026',
        'GaN-wz,PBEsol-PAW-600,frequency,566,cm-1,,,10,E2(high),2,raman,inhouse-2026',
        'GaN-wz,PBEsol-PAW-600,frequency,728,cm-1,,,11,A1(LO),1,raman+ir,inhouse-2026',
        'GaN-wz,PBEsol-PAW-600,frequency,740,cm-1,,,12,E1(LO),2,raman+ir,inhouse-2026',
      ],
      'calculations',
      'gan-computed.csv',
    );
    const snap = await createBenchmark({ name: 'GaN LO–TO', quantity: 'lo-to-splitting' });
    expect(snap.unit).toBe('cm⁻¹');
    expect(snap.caution).toMatch(/ω_LO − ω_TO/);
    const bySpecies = Object.fromEntries(snap.pairs.map((p) => [p.label, [p.measured, p.calculated, p.error, p.measurementIds.length]]));
    // measured 735 − 533 = 202 and 743 − 561 = 182; computed 728 − 530 = 198 and 740 − 556 = 184
    expect(bySpecies).toEqual({ A1: [202, 198, -4, 2], E1: [182, 184, 2, 2] });
    expect(snap.counts.measuredInScope).toBe(2);
    // a splitting is one measured value though it names two measurements
    expect(snap.methods[0]).toMatchObject({ paired: 2, coverage: 1 });
    expect(snap.species!.map((r) => r.group).sort()).toEqual(['A1', 'E1']);
  });
});
