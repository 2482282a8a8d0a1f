import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, calculation, importBatch, material } from '@/db/schema';
import { undoImport } from '@/db/queries/imports';
import * as uploadRoute from '@/app/api/workspaces/[workspaceId]/imports/route';
import * as v1ImportsRoute from '@/app/api/v1/imports/route';
import * as templateRoute from '@/app/api/workspaces/[workspaceId]/imports/templates/[kind]/route';
import * as referencesRoute from '@/app/api/workspaces/[workspaceId]/imports/references/route';
import { createApiToken } from '@/app/(app)/w/[workspace]/settings/tokens/actions';
import { whenRecomputeIdle } from '@/lib/services/benchmarks/recompute-queue';
import { dosQuery } from '@/lib/import/dos-format';
import { dosTemplateCsv } from '@/lib/import/dos-template';
import { callAction } from '../support/actions';
import { requestContext } from '../support/request-context';
import { createWorkspaceWith, signInAs } from '../support/users';
import { seedCatalogue } from './import-fixtures';

// CODATA 2018 / SI 2019 exact constants.
import { c, h, kB, R } from '../support/codata';

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let cat: Awaited<ReturnType<typeof seedCatalogue>>;

function post(workspaceId: string, body: string, temperatures: number[] = [298.15], fileName = 'gan-dos.csv') {
  const headers = requestContext.headers();
  headers.set('content-type', 'text/csv');
  return (uploadRoute.POST as Handler)(
    new Request(`http://localhost:3999/api/workspaces/${workspaceId}/imports?${dosQuery({ fileName, temperatures })}`, { method: 'POST', headers, body }),
    { params: Promise.resolve({ workspaceId }) },
  );
}

const HEADER = 'material,method,source,unit,frequency,density';
/** An Einstein-like DOS: all weight on the 400 cm⁻¹ point (its neighbours have density 0). Invented, for the test. */
const einstein = (materialName = 'GaN-wz', peak = 400) =>
  [HEADER, `${materialName},PBEsol-PAW-600,inhouse-2026,cm-1,0,0`, `${materialName},PBEsol-PAW-600,inhouse-2026,cm-1,${peak - 1},0`, `${materialName},PBEsol-PAW-600,inhouse-2026,cm-1,${peak},1`, `${materialName},PBEsol-PAW-600,inhouse-2026,cm-1,${peak + 1},0`].join('\n') + '\n';

async function counts() {
  return { imports: await db.$count(importBatch), calculations: await db.$count(calculation), audit: await db.$count(auditLog) };
}

beforeAll(async () => {
  ws = await createWorkspaceWith(['contributor', 'reviewer']);
  cat = await seedCatalogue(ws.workspaceId);
  // Wurtzite GaN: 4 atoms in the primitive cell, 2 per formula unit (Z = 2). Si is left without atoms in the cell.
  await db.update(material).set({ atomsInCell: 4 }).where(eq(material.id, cat.gan.id));
});

afterAll(async () => {
  await whenRecomputeIdle(ws.workspaceId);
});

