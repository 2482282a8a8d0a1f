import { index, integer, sqliteTable, text } from 'drizzle-orm/sqlite-core';
import { organization, user } from './auth';
import { benchmark, revision } from './benchmarks';
import { createdAt, id, timestamp } from './columns';
import { THREAD_SUBJECTS } from '@/lib/record-kinds';

export { THREAD_SUBJECTS };


export const commentThread = sqliteTable(
  'comment_thread',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    subjectKind: text({ enum: THREAD_SUBJECTS }).notNull(),
    subjectId: text().notNull(),
    benchmarkId: text().references(() => benchmark.id),
    createdBy: text().references(() => user.id),
    createdAt: createdAt(),
    resolvedAt: timestamp(),
    resolvedBy: text().references(() => user.id),
  },
  (t) => [index('thread_subject_idx').on(t.workspaceId, t.subjectKind, t.subjectId)],
);

export const comment = sqliteTable(
  'comment',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    threadId: text()
      .notNull()
      .references(() => commentThread.id),
    authorId: text().references(() => user.id),
    body: text().notNull(),
    createdAt: createdAt(),
  },
  (t) => [index('comment_thread_idx').on(t.threadId)],
);

export const deck = sqliteTable('deck', {
  id: id(),
  workspaceId: text()
    .notNull()
    .references(() => organization.id, { onDelete: 'cascade' }),
  title: text().notNull(),
  createdBy: text().references(() => user.id),
  createdAt: createdAt(),
  updatedAt: timestamp(),
});

export const deckView = sqliteTable(
  'deck_view',
  {
    id: id(),
    deckId: text()
      .notNull()
      .references(() => deck.id, { onDelete: 'cascade' }),
    position: integer().notNull(),
    benchmarkId: text().references(() => benchmark.id),
    revisionId: text().references(() => revision.id),
    viewKind: text().notNull(),
    filters: text({ mode: 'json' }).$type<Record<string, unknown>>(),
    title: text(),
    note: text(),
  },
  (t) => [index('deck_view_idx').on(t.deckId, t.position)],
);
