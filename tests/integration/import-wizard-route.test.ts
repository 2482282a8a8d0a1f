import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { importBatch, measurement } from '@/db/schema';
import * as uploadRoute from '@/app/api/workspaces/[workspaceId]/imports/route';
import * as referencesRoute from '@/app/api/workspaces/[workspaceId]/imports/references/route';
import * as templateRoute from '@/app/api/workspaces/[workspaceId]/imports/templates/[kind]/route';
import { undoImportAction } from '@/app/(app)/w/[workspace]/imports/actions';
import { wizardQuery } from '@/lib/import/wizard-options';
import { templateCsv } from '@/lib/import/templates';
import { requestContext } from '../support/request-context';
import { callAction } from '../support/actions';
import { createWorkspaceWith, signInAs } from '../support/users';
import { seedCatalogue } from './import-fixtures';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

function post(workspaceId: string, query: string, body: string) {
  const headers = requestContext.headers();
  headers.set('content-type', 'text/csv');
  return (uploadRoute.POST as Handler)(new Request(`http://localhost:3999/api/workspaces/${workspaceId}/imports?${query}`, { method: 'POST', headers, body }), {
    params: Promise.resolve({ workspaceId }),
  });
}

beforeAll(async () => {
  ws = await createWorkspaceWith(['contributor', 'reviewer']);
  await seedCatalogue(ws.workspaceId);
});

describe('the wizard’s upload route', () => {
  it('commits the original bytes with the corrected mapping and the chosen unit', async () => {
    await signInAs(ws.members.contributor.email);
    const query = wizardQuery({
      kind: 'measurements',
      fileName: 'lab.csv',
      mapping: { material: 'Sample', quantity: 'What', value: 'Peak', source: 'Ref', unit: null },
      units: { frequency: 'meV' },
    });
    const res = await post(ws.workspaceId, query, 'Sample,What,Peak,Ref\nSi,frequency,64.5,azuhata1995\n');
    expect(res.status).toBe(201);
    const out = await res.json();
    const [row] = await db.select().from(measurement).where(eq(measurement.importId, out.importId));
    expect(row).toMatchObject({ unit: 'meV', valueText: '64.5', contributorId: ws.members.contributor.id });
    // 1 meV = 8.065543937 cm⁻¹ (derived from exact SI constants; reference/check-values.md gives 1 cm⁻¹ = 0.1239841984 meV).
    expect(row.value).toBeCloseTo(64.5 / 0.1239841984, 4);
  });

  it('answers 422 with the row errors and 409 for the same file, as problem documents', async () => {
    await signInAs(ws.members.contributor.email);
    const bad = await post(ws.workspaceId, wizardQuery({ kind: 'measurements' }), 'material,quantity,value,unit,source\nSi,frequency,12x,cm-1,azuhata1995\n');
    expect(bad.status).toBe(422);
    expect((await bad.json()).errors).toEqual([{ row: 2, column: 'value', reason: '"12x" is not a number.', value: '12x' }]);
    const csv = 'material,quantity,value,unit,source\nSi,frequency,511,cm-1,azuhata1995\n';
    expect((await post(ws.workspaceId, wizardQuery({ kind: 'measurements' }), csv)).status).toBe(201);
    const dup = await post(ws.workspaceId, wizardQuery({ kind: 'measurements' }), csv);
    expect(dup.status).toBe(409);
    expect(await dup.json()).toHaveProperty('firstImportId');
  });

  it('refuses a reviewer (403) and a member of another workspace (404)', async () => {
    await signInAs(ws.members.reviewer.email);
    expect((await post(ws.workspaceId, wizardQuery({ kind: 'measurements' }), 'material\n')).status).toBe(403);
    const other = await createWorkspaceWith();
    await signInAs(other.owner.email);
    const before = await db.$count(importBatch);
    expect((await post(ws.workspaceId, wizardQuery({ kind: 'measurements' }), 'material,quantity,value,unit,source\nSi,frequency,1,cm-1,azuhata1995\n')).status).toBe(404);
    expect(await db.$count(importBatch)).toBe(before);
  });

  it('serves the references and the templates to members', async () => {
    await signInAs(ws.members.contributor.email);
    const refs = await (referencesRoute.GET as Handler)(new Request('http://localhost:3999/x', { headers: requestContext.headers() }), { params: Promise.resolve({ workspaceId: ws.workspaceId }) });
    expect((await refs.json()).materials.map((m: { name: string }) => m.name).sort()).toEqual(['GaN-wz', 'Si']);
    const tpl = await (templateRoute.GET as Handler)(new Request('http://localhost:3999/x', { headers: requestContext.headers() }), {
      params: Promise.resolve({ workspaceId: ws.workspaceId, kind: 'calculations.csv' }),
    });
    expect(await tpl.text()).toBe(templateCsv('calculations'));
  });
});

describe('undo from the import page', () => {
  it("needs imports:undo (or to be the importer, see import-single-entry.test.ts) and a reason", async () => {
    await signInAs(ws.owner.email);
    const res = await post(ws.workspaceId, wizardQuery({ kind: 'measurements' }), 'material,quantity,value,unit,source\nSi,frequency,501,cm-1,azuhata1995\n');
    const { importId } = await res.json();
    await signInAs(ws.members.contributor.email);
    const denied = await callAction(undoImportAction, { workspaceId: ws.workspaceId, importId, reason: 'mistake' });
    expect(denied.state).toMatchObject({ ok: false, code: 'forbidden' });
    await signInAs(ws.owner.email);
    const noReason = await callAction(undoImportAction, { workspaceId: ws.workspaceId, importId, reason: '' });
    expect(noReason.state?.fieldErrors?.reason).toBeDefined();
    const done = await callAction(undoImportAction, { workspaceId: ws.workspaceId, importId, reason: 'mistake' });
    expect(done.state).toMatchObject({ ok: true });
    const [batch] = await db.select().from(importBatch).where(eq(importBatch.id, importId));
    expect(batch.status).toBe('undone');
  });
});
