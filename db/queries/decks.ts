import 'server-only';
import { and, asc, count, desc, eq, gt, lt, max } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import { benchmark, deck, deckView, material, revision, user } from '@/db/schema';
import { AppError } from '@/lib/errors';
import { readFilters, type ViewFilters, type ViewKind } from '@/lib/decks/view-kinds';
import { writeAudit, type Actor } from './audit';

export async function listDecks(workspaceId: string) {
  return db
    .select({ id: deck.id, title: deck.title, createdAt: deck.createdAt, updatedAt: deck.updatedAt, createdBy: user.name, views: count(deckView.id) })
    .from(deck)
    .leftJoin(user, eq(deck.createdBy, user.id))
    .leftJoin(deckView, eq(deckView.deckId, deck.id))
    .where(eq(deck.workspaceId, workspaceId))
    .groupBy(deck.id)
    .orderBy(desc(deck.createdAt));
}

async function requireDeck(tx: Executor, workspaceId: string, deckId: string) {
  const rows = await tx.select().from(deck).where(and(eq(deck.workspaceId, workspaceId), eq(deck.id, deckId))).limit(1);
  if (!rows[0]) throw new AppError('not-found', 'No such deck in this workspace.');
  return rows[0];
}

/** A view of a deck of this workspace (404 for a view of another workspace's deck). */
async function requireView(tx: Executor, workspaceId: string, viewId: string) {
  const rows = await tx
    .select({ view: deckView })
    .from(deckView)
    .innerJoin(deck, eq(deckView.deckId, deck.id))
    .where(and(eq(deck.workspaceId, workspaceId), eq(deckView.id, viewId)))
    .limit(1);
  if (!rows[0]) throw new AppError('not-found', 'No such view in this workspace.');
  return rows[0].view;
}

async function touch(tx: Executor, deckId: string) {
  await tx.update(deck).set({ updatedAt: new Date() }).where(eq(deck.id, deckId));
}

export async function createDeck(workspaceId: string, actor: Actor, title: string, tx: Executor = db): Promise<{ id: string }> {
  const [row] = await tx.insert(deck).values({ workspaceId, title: title.trim(), createdBy: actor.userId }).returning();
  await writeAudit({ workspaceId, actor, action: 'create', entityType: 'deck', entityId: row.id, after: row }, tx);
  return { id: row.id };
}

export async function retitleDeck(workspaceId: string, actor: Actor, deckId: string, title: string): Promise<void> {
  await db.transaction(async (tx) => {
    const before = await requireDeck(tx, workspaceId, deckId);
    await tx.update(deck).set({ title: title.trim(), updatedAt: new Date() }).where(eq(deck.id, deckId));
    await writeAudit({ workspaceId, actor, action: 'update', entityType: 'deck', entityId: deckId, before, after: { ...before, title: title.trim() } }, tx);
  });
}

export interface NewViewInput {
  /** Add to this deck, or create one with newDeckTitle. */
  deckId?: string | null;
  newDeckTitle?: string | null;
  viewKind: ViewKind;
  benchmarkId?: string | null;
  /** The revision shown when the view was saved; absent: the latest. */
  revisionNumber?: number | null;
  filters: ViewFilters;
  title?: string | null;
  note?: string | null;
}

/** Appends a view (pinned to a revision of a live benchmark of this workspace, or a material) to a deck. */
export async function addView(workspaceId: string, actor: Actor, input: NewViewInput): Promise<{ deckId: string; viewId: string; position: number }> {
  return db.transaction(async (tx) => {
    let benchmarkId: string | null = null;
    let revisionId: string | null = null;
    const filters = { ...input.filters };
    if (input.viewKind === 'material') {
      if (!filters.materialId) throw new AppError('bad-request', 'A material view needs its material.', [{ path: 'filters' }]);
      const m = await tx.select({ id: material.id }).from(material).where(and(eq(material.workspaceId, workspaceId), eq(material.id, filters.materialId))).limit(1);
      if (!m[0]) throw new AppError('not-found', 'No such material in this workspace.');
    } else {
      if (!input.benchmarkId) throw new AppError('bad-request', 'This view needs a benchmark.', [{ path: 'benchmarkId' }]);
      const bm = await tx.select({ id: benchmark.id, retractedAt: benchmark.retractedAt }).from(benchmark).where(and(eq(benchmark.workspaceId, workspaceId), eq(benchmark.id, input.benchmarkId))).limit(1);
      if (!bm[0] || bm[0].retractedAt) throw new AppError('not-found', 'No such benchmark in this workspace.');
      const conditions = [eq(revision.workspaceId, workspaceId), eq(revision.benchmarkId, input.benchmarkId), eq(revision.status, 'ready')];
      if (input.revisionNumber) conditions.push(eq(revision.number, input.revisionNumber));
      const rev = await tx.select({ id: revision.id }).from(revision).where(and(...conditions)).orderBy(desc(revision.number)).limit(1);
      if (!rev[0]) throw new AppError('not-found', input.revisionNumber ? `No revision ${input.revisionNumber} of this benchmark.` : 'This benchmark has no revision yet.');
      benchmarkId = input.benchmarkId;
      revisionId = rev[0].id;
    }
    let deckId: string;
    if (input.deckId) deckId = (await requireDeck(tx, workspaceId, input.deckId)).id;
    else if (input.newDeckTitle?.trim()) deckId = (await createDeck(workspaceId, actor, input.newDeckTitle, tx)).id;
    else throw new AppError('bad-request', 'Choose a deck or give the new one a title.', [{ path: 'deckId' }]);
    const [{ last }] = await tx.select({ last: max(deckView.position) }).from(deckView).where(eq(deckView.deckId, deckId));
    const position = (last ?? 0) + 1;
    const [row] = await tx
      .insert(deckView)
      .values({ deckId, position, benchmarkId, revisionId, viewKind: input.viewKind, filters, title: input.title?.trim() || null, note: input.note?.trim() || null })
      .returning({ id: deckView.id });
    await touch(tx, deckId);
    return { deckId, viewId: row.id, position };
  });
}

