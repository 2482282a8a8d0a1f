/**
 * The three material fields of the Cp − Cv correction (volumetric α_V, isothermal B_T, molar volume V_m)
 * through every path that writes a material: the catalogue import (create, identical re-import, a changed
 * value refused unless onChange=update, undo), the REST API (POST, PATCH) and the web form's actions; and
 * the material page's gap at 298.15 K read back from what was stored.
 * MgO and NaCl values: handbook values recalled from memory, as in tests/unit/science/heat-capacity.test.ts.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { and, count, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, importBatch, material } from '@/db/schema';
import { getMaterial } from '@/db/queries/materials';
import * as materialsRoute from '@/app/api/v1/materials/route';
import * as materialRoute from '@/app/api/v1/materials/[id]/route';
import { createMaterialAction, updateMaterialAction } from '@/app/(app)/w/[workspace]/materials/actions';
import { importFile } from '@/lib/services/imports/csv-import';
import type { CatalogImportOutcome } from '@/lib/services/imports/catalog-import';
import { undoImport } from '@/lib/services/imports/undo';
import { materialCpCorrection } from '@/lib/services/catalog/cp-correction';
import { isImportRefusal, type ImportRefusalError } from '@/lib/import/errors';
import { AppError } from '@/lib/errors';
import type { WorkspaceRole } from '@/lib/permissions';
import { createWorkspaceWith, signInAs } from '../support/users';
import { makeToken } from './api-workflow-fixtures';
import { bytesOf, chunksOf } from './import-fixtures';

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
const BASE = 'http://localhost:3999/api/v1';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let token: string;

let fileNumber = 0;
function importMaterials(text: string, extra: { role?: WorkspaceRole; onChange?: 'refuse' | 'update'; userId?: string } = {}) {
  return importFile({
    workspaceId: ws.workspaceId,
    actor: { userId: extra.userId ?? ws.owner.id, tokenId: null },
    role: extra.role ?? 'owner',
    via: 'wizard',
    kind: 'materials',
    fileName: `thermal-${++fileNumber}.csv`,
    body: chunksOf(bytesOf(text), 11),
    onChange: extra.onChange,
  }) as Promise<CatalogImportOutcome>;
}

async function rejected<T>(p: Promise<unknown>): Promise<T> {
  const e = await p.then(
    () => null,
    (err: unknown) => err,
  );
  expect(e, 'expected a refusal').not.toBeNull();
  return e as T;
}

function send(handler: unknown, method: 'GET' | 'POST' | 'PATCH', path: string, body?: unknown, params: Record<string, string> = {}) {
  return (handler as Handler)(
    new Request(`${BASE}${path}`, { method, headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' }, body: body === undefined ? undefined : JSON.stringify(body) }),
    { params: Promise.resolve(params) },
  );
}

function form(fields: Record<string, string>) {
  const fd = new FormData();
  for (const [k, v] of Object.entries(fields)) fd.append(k, v);
  return fd;
}

const imports = async () => (await db.select({ n: count() }).from(importBatch).where(eq(importBatch.workspaceId, ws.workspaceId)))[0].n;
const byName = async (name: string) => (await db.select().from(material).where(and(eq(material.workspaceId, ws.workspaceId), eq(material.name, name))))[0];

const FILE = [
  'name,formula,space_group,atoms_in_cell,thermal_expansion_per_K,bulk_modulus_GPa,molar_volume_cm3',
  'MgO-rs,MgO,225,2,3.12e-5,160,11.25',
  'NaCl-rs,NaCl,225,2,1.2e-4,24.0,27.0',
  'GaAs-zb,GaAs,216,2,,,',
].join('\n');

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator', 'contributor']);
  token = await makeToken(ws.members.contributor.email, ws.workspaceId, 'contributor');
});

describe('materials import with α_V, B_T and V_m', () => {
  let mgoId: string;

  it('stores the three fields where the row gives them and leaves them empty where it does not', async () => {
    const out = await importMaterials(FILE);
    expect(out).toMatchObject({ createdCount: 3, updatedCount: 0, unchangedCount: 0 });
    const mgo = await byName('MgO-rs');
    mgoId = mgo.id;
    expect(mgo).toMatchObject({ thermalExpansionPerK: 3.12e-5, bulkModulusGpa: 160, molarVolumeCm3: 11.25 });
    expect(await byName('NaCl-rs')).toMatchObject({ thermalExpansionPerK: 1.2e-4, bulkModulusGpa: 24, molarVolumeCm3: 27 });
    expect(await byName('GaAs-zb')).toMatchObject({ thermalExpansionPerK: null, bulkModulusGpa: null, molarVolumeCm3: null });
  });

  it('an identical re-import writes nothing, also with the numbers written otherwise and the header spelt otherwise', async () => {
    const before = await imports();
    const same = await importMaterials(FILE);
    expect(same).toMatchObject({ importId: null, unchangedCount: 3 });
    const respelt = await importMaterials('name,formula,space_group,Thermal expansion (1/K),Bulk modulus (GPa),Molar volume (cm3/mol)\nMgO-rs,MgO,225,0.0000312,160.0,1.125e1');
    expect(respelt).toMatchObject({ importId: null, unchangedCount: 1 });
    expect(await imports()).toBe(before);
  });

  it('refuses a changed value without onChange=update, naming row, column, stored and new value, and writes nothing', async () => {
    const before = await imports();
    const e = await rejected<ImportRefusalError>(importMaterials('name,formula,space_group,bulk_modulus_GPa\nGaAs-zb,GaAs,216,\nMgO-rs,MgO,225,165'));
    expect(isImportRefusal(e)).toBe(true);
    expect(e.errors).toEqual([expect.objectContaining({ row: 3, column: 'bulk_modulus_GPa', value: '165', reason: expect.stringContaining('stored 160, this file 165') })]);
    expect(await imports()).toBe(before);
    expect((await byName('MgO-rs')).bulkModulusGpa).toBe(160);
  });

  it('with onChange=update (curator) updates that one field, audits before and after, and reads back; undo restores it', async () => {
    const text = 'name,formula,space_group,bulk_modulus_GPa\nMgO-rs,MgO,225,165';
    const denied = await rejected<AppError>(importMaterials(text, { role: 'contributor', onChange: 'update' }));
    expect(denied).toBeInstanceOf(AppError);
    expect(denied.code).toBe('forbidden');
    const out = await importMaterials(text, { role: 'curator', onChange: 'update', userId: ws.members.curator.id });
    expect(out).toMatchObject({ updatedCount: 1, createdCount: 0 });
    const read = await getMaterial(ws.workspaceId, mgoId);
    expect(read).toMatchObject({ thermalExpansionPerK: 3.12e-5, bulkModulusGpa: 165, molarVolumeCm3: 11.25 });
    const [entry] = await db.select().from(auditLog).where(and(eq(auditLog.entityId, mgoId), eq(auditLog.action, 'import-update')));
    expect(entry.before).toMatchObject({ bulkModulusGpa: 160, thermalExpansionPerK: 3.12e-5 });
    expect(entry.after).toMatchObject({ bulkModulusGpa: 165, thermalExpansionPerK: 3.12e-5, importId: out.importId });

    const api = await send(materialRoute.GET, 'GET', `/materials/${mgoId}`, undefined, { id: mgoId });
    expect(await api.json()).toMatchObject({ thermalExpansionPerK: 3.12e-5, bulkModulusGpa: 165, molarVolumeCm3: 11.25 });

    await undoImport(ws.workspaceId, out.importId!, ws.owner.id, 'wrong modulus');
    expect((await getMaterial(ws.workspaceId, mgoId))?.bulkModulusGpa).toBe(160);
  });

  it('refuses bad cells with row, column and reason, and writes nothing', async () => {
    const before = await imports();
    const e = await rejected<ImportRefusalError>(
      importMaterials(
        ['name,formula,alpha_V,bulk_modulus_GPa,molar_volume_cm3', 'KCl-rs,KCl,110,17.4,37.5', 'KBr-rs,KBr,1.1e-4,0,43.3', 'LiF-rs,LiF,1.0e-4,66,9.8', 'CsCl-B2,CsCl,1.4e-4,18,1200'].join('\n'),
      ),
    );
    expect(e.errors.map((x) => [x.row, x.column])).toEqual([
      [2, 'alpha_V'],
      [3, 'bulk_modulus_GPa'],
      [5, 'molar_volume_cm3'],
    ]);
    expect(e.errors[0].reason).toMatch(/percentage or a coefficient in 10⁻⁶ K⁻¹/);
    expect(await imports()).toBe(before);
    expect(await byName('KBr-rs')).toBeUndefined();
  });

  it('the material page gap: α² B V_m T at 298.15 K from the stored fields, its share of a Cp measured near 298 K, and what is missing otherwise', async () => {
    const mgo = (await getMaterial(ws.workspaceId, mgoId))!;
    const measured = [
      { id: 'b', value: 47.0, temperatureK: 500, citeKey: 'far-away' },
      { id: 'a', value: 37.24, temperatureK: 298.15, citeKey: 'janaf1998' },
    ];
    const view = materialCpCorrection(mgo, measured);
    // (3.12e-5)² × 160e9 Pa × 11.25e-6 m³/mol × 298.15 K = 0.522416 J mol⁻¹ K⁻¹ (by hand, in the unit test)
    expect(view.cpMinusCv).toBeCloseTo(0.522416, 5);
    expect(view.measured).toMatchObject({ id: 'a', citeKey: 'janaf1998', temperatureK: 298.15 });
    expect(view.measured!.share).toBeCloseTo(0.522416 / 37.24, 6);
    expect(materialCpCorrection(mgo, [measured[0]]).measured).toBeNull();
    const gaas = (await getMaterial(ws.workspaceId, (await byName('GaAs-zb')).id))!;
    expect(materialCpCorrection(gaas, measured)).toMatchObject({ cpMinusCv: null, measured: null, missing: ['thermalExpansionPerK', 'bulkModulusGpa', 'molarVolumeCm3'] });
  });
});

describe('the API and the web form write the same fields', () => {
  it('POST takes them as JSON numbers, PATCH changes one and keeps the others, null clears one, a bad one is 422 with its path', async () => {
    const res = await send(materialsRoute.POST, 'POST', '/materials', { name: 'NaCl-api', formula: 'NaCl', spaceGroup: 225, thermalExpansionPerK: 1.2e-4, bulkModulusGpa: 24, molarVolumeCm3: 27 });
    expect(res.status).toBe(201);
    const created = await res.json();
    expect(created).toMatchObject({ thermalExpansionPerK: 1.2e-4, bulkModulusGpa: 24, molarVolumeCm3: 27 });
    const id = created.id as string;
    const patched = await send(materialRoute.PATCH, 'PATCH', `/materials/${id}`, { bulkModulusGpa: 25.1, molarVolumeCm3: null }, { id });
    expect(patched.status).toBe(200);
    expect(await patched.json()).toMatchObject({ thermalExpansionPerK: 1.2e-4, bulkModulusGpa: 25.1, molarVolumeCm3: null });
    const bad = await send(materialRoute.PATCH, 'PATCH', `/materials/${id}`, { thermalExpansionPerK: 40, bulkModulusGpa: -1 }, { id });
    expect(bad.status).toBe(422);
    const problem = await bad.json();
    expect(problem.fields.map((f: { path: string }) => f.path).sort()).toEqual(['bulkModulusGpa', 'thermalExpansionPerK']);
    expect(await getMaterial(ws.workspaceId, id)).toMatchObject({ thermalExpansionPerK: 1.2e-4, bulkModulusGpa: 25.1, molarVolumeCm3: null });
  });

  it('the form creates with the fields, reports a bad one as a field error, and an emptied input clears it', async () => {
    await signInAs(ws.members.contributor.email);
    const fields = { workspaceId: ws.workspaceId, name: 'MgO-form', formula: 'MgO', spaceGroup: '225', atomsInCell: '2', displayName: '', externalId: '', tags: 'oxide' };
    const state = await createMaterialAction(undefined, form({ ...fields, thermalExpansionPerK: '3.12e-5', bulkModulusGpa: '160', molarVolumeCm3: '11.25' }));
    expect(state).toMatchObject({ ok: true });
    const id = (state.data as { id: string }).id;
    expect(await getMaterial(ws.workspaceId, id)).toMatchObject({ thermalExpansionPerK: 3.12e-5, bulkModulusGpa: 160, molarVolumeCm3: 11.25 });
    const [audit] = await db.select().from(auditLog).where(and(eq(auditLog.entityId, id), eq(auditLog.action, 'create')));
    expect(audit.after).toMatchObject({ thermalExpansionPerK: 3.12e-5, bulkModulusGpa: 160, molarVolumeCm3: 11.25 });

    const bad = await updateMaterialAction(undefined, form({ ...fields, id, thermalExpansionPerK: '3.12', bulkModulusGpa: '160', molarVolumeCm3: '11.25' }));
    expect(bad.ok).toBe(false);
    expect(bad.fieldErrors?.thermalExpansionPerK?.[0]).toMatch(/too large for a solid/);
    expect((await getMaterial(ws.workspaceId, id))?.thermalExpansionPerK).toBe(3.12e-5);

    const cleared = await updateMaterialAction(undefined, form({ ...fields, id, thermalExpansionPerK: '3.12e-5', bulkModulusGpa: '', molarVolumeCm3: '11.25' }));
    expect(cleared).toMatchObject({ ok: true });
    expect(await getMaterial(ws.workspaceId, id)).toMatchObject({ thermalExpansionPerK: 3.12e-5, bulkModulusGpa: null, molarVolumeCm3: 11.25 });
  });
});
