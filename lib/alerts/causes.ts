/**
 * What caused an alert: every step between the revision last announced to a watcher
 * and the new one, with its share of the change.
 *
 * Steps are the revisions in between, oldest first. Each revision's recorded cause
 * names its imports (rows that entered the scope), undone imports, decisions added
 * or reverted, pins added or revoked, and edits of the benchmark's definition; edits
 * of the alert thresholds (which change no number, only what counts as a shift) come
 * from the audit log. A revision whose cause names nothing is a data change (rows
 * added or removed, counted).
 *
 * Share: the headline method is the one whose MAE moved most between the two
 * announced revisions. Revision k changed its MAE by Δk = MAEk − MAEk−1; the Δk add
 * up to the whole change, so each revision's share is Δk / Σ Δ (negative when it
 * moved the other way). Causes recorded in the same revision share it and say so:
 * one recomputation cannot tell their parts apart. Edits of thresholds have no share.
 *
 * Many causes: the alert lists at most MAX_LISTED_CAUSES, largest |share| first, and
 * summarises the rest by kind with a link to the revision history.
 */
import type { MethodResult } from '@/lib/benchmark/types';
import { count } from '@/lib/format';

export const MAX_LISTED_CAUSES = 6;

export type CauseKind = 'import' | 'import-undone' | 'decision' | 'decision-reverted' | 'pin' | 'pin-revoked' | 'definition' | 'thresholds' | 'data-change';

export interface AlertCause {
  kind: CauseKind;
  /** Revision that recorded it (null: a threshold edit, which makes no revision). */
  revision: number | null;
  text: string;
  /** Fraction of the headline method's MAE change from this cause's revision; null when not computable. */
  share: number | null;
  /** Other causes recorded in the same revision (sharing the share). */
  together: number;
  /** Rows an import brought into the scope. */
  rows?: number;
}

export interface CauseStep {
  number: number;
  cause: {
    reported?: Array<{ trigger: string; importId?: string; decisionId?: string; pinId?: string; userId?: string | null }>;
    rows?: { measurementsAdded: number; measurementsRemoved: number; calculationsAdded: number; calculationsRemoved: number };
    imports?: Array<{ id: string; rows: number }>;
    decisions?: { added: string[]; reverted: string[] };
    pins?: { added: string[]; revoked: string[] };
  } | null;
  methods: Array<Pick<MethodResult, 'methodId' | 'label'> & { statistics: { meanAbsoluteError: number } | null }>;
}

export interface CauseLookups {
  imports: ReadonlyMap<string, { fileName: string | null; by: string | null }>;
  decisions: ReadonlyMap<string, { kind: string; reason: string; by: string | null; method: string | null; revertedBy?: string | null; revertReason?: string | null }>;
  pins: ReadonlyMap<string, { reason: string; by: string | null; method: string | null; noCounterpart: boolean }>;
  users: ReadonlyMap<string, string>;
  thresholdEdits: Array<{ by: string | null; at: Date }>;
}

export interface CauseAttribution {
  headline: { methodId: string; label: string; before: number; after: number } | null;
  causes: AlertCause[];
}

const DECISION_WORDS: Record<string, string> = {
  'exclude-pair': 'excluded a pair',
  'exclude-measurement': 'excluded a measurement for every method',
  keep: 'kept a flagged pair',
};

function maeOf(methods: CauseStep['methods'] | undefined, methodId: string): number | null {
  return methods?.find((m) => m.methodId === methodId)?.statistics?.meanAbsoluteError ?? null;
}

function headlineOf(baseline: CauseStep['methods'] | null, target: CauseStep['methods']): CauseAttribution['headline'] {
  let best: CauseAttribution['headline'] = null;
  for (const m of target) {
    const after = m.statistics?.meanAbsoluteError;
    const before = maeOf(baseline ?? undefined, m.methodId);
    if (after === undefined || before === null) continue;
    if (!best || Math.abs(after - before) > Math.abs(best.after - best.before)) best = { methodId: m.methodId, label: m.label, before, after };
  }
  return best && best.after !== best.before ? best : null;
}

const who = (name: string | null | undefined) => name ?? 'someone';
const quoted = (s: string) => `“${s}”`;