/** Swaps a view with its neighbour above (-1) or below (+1); at either end nothing changes. */
export async function moveView(workspaceId: string, viewId: string, direction: -1 | 1): Promise<{ deckId: string; moved: boolean }> {
  return db.transaction(async (tx) => {
    const view = await requireView(tx, workspaceId, viewId);
    const neighbour = await tx
      .select({ id: deckView.id, position: deckView.position })
      .from(deckView)
      .where(and(eq(deckView.deckId, view.deckId), direction < 0 ? lt(deckView.position, view.position) : gt(deckView.position, view.position)))
      .orderBy(direction < 0 ? desc(deckView.position) : asc(deckView.position))
      .limit(1);
    if (!neighbour[0]) return { deckId: view.deckId, moved: false };
    await tx.update(deckView).set({ position: neighbour[0].position }).where(eq(deckView.id, view.id));
    await tx.update(deckView).set({ position: view.position }).where(eq(deckView.id, neighbour[0].id));
    await touch(tx, view.deckId);
    return { deckId: view.deckId, moved: true };
  });
}

export async function updateView(workspaceId: string, viewId: string, patch: { title: string | null; note: string | null }): Promise<{ deckId: string }> {
  return db.transaction(async (tx) => {
    const view = await requireView(tx, workspaceId, viewId);
    await tx
      .update(deckView)
      .set({ title: patch.title?.trim() || null, note: patch.note?.trim() || null })
      .where(eq(deckView.id, viewId));
    await touch(tx, view.deckId);
    return { deckId: view.deckId };
  });
}

/** Re-pins a view to the latest ready revision of its benchmark. */
export async function refreshView(workspaceId: string, viewId: string): Promise<{ deckId: string; number: number }> {
  return db.transaction(async (tx) => {
    const view = await requireView(tx, workspaceId, viewId);
    if (!view.benchmarkId) throw new AppError('bad-request', 'This view is not pinned to a benchmark revision.');
    const latest = await tx
      .select({ id: revision.id, number: revision.number })
      .from(revision)
      .innerJoin(benchmark, eq(revision.benchmarkId, benchmark.id))
      .where(and(eq(revision.workspaceId, workspaceId), eq(revision.benchmarkId, view.benchmarkId), eq(revision.status, 'ready')))
      .orderBy(desc(revision.number))
      .limit(1);
    if (!latest[0]) throw new AppError('not-found', 'The benchmark of this view has no revision.');
    await tx.update(deckView).set({ revisionId: latest[0].id }).where(eq(deckView.id, viewId));
    await touch(tx, view.deckId);
    return { deckId: view.deckId, number: latest[0].number };
  });
}

/** Takes a view off its deck; the audit row keeps what it was. */
export async function removeView(workspaceId: string, actor: Actor, viewId: string): Promise<{ deckId: string }> {
  return db.transaction(async (tx) => {
    const view = await requireView(tx, workspaceId, viewId);
    await tx.delete(deckView).where(eq(deckView.id, viewId));
    await touch(tx, view.deckId);
    await writeAudit({ workspaceId, actor, action: 'remove-view', entityType: 'deck', entityId: view.deckId, before: view, reason: 'view removed from the deck' }, tx);
    return { deckId: view.deckId };
  });
}

