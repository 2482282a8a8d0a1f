/**
 * The wizard's method table: a calculations file naming new method labels, committed with one
 * table line per label through the wizard's upload route, creates those methods with the lines'
 * recipes and the rows in one write; any bad line (or row) refuses all of it, naming the line and field.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq, inArray } from 'drizzle-orm';
import { db } from '@/db/client';
import { calculation, importBatch, method } from '@/db/schema';
import * as uploadRoute from '@/app/api/workspaces/[workspaceId]/imports/route';
import { wizardQuery, type WizardOptions } from '@/lib/import/wizard-options';
import type { MethodTableLine } from '@/lib/import/method-table';
import { requestContext } from '../support/request-context';
import { createWorkspaceWith, signInAs } from '../support/users';
import { seedCatalogue } from './import-fixtures';

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;

function post(query: string, body: string, workspaceId = ws.workspaceId) {
  const headers = requestContext.headers();
  headers.set('content-type', 'text/csv');
  return (uploadRoute.POST as Handler)(new Request(`http://localhost:3999/api/workspaces/${workspaceId}/imports?${query}`, { method: 'POST', headers, body }), {
    params: Promise.resolve({ workspaceId }),
  });
}

const query = (methodTable: MethodTableLine[] | undefined, extra: Partial<WizardOptions> = {}) =>
  wizardQuery({ kind: 'calculations', fileName: 'family.csv', createMissing: true, methodTable, ...extra });

/** Three grids of one invented family on Si (a stored material), two modes each; only the first row of a label has method_ cells. */
function familyCsv(tag: string): string {
  const lines = ['material,method,quantity,value,unit,mode_index,source,method_functional,method_k_grid'];
  for (const [k, shift] of [
    [4, 3.1],
    [6, 1.2],
    [8, 0.4],
  ] as const) {
    const label = `${tag}-k${k}`;
    lines.push(`Si,${label},frequency,0.00,cm-1,1,inhouse-2026,PBE,3x3x3`);
    lines.push(`Si,${label},frequency,${(515 + shift).toFixed(2)},cm-1,4,inhouse-2026,,`);
  }
  return lines.join('\n');
}

const line = (tag: string, k: number, over: Partial<MethodTableLine> = {}): MethodTableLine => ({
  label: `${tag}-k${k}`,
  functional: 'PBEsol',
  dispersion: 'D3',
  pseudopotential: 'PAW-std',
  cutoff_eV: '600',
  k_grid: `${k}x${k}x${k}`,
  q_grid: '2x2x2',
  smearing: 'Gaussian 0.01 eV',
  approach: 'perturbation',
  lo_to_correction: 'no',
  ...over,
});

const methodsLabelled = (labels: string[]) => db.select().from(method).where(and(eq(method.workspaceId, ws.workspaceId), inArray(method.label, labels)));

beforeAll(async () => {
  ws = await createWorkspaceWith(['contributor', 'reviewer']);
  await seedCatalogue(ws.workspaceId);
});

