import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, material, materialTag } from '@/db/schema';
import { createMaterialAction, restoreMaterialAction, retractMaterialAction, updateMaterialAction } from '@/app/(app)/w/[workspace]/materials/actions';
import { createWorkspaceWith, signInAs } from '../support/users';
import { requestContext } from '../support/request-context';

function form(fields: Record<string, string>) {
  const fd = new FormData();
  for (const [k, v] of Object.entries(fields)) fd.append(k, v);
  return fd;
}

async function auditOf(workspaceId: string, entityId: string) {
  return db.select().from(auditLog).where(and(eq(auditLog.workspaceId, workspaceId), eq(auditLog.entityId, entityId))).orderBy(auditLog.createdAt);
}

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;

const GAN = { name: 'GaN-wz', displayName: 'GaN (wurtzite)', formula: 'GaN', spaceGroup: '186', atomsInCell: '4', externalId: 'mp-804', tags: 'semiconductor, nitride' };

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator', 'contributor', 'reviewer']);
  other = await createWorkspaceWith(['curator']);
});

describe('materials: create, edit, retract, restore', () => {
  let id: string;

  it('creates a material with derived fields, tags and an audit row', async () => {
    await signInAs(ws.members.contributor.email);
    const state = await createMaterialAction(undefined, form({ workspaceId: ws.workspaceId, ...GAN }));
    expect(state).toMatchObject({ ok: true });
    id = (state.data as { id: string }).id;
    const [row] = await db.select().from(material).where(eq(material.id, id));
    expect(row).toMatchObject({ workspaceId: ws.workspaceId, name: 'GaN-wz', reducedFormula: 'GaN', atomsPerFormulaUnit: 2, spaceGroup: 186, crystalSystem: 'hexagonal', atomsInCell: 4, createdBy: ws.members.contributor.id });
    const tags = await db.select({ tag: materialTag.tag }).from(materialTag).where(eq(materialTag.materialId, id));
    expect(tags.map((t) => t.tag).sort()).toEqual(['nitride', 'semiconductor']);
    const audit = await auditOf(ws.workspaceId, id);
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ action: 'create', entityType: 'material', actorUserId: ws.members.contributor.id, before: null });
    expect(audit[0].after).toMatchObject({ name: 'GaN-wz', tags: ['nitride', 'semiconductor'] });
  });

  it('reports a taken name as a field error and writes nothing', async () => {
    const before = await db.select().from(auditLog).where(eq(auditLog.workspaceId, ws.workspaceId));
    const state = await createMaterialAction(undefined, form({ workspaceId: ws.workspaceId, ...GAN, formula: 'Ga2N2' }));
    expect(state).toMatchObject({ ok: false, code: 'conflict' });
    expect(state.fieldErrors?.name?.[0]).toMatch(/already exists/);
    expect(await db.select().from(material).where(eq(material.workspaceId, ws.workspaceId))).toHaveLength(1);
    expect(await db.select().from(auditLog).where(eq(auditLog.workspaceId, ws.workspaceId))).toHaveLength(before.length);
  });

  it('reports an unknown element with its position and a bad space group as field errors', async () => {
    const state = await createMaterialAction(undefined, form({ workspaceId: ws.workspaceId, name: 'bad', formula: 'GaQ', spaceGroup: '231', tags: '' }));
    expect(state.ok).toBe(false);
    expect(state.fieldErrors?.formula?.[0]).toMatch(/unknown element symbol "Q" at position 3/);
    expect(state.fieldErrors?.spaceGroup?.[0]).toMatch(/between 1 and 230/);
  });

  it('edits a material, recording before and after', async () => {
    const state = await updateMaterialAction(undefined, form({ workspaceId: ws.workspaceId, id, ...GAN, atomsInCell: '4', tags: 'semiconductor, wide-gap' }));
    expect(state).toMatchObject({ ok: true });
    const audit = await auditOf(ws.workspaceId, id);
    expect(audit.map((a) => a.action)).toEqual(['create', 'update']);
    expect(audit[1].before).toMatchObject({ tags: ['nitride', 'semiconductor'] });
    expect(audit[1].after).toMatchObject({ tags: ['semiconductor', 'wide-gap'] });
  });

  it('refuses a reviewer with forbidden', async () => {
    await signInAs(ws.members.reviewer.email);
    const state = await createMaterialAction(undefined, form({ workspaceId: ws.workspaceId, ...GAN, name: 'Si' , formula: 'Si' }));
    expect(state).toMatchObject({ ok: false, code: 'forbidden' });
    const retract = await retractMaterialAction(undefined, form({ workspaceId: ws.workspaceId, id, reason: 'x' }));
    expect(retract).toMatchObject({ ok: false, code: 'forbidden' });
  });

  it('refuses a contributor to retract (curators and owners retract)', async () => {
    await signInAs(ws.members.contributor.email);
    expect(await retractMaterialAction(undefined, form({ workspaceId: ws.workspaceId, id, reason: 'duplicate' }))).toMatchObject({ ok: false, code: 'forbidden' });
  });

  it('treats another workspace\'s material as not found and writes nothing', async () => {
    await signInAs(other.members.curator.email);
    const auditBefore = (await db.select().from(auditLog)).length;
    const edit = await updateMaterialAction(undefined, form({ workspaceId: other.workspaceId, id, ...GAN, name: 'hijack' }));
    expect(edit).toMatchObject({ ok: false, code: 'not-found' });
    const retract = await retractMaterialAction(undefined, form({ workspaceId: other.workspaceId, id, reason: 'x' }));
    expect(retract).toMatchObject({ ok: false, code: 'not-found' });
    // Naming the victim workspace directly is refused at the membership gate.
    const direct = await retractMaterialAction(undefined, form({ workspaceId: ws.workspaceId, id, reason: 'x' }));
    expect(direct).toMatchObject({ ok: false, code: 'not-found' });
    const [row] = await db.select().from(material).where(eq(material.id, id));
    expect(row.name).toBe('GaN-wz');
    expect(row.retractedAt).toBeNull();
    expect((await db.select().from(auditLog)).length).toBe(auditBefore);
  });

  it('refuses anonymous callers', async () => {
    requestContext.anonymous();
    expect(await createMaterialAction(undefined, form({ workspaceId: ws.workspaceId, ...GAN }))).toMatchObject({ ok: false, code: 'unauthorized' });
  });

  it('retracts with a reason, frees the name, and restores only while the name is free', async () => {
    await signInAs(ws.members.curator.email);
    const noReason = await retractMaterialAction(undefined, form({ workspaceId: ws.workspaceId, id, reason: '' }));
    expect(noReason.fieldErrors?.reason?.[0]).toMatch(/reason is required/i);

    expect(await retractMaterialAction(undefined, form({ workspaceId: ws.workspaceId, id, reason: 'Duplicate of GaN entry' }))).toMatchObject({ ok: true });
    const [row] = await db.select().from(material).where(eq(material.id, id));
    expect(row).toMatchObject({ retractionReason: 'Duplicate of GaN entry', retractedBy: ws.members.curator.id });
    expect(row.retractedAt).toBeInstanceOf(Date);

    // Retracted rows are kept: the name can be reused, and restoring the old one then conflicts.
    const again = await createMaterialAction(undefined, form({ workspaceId: ws.workspaceId, ...GAN }));
    expect(again).toMatchObject({ ok: true });
    const blocked = await restoreMaterialAction(undefined, form({ workspaceId: ws.workspaceId, id, reason: '' }));
    expect(blocked).toMatchObject({ ok: false, code: 'conflict' });

    const newId = (again.data as { id: string }).id;
    expect(await retractMaterialAction(undefined, form({ workspaceId: ws.workspaceId, id: newId, reason: 'made by mistake' }))).toMatchObject({ ok: true });
    expect(await restoreMaterialAction(undefined, form({ workspaceId: ws.workspaceId, id, reason: 'was right after all' }))).toMatchObject({ ok: true });
    const audit = await auditOf(ws.workspaceId, id);
    expect(audit.map((a) => a.action)).toEqual(['create', 'update', 'retract', 'restore']);
    expect(audit[2].reason).toBe('Duplicate of GaN entry');
    expect(audit[3].reason).toBe('was right after all');
  });
});
