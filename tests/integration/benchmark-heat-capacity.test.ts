/**
 * A heat-capacity benchmark through the real paths: a phonon DOS import stores the harmonic Cv,
 * a measurements CSV stores a calorimetric Cp, the curator creates the benchmark in the form,
 * and the stored revision pairs the two at the benchmark temperature with the Cp/Cv caution.
 * The DOS and the Cp value are invented for the test; the Cv is checked against a hand
 * computation with CODATA 2018 constants.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { material } from '@/db/schema';
import * as uploadRoute from '@/app/api/workspaces/[workspaceId]/imports/route';
import { createBenchmarkAction } from '@/app/(app)/w/[workspace]/benchmarks/actions';
import { getRevision } from '@/db/queries/revisions';
import { whenRecomputeIdle } from '@/lib/services/benchmarks/recompute-queue';
import { importCsvFile } from '@/lib/services/imports/csv-import';
import { dosQuery } from '@/lib/import/dos-format';
import { requestContext } from '../support/request-context';
import { createWorkspaceWith, signInAs } from '../support/users';
import { formData } from './benchmark-support';
import { bytesOf, chunksOf, seedCatalogue } from './import-fixtures';

// CODATA 2018 / SI 2019 exact constants.
import { c, h, kB, R } from '../support/codata';

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let cat: Awaited<ReturnType<typeof seedCatalogue>>;

/** An Einstein DOS of wurtzite GaN (all weight at 400 cm⁻¹), invented for the test. */
const DOS = ['material,method,source,unit,frequency,density', 'GaN-wz,PBEsol-PAW-600,inhouse-2026,cm-1,0,0', 'GaN-wz,PBEsol-PAW-600,inhouse-2026,cm-1,399,0', 'GaN-wz,PBEsol-PAW-600,inhouse-2026,cm-1,400,1', 'GaN-wz,PBEsol-PAW-600,inhouse-2026,cm-1,401,0'].join('\n') + '\n';

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator']);
  cat = await seedCatalogue(ws.workspaceId);
  await db.update(material).set({ atomsInCell: 4 }).where(eq(material.id, cat.gan.id));
});

describe('heat-capacity benchmark', () => {
  it('pairs a measured Cp with the Cv a DOS import computed, at the benchmark temperature', async () => {
    await signInAs(ws.members.curator.email);
    const headers = requestContext.headers();
    headers.set('content-type', 'text/csv');
    const dos = await (uploadRoute.POST as Handler)(
      new Request(`http://localhost:3999/api/workspaces/${ws.workspaceId}/imports?${dosQuery({ fileName: 'gan-dos.csv', temperatures: [100, 298.15] })}`, { method: 'POST', headers, body: DOS }),
      { params: Promise.resolve({ workspaceId: ws.workspaceId }) },
    );
    expect(dos.status).toBe(201);

    // Cp of 32.50 J mol⁻¹ K⁻¹ at 298.15 K and one at 100 K, both invented; a 500 K row is outside the window.
    const csv = [
      'material,quantity,value,unit,temperature_K,technique,source',
      'GaN-wz,heat-capacity,32.50,J/mol/K,298.15,calorimetry,azuhata1995',
      'GaN-wz,heat-capacity,9.80,J/mol/K,100,calorimetry,azuhata1995',
      'GaN-wz,heat-capacity,2.10,kB/atom,500,calorimetry,azuhata1995',
    ].join('\n');
    const imported = await importCsvFile({ workspaceId: ws.workspaceId, actor: { userId: ws.owner.id, tokenId: null }, via: 'wizard', kind: 'measurements', fileName: 'cp.csv', body: chunksOf(bytesOf(csv), 13) });
    expect(imported).toMatchObject({ rowCount: 3, insertedCount: 3 });

    const state = await createBenchmarkAction(
      undefined,
      formData({ workspaceId: ws.workspaceId, name: 'Cp at 298 K', quantity: 'heat-capacity', entropyTemperatureK: '298.15', entropyToleranceK: '1', outlierKind: 'modified-z', repeatedMeasurements: 'separate' }),
    );
    expect(state.ok, state.message).toBe(true);
    const benchmarkId = (state.data as { id: string }).id;
    await whenRecomputeIdle(ws.workspaceId, benchmarkId);

    const rev = await getRevision(ws.workspaceId, benchmarkId);
    const snap = rev!.statistics;
    expect(snap.quantity).toBe('heat-capacity');
    expect(snap.unit).toBe('J mol⁻¹ K⁻¹');
    expect(snap.caution).toMatch(/Calorimetry measures Cp/);
    expect(snap.counts.measuredInScope).toBe(1);
    expect(snap.pairs).toHaveLength(1);
    // Hand computation: 6 Einstein modes per formula unit (12 per cell of 4 atoms, Z = 2) at 400 cm⁻¹.
    const x = (h * c * 100 * 400) / (kB * 298.15);
    const cv = (6 * R * x * x * Math.exp(x)) / Math.expm1(x) ** 2;
    const pair = snap.pairs[0];
    expect(pair.measured).toBe(32.5);
    expect(pair.calculated).toBeCloseTo(cv, 3);
    expect(pair.error).toBeCloseTo(cv - 32.5, 3);
    // one pair: N is shown, the statistics are not (below the minimum N)
    expect(snap.methods[0].n).toBe(1);
    expect(snap.methods[0].statistics).toBeNull();
  });

  it('compares a measured Cp(T) series at every measured temperature with the Cv the DOS gave at each', async () => {
    // Invented Cp(T) at 100 K (imported above) and 200 K, 298.15 K; the DOS was imported at 100 and 298.15 K, so 200 K stays unpaired.
    const csv = ['material,quantity,value,unit,temperature_K,technique,source', 'GaN-wz,heat-capacity,24.00,J/mol/K,200,calorimetry,azuhata1995'].join('\n');
    await importCsvFile({ workspaceId: ws.workspaceId, actor: { userId: ws.owner.id, tokenId: null }, via: 'wizard', kind: 'measurements', fileName: 'cp-200.csv', body: chunksOf(bytesOf(csv), 13) });
    const state = await createBenchmarkAction(
      undefined,
      formData({ workspaceId: ws.workspaceId, name: 'Cp(T) series', quantity: 'heat-capacity', thermalTemperatures: 'each', entropyTemperatureK: '298.15', entropyToleranceK: '0.5', outlierKind: 'modified-z', repeatedMeasurements: 'separate' }),
    );
    expect(state.ok, state.message).toBe(true);
    const benchmarkId = (state.data as { id: string }).id;
    await whenRecomputeIdle(ws.workspaceId, benchmarkId);
    const rev = await getRevision(ws.workspaceId, benchmarkId);
    const snap = rev!.statistics;
    const einsteinCv = (t: number) => {
      const x = (h * c * 100 * 400) / (kB * t);
      return (6 * R * x * x * Math.exp(x)) / Math.expm1(x) ** 2;
    };
    const byT = new Map(snap.pairs.map((p) => [p.temperatureK, p]));
    expect([...byT.keys()].sort((a, b) => a! - b!)).toEqual([100, 298.15]);
    expect(byT.get(100)!.measured).toBe(9.8);
    expect(byT.get(100)!.calculated).toBeCloseTo(einsteinCv(100), 3);
    expect(byT.get(298.15)!.calculated).toBeCloseTo(einsteinCv(298.15), 3);
    // 100, 200, 298.15 K measured; the 500 K row is measured too (every measured temperature is in scope)
    expect(snap.counts.measuredInScope).toBe(4);
    expect(snap.methods[0].unpairedMeasurements).toBe(2);
  });
});
