/**
 * The JSON body of a webhook alert (documented in the README, "Webhooks").
 * Pure: built from the same content as the alert e-mail, numbers as numbers
 * in the benchmark's unit, times as ISO 8601 UTC. The `id` is the outbox row
 * id, the same as the Ledger-Webhook-Id header: a receiver dedupes by it.
 */
import type { AlertCause } from '@/lib/alerts/causes';
import type { ShiftSummary } from '@/lib/alerts/shift-summary';
import { alertLinks } from '@/lib/alerts/alert-mail';

export const WEBHOOK_PAYLOAD_VERSION = 1;

export type AlertEventType = 'benchmark.shifted' | 'benchmark.digest';

export interface AlertPayloadInput {
  id: string;
  type: AlertEventType;
  createdAt: Date;
  baseUrl: string;
  workspace: { id: string; slug: string; name: string };
  watch: { id: string; mode: 'immediate' | 'digest' };
  benchmark: { id: string; name: string };
  fromRevision: { id: string; number: number } | null;
  toRevision: { id: string; number: number; createdAt: Date };
  summary: ShiftSummary;
  materialNames: Record<string, string>;
  causes: { listed: AlertCause[]; rest: string | null };
  /** Digests: the day covered, YYYY-MM-DD (UTC). */
  day?: string;
}

export function alertPayload(p: AlertPayloadInput) {
  const links = alertLinks({ baseUrl: p.baseUrl, workspace: p.workspace, benchmark: p.benchmark, toRevision: p.toRevision, unsubscribeToken: '' });
  return {
    id: p.id,
    type: p.type,
    version: WEBHOOK_PAYLOAD_VERSION,
    createdAt: p.createdAt.toISOString(),
    ...(p.day ? { day: p.day } : {}),
    workspace: { id: p.workspace.id, slug: p.workspace.slug, name: p.workspace.name },
    watch: { id: p.watch.id, mode: p.watch.mode },
    benchmark: { id: p.benchmark.id, name: p.benchmark.name, unit: p.summary.unit },
    revision: {
      from: p.fromRevision ? { id: p.fromRevision.id, number: p.fromRevision.number } : null,
      to: { id: p.toRevision.id, number: p.toRevision.number, createdAt: p.toRevision.createdAt.toISOString(), url: links.revision },
    },
    changes: p.summary.methods
      .filter((m) => m.kinds.length > 0)
      .map((m) => ({
        methodId: m.methodId,
        method: m.label,
        reasons: m.kinds,
        mae: { before: m.maeBefore, after: m.maeAfter },
        n: { before: m.nBefore, after: m.nAfter },
        rank: { before: m.rankBefore, after: m.rankAfter },
      })),
    newOutliers: p.summary.newOutliers.map((o) => ({
      methodId: o.methodId,
      method: o.methodLabel,
      materialId: o.materialId,
      material: p.materialNames[o.materialId] ?? null,
      label: o.label,
      measured: o.measured,
      calculated: o.calculated,
      error: o.error,
    })),
    causes: p.causes.listed.map((c) => ({ kind: c.kind, revision: c.revision, text: c.text, share: c.share })),
    causesNotListed: p.causes.rest,
  };
}

export type AlertPayload = ReturnType<typeof alertPayload>;
