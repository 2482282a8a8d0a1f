import 'server-only';
import { and, eq, inArray } from 'drizzle-orm';
import { db } from '@/db/client';
import { method, user, workspaceSettings } from '@/db/schema';
import { DEFAULT_QUALITY_THRESHOLDS, type QualityThresholds } from '@/lib/science';
import { writeAudit, type Actor } from './audit';

export type WorkspaceQualityThresholds = Required<QualityThresholds>;

export interface QualitySettings {
  thresholds: WorkspaceQualityThresholds;
  updatedAt: Date | null;
  updatedByName: string | null;
}

function thresholdsOf(row: typeof workspaceSettings.$inferSelect | undefined): WorkspaceQualityThresholds {
  if (!row) return { ...DEFAULT_QUALITY_THRESHOLDS };
  return {
    kPointsPerReciprocalAtom: row.kPointsPerReciprocalAtom,
    acousticCm1: row.acousticCm1,
    imaginaryCm1: row.imaginaryCm1,
    bornNeutrality: row.bornNeutrality,
    lstRelative: row.lstRelative,
  };
}

/** The workspace's quality thresholds (the defaults of lib/science when no row exists yet). */
export async function getQualityThresholds(workspaceId: string): Promise<WorkspaceQualityThresholds> {
  const [row] = await db.select().from(workspaceSettings).where(eq(workspaceSettings.workspaceId, workspaceId)).limit(1);
  return thresholdsOf(row);
}

/** The thresholds with who changed them last, for the settings page. */
export async function getQualitySettings(workspaceId: string): Promise<QualitySettings> {
  const [found] = await db
    .select({ settings: workspaceSettings, updatedByName: user.name })
    .from(workspaceSettings)
    .leftJoin(user, eq(user.id, workspaceSettings.updatedBy))
    .where(eq(workspaceSettings.workspaceId, workspaceId))
    .limit(1);
  return { thresholds: thresholdsOf(found?.settings), updatedAt: found?.settings.updatedAt ?? null, updatedByName: found?.updatedByName ?? null };
}

/**
 * Sets the quality thresholds and writes the audit row in the same transaction.
 * Returns whether anything changed (an unchanged form writes nothing).
 */
export async function updateQualityThresholds(workspaceId: string, actor: Actor, next: WorkspaceQualityThresholds): Promise<{ changed: boolean }> {
  return db.transaction(async (tx) => {
    const [row] = await tx.select().from(workspaceSettings).where(eq(workspaceSettings.workspaceId, workspaceId)).limit(1);
    const before = thresholdsOf(row);
    const after: WorkspaceQualityThresholds = {
      kPointsPerReciprocalAtom: next.kPointsPerReciprocalAtom,
      acousticCm1: next.acousticCm1,
      imaginaryCm1: next.imaginaryCm1,
      bornNeutrality: next.bornNeutrality,
      lstRelative: next.lstRelative,
    };
    if ((Object.keys(after) as Array<keyof WorkspaceQualityThresholds>).every((k) => before[k] === after[k])) return { changed: false };
    const values = { ...after, updatedAt: new Date(), updatedBy: actor.userId };
    await tx
      .insert(workspaceSettings)
      .values({ workspaceId, ...values })
      .onConflictDoUpdate({ target: workspaceSettings.workspaceId, set: values });
    await writeAudit({ workspaceId, actor, action: 'update', entityType: 'workspace-settings', entityId: workspaceId, before, after }, tx);
    return { changed: true };
  });
}

/** The k- and q-point grids of some methods of the workspace, for the quality checks of a material page. */
export async function getMethodGrids(workspaceId: string, methodIds: string[]) {
  if (methodIds.length === 0) return new Map<string, { kGrid: [number, number, number] | null; qGrid: [number, number, number] | null }>();
  const rows = await db
    .select({ id: method.id, kGrid: method.kGrid, qGrid: method.qGrid })
    .from(method)
    .where(and(eq(method.workspaceId, workspaceId), inArray(method.id, methodIds)));
  return new Map(rows.map((r) => [r.id, { kGrid: r.kGrid, qGrid: r.qGrid }]));
}

/** Whether this workspace's webhooks may target private networks (false when no settings row exists yet). */
export async function privateWebhookTargetsAllowed(workspaceId: string): Promise<boolean> {
  const [row] = await db
    .select({ allow: workspaceSettings.allowPrivateWebhookTargets })
    .from(workspaceSettings)
    .where(eq(workspaceSettings.workspaceId, workspaceId))
    .limit(1);
  return row?.allow ?? false;
}

/** An owner's choice (the caller checks the role), audited; the quality thresholds of the row are left as they are. */
export async function setPrivateWebhookTargets(workspaceId: string, actor: Actor, allow: boolean): Promise<{ changed: boolean }> {
  return db.transaction(async (tx) => {
    const [row] = await tx.select().from(workspaceSettings).where(eq(workspaceSettings.workspaceId, workspaceId)).limit(1);
    const before = row?.allowPrivateWebhookTargets ?? false;
    if (before === allow) return { changed: false };
    const values = { allowPrivateWebhookTargets: allow, updatedAt: new Date(), updatedBy: actor.userId };
    await tx
      .insert(workspaceSettings)
      .values({ workspaceId, ...values })
      .onConflictDoUpdate({ target: workspaceSettings.workspaceId, set: values });
    await writeAudit(
      { workspaceId, actor, action: 'update', entityType: 'workspace-settings', entityId: workspaceId, before: { allowPrivateWebhookTargets: before }, after: { allowPrivateWebhookTargets: allow } },
      tx,
    );
    return { changed: true };
  });
}
