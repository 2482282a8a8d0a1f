import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { dbEnv } from '../lib/db-env';
import { backupDatabase, checkFile, filePathOf, migrationState, restoreDatabase, tableCounts } from './backup';

// npm run db:backup [-- <file>] · npm run db:restore <file> · npm run db:check

const url = dbEnv().DATABASE_URL;

function stamp(d = new Date()): string {
  return d.toISOString().replace(/[:.]/g, '-');
}

function main(argv: string[]): number {
  const [command, file] = argv;
  const path = filePathOf(url);
  if (command === 'backup') {
    const out = file ?? join('.data', 'backups', `ledger-${stamp()}.db`);
    const result = backupDatabase(path, out);
    const state = migrationState(result.path);
    console.log(`Backup written to ${result.path} (${result.bytes.toLocaleString('en')} bytes): integrity_check ok, ${state.known} of ${state.total} migrations.`);
    return 0;
  }
  if (command === 'restore') {
    if (!file) {
      console.error('Give the backup file: npm run db:restore -- <file>');
      return 2;
    }
    const { keptAs, state } = restoreDatabase(file, path);
    console.log(`Restored ${file} to ${path}${keptAs ? `; the previous file is kept as ${keptAs}` : ''}.`);
    if (state.known < state.total) console.log(`The backup has ${state.known} of ${state.total} migrations: run npm run db:migrate before starting the server.`);
    return 0;
  }
  if (command === 'check') {
    const result = checkFile(path);
    const counts = tableCounts(path);
    console.log(`integrity_check: ${result.integrity.slice(0, 20).join('; ')}`);
    console.log(`foreign_key_check: ${result.foreignKeys.length === 0 ? 'ok' : `${result.foreignKeys.length} rows point at missing parents`}`);
    for (const fk of result.foreignKeys.slice(0, 20)) console.log(`  ${fk.table} rowid ${fk.rowid ?? '?'} → ${fk.parent}`);
    const state = migrationState(path);
    console.log(`migrations: ${state.problem ?? `${state.known} of ${state.total}`}`);
    console.log(`rows: ${Object.values(counts).reduce((a, b) => a + b, 0).toLocaleString('en')} in ${Object.keys(counts).length} tables`);
    return result.ok ? 0 : 1;
  }
  console.error('Usage: tsx db/backup-cli.ts backup [file] | restore <file> | check');
  return 2;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  try {
    process.exitCode = main(process.argv.slice(2));
  } catch (e) {
    console.error((e as Error).message);
    process.exitCode = 1;
  }
}
