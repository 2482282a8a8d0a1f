import 'server-only';
import { and, asc, count, desc, eq, inArray, isNull, or, sql, type SQL } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import { measurement, calculation, source, type Source } from '@/db/schema';
import { AppError } from '@/lib/errors';
import { likePattern, type ListParams } from '@/lib/catalog/list-params';
import type { SourceInput } from '@/lib/catalog/source-schema';
import { writeAudit, type Actor } from './audit';

const SORTABLE = {
  citeKey: source.citeKey,
  kind: source.kind,
  year: source.year,
  title: source.title,
  authors: source.authors,
  venue: source.venue,
  createdAt: source.createdAt,
} as const;
export const SOURCE_SORT_COLUMNS = Object.keys(SORTABLE) as Array<keyof typeof SORTABLE>;

function listFilter(workspaceId: string, params: ListParams): SQL | undefined {
  const conditions: Array<SQL | undefined> = [eq(source.workspaceId, workspaceId)];
  if (!params.retracted) conditions.push(isNull(source.retractedAt));
  if (params.q) {
    const pattern = likePattern(params.q);
    conditions.push(
      or(
        ...[source.citeKey, source.title, source.authors, source.doi, source.venue, source.notebookRef].map((c) => sql`${c} like ${pattern} escape '\\'`),
      ),
    );
  }
  return and(...conditions);
}

export type SourceListRow = Awaited<ReturnType<typeof listSources>>['rows'][number];

export async function listSources(workspaceId: string, params: ListParams) {
  const where = listFilter(workspaceId, params);
  const sortKey = params.sort && params.sort in SORTABLE ? (params.sort as keyof typeof SORTABLE) : 'citeKey';
  const order = params.dir === 'desc' ? desc(SORTABLE[sortKey]) : asc(SORTABLE[sortKey]);
  const [rows, [{ total }]] = await Promise.all([
    db
      .select({
        id: source.id,
        citeKey: source.citeKey,
        kind: source.kind,
        doi: source.doi,
        title: source.title,
        authors: source.authors,
        year: source.year,
        venue: source.venue,
        notebookRef: source.notebookRef,
        retractedAt: source.retractedAt,
      })
      .from(source)
      .where(where)
      .orderBy(order, asc(source.id))
      .limit(params.size)
      .offset((params.page - 1) * params.size),
    db.select({ total: count() }).from(source).where(where),
  ]);
  const counts = await valueCounts(workspaceId, rows.map((r) => r.id));
  return { rows: rows.map((r) => ({ ...r, valueCount: counts.get(r.id) ?? 0 })), total, sort: sortKey };
}

/** Measurements plus calculations citing each source of one page, in one grouped pass per table (no index leads with the source). */
async function valueCounts(workspaceId: string, sourceIds: string[]): Promise<Map<string, number>> {
  const counts = new Map<string, number>();
  if (sourceIds.length === 0) return counts;
  for (const table of [measurement, calculation]) {
    const rows = await db
      .select({ sourceId: table.sourceId, n: count() })
      .from(table)
      .where(and(eq(table.workspaceId, workspaceId), inArray(table.sourceId, sourceIds), isNull(table.retractedAt)))
      .groupBy(table.sourceId);
    for (const r of rows) counts.set(r.sourceId, (counts.get(r.sourceId) ?? 0) + r.n);
  }
  return counts;
}

async function loadSource(executor: Executor, workspaceId: string, id: string): Promise<Source | null> {
  const rows = await executor.select().from(source).where(and(eq(source.workspaceId, workspaceId), eq(source.id, id))).limit(1);
  return rows[0] ?? null;
}

export async function getSource(workspaceId: string, id: string): Promise<Source | null> {
  return loadSource(db, workspaceId, id);
}

async function requireSource(executor: Executor, workspaceId: string, id: string): Promise<Source> {
  const found = await loadSource(executor, workspaceId, id);
  if (!found) throw new AppError('not-found', 'No such source in this workspace.');
  return found;
}

/** Cite keys are unique for good, retracted sources included, so old citations never change meaning. */
async function assertCiteKeyFree(executor: Executor, workspaceId: string, citeKey: string, exceptId?: string) {
  const clash = await executor
    .select({ id: source.id, retractedAt: source.retractedAt })
    .from(source)
    .where(and(eq(source.workspaceId, workspaceId), eq(source.citeKey, citeKey)))
    .limit(1);
  if (clash[0] && clash[0].id !== exceptId) {
    const retracted = clash[0].retractedAt ? ' (retracted)' : '';
    throw new AppError('conflict', `The cite key "${citeKey}" is already used by a source${retracted} in this workspace.`, { field: 'citeKey' });
  }
}

function snapshot(s: Source) {
  const { workspaceId: _w, createdBy: _c, createdAt: _a, updatedAt: _u, retractedBy: _r, retractedAt, ...fields } = s;
  return { ...fields, retractedAt: retractedAt?.toISOString() ?? null };
}

