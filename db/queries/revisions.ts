import 'server-only';
import { and, asc, desc, eq, inArray, max, sql } from 'drizzle-orm';
import { db } from '@/db/client';
import { flag, importBatch, material, revision, source, user } from '@/db/schema';
import { shortCitation } from '@/lib/citations/short-citation';
import { AppError } from '@/lib/errors';
import { computeBenchmark } from '@/lib/benchmark/compute';
import { benchmarkFingerprint } from '@/lib/benchmark/fingerprint';
import type { BenchmarkSnapshot, MethodResult } from '@/lib/benchmark/types';
import { requireBenchmark, loadBenchmarkInput } from './benchmarks';
import { revisionStored } from '@/lib/alerts/scheduler';

/** What made a recomputation run (accumulated by the queue while it waits). */
export interface RecomputeCause {
  trigger: 'benchmark-created' | 'benchmark-updated' | 'import' | 'import-undone' | 'decision' | 'pin' | 'manual' | 'data-change';
  importId?: string;
  decisionId?: string;
  pinId?: string;
  userId?: string | null;
}

/** What a revision records about its origin: the reported causes and the change it measured. */
export interface RevisionCause {
  reported: RecomputeCause[];
  rows: { measurementsAdded: number; measurementsRemoved: number; calculationsAdded: number; calculationsRemoved: number };
  /** Imports whose rows entered the scope with this revision. */
  imports: Array<{ id: string; rows: number }>;
  decisions: { added: string[]; reverted: string[] };
  pins: { added: string[]; revoked: string[] };
}

export interface RevisionHead {
  id: string;
  number: number;
  fingerprint: string;
  createdAt: Date;
}

type RowIds = { measurements: string[]; calculations: string[] };

function setDiff(now: readonly string[], before: readonly string[]): { added: string[]; removed: string[] } {
  const a = new Set(now);
  const b = new Set(before);
  return { added: now.filter((x) => !b.has(x)), removed: before.filter((x) => !a.has(x)) };
}

async function latestReady(workspaceId: string, benchmarkId: string) {
  const rows = await db
    .select({ id: revision.id, number: revision.number, fingerprint: revision.fingerprint, createdAt: revision.createdAt })
    .from(revision)
    .where(and(eq(revision.workspaceId, workspaceId), eq(revision.benchmarkId, benchmarkId), eq(revision.status, 'ready')))
    .orderBy(desc(revision.number))
    .limit(1);
  return rows[0] ?? null;
}

/** The number and time of the latest stored revision (no statistics): what a page polls to learn that a newer one exists. */
export async function latestRevisionHead(workspaceId: string, benchmarkId: string): Promise<{ number: number; createdAt: Date } | null> {
  const head = await latestReady(workspaceId, benchmarkId);
  return head ? { number: head.number, createdAt: head.createdAt } : null;
}

const CHUNK = 400;

/**
 * Recomputes a benchmark and stores a new Revision only when the fingerprint of
 * the rows, rules, decisions and pins changed. Revisions are never updated after
 * this insert: there is no function that writes to an existing one.
 */
