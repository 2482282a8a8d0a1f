import { beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, calculation, material, method, source, workspaceSettings } from '@/db/schema';
import { getMaterialValues } from '@/db/queries/material-values';
import { getQualityThresholds } from '@/db/queries/settings';
import { DEFAULT_QUALITY_THRESHOLDS } from '@/lib/science';
import { updateQualityThresholdsAction } from '@/app/(app)/w/[workspace]/settings/quality/actions';
import { loadMaterialQuality } from '@/app/(app)/w/[workspace]/materials/_components/load-material-quality';
import { QualityFlags } from '@/components/quality/quality-flags';
import { callAction } from '../support/actions';
import { createWorkspaceWith, signInAs } from '../support/users';

const { scheduled } = vi.hoisted(() => ({ scheduled: [] as Array<{ workspaceId: string; cause: unknown }> }));
vi.mock('@/lib/services/benchmarks/recompute-queue', () => ({
  scheduleRecompute: (workspaceId: string, benchmarkIds: string[] | undefined, cause: unknown) => {
    if (benchmarkIds === undefined) scheduled.push({ workspaceId, cause });
  },
}));

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;

const valid = { kPointsPerReciprocalAtom: '2000', acousticCm1: '5', imaginaryCm1: '20', bornNeutrality: '0.05', lstRelative: '0.1' };

async function settingsAudit(workspaceId: string) {
  return db
    .select()
    .from(auditLog)
    .where(and(eq(auditLog.workspaceId, workspaceId), eq(auditLog.entityType, 'workspace-settings')));
}

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator', 'contributor']);
  other = await createWorkspaceWith(['curator']);
});

beforeEach(() => {
  scheduled.length = 0;
});

describe('quality thresholds in settings', () => {
  it('starts from the documented defaults', async () => {
    expect(await getQualityThresholds(ws.workspaceId)).toEqual(DEFAULT_QUALITY_THRESHOLDS);
    expect(DEFAULT_QUALITY_THRESHOLDS.kPointsPerReciprocalAtom).toBe(1500);
  });

  it('refuses a contributor and writes nothing', async () => {
    await signInAs(ws.members.contributor.email);
    const out = await callAction(updateQualityThresholdsAction, { workspaceId: ws.workspaceId, ...valid });
    expect(out.state).toMatchObject({ ok: false, code: 'forbidden' });
    expect(await getQualityThresholds(ws.workspaceId)).toEqual(DEFAULT_QUALITY_THRESHOLDS);
    expect(await settingsAudit(ws.workspaceId)).toHaveLength(0);
    expect(scheduled).toEqual([]);
  });

  it('answers not-found for another workspace and writes nothing there', async () => {
    await signInAs(ws.members.curator.email);
    const out = await callAction(updateQualityThresholdsAction, { workspaceId: other.workspaceId, ...valid });
    expect(out.state).toMatchObject({ ok: false, code: 'not-found' });
    expect(await getQualityThresholds(other.workspaceId)).toEqual(DEFAULT_QUALITY_THRESHOLDS);
    expect(await settingsAudit(other.workspaceId)).toHaveLength(0);
  });

  it('reports invalid numbers per field and writes nothing', async () => {
    await signInAs(ws.members.curator.email);
    const out = await callAction(updateQualityThresholdsAction, {
      workspaceId: ws.workspaceId,
      kPointsPerReciprocalAtom: 'lots',
      acousticCm1: '-1',
      imaginaryCm1: '',
      bornNeutrality: '0',
      lstRelative: '2',
    });
    expect(out.state?.ok).toBe(false);
    expect(out.state?.fieldErrors).toEqual({
      kPointsPerReciprocalAtom: ['Enter a number.'],
      acousticCm1: ['Must be greater than 0.'],
      imaginaryCm1: ['Enter the imaginary mode limit.'],
      bornNeutrality: ['Must be greater than 0.'],
      lstRelative: ['At most 1.'],
    });
    expect(await getQualityThresholds(ws.workspaceId)).toEqual(DEFAULT_QUALITY_THRESHOLDS);
    expect(await settingsAudit(ws.workspaceId)).toHaveLength(0);
  });

  it('lets a curator change them, with an audit row and a recompute of the workspace’s benchmarks', async () => {
    await signInAs(ws.members.curator.email);
    const out = await callAction(updateQualityThresholdsAction, { workspaceId: ws.workspaceId, ...valid });
    expect(out.state).toMatchObject({ ok: true });
    expect(await getQualityThresholds(ws.workspaceId)).toEqual({ kPointsPerReciprocalAtom: 2000, acousticCm1: 5, imaginaryCm1: 20, bornNeutrality: 0.05, lstRelative: 0.1 });
    const [row] = await db.select().from(workspaceSettings).where(eq(workspaceSettings.workspaceId, ws.workspaceId));
    expect(row.updatedBy).toBe(ws.members.curator.id);
    const audit = await settingsAudit(ws.workspaceId);
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ action: 'update', entityId: ws.workspaceId, actorUserId: ws.members.curator.id });
    expect(audit[0].before).toEqual(DEFAULT_QUALITY_THRESHOLDS);
    expect(audit[0].after).toMatchObject({ imaginaryCm1: 20 });
    expect(scheduled).toEqual([{ workspaceId: ws.workspaceId, cause: { trigger: 'data-change', userId: ws.members.curator.id } }]);

    // The same values again change nothing: no audit row, no recompute.
    const again = await callAction(updateQualityThresholdsAction, { workspaceId: ws.workspaceId, ...valid });
    expect(again.state).toMatchObject({ ok: true, message: 'Nothing changed.' });
    expect(await settingsAudit(ws.workspaceId)).toHaveLength(1);
    expect(scheduled).toHaveLength(1);
  });
});

