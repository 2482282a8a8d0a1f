// A separate writer for the backup drill: commits batches of 50 rows into `verification`
// until SIGTERM, printing "writing" after the first batch and the total when it stops.
import Database from 'libsql';

const db = new Database(process.argv[2]);
db.exec('PRAGMA busy_timeout = 5000');
const insert = db.prepare('INSERT INTO verification (id, identifier, value, expires_at, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?)');
let total = 0;
let stop = false;
process.on('SIGTERM', () => (stop = true));

const batch = db.transaction((n: number) => {
  for (let i = 0; i < 50; i++) {
    const k = n + i;
    insert.run(`drill-${k}`, `writer-${k % 7}`, `value ${k} ${'x'.repeat(k % 200)}`, 2_000_000_000 + k, 1_700_000_000 + k, 1_700_000_000 + k);
  }
});

while (!stop) {
  batch.immediate(total);
  total += 50;
  if (total === 50) process.stdout.write('writing\n');
  await new Promise((r) => setTimeout(r, 1));
}
db.close();
process.stdout.write(`stopped ${total}\n`);