function stepCauses(step: CauseStep, lookups: CauseLookups): Array<Omit<AlertCause, 'share' | 'together' | 'revision'>> {
  const out: Array<Omit<AlertCause, 'share' | 'together' | 'revision'>> = [];
  const c = step.cause;
  if (!c) return [{ kind: 'data-change', text: 'Recomputed (no cause recorded)' }];
  for (const i of c.imports ?? []) {
    const found = lookups.imports.get(i.id);
    out.push({ kind: 'import', rows: i.rows, text: `Import ${quoted(found?.fileName ?? 'without a file name')} by ${who(found?.by)}: ${i.rows} row${i.rows === 1 ? '' : 's'} entered the scope` });
  }
  for (const r of c.reported ?? []) {
    if (r.trigger === 'import-undone' && r.importId) {
      const found = lookups.imports.get(r.importId);
      const removed = (c.rows?.measurementsRemoved ?? 0) + (c.rows?.calculationsRemoved ?? 0);
      out.push({ kind: 'import-undone', text: `Import ${quoted(found?.fileName ?? 'without a file name')} undone by ${who(r.userId ? lookups.users.get(r.userId) : null)}: ${removed} row${removed === 1 ? '' : 's'} left the scope` });
    }
    if (r.trigger === 'benchmark-updated') out.push({ kind: 'definition', text: `The benchmark's definition (scope or rules) was edited by ${who(r.userId ? lookups.users.get(r.userId) : null)}` });
  }
  for (const id of c.decisions?.added ?? []) {
    const d = lookups.decisions.get(id);
    out.push({ kind: 'decision', text: d ? `Decision by ${who(d.by)}: ${DECISION_WORDS[d.kind] ?? d.kind}${d.method ? ` of ${d.method}` : ''} — ${quoted(d.reason)}` : 'A decision (no longer readable)' });
  }
  for (const id of c.decisions?.reverted ?? []) {
    const d = lookups.decisions.get(id);
    out.push({
      kind: 'decision-reverted',
      text: d ? `Decision reverted by ${who(d.revertedBy)}: ${DECISION_WORDS[d.kind] ?? d.kind}${d.method ? ` of ${d.method}` : ''} (${quoted(d.reason)})${d.revertReason ? ` — ${quoted(d.revertReason)}` : ''}` : 'A decision was reverted',
    });
  }
  for (const id of c.pins?.added ?? []) {
    const p = lookups.pins.get(id);
    out.push({ kind: 'pin', text: p ? `Pairing pinned by ${who(p.by)}${p.method ? ` for ${p.method}` : ''}${p.noCounterpart ? ' (no counterpart)' : ''} — ${quoted(p.reason)}` : 'A pin' });
  }
  for (const id of c.pins?.revoked ?? []) {
    const p = lookups.pins.get(id);
    out.push({ kind: 'pin-revoked', text: p ? `Pin revoked${p.method ? ` for ${p.method}` : ''} (${quoted(p.reason)})` : 'A pin was revoked' });
  }
  if (out.length === 0) {
    const r = c.rows;
    const parts = r
      ? [`+${r.measurementsAdded}/−${r.measurementsRemoved} measurements`, `+${r.calculationsAdded}/−${r.calculationsRemoved} calculations`]
      : [];
    out.push({ kind: 'data-change', text: `Data changed in scope${parts.length ? ` (${parts.join(', ')})` : ''}` });
  }
  return out;
}

/** Every cause between the baseline and the last step, with shares (module header). */
export function attributeCauses(baseline: CauseStep['methods'] | null, steps: readonly CauseStep[], lookups: CauseLookups): CauseAttribution {
  const last = steps[steps.length - 1];
  const headline = last ? headlineOf(baseline, last.methods) : null;
  const total = headline ? headline.after - headline.before : 0;
  const causes: AlertCause[] = [];
  let previous = baseline;
  for (const step of steps) {
    let share: number | null = null;
    if (headline) {
      const before = maeOf(previous ?? undefined, headline.methodId);
      const after = maeOf(step.methods, headline.methodId);
      if (before !== null && after !== null) share = (after - before) / total;
    }
    const own = stepCauses(step, lookups);
    for (const c of own) causes.push({ ...c, revision: step.number, share, together: own.length - 1 });
    previous = step.methods;
  }
  for (const e of lookups.thresholdEdits) {
    causes.push({ kind: 'thresholds', revision: null, share: null, together: 0, text: `Alert thresholds edited by ${who(e.by)} (this changes what counts as a shift, not the numbers)` });
  }
  causes.sort((a, b) => Number(a.share === null) - Number(b.share === null) || Math.abs(b.share ?? 0) - Math.abs(a.share ?? 0) || (a.revision ?? 0) - (b.revision ?? 0));
  return { headline, causes };
}

const KIND_NAMES: Record<CauseKind, [string, string]> = {
  import: ['import', 'imports'],
  'import-undone': ['undone import', 'undone imports'],
  decision: ['decision', 'decisions'],
  'decision-reverted': ['reverted decision', 'reverted decisions'],
  pin: ['pin', 'pins'],
  'pin-revoked': ['revoked pin', 'revoked pins'],
  definition: ['definition edit', 'definition edits'],
  thresholds: ['threshold edit', 'threshold edits'],
  'data-change': ['data change', 'data changes'],
};

/** The causes to list and a one-line summary of the rest (null when all are listed). */
export function summariseCauses(causes: readonly AlertCause[], max = MAX_LISTED_CAUSES): { listed: AlertCause[]; rest: string | null } {
  if (causes.length <= max) return { listed: [...causes], rest: null };
  const listed = causes.slice(0, max);
  const counts = new Map<CauseKind, { n: number; rows: number }>();
  for (const c of causes.slice(max)) {
    const e = counts.get(c.kind) ?? { n: 0, rows: 0 };
    e.n++;
    e.rows += c.rows ?? 0;
    counts.set(c.kind, e);
  }
  const n = (v: number) => count(v);
  const parts = [...counts].map(([kind, e]) => `${n(e.n)} ${KIND_NAMES[kind][e.n === 1 ? 0 : 1]}${kind === 'import' ? ` (${n(e.rows)} rows)` : ''}`);
  return { listed, rest: `…and ${n(causes.length - max)} more: ${parts.join(', ')}.` };
}

/** A cause with its share in words. */
export function causeLine(c: AlertCause, headline: CauseAttribution['headline']): string {
  if (c.share === null || !headline) return c.text;
  const pct = Math.round(100 * c.share);
  const where = c.together > 0 ? `, shared with ${c.together} other cause${c.together === 1 ? '' : 's'} of revision ${c.revision}` : ` (revision ${c.revision})`;
  return `${c.text} — ${pct} % of ${headline.label}'s MAE change${where}`;
}