describe('phonon DOS import', () => {
  it('commits entropy and heat-capacity calculations per formula unit, with the import record and one audit row', async () => {
    await signInAs(ws.members.contributor.email);
    const body = einstein();
    const res = await post(ws.workspaceId, body, [100, 298.15]);
    expect(res.status).toBe(201);
    const out = await res.json();
    expect(out).toMatchObject({ rowCount: 4, insertedCount: 4, duplicateCount: 0, dosCount: 1, computedCount: 4, temperatures: [100, 298.15] });

    const [batch] = await db.select().from(importBatch).where(eq(importBatch.id, out.importId));
    expect(batch).toMatchObject({
      kind: 'dos',
      sha256: createHash('sha256').update(body).digest('hex'),
      byteCount: Buffer.byteLength(body),
      rowCount: 4,
      insertedCount: 4,
      via: 'wizard',
      fileName: 'gan-dos.csv',
    });

    const rows = await db.select().from(calculation).where(eq(calculation.importId, out.importId));
    expect(rows.map((r) => [r.quantity, r.temperatureK]).sort()).toEqual([
      ['entropy', 100],
      ['entropy', 298.15],
      ['heat-capacity', 100],
      ['heat-capacity', 298.15],
    ]);
    // Hand computation: one Einstein mode at 400 cm⁻¹ renormalised to 3 × 4 = 12 modes per cell,
    // divided by Z = 4 atoms in the cell / 2 atoms per formula unit = 2 → 6 modes per formula unit.
    const x = (h * c * 100 * 400) / (kB * 298.15);
    const entropy = 6 * R * (x / Math.expm1(x) - Math.log(1 - Math.exp(-x)));
    const s = rows.find((r) => r.quantity === 'entropy' && r.temperatureK === 298.15)!;
    expect(s.value).toBeCloseTo(entropy, 8);
    expect(s).toMatchObject({
      unit: 'J/mol/K',
      valueText: entropy.toFixed(4),
      materialId: cat.gan.id,
      methodId: cat.pbesol.id,
      sourceId: cat.calcSrc.id,
      notes: `computed from phonon DOS (import ${out.importId})`,
      contributorId: ws.members.contributor.id,
    });

    const audit = await db.select().from(auditLog).where(and(eq(auditLog.entityType, 'import'), eq(auditLog.entityId, out.importId)));
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ action: 'import', actorUserId: ws.members.contributor.id });
    expect(audit[0].after).toMatchObject({ kind: 'dos', insertedCount: 4, temperatures: [100, 298.15] });
  });

  it('refuses the same file twice (409) and reports identical computed values in another file as duplicates', async () => {
    await signInAs(ws.members.contributor.email);
    const body = einstein('GaN-wz', 500);
    expect((await post(ws.workspaceId, body)).status).toBe(201);
    const before = await counts();
    const again = await post(ws.workspaceId, body);
    expect(again.status).toBe(409);
    expect(await again.json()).toHaveProperty('firstImportId');
    expect(await counts()).toEqual(before);

    // The same DOS with a different grid spacing around the empty neighbours: other bytes, identical values.
    const sameValues = body.replace(',499,0', ',498,0');
    const dup = await post(ws.workspaceId, sameValues, [298.15], 'again.csv');
    expect(dup.status).toBe(201);
    expect(await dup.json()).toMatchObject({ insertedCount: 0, duplicateCount: 2, computedCount: 2 });
  });

  it.each([
    ['a negative density', einstein().replace(',400,1', ',400,-1'), [{ row: 4, column: 'density' }]],
    ['a frequency that does not increase', einstein().replace(',401,0', ',399,0'), [{ row: 5, column: 'frequency' }]],
    ['imaginary weight (density at a negative frequency)', einstein().replace(',0,0', ',-20,0.5'), [{ row: 2, column: 'density' }]],
    ['an unknown material', einstein('GaN-zb'), [{ row: 2, column: 'material' }]],
    ['a material without atoms in the cell', einstein('Si'), [{ row: 2, column: 'material' }]],
  ])('refuses a file with %s (422) and writes nothing', async (_what, body, expected) => {
    await signInAs(ws.members.contributor.email);
    const before = await counts();
    const res = await post(ws.workspaceId, body);
    expect(res.status).toBe(422);
    const problem = await res.json();
    expect(problem.errors).toEqual(expected.map((e) => expect.objectContaining(e)));
    expect(await counts()).toEqual(before);
  });

  it('says clearly why a material without atoms in the cell is refused', async () => {
    await signInAs(ws.members.contributor.email);
    const problem = await (await post(ws.workspaceId, einstein('Si'))).json();
    expect(problem.errors[0].reason).toMatch(/no atoms in the cell/);
  });

  it('refuses bad temperatures (400), a reviewer (403) and a member of another workspace (404), writing nothing', async () => {
    await signInAs(ws.members.contributor.email);
    const headers = requestContext.headers();
    headers.set('content-type', 'text/csv');
    const bad = await (uploadRoute.POST as Handler)(
      new Request(`http://localhost:3999/api/workspaces/${ws.workspaceId}/imports?kind=dos&temperatures=-5`, { method: 'POST', headers, body: einstein() }),
      { params: Promise.resolve({ workspaceId: ws.workspaceId }) },
    );
    expect(bad.status).toBe(400);
    await signInAs(ws.members.reviewer.email);
    expect((await post(ws.workspaceId, einstein('GaN-wz', 600))).status).toBe(403);
    const other = await createWorkspaceWith();
    await signInAs(other.owner.email);
    const before = await counts();
    expect((await post(ws.workspaceId, einstein('GaN-wz', 600))).status).toBe(404);
    expect(await counts()).toEqual(before);
  });

  it('takes the same file through the API with a token, and an undo retracts the computed rows', async () => {
    await signInAs(ws.owner.email);
    const made = await callAction(createApiToken, { workspaceId: ws.workspaceId, name: 'dos pipeline', role: 'contributor' });
    const token = (made.state as unknown as { data: { token: string } }).data.token;
    const res = await (v1ImportsRoute.POST as Handler)(
      new Request('http://localhost:3999/api/v1/imports?kind=dos&temperatures=300', {
        method: 'POST',
        headers: { authorization: `Bearer ${token}`, 'content-type': 'text/csv' },
        body: einstein('GaN-wz', 700),
      }),
      { params: Promise.resolve({}) },
    );
    expect(res.status).toBe(201);
    const out = await res.json();
    expect(out).toMatchObject({ insertedCount: 2, temperatures: [300] });
    const { retracted } = await undoImport(ws.workspaceId, out.importId, ws.owner.id, 'wrong DOS');
    expect(retracted).toBe(2);
  });

  it('serves the DOS template and atoms in the cell in the references', async () => {
    await signInAs(ws.members.contributor.email);
    const tpl = await (templateRoute.GET as Handler)(new Request('http://localhost:3999/x', { headers: requestContext.headers() }), {
      params: Promise.resolve({ workspaceId: ws.workspaceId, kind: 'dos.csv' }),
    });
    expect(await tpl.text()).toBe(dosTemplateCsv());
    const refs = await (referencesRoute.GET as Handler)(new Request('http://localhost:3999/x', { headers: requestContext.headers() }), {
      params: Promise.resolve({ workspaceId: ws.workspaceId }),
    });
    const materials = (await refs.json()).materials as Array<{ name: string; atomsInCell: number | null }>;
    expect(Object.fromEntries(materials.map((m) => [m.name, m.atomsInCell]))).toEqual({ 'GaN-wz': 4, Si: null });
  });
});