function columnsOf(input: SourceInput) {
  return {
    kind: input.kind,
    citeKey: input.citeKey,
    doi: input.doi ?? null,
    title: input.title ?? null,
    authors: input.authors ?? null,
    year: input.year ?? null,
    venue: input.venue ?? null,
    url: input.url ?? null,
    notebookRef: input.notebookRef ?? null,
    instrument: input.instrument ?? null,
    operator: input.operator ?? null,
    recordedOn: input.recordedOn ?? null,
  };
}

async function insertSource(tx: Executor, workspaceId: string, actor: Actor, input: SourceInput, reason?: string): Promise<string> {
  await assertCiteKeyFree(tx, workspaceId, input.citeKey);
  const [row] = await tx.insert(source).values({ workspaceId, createdBy: actor.userId, ...columnsOf(input) }).returning();
  await writeAudit(tx, { workspaceId, actor, action: 'create', entityType: 'source', entityId: row.id, after: snapshot(row), reason });
  return row.id;
}

export async function createSource(workspaceId: string, actor: Actor, input: SourceInput): Promise<string> {
  return db.transaction((tx) => insertSource(tx, workspaceId, actor, input));
}

export interface SourceImportResult {
  created: Array<{ id: string; citeKey: string }>;
  existing: string[];
}

/**
 * Creates every source whose cite key is new, in one transaction; cite keys already
 * in the workspace are reported, not duplicated.
 */
export async function importSources(workspaceId: string, actor: Actor, inputs: SourceInput[], reason: string): Promise<SourceImportResult> {
  return db.transaction(async (tx) => {
    const keys = inputs.map((i) => i.citeKey);
    const taken = new Set<string>();
    for (let i = 0; i < keys.length; i += 500) {
      const rows = await tx
        .select({ citeKey: source.citeKey })
        .from(source)
        .where(and(eq(source.workspaceId, workspaceId), inArray(source.citeKey, keys.slice(i, i + 500))));
      rows.forEach((r) => taken.add(r.citeKey));
    }
    const result: SourceImportResult = { created: [], existing: [] };
    for (const input of inputs) {
      if (taken.has(input.citeKey)) {
        result.existing.push(input.citeKey);
        continue;
      }
      const id = await insertSource(tx, workspaceId, actor, input, reason);
      taken.add(input.citeKey);
      result.created.push({ id, citeKey: input.citeKey });
    }
    return result;
  });
}

export async function updateSource(workspaceId: string, actor: Actor, id: string, input: SourceInput): Promise<void> {
  await db.transaction(async (tx) => {
    const before = await requireSource(tx, workspaceId, id);
    if (before.retractedAt) throw new AppError('conflict', 'This source is retracted: restore it before editing.');
    await assertCiteKeyFree(tx, workspaceId, input.citeKey, id);
    const [after] = await tx
      .update(source)
      .set({ ...columnsOf(input), updatedAt: new Date() })
      .where(and(eq(source.workspaceId, workspaceId), eq(source.id, id)))
      .returning();
    await writeAudit(tx, { workspaceId, actor, action: 'update', entityType: 'source', entityId: id, before: snapshot(before), after: snapshot(after) });
  });
}

export async function retractSource(workspaceId: string, actor: Actor, id: string, reason: string): Promise<void> {
  await db.transaction(async (tx) => {
    const before = await requireSource(tx, workspaceId, id);
    if (before.retractedAt) throw new AppError('conflict', 'This source is already retracted.');
    const [after] = await tx
      .update(source)
      .set({ retractedAt: new Date(), retractedBy: actor.userId, retractionReason: reason })
      .where(and(eq(source.workspaceId, workspaceId), eq(source.id, id)))
      .returning();
    await writeAudit(tx, { workspaceId, actor, action: 'retract', entityType: 'source', entityId: id, before: snapshot(before), after: snapshot(after), reason });
  });
}

export async function restoreSource(workspaceId: string, actor: Actor, id: string, reason: string | null): Promise<void> {
  await db.transaction(async (tx) => {
    const before = await requireSource(tx, workspaceId, id);
    if (!before.retractedAt) throw new AppError('conflict', 'This source is not retracted.');
    const [after] = await tx
      .update(source)
      .set({ retractedAt: null, retractedBy: null, retractionReason: null, updatedAt: new Date() })
      .where(and(eq(source.workspaceId, workspaceId), eq(source.id, id)))
      .returning();
    await writeAudit(tx, { workspaceId, actor, action: 'restore', entityType: 'source', entityId: id, before: snapshot(before), after: snapshot(after), reason });
  });
}

/** Sources for a BibTeX export: the given ids (only those of this workspace), or every unretracted source. */
export async function listSourcesForExport(workspaceId: string, ids?: string[]): Promise<Source[]> {
  const scope = ids ? inArray(source.id, ids) : isNull(source.retractedAt);
  return db.select().from(source).where(and(eq(source.workspaceId, workspaceId), scope)).orderBy(asc(source.citeKey));
}
