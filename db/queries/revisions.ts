import 'server-only';
import { and, asc, desc, eq, inArray, max, sql } from 'drizzle-orm';
import { db, getClient } from '@/db/client';
import { flag, importBatch, material, revision, source, user } from '@/db/schema';
import { shortCitation } from '@/lib/citations/short-citation';
import { AppError } from '@/lib/errors';
import type { RevisionBaseline, RevisionCause, RevisionRecord } from '@/lib/benchmark/revision-record';
import type { RowSet } from '@/lib/benchmark/row-set';
import { packRowSet, unpackRowSet, unpackRowSetRuns } from '@/db/row-set-bytes';
import { snapshotOfRow, storedSnapshot } from '@/db/snapshot-bytes';
import { overlapCount, runsHave } from '@/lib/benchmark/row-set';
import type { BenchmarkSnapshot, MethodResult } from '@/lib/benchmark/types';

export interface RevisionHead {
  id: string;
  number: number;
  fingerprint: string;
  createdAt: Date;
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

const CHUNK = 400;

/** The latest stored revision of a benchmark (its head, no statistics), or null before the first: what the recomputation compares with and a page polls. */
export async function latestRevisionHead(workspaceId: string, benchmarkId: string): Promise<RevisionHead | null> {
  return latestReady(workspaceId, benchmarkId);
}

/** The sequence numbers of the rows a revision was computed from; null for a revision stored without them. */
export async function revisionRowSet(workspaceId: string, revisionId: string): Promise<RowSet | null> {
  const [row] = await db
    .select({ rowSet: revision.rowSet })
    .from(revision)
    .where(and(eq(revision.workspaceId, workspaceId), eq(revision.id, revisionId)));
  if (!row) throw new AppError('not-found', 'That revision does not exist in this workspace.');
  return row.rowSet ? unpackRowSet(row.rowSet) : null;
}

/** The rows, decisions and pins a revision was computed from: the baseline of the next revision's cause. */
export async function revisionBaseline(workspaceId: string, revisionId: string): Promise<RevisionBaseline> {
  const [row] = await db
    .select({
      rowSet: revision.rowSet,
      decisions: sql<string | null>`json_extract(${revision.statistics}, '$.decisions')`,
      pins: sql<string | null>`json_extract(${revision.statistics}, '$.pins')`,
    })
    .from(revision)
    .where(and(eq(revision.workspaceId, workspaceId), eq(revision.id, revisionId)));
  if (!row) throw new AppError('not-found', 'That revision does not exist in this workspace.');
  const ids = (json: string | null) => (JSON.parse(json ?? '[]') as Array<{ id: string }>).map((x) => x.id);
  return { rows: row.rowSet ? unpackRowSet(row.rowSet) : null, decisionIds: ids(row.decisions), pinIds: ids(row.pins) };
}

/**
 * Stores a new Revision and its flags in one transaction, numbered after the
 * latest. Revisions are never updated after this insert: there is no function
 * that writes to an existing one.
 */
export async function insertRevision(workspaceId: string, benchmarkId: string, record: RevisionRecord): Promise<RevisionHead & { created: boolean }> {
  // Packed before the write transaction: packing and deflating the pairs takes a few hundred ms, not worth a held lock.
  const stored = storedSnapshot(record.snapshot);
  return db.transaction(async (tx) => {
    // Inside the write transaction: two processes that computed the same rows store one revision, not two.
    const [latest] = await tx
      .select({ id: revision.id, number: revision.number, fingerprint: revision.fingerprint, createdAt: revision.createdAt })
      .from(revision)
      .where(and(eq(revision.benchmarkId, benchmarkId), eq(revision.status, 'ready')))
      .orderBy(desc(revision.number))
      .limit(1);
    if (latest && latest.fingerprint === record.fingerprint) return { ...latest, created: false };
    const [{ last }] = await tx.select({ last: max(revision.number) }).from(revision).where(eq(revision.benchmarkId, benchmarkId));
    const [row] = await tx
      .insert(revision)
      .values({
        workspaceId,
        benchmarkId,
        number: (last ?? 0) + 1,
        fingerprint: record.fingerprint,
        status: 'ready',
        ...stored,
        rowSet: packRowSet(record.rows),
        cause: record.cause,
        completedAt: new Date(),
      })
      .returning({ id: revision.id, number: revision.number, fingerprint: revision.fingerprint, createdAt: revision.createdAt });
    for (let i = 0; i < record.flags.length; i += CHUNK) {
      await tx.insert(flag).values(record.flags.slice(i, i + CHUNK).map((f) => ({ ...f, workspaceId, benchmarkId, revisionId: row.id })));
      await new Promise(setImmediate);
    }
    return { ...row, created: true };
  });
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
      snapshot: revision.snapshot,
      cause: revision.cause,
    })
    .from(revision)
    .where(eq(revision.id, id));
  const { snapshot, ...head } = row;
  const view: RevisionView = {
    ...head,
    statistics: snapshotOfRow(row.statistics, snapshot),
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

/** A page of a benchmark's ready revisions, newest first (heads and causes only), and how many there are. */
export async function listRevisionPage(workspaceId: string, benchmarkId: string, page: { page: number; size: number }) {
  const where = and(eq(revision.workspaceId, workspaceId), eq(revision.benchmarkId, benchmarkId), eq(revision.status, 'ready'));
  const rows = await db
    .select({ id: revision.id, number: revision.number, fingerprint: revision.fingerprint, createdAt: revision.createdAt, cause: revision.cause })
    .from(revision)
    .where(where)
    .orderBy(desc(revision.number))
    .limit(page.size)
    .offset((page.page - 1) * page.size);
  const [{ total }] = await db.select({ total: sql<number>`count(*)` }).from(revision).where(where);
  return { rows: rows.map((r) => ({ ...r, cause: (r.cause as RevisionCause | null) ?? null })), total: Number(total) };
}

/**
 * How many rows of an import a revision was computed from (its stored row set), and how many rows the import
 * holds: what tells a workflow that a revision includes its import. Null when the import is not this workspace's.
 * An import's rows hold one run of sequence numbers, so this counts the overlap of that run with the set's runs
 * (a few comparisons, however many rows) instead of looking up every row.
 */
export async function importRowsInRevision(workspaceId: string, importId: string, revisionId: string | null) {
  const [batch] = await db
    .select({ id: importBatch.id, kind: importBatch.kind, status: importBatch.status, createdAt: importBatch.createdAt, insertedCount: importBatch.insertedCount })
    .from(importBatch)
    .where(and(eq(importBatch.workspaceId, workspaceId), eq(importBatch.id, importId)));
  if (!batch) return null;
  if (!revisionId) return { ...batch, inRevision: 0 };
  const [stored] = await db
    .select({ rowSet: revision.rowSet })
    .from(revision)
    .where(and(eq(revision.workspaceId, workspaceId), eq(revision.id, revisionId)));
  if (!stored?.rowSet) return { ...batch, inRevision: 0 };
  const runs = unpackRowSetRuns(stored.rowSet);
  let inRevision = 0;
  for (const [table, tableRuns] of [['measurement', runs.measurements], ['calculation', runs.calculations]] as const) {
    const { rows } = await getClient().execute({
      sql: `SELECT min(seq), max(seq), count(*) FROM ${table} WHERE workspace_id = ? AND import_id = ?`,
      args: [workspaceId, importId],
    });
    const [first, last, count] = [Number(rows[0][0]), Number(rows[0][1]), Number(rows[0][2])];
    if (count === 0) continue;
    if (last - first + 1 === count) {
      inRevision += overlapCount(tableRuns, first, last);
      continue;
    }
    // Not one run (rows written another way): check each row.
    const all = await getClient().execute({ sql: `SELECT seq FROM ${table} WHERE workspace_id = ? AND import_id = ?`, args: [workspaceId, importId] });
    for (const r of all.rows) if (runsHave(tableRuns, Number(r[0]))) inRevision++;
  }
  return { ...batch, inRevision };
}

/** A page of the flags a revision raised (outliers and quality checks), optionally of one method or kind. */
export async function listRevisionFlags(
  workspaceId: string,
  revisionId: string,
  filter: { methodId?: string; kind?: 'outlier' | 'quality' },
  page: { page: number; size: number },
) {
  const where = and(
    eq(flag.workspaceId, workspaceId),
    eq(flag.revisionId, revisionId),
    filter.methodId ? eq(flag.methodId, filter.methodId) : undefined,
    filter.kind ? eq(flag.kind, filter.kind) : undefined,
  );
  const rows = await db
    .select({ id: flag.id, kind: flag.kind, code: flag.code, methodId: flag.methodId, measurementId: flag.measurementId, subjectKey: flag.subjectKey, details: flag.details })
    .from(flag)
    .where(where)
    .orderBy(asc(flag.kind), asc(flag.subjectKey), asc(flag.code))
    .limit(page.size)
    .offset((page.page - 1) * page.size);
  const [{ total }] = await db.select({ total: sql<number>`count(*)` }).from(flag).where(where);
  return { rows, total: Number(total) };
}
