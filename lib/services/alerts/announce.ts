import 'server-only';
import { readAlertThresholds } from '@/lib/benchmark/schemas';
import { env } from '@/lib/env';
import { detectShift } from '@/lib/science';
import { materialNames } from '@/db/queries/revisions';
import {
  alertDedupeKey,
  causeLookups,
  digestDedupeKey,
  latestRevisionSnapshot,
  recordAlert,
  revisionSnapshot,
  webhookDedupeKey,
  revisionSteps,
  type AlertRevision,
  type RevisionStep,
} from '@/db/queries/alerts';
import { activeDigestWatches, activeWatchesOf, type ActiveWatch } from '@/db/queries/watches';
import { alertMail, digestMail, type AlertContent } from '@/lib/alerts/alert-mail';
import { attributeCauses, causeLine, summariseCauses, type AlertCause } from '@/lib/alerts/causes';
import { alertPayload, type AlertEventType } from '@/lib/webhooks/alert-payload';
import type { NewWebhookDelivery } from '@/db/queries/mail';
import { describeReason, summarizeShift, type ShiftSummary } from '@/lib/alerts/shift-summary';
import { effectiveThresholds, readWatchThresholds } from '@/lib/alerts/thresholds';
import { signUnsubscribeToken } from '@/lib/alerts/unsubscribe-token';

/** Every cause of the steps between the baseline and the target, in words with its share (causes.ts). */
async function describeCauses(w: ActiveWatch, baseline: AlertRevision | null, target: AlertRevision, steps: RevisionStep[]) {
  const ids = { imports: [] as string[], decisions: [] as string[], pins: [] as string[], users: [] as string[] };
  for (const step of steps) {
    const c = step.cause;
    if (!c) continue;
    ids.imports.push(...c.imports.map((i) => i.id));
    ids.decisions.push(...c.decisions.added, ...c.decisions.reverted);
    ids.pins.push(...c.pins.added, ...c.pins.revoked);
    for (const r of c.reported) {
      if (r.importId) ids.imports.push(r.importId);
      if (r.userId) ids.users.push(r.userId);
    }
  }
  const lookups = await causeLookups(w.workspaceId, w.benchmarkId, ids, { from: baseline?.createdAt ?? null, to: target.createdAt });
  const { headline, causes } = attributeCauses(baseline?.statistics.methods ?? null, steps, lookups);
  const { listed, rest } = summariseCauses(causes);
  return { lines: listed.map((c) => causeLine(c, headline)), rest, listed };
}

interface Prepared {
  baseline: AlertRevision | null;
  target: AlertRevision;
  summary: ShiftSummary;
  content: Omit<AlertContent, 'dedupeKey'>;
  steps: RevisionStep[];
  listedCauses: AlertCause[];
}

/** Compares a watch's baseline with `target`; null when nothing crosses the watch's thresholds. */
async function prepare(w: ActiveWatch, target: AlertRevision): Promise<Prepared | null> {
  if (w.lastAnnouncedRevisionId === target.id) return null;
  const baseline = w.lastAnnouncedRevisionId ? await revisionSnapshot(w.workspaceId, w.lastAnnouncedRevisionId) : null;
  if (baseline && baseline.number >= target.number) return null;
  const thresholds = effectiveThresholds(readAlertThresholds(w.benchmarkThresholds, target.statistics.quantity), readWatchThresholds(w.thresholds));
  const summary = summarizeShift(baseline?.statistics ?? null, target.statistics, thresholds);
  if (!summary.shifted) return null;
  const steps = await revisionSteps(w.workspaceId, w.benchmarkId, baseline?.number ?? 0, target.number);
  const [causes, names] = await Promise.all([
    describeCauses(w, baseline, target, steps),
    materialNames(
      w.workspaceId,
      summary.newOutliers.map((o) => o.materialId),
    ),
  ]);
  const e = env();
  return {
    baseline,
    target,
    summary,
    steps,
    listedCauses: causes.listed,
    content: {
      to: w.email,
      recipientName: w.name,
      baseUrl: e.BETTER_AUTH_URL,
      workspace: { name: w.workspaceName, slug: w.workspaceSlug },
      benchmark: { id: w.benchmarkId, name: w.benchmarkName },
      fromRevision: baseline?.number ?? null,
      toRevision: { number: target.number, createdAt: target.createdAt },
      summary,
      materialNames: Object.fromEntries(names),
      imports: [],
      causes: { lines: causes.lines, rest: causes.rest },
      unsubscribeToken: signUnsubscribeToken(w.id, e.BETTER_AUTH_SECRET),
    },
  };
}