describe('quality flags of a material page', () => {
  // A hand-built, invented calculation set: a two-atom cell (6 modes at Γ), three acoustic modes
  // at 0 and three optical modes at −50 cm⁻¹ (a dynamical instability), on a 4×4×4 k-grid
  // (4³ × 2 = 128 per reciprocal atom) with an incommensurate 3×3×3 q-grid.
  it('lists each method’s flags with the workspace’s thresholds', async () => {
    const fresh = await createWorkspaceWith([]);
    const w = fresh.workspaceId;
    const [mat] = await db
      .insert(material)
      .values({ workspaceId: w, name: 'Unstable', formula: 'Si', reducedFormula: 'Si', atomsPerFormulaUnit: 1, elementCounts: { Si: 1 }, atomsInCell: 2 })
      .returning();
    const [src] = await db.insert(source).values({ workspaceId: w, citeKey: 'invented', kind: 'computed-data-set' }).returning({ id: source.id });
    const [coarse] = await db.insert(method).values({ workspaceId: w, label: 'Coarse', functional: 'PBE', kGrid: [4, 4, 4], qGrid: [3, 3, 3] }).returning({ id: method.id });
    const [bare] = await db.insert(method).values({ workspaceId: w, label: 'Bare', functional: 'LDA' }).returning({ id: method.id });
    const mode = (methodId: string, i: number, value: number, activity: 'acoustic' | 'raman') => ({
      workspaceId: w,
      materialId: mat.id,
      sourceId: src.id,
      methodId,
      quantity: 'frequency' as const,
      value,
      valueText: String(value),
      unit: 'cm-1',
      activity,
      modeIndex: i,
      rowHash: `${methodId}-${i}`,
    });
    await db.insert(calculation).values([
      ...[0, 1, 2].map((i) => mode(coarse.id, i, 0, 'acoustic')),
      ...[3, 4, 5].map((i) => mode(coarse.id, i, -50, 'raman')),
      ...[0, 1, 2].map((i) => mode(bare.id, i, 0.5, 'acoustic')),
      ...[3, 4, 5].map((i) => mode(bare.id, i, 520, 'raman')),
    ]);

    const results = await loadMaterialQuality(w, mat, await getMaterialValues(w, mat.id));
    expect(results.map((r) => r.methodLabel)).toEqual(['Bare', 'Coarse']);
    const coarseFlags = results.find((r) => r.methodId === coarse.id)!;
    expect(coarseFlags.flags.map((f) => [f.code, f.severity])).toEqual([
      ['imaginary-mode', 'error'],
      ['grid-commensurability', 'warning'],
      ['k-point-density', 'warning'],
    ]);
    expect(coarseFlags.flags[0].message).toContain('lowest -50 cm⁻¹');
    const bareFlags = results.find((r) => r.methodId === bare.id)!;
    expect(bareFlags.flags).toEqual([]);
    expect(bareFlags.skipped).toEqual(['k-point density: the method has no k-grid', 'grid commensurability: the method has no k- or q-grid']);

    const html = renderToStaticMarkup(QualityFlags({ slug: fresh.slug, results, thresholdsHref: `/w/${fresh.slug}/settings/quality` }));
    expect(html).toContain('imaginary-mode');
    expect(html).toContain('No flags.');

    // With a looser imaginary limit (60 cm⁻¹) the −50 cm⁻¹ modes are no longer flagged.
    await db.insert(workspaceSettings).values({ workspaceId: w, imaginaryCm1: 60 }).onConflictDoUpdate({ target: workspaceSettings.workspaceId, set: { imaginaryCm1: 60 } });
    const loosened = await loadMaterialQuality(w, mat, await getMaterialValues(w, mat.id));
    expect(loosened.find((r) => r.methodId === coarse.id)!.flags.map((f) => f.code)).toEqual(['grid-commensurability', 'k-point-density']);
  });
});
