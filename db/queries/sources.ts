import 'server-only';
import { and, asc, count, desc, eq, inArray, isNull, or, sql, type SQL } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import { measurement, calculation, source, type Source } from '@/db/schema';
import { AppError } from '@/lib/errors';
import { likePattern, type ListParams } from '@/lib/catalog/list-params';
import type { SourceInput } from '@/lib/catalog/source-schema';
import { storedSource } from '@/lib/citations/stored';
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
  const sortKey = params.sort && Object.hasOwn(SORTABLE, params.sort) ? (params.sort as keyof typeof SORTABLE) : 'citeKey';
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
        authorList: source.authorList,
        year: source.year,
        venue: source.venue,
        volume: source.volume,
        pages: source.pages,
        notebookRef: source.notebookRef,
        gaps: source.gaps,
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

/** One source per DOI: a second one is refused and pointed at the first (existing doubles are merged, see mergeSources). */
async function assertDoiFree(executor: Executor, workspaceId: string, doi: string | undefined, exceptId?: string) {
  if (!doi) return;
  const clash = await executor
    .select({ id: source.id, citeKey: source.citeKey })
    .from(source)
    .where(and(eq(source.workspaceId, workspaceId), eq(source.doi, doi), isNull(source.retractedAt)))
    .limit(2);
  const other = clash.find((c) => c.id !== exceptId);
  if (other) throw new AppError('conflict', `The DOI ${doi} is already the source "${other.citeKey}" in this workspace: cite that one.`, { field: 'doi', citeKey: other.citeKey });
}

function snapshot(s: Source) {
  const { workspaceId: _w, createdBy: _c, createdAt: _a, updatedAt: _u, retractedBy: _r, retractedAt, ...fields } = s;
  return { ...fields, retractedAt: retractedAt?.toISOString() ?? null };
}

function columnsOf(input: SourceInput) {
  return storedSource(input);
}

async function insertSource(tx: Executor, workspaceId: string, actor: Actor, input: SourceInput, reason?: string): Promise<string> {
  await assertCiteKeyFree(tx, workspaceId, input.citeKey);
  await assertDoiFree(tx, workspaceId, input.doi);
  const [row] = await tx.insert(source).values({ workspaceId, createdBy: actor.userId, ...columnsOf(input) }).returning();
  await writeAudit({ workspaceId, actor, action: 'create', entityType: 'source', entityId: row.id, after: snapshot(row), reason }, tx);
  return row.id;
}

export async function createSource(workspaceId: string, actor: Actor, input: SourceInput): Promise<string> {
  return db.transaction((tx) => insertSource(tx, workspaceId, actor, input));
}

export interface SourceImportEntry {
  input: SourceInput;
  /** How the entry is named in a refusal, e.g. "Entry 2 (azuhata1995), line 14". */
  label: string;
}

export type SourceImportResult =
  | { ok: true; created: Array<{ id: string; citeKey: string }>; existing: string[] }
  | { ok: false; refusals: string[] };

class ImportRefused extends Error {
  constructor(readonly refusals: string[]) {
    super('import refused');
  }
}

const sameTitle = (a: string | null | undefined, b: string | null | undefined) => Boolean(a && b && a.trim().toLowerCase() === b.trim().toLowerCase());

/**
 * Creates every new source in one transaction, or none: an entry whose cite key
 * is taken by a different source, or whose DOI is already another source, is
 * refused by name. An entry that is already here (same cite key and the same
 * DOI, or the same title when neither has a DOI) is reported, not duplicated.
 */