/** The webhook delivery beside the alert mail, when the watch has a URL: the same change as JSON (lib/webhooks/alert-payload.ts). */
function webhookFor(w: ActiveWatch, ready: Prepared, type: AlertEventType, mailDedupeKey: string, day?: string): NewWebhookDelivery | undefined {
  if (!w.webhookUrl) return undefined;
  const id = crypto.randomUUID();
  const c = ready.content;
  const payload = alertPayload({
    id,
    type,
    createdAt: new Date(),
    baseUrl: c.baseUrl,
    workspace: { id: w.workspaceId, slug: w.workspaceSlug, name: w.workspaceName },
    watch: { id: w.id, mode: w.mode },
    benchmark: c.benchmark,
    fromRevision: ready.baseline ? { id: ready.baseline.id, number: ready.baseline.number } : null,
    toRevision: { id: ready.target.id, number: ready.target.number, createdAt: ready.target.createdAt },
    summary: ready.summary,
    materialNames: c.materialNames,
    causes: { listed: ready.listedCauses, rest: c.causes?.rest ?? null },
    day,
  });
  const summary = `${type === 'benchmark.digest' ? `Digest ${day}` : 'Shift'}: ${c.benchmark.name}, revision ${c.fromRevision ?? '—'} → ${c.toRevision.number}`;
  return { id, kind: type, url: w.webhookUrl, watchId: w.id, summary, body: JSON.stringify(payload), dedupeKey: webhookDedupeKey(mailDedupeKey) };
}

/**
 * Announces the latest revision of a benchmark to its immediate watchers: one
 * alert per watcher whose thresholds it crosses, compared with the revision
 * last announced to that watcher. Nothing crossing → no mail and the baseline
 * stays, so small drifts add up until they matter.
 */
export async function announceBenchmark(workspaceId: string, benchmarkId: string): Promise<{ alerts: number }> {
  const watches = await activeWatchesOf(workspaceId, benchmarkId, 'immediate');
  if (watches.length === 0) return { alerts: 0 };
  const target = await latestRevisionSnapshot(workspaceId, benchmarkId);
  if (!target) return { alerts: 0 };
  let alerts = 0;
  for (const w of watches) {
    try {
      const ready = await prepare(w, target);
      if (!ready) continue;
      const dedupeKey = alertDedupeKey(w.id, target.id);
      const mail = alertMail({ ...ready.content, dedupeKey });
      const webhook = webhookFor(w, ready, 'benchmark.shifted', dedupeKey);
      if (await recordAlert(mail, { workspaceId, watchId: w.id, fromRevisionId: ready.baseline?.id ?? null, toRevisionId: target.id }, webhook)) alerts++;
    } catch (error) {
      // One watcher's failure must not keep the others from their alert.
      console.error(`[alerts] watch ${w.id}: could not announce revision ${target.number}`, error);
    }
  }
  return { alerts };
}

function utcDayStart(now: Date): Date {
  return new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate()));
}

/** Each revision of the period with what changed since the one before it (MAE, N, rank and leaderboard changes). */
function stepLines(steps: RevisionStep[], baseline: AlertRevision | null, thresholds: ReturnType<typeof effectiveThresholds>, unit: string) {
  const toSummaries = (methods: RevisionStep['methods']) =>
    methods.filter((m) => m.statistics).map((m) => ({ methodId: m.methodId, n: m.n, meanAbsoluteError: m.statistics!.meanAbsoluteError, outlierIds: [] as string[] }));
  let previous = toSummaries(baseline?.statistics.methods ?? []);
  const labels = new Map<string, string>();
  return steps.map((step) => {
    for (const m of step.methods) labels.set(m.methodId, m.label);
    const now = toSummaries(step.methods);
    const { reasons } = detectShift(previous, now, thresholds);
    previous = now;
    const outliers = step.methods.reduce((s, m) => s + m.outliers, 0);
    const lines = reasons.map((r) => describeReason(r, labels.get(r.methodId) ?? r.methodId, unit));
    const added = step.cause?.rows.measurementsAdded ?? 0;
    const addedCalc = step.cause?.rows.calculationsAdded ?? 0;
    if (added || addedCalc) lines.push(`${added} measurement(s) and ${addedCalc} calculation(s) entered the scope; ${outliers} outlier(s) in total`);
    return { number: step.number, createdAt: step.createdAt, lines };
  });
}

/**
 * Sends the daily digests that are due at `now`: for every active digest watch,
 * the revisions created before the start of today (UTC) that its baseline has
 * not seen, in one mail if they cross its thresholds. Called from a timer; safe
 * to call often (one mail per watch and day, by dedupe key and baseline).
 */
export async function sendDueDigests(now: Date = new Date()): Promise<{ digests: number }> {
  const cutoff = utcDayStart(now);
  const day = new Date(cutoff.getTime() - 86_400_000).toISOString().slice(0, 10);
  let digests = 0;
  for (const w of await activeDigestWatches()) {
    try {
      const target = await latestRevisionSnapshot(w.workspaceId, w.benchmarkId, cutoff);
      if (!target) continue;
      const ready = await prepare(w, target);
      if (!ready) continue;
      const thresholds = effectiveThresholds(readAlertThresholds(w.benchmarkThresholds, target.statistics.quantity), readWatchThresholds(w.thresholds));
      const dedupeKey = digestDedupeKey(w.id, day);
      const mail = digestMail({
        ...ready.content,
        dedupeKey,
        day,
        revisions: stepLines(ready.steps, ready.baseline, thresholds, ready.summary.unit),
      });
      const webhook = webhookFor(w, ready, 'benchmark.digest', dedupeKey, day);
      if (await recordAlert(mail, { workspaceId: w.workspaceId, watchId: w.id, fromRevisionId: ready.baseline?.id ?? null, toRevisionId: target.id }, webhook)) digests++;
    } catch (error) {
      console.error(`[alerts] watch ${w.id}: could not send the digest of ${day}`, error);
    }
  }
  return { digests };
}
