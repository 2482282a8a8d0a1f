/**
 * One-time data step of the row-set migration (0009), run by db:migrate after
 * the SQL migrations: revisions stored before row sets keep their rows as a JSON
 * list of row ids. Each is converted to the compact row set of the same rows
 * (their sequence numbers), and the JSON is dropped. A listed id whose row no
 * longer exists stops the step with the revision named, rather than storing a
 * smaller set. Idempotent: it only touches rows with row_ids and no row_set.
 */
import type { Client } from '@libsql/client';
import { packRowSet } from './row-set-bytes';

export async function backfillRevisionRowSets(client: Client): Promise<number> {
  const { rows } = await client.execute('SELECT id FROM revision WHERE row_ids IS NOT NULL AND row_set IS NULL');
  for (const r of rows) {
    const id = String(r[0]);
    const seqs = async (table: 'measurement' | 'calculation', path: string) => {
      const listed = await client.execute({ sql: `SELECT count(*) FROM json_each((SELECT row_ids FROM revision WHERE id = ?), '${path}')`, args: [id] });
      const found = await client.execute({
        sql: `SELECT t.seq FROM json_each((SELECT row_ids FROM revision WHERE id = ?), '${path}') j JOIN ${table} t ON t.id = j.value`,
        args: [id],
      });
      if (found.rows.length !== Number(listed.rows[0][0])) throw new Error(`revision ${id}: ${Number(listed.rows[0][0]) - found.rows.length} of its ${table} rows are missing`);
      return found.rows.map((x) => Number(x[0]));
    };
    const packed = packRowSet({ measurements: await seqs('measurement', '$.measurements'), calculations: await seqs('calculation', '$.calculations') });
    await client.execute({ sql: 'UPDATE revision SET row_set = ?, row_ids = NULL WHERE id = ? AND row_set IS NULL', args: [packed, id] });
  }
  return rows.length;
}