export async function importSources(workspaceId: string, actor: Actor, entries: SourceImportEntry[], reason: string): Promise<SourceImportResult> {
  try {
    return await db.transaction(async (tx) => {
      const byKey = new Map<string, { citeKey: string; doi: string | null; title: string | null }>();
      const byDoi = new Map<string, string>();
      const keys = entries.map((e) => e.input.citeKey);
      const dois = entries.map((e) => e.input.doi).filter((d): d is string => Boolean(d));
      for (let i = 0; i < keys.length; i += 500) {
        const rows = await tx
          .select({ citeKey: source.citeKey, doi: source.doi, title: source.title })
          .from(source)
          .where(and(eq(source.workspaceId, workspaceId), inArray(source.citeKey, keys.slice(i, i + 500))));
        rows.forEach((r) => byKey.set(r.citeKey, r));
      }
      for (let i = 0; i < dois.length; i += 500) {
        const rows = await tx
          .select({ citeKey: source.citeKey, doi: source.doi })
          .from(source)
          .where(and(eq(source.workspaceId, workspaceId), inArray(source.doi, dois.slice(i, i + 500)), isNull(source.retractedAt)));
        rows.forEach((r) => byDoi.set(r.doi!, r.citeKey));
      }
      const created: Array<{ id: string; citeKey: string }> = [];
      const existing: string[] = [];
      const refusals: string[] = [];
      for (const { input, label } of entries) {
        const same = byKey.get(input.citeKey);
        if (same) {
          const identical = same.doi || input.doi ? same.doi === (input.doi ?? null) : sameTitle(same.title, input.title);
          if (identical) existing.push(input.citeKey);
          else refusals.push(`${label}: the cite key "${input.citeKey}" is already used by a different source in this workspace${same.title ? ` ("${same.title}")` : ''}.`);
          continue;
        }
        const doiOwner = input.doi ? byDoi.get(input.doi) : undefined;
        if (doiOwner) {
          refusals.push(`${label}: the DOI ${input.doi} is already the source "${doiOwner}" in this workspace.`);
          continue;
        }
        const id = await insertSource(tx, workspaceId, actor, input, reason);
        byKey.set(input.citeKey, { citeKey: input.citeKey, doi: input.doi ?? null, title: input.title ?? null });
        if (input.doi) byDoi.set(input.doi, input.citeKey);
        created.push({ id, citeKey: input.citeKey });
      }
      if (refusals.length) throw new ImportRefused(refusals);
      return { ok: true as const, created, existing };
    });
  } catch (e) {
    if (e instanceof ImportRefused) return { ok: false, refusals: e.refusals };
    throw e;
  }
}

export async function updateSource(workspaceId: string, actor: Actor, id: string, input: SourceInput): Promise<void> {
  await db.transaction(async (tx) => {
    const before = await requireSource(tx, workspaceId, id);
    if (before.retractedAt) throw new AppError('conflict', 'This source is retracted: restore it before editing.');
    await assertCiteKeyFree(tx, workspaceId, input.citeKey, id);
    await assertDoiFree(tx, workspaceId, input.doi, id);
    const [after] = await tx
      .update(source)
      .set({ ...columnsOf(input), updatedAt: new Date() })
      .where(and(eq(source.workspaceId, workspaceId), eq(source.id, id)))
      .returning();
    await writeAudit({ workspaceId, actor, action: 'update', entityType: 'source', entityId: id, before: snapshot(before), after: snapshot(after) }, tx);
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
    await writeAudit({ workspaceId, actor, action: 'retract', entityType: 'source', entityId: id, before: snapshot(before), after: snapshot(after), reason }, tx);
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
    await writeAudit({ workspaceId, actor, action: 'restore', entityType: 'source', entityId: id, before: snapshot(before), after: snapshot(after), reason }, tx);
  });
}

/** Sources for an export: the given ids (only those of this workspace, read 500 at a time), or every unretracted source. */
export async function listSourcesForExport(workspaceId: string, ids?: string[]): Promise<Source[]> {
  if (!ids) return db.select().from(source).where(and(eq(source.workspaceId, workspaceId), isNull(source.retractedAt))).orderBy(asc(source.citeKey));
  const unique = [...new Set(ids)];
  const out: Source[] = [];
  for (let i = 0; i < unique.length; i += 500) {
    out.push(...(await db.select().from(source).where(and(eq(source.workspaceId, workspaceId), inArray(source.id, unique.slice(i, i + 500))))));
  }
  return out.sort((a, b) => a.citeKey.localeCompare(b.citeKey));
}

