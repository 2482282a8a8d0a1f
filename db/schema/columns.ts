import { sql } from 'drizzle-orm';
import { integer, text } from 'drizzle-orm/sqlite-core';

export const id = () => text().primaryKey().$defaultFn(() => crypto.randomUUID());
export const createdAt = () => integer({ mode: 'timestamp_ms' }).notNull().default(sql`(unixepoch('subsec') * 1000)`);
export const timestamp = () => integer({ mode: 'timestamp_ms' });

/** Nothing is deleted: a retraction keeps the row, says who, when and why. */
export const retraction = () => ({
  retractedAt: integer({ mode: 'timestamp_ms' }),
  retractedBy: text(),
  retractionReason: text(),
});