export async function recomputeBenchmark(
  workspaceId: string,
  benchmarkId: string,
  reported: RecomputeCause[] = [{ trigger: 'manual' }],
): Promise<{ created: boolean; revision: RevisionHead | null }> {
  const bm = await requireBenchmark(workspaceId, benchmarkId);
  const input = await loadBenchmarkInput(workspaceId, bm);
  const fingerprint = benchmarkFingerprint(input, bm.scope);
  const latest = await latestReady(workspaceId, benchmarkId);
  if (latest && latest.fingerprint === fingerprint) return { created: false, revision: latest };

  const snapshot = computeBenchmark(input);
  const rowIds: RowIds = {
    measurements: input.measurements.map((m) => m.id).sort(),
    calculations: input.calculations.map((c) => c.id).sort(),
  };
  let previous: { rowIds: RowIds | null; statistics: BenchmarkSnapshot | null } | null = null;
  if (latest) {
    const [row] = await db
      .select({
        rowIds: revision.rowIds,
        decisions: sql<string | null>`json_extract(${revision.statistics}, '$.decisions')`,
        pins: sql<string | null>`json_extract(${revision.statistics}, '$.pins')`,
      })
      .from(revision)
      .where(eq(revision.id, latest.id));
    previous = {
      rowIds: row.rowIds,
      statistics: { decisions: JSON.parse(row.decisions ?? '[]'), pins: JSON.parse(row.pins ?? '[]') } as BenchmarkSnapshot,
    };
  }
  const m = setDiff(rowIds.measurements, previous?.rowIds?.measurements ?? []);
  const c = setDiff(rowIds.calculations, previous?.rowIds?.calculations ?? []);
  const addedIds = new Set([...m.added, ...c.added]);
  const importRows = new Map<string, number>();
  for (const row of [...input.measurements, ...input.calculations]) {
    if (row.importId && addedIds.has(row.id)) importRows.set(row.importId, (importRows.get(row.importId) ?? 0) + 1);
  }
  const d = setDiff(
    snapshot.decisions.map((x) => x.id),
    (previous?.statistics?.decisions ?? []).map((x) => x.id),
  );
  const p = setDiff(
    snapshot.pins.map((x) => x.id),
    (previous?.statistics?.pins ?? []).map((x) => x.id),
  );
  const cause: RevisionCause = {
    reported,
    rows: { measurementsAdded: m.added.length, measurementsRemoved: m.removed.length, calculationsAdded: c.added.length, calculationsRemoved: c.removed.length },
    imports: [...importRows].map(([id, rows]) => ({ id, rows })).sort((a, b) => b.rows - a.rows),
    decisions: { added: d.added, reverted: d.removed },
    pins: { added: p.added, revoked: p.removed },
  };

  const flagRows = [
    ...snapshot.pairs
      .filter((pair) => pair.outlier !== null)
      .map((pair) => ({
        workspaceId,
        benchmarkId,
        kind: 'outlier' as const,
        code: snapshot.rules.outlierRule.kind,
        methodId: pair.methodId,
        measurementId: pair.measurementIds[0],
        subjectKey: pair.key,
        details: { reason: pair.outlier, error: pair.error },
      })),
    ...snapshot.quality.map((q) => ({
      workspaceId,
      benchmarkId,
      kind: 'quality' as const,
      code: q.code,
      methodId: q.methodId,
      measurementId: null,
      subjectKey: `${q.materialId}|${q.methodId}`,
      details: { severity: q.severity, message: q.message, materialId: q.materialId },
    })),
  ];

  const head = await db.transaction(async (tx) => {
    const [{ last }] = await tx.select({ last: max(revision.number) }).from(revision).where(eq(revision.benchmarkId, benchmarkId));
    const [row] = await tx
      .insert(revision)
      .values({
        workspaceId,
        benchmarkId,
        number: (last ?? 0) + 1,
        fingerprint,
        status: 'ready',
        statistics: snapshot,
        rowIds,
        cause,
        completedAt: new Date(),
      })
      .returning({ id: revision.id, number: revision.number, fingerprint: revision.fingerprint, createdAt: revision.createdAt });
    for (let i = 0; i < flagRows.length; i += CHUNK) {
      await tx.insert(flag).values(flagRows.slice(i, i + CHUNK).map((f) => ({ ...f, revisionId: row.id })));
      await new Promise(setImmediate);
    }
    return row;
  });
  revisionStored(workspaceId, benchmarkId, head.id);
  return { created: true, revision: head };
}

export interface RevisionView extends RevisionHead {
  benchmarkId: string;
  statistics: BenchmarkSnapshot;
  cause: RevisionCause | null;
  isLatest: boolean;
}

/** Revisions are immutable, so their parsed snapshots can be cached by id. */
const cache = new Map<string, RevisionView>();
const CACHE_SIZE = 8;

/**
 * One ready revision of a benchmark of this workspace: the given number, or the
 * latest. Null when there is none (ids of another workspace included).
 */
export async function getRevision(workspaceId: string, benchmarkId: string, number?: number): Promise<RevisionView | null> {
  const latest = await latestReady(workspaceId, benchmarkId);
  if (!latest) return null;
  const wanted = number ?? latest.number;
  const heads = await db
    .select({ id: revision.id })
    .from(revision)
    .where(and(eq(revision.workspaceId, workspaceId), eq(revision.benchmarkId, benchmarkId), eq(revision.number, wanted), eq(revision.status, 'ready')))
    .limit(1);
  if (!heads[0]) return null;
  const id = heads[0].id;
  const hit = cache.get(id);
  if (hit) {
    cache.delete(id);
    cache.set(id, hit);
    return { ...hit, isLatest: wanted === latest.number };
  }
  const [row] = await db
    .select({
      id: revision.id,
      benchmarkId: revision.benchmarkId,
      number: revision.number,
      fingerprint: revision.fingerprint,
      createdAt: revision.createdAt,
      statistics: revision.statistics,
      cause: revision.cause,
    })
    .from(revision)
    .where(eq(revision.id, id));
  const view: RevisionView = {
    ...row,
    statistics: row.statistics as BenchmarkSnapshot,
    cause: (row.cause as RevisionCause | null) ?? null,
    isLatest: wanted === latest.number,
  };
  cache.set(id, view);
  if (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value!);
  return view;
}

