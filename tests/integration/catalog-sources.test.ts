import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, source } from '@/db/schema';
import { createSourceAction, restoreSourceAction, retractSourceAction, updateSourceAction } from '@/app/(app)/w/[workspace]/sources/actions';
import { createWorkspaceWith, signInAs } from '../support/users';

function form(fields: Record<string, string>) {
  const fd = new FormData();
  for (const [k, v] of Object.entries(fields)) fd.append(k, v);
  return fd;
}

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;

// Parker, Feldman & Ashkin, Phys. Rev. 155, 712 (1967) — shared/reference/check-values.md
const PARKER = {
  kind: 'journal-article',
  citeKey: 'parker1967',
  doi: 'https://doi.org/10.1103/PhysRev.155.712',
  title: 'Raman Scattering by Silicon and Germanium',
  authors: 'Parker, J. H. and Feldman, D. W. and Ashkin, M.',
  year: '1967',
  venue: 'Physical Review',
};

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator', 'contributor', 'reviewer']);
  other = await createWorkspaceWith(['curator']);
});

describe('sources: create, edit, retract, restore', () => {
  let id: string;

  it('creates a journal article with its DOI stripped of the resolver prefix and its authors split, audited', async () => {
    await signInAs(ws.members.contributor.email);
    const state = await createSourceAction(undefined, form({ workspaceId: ws.workspaceId, ...PARKER }));
    expect(state).toMatchObject({ ok: true });
    id = (state.data as { id: string }).id;
    const [row] = await db.select().from(source).where(eq(source.id, id));
    expect(row).toMatchObject({
      citeKey: 'parker1967',
      doi: '10.1103/physrev.155.712',
      year: 1967,
      kind: 'journal-article',
      authorList: [
        { family: 'Parker', given: 'J. H.' },
        { family: 'Feldman', given: 'D. W.' },
        { family: 'Ashkin', given: 'M.' },
      ],
    });
    const audit = await db.select().from(auditLog).where(and(eq(auditLog.workspaceId, ws.workspaceId), eq(auditLog.entityId, id)));
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ action: 'create', entityType: 'source' });
  });

  it('refuses a DOI that is not a DOI, and a notebook without its reference', async () => {
    const bad = await createSourceAction(undefined, form({ workspaceId: ws.workspaceId, ...PARKER, citeKey: 'x1', doi: '10.1103' }));
    expect(bad.fieldErrors?.doi?.[0]).toMatch(/not a DOI/);
    const notebook = await createSourceAction(undefined, form({ workspaceId: ws.workspaceId, kind: 'in-house-notebook', citeKey: 'lab-nb-3' }));
    expect(notebook.fieldErrors?.notebookRef?.[0]).toMatch(/notebook reference/);
    const good = await createSourceAction(
      undefined,
      form({ workspaceId: ws.workspaceId, kind: 'in-house-notebook', citeKey: 'lab-nb-3', notebookRef: 'LN-3 p. 41', instrument: 'Raman microscope, 532 nm', operator: 'A. Example', recordedOn: '2024-03-05' }),
    );
    expect(good).toMatchObject({ ok: true });
  });

  it('reports a taken cite key as a field error', async () => {
    const state = await createSourceAction(undefined, form({ workspaceId: ws.workspaceId, ...PARKER }));
    expect(state).toMatchObject({ ok: false, code: 'conflict' });
    expect(state.fieldErrors?.citeKey?.[0]).toMatch(/already used/);
    expect(await db.select().from(source).where(and(eq(source.workspaceId, ws.workspaceId), eq(source.citeKey, 'parker1967')))).toHaveLength(1);
  });

  it('edits, retracts with a reason and restores, each audited', async () => {
    expect(await updateSourceAction(undefined, form({ workspaceId: ws.workspaceId, id, ...PARKER, venue: 'Phys. Rev.' }))).toMatchObject({ ok: true });
    await signInAs(ws.members.curator.email);
    expect(await retractSourceAction(undefined, form({ workspaceId: ws.workspaceId, id, reason: 'Entered twice' }))).toMatchObject({ ok: true });
    // A retracted source keeps its cite key reserved.
    const reuse = await createSourceAction(undefined, form({ workspaceId: ws.workspaceId, ...PARKER }));
    expect(reuse.fieldErrors?.citeKey?.[0]).toMatch(/retracted/);
    expect(await restoreSourceAction(undefined, form({ workspaceId: ws.workspaceId, id }))).toMatchObject({ ok: true });
    const audit = await db.select().from(auditLog).where(and(eq(auditLog.workspaceId, ws.workspaceId), eq(auditLog.entityId, id))).orderBy(auditLog.createdAt);
    expect(audit.map((a) => a.action)).toEqual(['create', 'update', 'retract', 'restore']);
    expect(audit[1].before).toMatchObject({ venue: 'Physical Review' });
    expect(audit[1].after).toMatchObject({ venue: 'Phys. Rev.' });
    expect(audit[2].reason).toBe('Entered twice');
  });

  it('refuses a reviewer and another workspace\'s member, writing nothing', async () => {
    await signInAs(ws.members.reviewer.email);
    expect(await updateSourceAction(undefined, form({ workspaceId: ws.workspaceId, id, ...PARKER, title: 'x' }))).toMatchObject({ ok: false, code: 'forbidden' });
    await signInAs(other.members.curator.email);
    const n = (await db.select().from(auditLog)).length;
    expect(await updateSourceAction(undefined, form({ workspaceId: other.workspaceId, id, ...PARKER, title: 'x' }))).toMatchObject({ ok: false, code: 'not-found' });
    expect(await retractSourceAction(undefined, form({ workspaceId: other.workspaceId, id, reason: 'x' }))).toMatchObject({ ok: false, code: 'not-found' });
    expect((await db.select().from(auditLog)).length).toBe(n);
    const [row] = await db.select().from(source).where(eq(source.id, id));
    expect(row.title).toBe(PARKER.title);
  });
});