export type ViewProblem =
  | { kind: 'benchmark-missing' }
  | { kind: 'benchmark-retracted'; name: string; at: Date; reason: string | null }
  | { kind: 'revision-missing'; benchmarkName: string }
  | { kind: 'material-missing' }
  | { kind: 'material-retracted'; name: string; reason: string | null };

export interface DeckViewEntry {
  id: string;
  position: number;
  viewKind: ViewKind;
  title: string | null;
  note: string | null;
  filters: ViewFilters;
  benchmark: { id: string; name: string } | null;
  revision: { id: string; number: number; createdAt: Date } | null;
  latestNumber: number | null;
  material: { id: string; name: string } | null;
  problem: ViewProblem | null;
}

/** A deck with its views in order, each checked against what it points at (never throwing for a missing target). */
export async function getDeck(workspaceId: string, deckId: string) {
  const rows = await db.select().from(deck).where(and(eq(deck.workspaceId, workspaceId), eq(deck.id, deckId))).limit(1);
  if (!rows[0]) return null;
  const views = await db.select().from(deckView).where(eq(deckView.deckId, deckId)).orderBy(asc(deckView.position));
  const entries: DeckViewEntry[] = [];
  const latestCache = new Map<string, number | null>();
  for (const v of views) {
    const filters = readFilters(v.filters);
    const entry: DeckViewEntry = {
      id: v.id,
      position: v.position,
      viewKind: v.viewKind as ViewKind,
      title: v.title,
      note: v.note,
      filters,
      benchmark: null,
      revision: null,
      latestNumber: null,
      material: null,
      problem: null,
    };
    if (v.viewKind === 'material') {
      const m = filters.materialId
        ? await db
            .select({ id: material.id, name: material.name, retractedAt: material.retractedAt, reason: material.retractionReason })
            .from(material)
            .where(and(eq(material.workspaceId, workspaceId), eq(material.id, filters.materialId)))
            .limit(1)
        : [];
      if (!m[0]) entry.problem = { kind: 'material-missing' };
      else if (m[0].retractedAt) entry.problem = { kind: 'material-retracted', name: m[0].name, reason: m[0].reason };
      else entry.material = { id: m[0].id, name: m[0].name };
      entries.push(entry);
      continue;
    }
    const bm = v.benchmarkId
      ? await db
          .select({ id: benchmark.id, name: benchmark.name, retractedAt: benchmark.retractedAt, reason: benchmark.retractionReason })
          .from(benchmark)
          .where(and(eq(benchmark.workspaceId, workspaceId), eq(benchmark.id, v.benchmarkId)))
          .limit(1)
      : [];
    if (!bm[0]) entry.problem = { kind: 'benchmark-missing' };
    else if (bm[0].retractedAt) entry.problem = { kind: 'benchmark-retracted', name: bm[0].name, at: bm[0].retractedAt, reason: bm[0].reason };
    else {
      entry.benchmark = { id: bm[0].id, name: bm[0].name };
      const rev = v.revisionId
        ? await db
            .select({ id: revision.id, number: revision.number, createdAt: revision.createdAt })
            .from(revision)
            .where(and(eq(revision.workspaceId, workspaceId), eq(revision.id, v.revisionId), eq(revision.benchmarkId, bm[0].id), eq(revision.status, 'ready')))
            .limit(1)
        : [];
      if (!latestCache.has(bm[0].id)) {
        const [{ last }] = await db
          .select({ last: max(revision.number) })
          .from(revision)
          .where(and(eq(revision.workspaceId, workspaceId), eq(revision.benchmarkId, bm[0].id), eq(revision.status, 'ready')));
        latestCache.set(bm[0].id, last ?? null);
      }
      entry.latestNumber = latestCache.get(bm[0].id) ?? null;
      if (!rev[0]) entry.problem = { kind: 'revision-missing', benchmarkName: bm[0].name };
      else entry.revision = rev[0];
    }
    entries.push(entry);
  }
  return { ...rows[0], views: entries };
}

export type DeckRecord = NonNullable<Awaited<ReturnType<typeof getDeck>>>;

/** What a view that cannot be shown is missing, in words. */
export function describeProblem(p: ViewProblem): string {
  switch (p.kind) {
    case 'benchmark-missing':
      return 'The benchmark this view showed no longer exists in this workspace.';
    case 'benchmark-retracted':
      return `The benchmark “${p.name}” was retracted on ${p.at.toISOString().slice(0, 10)}${p.reason ? `: ${p.reason}` : ''}.`;
    case 'revision-missing':
      return `The revision this view was pinned to is no longer available for “${p.benchmarkName}”. Refresh it to the latest revision.`;
    case 'material-missing':
      return 'The material this view showed no longer exists in this workspace.';
    case 'material-retracted':
      return `The material “${p.name}” was retracted${p.reason ? `: ${p.reason}` : ''}.`;
  }
}
