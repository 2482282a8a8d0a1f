// A separate process that writes to a shared SQLite file, for tests/integration/db-cross-process.test.ts.
// argv: url, writer tag, number of writes, busy timeout (ms), busy retry budget (ms). Prints one JSON line.
import { connect } from '@/db/connection';

const [url, tag, countText, timeoutText, retryText] = process.argv.slice(2);
const client = connect({ url, busyTimeoutMs: Number(timeoutText), busyRetryMs: Number(retryText) });
const errors: string[] = [];
// Half autocommit inserts, half two-row transactions, all started at once.
await Promise.all(
  Array.from({ length: Number(countText) }, async (_, i) => {
    try {
      if (i % 2 === 0) {
        await client.execute({ sql: 'INSERT INTO w (tag, n) VALUES (?, ?)', args: [tag, i] });
      } else {
        const tx = await client.transaction('write');
        await tx.execute({ sql: 'INSERT INTO w (tag, n) VALUES (?, ?)', args: [tag, i] });
        await tx.execute({ sql: 'INSERT INTO w (tag, n) VALUES (?, ?)', args: [tag, -i] });
        await tx.commit();
      }
    } catch (e) {
      errors.push(`${(e as { code?: string }).code ?? ''} ${(e as Error).message}`);
    }
  }),
);
client.close();
console.log(JSON.stringify({ tag, errors: errors.length, first: errors[0] ?? null }));