describe('DOS values per reduced formula unit, negative tails', () => {
  it('"Ga2N2" gets the same per-formula-unit entropy as "GaN" (per GaN, as thermochemical tables), and a zero-density negative tail is accepted', async () => {
    await signInAs(ws.members.contributor.email);
    await db
      .insert(material)
      .values({ workspaceId: ws.workspaceId, name: 'GaN-x2', formula: 'Ga2N2', reducedFormula: 'GaN', atomsPerFormulaUnit: 4, elementCounts: { Ga: 2, N: 2 }, atomsInCell: 4 });
    const tail = (name: string) =>
      [HEADER, `${name},PBEsol-PAW-600,inhouse-2026,cm-1,-0.8,0`, `${name},PBEsol-PAW-600,inhouse-2026,cm-1,-0.2,0`]
        .concat(einstein(name, 450).trim().split('\n').slice(1))
        .join('\n') + '\n';
    const res = await post(ws.workspaceId, tail('GaN-x2'), [298.15], 'doubled.csv');
    expect(res.status).toBe(201);
    const ref = await post(ws.workspaceId, einstein('GaN-wz', 450), [298.15], 'reference.csv');
    expect(ref.status).toBe(201);
    const entropyOf = async (response: Response) => {
      const { importId } = (await response.json()) as { importId: string };
      const rows = await db.select({ value: calculation.value }).from(calculation).where(and(eq(calculation.importId, importId), eq(calculation.quantity, 'entropy')));
      return rows[0].value;
    };
    // Z = atoms in the cell / atoms per reduced formula unit = 4 / 2 for both (before: 4 / 4 for Ga2N2, per Ga2N2).
    expect(await entropyOf(res)).toBeCloseTo(await entropyOf(ref), 10);
  });
});