export interface DoiDuplicate {
  doi: string;
  sources: Array<{ id: string; citeKey: string; title: string | null; valueCount: number; createdAt: Date }>;
}

/** Unretracted sources of this workspace that share a DOI, oldest first in each group. */
export async function findDoiDuplicates(workspaceId: string): Promise<DoiDuplicate[]> {
  const shared = db
    .select({ doi: source.doi })
    .from(source)
    .where(and(eq(source.workspaceId, workspaceId), isNull(source.retractedAt), sql`${source.doi} is not null`))
    .groupBy(source.doi)
    .having(sql`count(*) > 1`);
  const rows = await db
    .select({ id: source.id, doi: source.doi, citeKey: source.citeKey, title: source.title, createdAt: source.createdAt })
    .from(source)
    .where(and(eq(source.workspaceId, workspaceId), isNull(source.retractedAt), inArray(source.doi, shared)))
    .orderBy(asc(source.doi), asc(source.createdAt), asc(source.citeKey));
  const counts = await valueCounts(workspaceId, rows.map((r) => r.id));
  const groups = new Map<string, DoiDuplicate>();
  for (const r of rows) {
    const group = groups.get(r.doi!) ?? { doi: r.doi!, sources: [] };
    group.sources.push({ id: r.id, citeKey: r.citeKey, title: r.title, createdAt: r.createdAt, valueCount: counts.get(r.id) ?? 0 });
    groups.set(r.doi!, group);
  }
  return [...groups.values()];
}

/**
 * Merges a source into another with the same DOI: its measurements and
 * calculations (retracted ones too) now cite the kept source, and it is retracted
 * as "merged into …". One audit entry on each source says what moved.
 */
export async function mergeSources(workspaceId: string, actor: Actor, keepId: string, mergeId: string, reason: string | null): Promise<{ moved: number }> {
  if (keepId === mergeId) throw new AppError('bad-request', 'Choose two different sources to merge.');
  return db.transaction(async (tx) => {
    const keep = await requireSource(tx, workspaceId, keepId);
    const merged = await requireSource(tx, workspaceId, mergeId);
    if (keep.retractedAt || merged.retractedAt) throw new AppError('conflict', 'Both sources must be unretracted to merge them.');
    if (!keep.doi || keep.doi !== merged.doi) throw new AppError('conflict', 'Only sources that share a DOI are merged here.');
    let moved = 0;
    const movedIds: Record<string, string[]> = {};
    for (const table of [measurement, calculation]) {
      const rows = await tx
        .update(table)
        .set({ sourceId: keep.id })
        .where(and(eq(table.workspaceId, workspaceId), eq(table.sourceId, merged.id)))
        .returning({ id: table.id });
      movedIds[table === measurement ? 'measurements' : 'calculations'] = rows.map((r) => r.id);
      moved += rows.length;
    }
    const why = `merged into ${keep.citeKey} (same DOI ${keep.doi})${reason ? `: ${reason}` : ''}`;
    const [after] = await tx
      .update(source)
      .set({ retractedAt: new Date(), retractedBy: actor.userId, retractionReason: why })
      .where(and(eq(source.workspaceId, workspaceId), eq(source.id, merged.id)))
      .returning();
    await writeAudit({ workspaceId, actor, action: 'merge', entityType: 'source', entityId: merged.id, before: snapshot(merged), after: { ...snapshot(after), mergedInto: keep.id, moved: movedIds }, reason: why }, tx);
    await writeAudit({ workspaceId, actor, action: 'merge', entityType: 'source', entityId: keep.id, after: { mergedFrom: merged.id, mergedCiteKey: merged.citeKey, moved: movedIds }, reason: why }, tx);
    return { moved };
  });
}