export async function requireRevision(workspaceId: string, benchmarkId: string, number?: number): Promise<RevisionView> {
  const found = await getRevision(workspaceId, benchmarkId, number);
  if (!found) throw new AppError('not-found', number === undefined ? 'This benchmark has no revision yet.' : `No revision ${number} of this benchmark.`);
  return found;
}

export interface HistoryEntry extends RevisionHead {
  cause: RevisionCause | null;
  methods: Array<Pick<MethodResult, 'methodId' | 'label' | 'n' | 'excluded' | 'outliers'> & { mae: number | null; rmse: number | null; mse: number | null }>;
}

/** Every ready revision, newest first, with its per-method headline (read through json_extract, not the whole snapshot). */
export async function listRevisionHistory(workspaceId: string, benchmarkId: string): Promise<HistoryEntry[]> {
  const rows = await db
    .select({
      id: revision.id,
      number: revision.number,
      fingerprint: revision.fingerprint,
      createdAt: revision.createdAt,
      cause: revision.cause,
      methods: sql<string | null>`json_extract(${revision.statistics}, '$.methods')`,
    })
    .from(revision)
    .where(and(eq(revision.workspaceId, workspaceId), eq(revision.benchmarkId, benchmarkId), eq(revision.status, 'ready')))
    .orderBy(desc(revision.number));
  return rows.map((r) => ({
    id: r.id,
    number: r.number,
    fingerprint: r.fingerprint,
    createdAt: r.createdAt,
    cause: (r.cause as RevisionCause | null) ?? null,
    methods: (JSON.parse(r.methods ?? '[]') as MethodResult[]).map((m) => ({
      methodId: m.methodId,
      label: m.label,
      n: m.n,
      excluded: m.excluded,
      outliers: m.outliers,
      mae: m.statistics?.meanAbsoluteError ?? null,
      rmse: m.statistics?.rootMeanSquareError ?? null,
      mse: m.statistics?.meanSignedError ?? null,
    })),
  }));
}

/** Import batches named in revision causes, with who made them (for the history). */
export async function importsByIds(workspaceId: string, ids: string[]) {
  if (ids.length === 0) return [];
  return db
    .select({ id: importBatch.id, fileName: importBatch.fileName, kind: importBatch.kind, status: importBatch.status, createdAt: importBatch.createdAt, by: user.name })
    .from(importBatch)
    .leftJoin(user, eq(importBatch.createdBy, user.id))
    .where(and(eq(importBatch.workspaceId, workspaceId), inArray(importBatch.id, ids)));
}

/** Sources cited by a revision's pairs, this workspace only. */
export async function sourcesOfRevision(workspaceId: string, snapshot: BenchmarkSnapshot) {
  const ids = [...new Set(snapshot.pairs.flatMap((p) => p.sourceIds))];
  if (ids.length === 0) return [];
  const out = [];
  for (let i = 0; i < ids.length; i += 500) {
    out.push(
      ...(await db
        .select()
        .from(source)
        .where(and(eq(source.workspaceId, workspaceId), inArray(source.id, ids.slice(i, i + 500))))
        .orderBy(asc(source.citeKey))),
    );
  }
  return out;
}

/** Names of the materials and short citations of the sources a revision's pairs refer to (this workspace only). */
export async function pairLookups(workspaceId: string, snapshot: BenchmarkSnapshot) {
  const materialIds = [...new Set(snapshot.pairs.map((p) => p.materialId))];
  const materials = new Map<string, { name: string; formula: string }>();
  for (let i = 0; i < materialIds.length; i += 500) {
    const rows = await db
      .select({ id: material.id, name: material.name, formula: material.formula })
      .from(material)
      .where(and(eq(material.workspaceId, workspaceId), inArray(material.id, materialIds.slice(i, i + 500))));
    for (const r of rows) materials.set(r.id, { name: r.name, formula: r.formula });
  }
  const sources = new Map<string, { citeKey: string; citation: string; doi: string | null; gaps: string[] }>();
  for (const s of await sourcesOfRevision(workspaceId, snapshot)) sources.set(s.id, { citeKey: s.citeKey, citation: shortCitation(s), doi: s.doi, gaps: s.gaps });
  return { materials, sources };
}

/** Names of some materials of this workspace. */
export async function materialNames(workspaceId: string, ids: string[]): Promise<Map<string, string>> {
  const unique = [...new Set(ids)];
  const out = new Map<string, string>();
  for (let i = 0; i < unique.length; i += 500) {
    const rows = await db
      .select({ id: material.id, name: material.name })
      .from(material)
      .where(and(eq(material.workspaceId, workspaceId), inArray(material.id, unique.slice(i, i + 500))));
    for (const r of rows) out.set(r.id, r.name);
  }
  return out;
}
