/**
 * The single-entry form's action: one typed row goes through the same row
 * validation and commit as an import file, lands as a one-row import with its
 * audit, and is undone like any import. The importer may undo their own import
 * within the window; otherwise a curator or owner undoes it.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, calculation, importBatch, measurement } from '@/db/schema';
import { createSingleEntryAction } from '@/app/(app)/w/[workspace]/measurements/actions';
import { undoImportAction } from '@/app/(app)/w/[workspace]/imports/actions';
import { IMPORTER_UNDO_HOURS } from '@/lib/import/undo-rule';
import { callAction } from '../support/actions';
import { createWorkspaceWith, signInAs } from '../support/users';
import { seedCatalogue } from './import-fixtures';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let contributor: { id: string; email: string };
let curator: { id: string; email: string };

beforeAll(async () => {
  ws = await createWorkspaceWith(['contributor', 'curator', 'reviewer']);
  contributor = ws.members.contributor;
  curator = ws.members.curator;
  await seedCatalogue(ws.workspaceId);
});

const peak = (extra: Record<string, string> = {}) => ({
  workspaceId: ws.workspaceId,
  kind: 'measurements',
  material: 'GaN-wz',
  quantity: 'frequency',
  value: '17.07',
  unit: 'THz',
  uncertainty: '0.01',
  temperature_K: '295',
  irrep: 'F2g',
  technique: 'raman',
  source: 'azuhata1995',
  ...extra,
});

type Saved = { importId: string; duplicate: boolean };
const savedOf = (outcome: { state?: unknown }): Saved => (outcome.state as { data: Saved }).data;

describe('single entry', () => {
  it('stores one measured peak as a one-row import: canonical value, text as typed, audit row', async () => {
    await signInAs(contributor.email);
    const out = await callAction(createSingleEntryAction, peak());
    expect(out.state).toMatchObject({ ok: true });
    const { importId, duplicate } = savedOf(out);
    expect(duplicate).toBe(false);
    const [batch] = await db.select().from(importBatch).where(eq(importBatch.id, importId));
    expect(batch).toMatchObject({ kind: 'measurements', via: 'form', rowCount: 1, insertedCount: 1, createdBy: contributor.id });
    const [row] = await db.select().from(measurement).where(eq(measurement.importId, importId));
    // 17.07 THz × 33.356 409 52 cm⁻¹/THz (CODATA 2018, derived) = 569.39 cm⁻¹
    expect(row.value).toBeCloseTo(17.07 * 33.35640952, 6);
    expect(row).toMatchObject({ valueText: '17.07', unit: 'THz', irrepNormalized: 'T2g', contributorId: contributor.id, sampleForm: null });
    const audits = await db.select().from(auditLog).where(and(eq(auditLog.entityType, 'import'), eq(auditLog.entityId, importId)));
    expect(audits.map((a) => a.action)).toEqual(['import']);
  });

  it('refuses a bad entry with the import row errors on their fields, and writes nothing', async () => {
    await signInAs(contributor.email);
    const before = await db.$count(importBatch, eq(importBatch.workspaceId, ws.workspaceId));
    const out = await callAction(createSingleEntryAction, peak({ value: '12,5', material: 'gan-wz', source: '', unit: 'furlong' }));
    expect(out.state?.ok).toBe(false);
    const fe = out.state!.fieldErrors!;
    expect(fe.material.join(' ')).toMatch(/Unknown material "gan-wz". Did you mean "GaN-wz"\?/);
    expect(fe.source.join(' ')).toMatch(/"source" is required/);
    expect(fe.unit.join(' ')).toMatch(/Unknown frequency unit "furlong"/);
    expect(await db.$count(importBatch, eq(importBatch.workspaceId, ws.workspaceId))).toBe(before);

    const decimalComma = await callAction(createSingleEntryAction, peak({ value: '12,5' }));
    expect(decimalComma.state!.fieldErrors!.value.join(' ')).toMatch(/decimal comma/);
  });

  it('stores a computed mode of a method; an identical one is reported, not stored twice', async () => {
    await signInAs(contributor.email);
    const mode = { workspaceId: ws.workspaceId, kind: 'calculations', material: 'Si', method: 'PBEsol-PAW-600', quantity: 'frequency', value: '-12.5', unit: 'cm-1', mode_index: '4', irrep: 'T2g', source: 'inhouse-2026' };
    const first = await callAction(createSingleEntryAction, mode);
    expect(first.state).toMatchObject({ ok: true });
    const id = savedOf(first).importId;
    expect(await db.$count(calculation, eq(calculation.importId, id))).toBe(1);
    const again = await callAction(createSingleEntryAction, mode);
    expect(again.state).toMatchObject({ ok: true, data: { duplicate: true } });
    expect(again.state!.message).toMatch(/identical calculation/);
  });

  it('is refused for a reviewer (no imports:create)', async () => {
    await signInAs(ws.members.reviewer.email);
    const out = await callAction(createSingleEntryAction, peak({ value: '570' }));
    expect(out.state).toMatchObject({ ok: false, code: 'forbidden' });
  });
});

describe('who may undo an import', () => {
  async function entry(email: string, value: string): Promise<string> {
    await signInAs(email);
    const out = await callAction(createSingleEntryAction, peak({ value, unit: 'cm-1' }));
    return savedOf(out).importId;
  }
  const undo = (importId: string) => callAction(undoImportAction, { workspaceId: ws.workspaceId, importId, reason: 'typed the wrong peak' });

  it('lets the importer undo their own import within the window', async () => {
    const id = await entry(contributor.email, '571.1');
    const out = await undo(id);
    expect(out.state).toMatchObject({ ok: true });
    const [batch] = await db.select().from(importBatch).where(eq(importBatch.id, id));
    expect(batch.status).toBe('undone');
    expect((await db.select().from(measurement).where(eq(measurement.importId, id)))[0].retractedAt).not.toBeNull();
  });

  it('refuses the importer after the window, and a contributor on an import of someone else, with the rule', async () => {
    const old = await entry(contributor.email, '571.2');
    await db
      .update(importBatch)
      .set({ createdAt: new Date(Date.now() - (IMPORTER_UNDO_HOURS + 1) * 3600_000) })
      .where(eq(importBatch.id, old));
    const late = await undo(old);
    expect(late.state).toMatchObject({ ok: false, code: 'forbidden' });
    expect(late.state!.message).toMatch(new RegExp(`${IMPORTER_UNDO_HOURS} hours`));

    const theirs = await entry(curator.email, '571.3');
    await signInAs(contributor.email);
    const other = await undo(theirs);
    expect(other.state).toMatchObject({ ok: false, code: 'forbidden' });
    expect(other.state!.message).toMatch(/A curator or owner can undo any import/);
    expect((await db.select().from(importBatch).where(eq(importBatch.id, theirs)))[0].status).toBe('committed');
  });

  it('lets a curator undo any import, at any age', async () => {
    const old = await entry(contributor.email, '571.4');
    await db.update(importBatch).set({ createdAt: new Date(Date.now() - 30 * 24 * 3600_000) }).where(eq(importBatch.id, old));
    await signInAs(curator.email);
    expect((await undo(old)).state).toMatchObject({ ok: true });
  });
});

describe('single entry of a Born charge', () => {
  it('takes a site and a tensor, the value left empty as the diagonal mean, and refuses a site that is no atom of the material', async () => {
    await signInAs(contributor.email);
    const entry = { workspaceId: ws.workspaceId, kind: 'calculations', material: 'GaN-wz', method: 'PBEsol-PAW-600', quantity: 'born-charge', source: 'inhouse-2026' };
    const out = await callAction(createSingleEntryAction, { ...entry, site: 'Ga1', tensor: '2.60 0 0; 0 2.60 0; 0 0 2.74' });
    expect(out.state).toMatchObject({ ok: true });
    const [row] = await db.select().from(calculation).where(eq(calculation.importId, savedOf(out).importId));
    expect(row).toMatchObject({ site: 'Ga1', components: [2.6, 0, 0, 0, 2.6, 0, 0, 0, 2.74], unit: 'e' });
    expect(row.value).toBeCloseTo(7.94 / 3, 10);

    const bad = await callAction(createSingleEntryAction, { ...entry, value: '2.6', site: 'As1' });
    expect(bad.state).toMatchObject({ ok: false });
    expect(JSON.stringify(bad.state)).toMatch(/As is not an element of this material \(Ga, N\)/);
  });
});
