import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, method } from '@/db/schema';
import { createMethodAction, restoreMethodAction, retractMethodAction, updateMethodAction } from '@/app/(app)/w/[workspace]/methods/actions';
import { createWorkspaceWith, signInAs } from '../support/users';

function form(fields: Record<string, string>) {
  const fd = new FormData();
  for (const [k, v] of Object.entries(fields)) fd.append(k, v);
  return fd;
}

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;

// An invented recipe for the test.
const RECIPE = { label: 'PBEsol/PAW 520', functional: 'PBEsol', dispersion: '', pseudopotential: 'PAW PBE 54', cutoffEv: '520', kGrid: '8x8x6', qGrid: '4x4x3', smearing: 'Gaussian 0.01 eV', approach: 'perturbation', nonAnalyticCorrection: 'yes', notes: 'Invented for the test.' };

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator', 'contributor', 'reviewer']);
  other = await createWorkspaceWith(['curator']);
});

describe('methods: create, edit, retract, restore', () => {
  let id: string;

  it('creates a method with its grids, audited', async () => {
    await signInAs(ws.members.contributor.email);
    const state = await createMethodAction(undefined, form({ workspaceId: ws.workspaceId, ...RECIPE }));
    expect(state).toMatchObject({ ok: true });
    id = (state.data as { id: string }).id;
    const [row] = await db.select().from(method).where(eq(method.id, id));
    expect(row).toMatchObject({ label: 'PBEsol/PAW 520', kGrid: [8, 8, 6], qGrid: [4, 4, 3], cutoffEv: 520, nonAnalyticCorrection: true, dispersion: null, approach: 'perturbation' });
    const audit = await db.select().from(auditLog).where(and(eq(auditLog.workspaceId, ws.workspaceId), eq(auditLog.entityId, id)));
    expect(audit.map((a) => a.action)).toEqual(['create']);
  });

  it('reports a bad grid and a taken label as field errors', async () => {
    const bad = await createMethodAction(undefined, form({ workspaceId: ws.workspaceId, ...RECIPE, label: 'other', kGrid: '8x8' }));
    expect(bad.fieldErrors?.kGrid?.[0]).toMatch(/8x8x8/);
    const taken = await createMethodAction(undefined, form({ workspaceId: ws.workspaceId, ...RECIPE }));
    expect(taken).toMatchObject({ ok: false, code: 'conflict' });
    expect(taken.fieldErrors?.label?.[0]).toMatch(/already exists/);
    expect(await db.select().from(method).where(eq(method.workspaceId, ws.workspaceId))).toHaveLength(1);
  });

  it('edits, retracts and restores with audit rows', async () => {
    expect(await updateMethodAction(undefined, form({ workspaceId: ws.workspaceId, id, ...RECIPE, kGrid: '12x12x8', nonAnalyticCorrection: 'no' }))).toMatchObject({ ok: true });
    const [row] = await db.select().from(method).where(eq(method.id, id));
    expect(row).toMatchObject({ kGrid: [12, 12, 8], nonAnalyticCorrection: false });
    await signInAs(ws.members.curator.email);
    expect(await retractMethodAction(undefined, form({ workspaceId: ws.workspaceId, id, reason: 'Superseded' }))).toMatchObject({ ok: true });
    expect(await updateMethodAction(undefined, form({ workspaceId: ws.workspaceId, id, ...RECIPE }))).toMatchObject({ ok: false, code: 'conflict' });
    expect(await restoreMethodAction(undefined, form({ workspaceId: ws.workspaceId, id }))).toMatchObject({ ok: true });
    const audit = await db.select().from(auditLog).where(and(eq(auditLog.workspaceId, ws.workspaceId), eq(auditLog.entityId, id))).orderBy(auditLog.createdAt);
    expect(audit.map((a) => a.action)).toEqual(['create', 'update', 'retract', 'restore']);
    expect(audit[1].before).toMatchObject({ kGrid: [8, 8, 6] });
    expect(audit[1].after).toMatchObject({ kGrid: [12, 12, 8] });
  });

  it('refuses a reviewer and another workspace, writing nothing', async () => {
    await signInAs(ws.members.reviewer.email);
    expect(await createMethodAction(undefined, form({ workspaceId: ws.workspaceId, ...RECIPE, label: 'new' }))).toMatchObject({ ok: false, code: 'forbidden' });
    await signInAs(other.members.curator.email);
    const n = (await db.select().from(auditLog)).length;
    expect(await retractMethodAction(undefined, form({ workspaceId: other.workspaceId, id, reason: 'x' }))).toMatchObject({ ok: false, code: 'not-found' });
    expect(await updateMethodAction(undefined, form({ workspaceId: other.workspaceId, id, ...RECIPE, label: 'hijack' }))).toMatchObject({ ok: false, code: 'not-found' });
    expect((await db.select().from(auditLog)).length).toBe(n);
  });
});
