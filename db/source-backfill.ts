/**
 * One-time data step of the structured-sources migration, run by db:migrate after
 * the SQL migrations (and so by every test database): sources stored before
 * authors were structured have `author_list` null. Their author text is parsed
 * with the same name parser as the form (SQL cannot split names), "Journal 7 L129"
 * venues of journal articles are split into journal, volume and pages, and the
 * gaps are computed. Idempotent: it only touches rows whose author_list is null.
 */
import { drizzle } from 'drizzle-orm/libsql';
import { eq, isNull } from 'drizzle-orm';
import type { Client } from '@libsql/client';
import * as schema from './schema';
import { auditLog, source } from './schema';
import { parseNameList } from '@/lib/citations/names';
import { authorsSortText } from '@/lib/citations/authors';
import { sourceGaps } from '@/lib/citations/completeness';
import { normalizePages } from '@/lib/catalog/source-schema';

/** "J. Phys.: Condens. Matter 7 L129" → journal, volume 7, pages L129; "J. Raman Spectrosc. 51" → volume 51. */
export function splitLegacyVenue(venue: string): { venue: string; volume?: string; pages?: string } {
  const full = /^(.*?[^\d\s])\s+(\d+)\s+([A-Za-z]?\d+(?:\s*[-–]{1,2}\s*[A-Za-z]?\d+)?)$/.exec(venue.trim());
  if (full) return { venue: full[1], volume: full[2], pages: normalizePages(full[3]) };
  const volumeOnly = /^(.*?[^\d\s])\s+(\d+)$/.exec(venue.trim());
  if (volumeOnly) return { venue: volumeOnly[1], volume: volumeOnly[2] };
  return { venue };
}

export async function backfillStructuredSources(client: Client): Promise<number> {
  const db = drizzle(client, { schema, casing: 'snake_case' });
  const rows = await db.select().from(source).where(isNull(source.authorList));
  for (const row of rows) {
    const authorList = row.authors ? parseNameList(row.authors) : [];
    const split = row.kind === 'journal-article' && row.venue && !row.volume ? splitLegacyVenue(row.venue) : null;
    const next = {
      authorList,
      authors: authorsSortText(authorList),
      venue: split ? split.venue : row.venue,
      volume: split?.volume ?? row.volume,
      pages: split?.pages ?? row.pages,
    };
    const gaps = sourceGaps({ ...row, ...next });
    await db.batch([
      db
        .update(source)
        .set({ ...next, gaps })
        .where(eq(source.id, row.id)),
      db.insert(auditLog).values({
        workspaceId: row.workspaceId,
        actorUserId: null,
        action: 'update',
        entityType: 'source',
        entityId: row.id,
        before: { authors: row.authors, venue: row.venue },
        after: { ...next, gaps },
        reason: 'structured citation fields (one-time migration)',
      }),
    ]);
  }
  return rows.length;
}