describe('calculations with a method table (wizard)', () => {
  it('creates the three methods with the table’s recipes and the rows in one import', async () => {
    await signInAs(ws.members.contributor.email);
    const table = [line('FamA', 4), line('FamA', 6, { lo_to_correction: 'yes' }), line('FamA', 8, { approach: 'finite-displacement', dispersion: '' })];
    const res = await post(query(table), familyCsv('FamA'));
    expect(res.status, await res.clone().text()).toBe(201);
    const out = await res.json();
    expect(out).toMatchObject({ rowCount: 6, insertedCount: 6, createdMaterials: 0, createdMethods: 3 });

    const made = await methodsLabelled(['FamA-k4', 'FamA-k6', 'FamA-k8']);
    const byLabel = new Map(made.map((m) => [m.label, m]));
    // the table's recipe, not the rows' method_ cells (PBE, 3x3x3)
    expect(byLabel.get('FamA-k4')).toMatchObject({
      functional: 'PBEsol',
      dispersion: 'D3',
      pseudopotential: 'PAW-std',
      cutoffEv: 600,
      kGrid: [4, 4, 4],
      qGrid: [2, 2, 2],
      smearing: 'Gaussian 0.01 eV',
      approach: 'perturbation',
      nonAnalyticCorrection: false,
      importId: out.importId,
      retractedAt: null,
    });
    expect(byLabel.get('FamA-k6')).toMatchObject({ kGrid: [6, 6, 6], nonAnalyticCorrection: true });
    expect(byLabel.get('FamA-k8')).toMatchObject({ kGrid: [8, 8, 8], approach: 'finite-displacement', dispersion: null });

    const rows = await db.select().from(calculation).where(eq(calculation.importId, out.importId));
    expect(rows).toHaveLength(6);
    const count = (id: string) => rows.filter((r) => r.methodId === id).length;
    expect(made.map((m) => count(m.id))).toEqual([2, 2, 2]);
    const [batch] = await db.select().from(importBatch).where(eq(importBatch.id, out.importId));
    expect(batch).toMatchObject({ status: 'committed', insertedCount: 6 });
  });

  it('refuses everything for a bad line, naming the line and the field', async () => {
    await signInAs(ws.members.contributor.email);
    const imports = await db.$count(importBatch, eq(importBatch.workspaceId, ws.workspaceId));
    const table = [line('FamB', 4), line('FamB', 6, { k_grid: '8x8' }), line('FamB', 8)];
    const res = await post(query(table), familyCsv('FamB'));
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.detail).toBe('Nothing was imported: 1 error in the method table.');
    expect(body.errors).toEqual([{ row: 0, methodLine: 2, column: 'k-grid', reason: 'The k-point grid must be three positive whole numbers like "8x8x8", got "8x8".', value: '8x8' }]);
    expect(await methodsLabelled(['FamB-k4', 'FamB-k6', 'FamB-k8'])).toEqual([]);
    expect(await db.$count(importBatch, eq(importBatch.workspaceId, ws.workspaceId))).toBe(imports);
  });

  it('reports the table’s errors with the rows’ own, and a line no row names', async () => {
    await signInAs(ws.members.contributor.email);
    const badRow = familyCsv('FamC').replace('515.40', '515.4x');
    const res = await post(query([line('FamC', 4, { functional: '' }), line('FamC', 6), line('FamC', 8), line('FamC', 10)]), badRow);
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.detail).toBe('Nothing was imported: 3 errors in the file and the method table.');
    expect(body.errors).toEqual([
      expect.objectContaining({ row: 0, methodLine: 1, column: 'functional', reason: 'A functional is required.' }),
      expect.objectContaining({ row: 0, methodLine: 4, column: 'label', reason: expect.stringContaining('No row of the file names method "FamC-k10"') }),
      expect.objectContaining({ row: 7, column: 'value' }),
    ]);
    expect(await methodsLabelled(['FamC-k4', 'FamC-k6', 'FamC-k8', 'FamC-k10'])).toEqual([]);
  });

  it('refuses a line for a stored label; a label the table lacks still needs its method_ cells', async () => {
    await signInAs(ws.members.contributor.email);
    const stored = await post(query([line('FamD', 4), { label: 'PBEsol-PAW-600', functional: 'PBE' }]), familyCsv('FamD'));
    expect(stored.status).toBe(422);
    const errors = (await stored.json()).errors;
    expect(errors).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ methodLine: 2, column: 'label', reason: expect.stringContaining('already has method "PBEsol-PAW-600"') }),
        // FamD-k6 and -k8 are not in the table: their first rows' cells (PBE, 3x3x3) would create them, so no row error
      ]),
    );
    expect(errors.filter((e: { row: number }) => e.row > 0)).toEqual([]);
  });

  it('checks the table’s shape with zod before reading the file: 400, nothing written', async () => {
    await signInAs(ws.members.contributor.email);
    const imports = await db.$count(importBatch);
    const noFlag = await post(query([line('FamE', 4)], { createMissing: undefined }), familyCsv('FamE'));
    expect(noFlag.status).toBe(400);
    expect((await noFlag.json()).detail).toContain('createMissing=true');
    const unknownKey = await post(`${query(undefined)}&methodTable=${encodeURIComponent(JSON.stringify([{ label: 'FamE-k4', functional: 'PBE', colour: 'red' }]))}`, familyCsv('FamE'));
    expect(unknownKey.status).toBe(400);
    const notJson = await post(`${query(undefined)}&methodTable=%5B%7B`, familyCsv('FamE'));
    expect(notJson.status).toBe(400);
    expect(await db.$count(importBatch)).toBe(imports);
  });

  it('refuses a reviewer (403) and a member of another workspace (404) before anything', async () => {
    const imports = await db.$count(importBatch);
    await signInAs(ws.members.reviewer.email);
    expect((await post(query([line('FamF', 4)]), familyCsv('FamF'))).status).toBe(403);
    const other = await createWorkspaceWith();
    await signInAs(other.owner.email);
    expect((await post(query([line('FamF', 4)]), familyCsv('FamF'))).status).toBe(404);
    requestContext.anonymous();
    expect((await post(query([line('FamF', 4)]), familyCsv('FamF'))).status).toBe(401);
    expect(await db.$count(importBatch)).toBe(imports);
    expect(await methodsLabelled(['FamF-k4'])).toEqual([]);
  });
});
