import { createHash } from 'node:crypto';
import { copyFileSync, existsSync, mkdirSync, readFileSync, renameSync, rmSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import Database from 'libsql';

// Backup, restore and checks of the SQLite file (npm run db:backup, db:restore, db:check).
// They work on file: URLs; a libSQL server keeps its own backups (README, "Backups").

const migrationsFolder = fileURLToPath(new URL('../drizzle', import.meta.url));
const MIGRATIONS_TABLE = '__drizzle_migrations';

type Connection = InstanceType<typeof Database>;

/** The file path of a file: DATABASE_URL; throws for a libSQL server URL. */
export function filePathOf(url: string): string {
  if (!url.startsWith('file:')) {
    throw new Error('DATABASE_URL is not a file: URL. A libSQL server is backed up by the server itself (see "Backups" in the README).');
  }
  const path = url.slice('file:'.length).split('?')[0];
  if (!path || path.startsWith(':memory:')) throw new Error('DATABASE_URL names an in-memory database; there is nothing to back up.');
  return resolve(path);
}

function open(path: string): Connection {
  if (!existsSync(path)) throw new Error(`${path} does not exist.`);
  const db = new Database(path);
  db.exec('PRAGMA busy_timeout = 5000');
  return db;
}

function rows<T>(db: Connection, sql: string, ...args: unknown[]): T[] {
  return db.prepare(sql).all(...args) as T[];
}

export interface CheckResult {
  ok: boolean;
  integrity: string[];
  foreignKeys: Array<{ table: string; rowid: number | null; parent: string }>;
}

/** PRAGMA integrity_check and foreign_key_check of one database file. */
export function checkFile(path: string, options: { foreignKeys?: boolean } = {}): CheckResult {
  let db: Connection;
  try {
    db = open(path);
    db.prepare('SELECT count(*) FROM sqlite_master').get();
  } catch (e) {
    // Not an SQLite file at all ("file is not a database"), or unreadable.
    return { ok: false, integrity: [(e as Error).message], foreignKeys: [] };
  }
  try {
    const integrity = rows<Record<string, string>>(db, 'PRAGMA integrity_check').map((r) => String(Object.values(r)[0]));
    const foreignKeys =
      options.foreignKeys === false
        ? []
        : rows<{ table: string; rowid: number | null; parent: string }>(db, 'PRAGMA foreign_key_check').map((r) => ({ table: r.table, rowid: r.rowid, parent: r.parent }));
    return { ok: integrity.length === 1 && integrity[0] === 'ok' && foreignKeys.length === 0, integrity, foreignKeys };
  } catch (e) {
    // Damage bad enough that the check itself stops ("database disk image is malformed") is a failed check.
    return { ok: false, integrity: [(e as Error).message], foreignKeys: [] };
  } finally {
    db.close();
  }
}

export interface MigrationState {
  /** Migrations recorded in the file, oldest first. */
  applied: Array<{ hash: string; createdAt: number }>;
  /** How many of drizzle/'s migrations the file has (a prefix of the journal), when its state is known. */
  known: number;
  /** Journal entries in drizzle/. */
  total: number;
  /** Why the state is not one this checkout knows, or null. */
  problem: string | null;
}

/** drizzle/'s migrations as the migrator records them: the file's SHA-256 and the journal's `when`. */
export function journalMigrations(folder = migrationsFolder): Array<{ tag: string; hash: string; createdAt: number }> {
  const journal = JSON.parse(readFileSync(join(folder, 'meta', '_journal.json'), 'utf8')) as { entries: Array<{ tag: string; when: number }> };
  return journal.entries.map((e) => ({
    tag: e.tag,
    hash: createHash('sha256').update(readFileSync(join(folder, `${e.tag}.sql`)).toString()).digest('hex'),
    createdAt: e.when,
  }));
}

/** Compares a file's migrations table with drizzle/: it must hold a prefix of the journal, hash for hash. */
export function migrationState(path: string): MigrationState {
  const journal = journalMigrations();
  const db = open(path);
  try {
    const table = rows<{ name: string }>(db, "SELECT name FROM sqlite_master WHERE type = 'table' AND name = ?", MIGRATIONS_TABLE);
    if (table.length === 0) return { applied: [], known: 0, total: journal.length, problem: `the file has no ${MIGRATIONS_TABLE} table: it is not a Lattice Ledger database, or it was never migrated` };
    const applied = rows<{ hash: string; created_at: number }>(db, `SELECT hash, created_at FROM ${MIGRATIONS_TABLE} ORDER BY created_at, id`).map((r) => ({ hash: r.hash, createdAt: Number(r.created_at) }));
    for (let i = 0; i < applied.length; i++) {
      const expected = journal[i];
      if (!expected) return { applied, known: i, total: journal.length, problem: `the file has ${applied.length} migrations, this checkout knows ${journal.length}: it comes from a newer version` };
      if (applied[i].hash !== expected.hash || applied[i].createdAt !== expected.createdAt) {
        return { applied, known: i, total: journal.length, problem: `migration ${i + 1} in the file (${applied[i].hash.slice(0, 12)}…) is not ${expected.tag} of drizzle/` };
      }
    }
    if (applied.length === 0) return { applied, known: 0, total: journal.length, problem: 'the file records no migrations' };
    return { applied, known: applied.length, total: journal.length, problem: null };
  } finally {
    db.close();
  }
}

/** Row count of every table, for a report and for comparing a restored copy. */
export function tableCounts(path: string): Record<string, number> {
  const db = open(path);
  try {
    const tables = rows<{ name: string }>(db, "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name");
    return Object.fromEntries(tables.map((t) => [t.name, Number(rows<{ n: number }>(db, `SELECT count(*) AS n FROM "${t.name.replaceAll('"', '""')}"`)[0].n)]));
  } finally {
    db.close();
  }
}

/** A SHA-256 over every row of every table, in primary-key order: equal hashes mean equal contents. */
export function contentHash(path: string): string {
  const db = open(path);
  const hash = createHash('sha256');
  try {
    const tables = rows<{ name: string }>(db, "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name");
    for (const { name } of tables) {
      hash.update(`\u0000table ${name}\u0000`);
      const quoted = `"${name.replaceAll('"', '""')}"`;
      const withoutRowid = rows<{ sql: string }>(db, 'SELECT sql FROM sqlite_master WHERE name = ?', name)[0]?.sql?.match(/WITHOUT\s+ROWID/i);
      const order = withoutRowid ? '1' : 'rowid';
      for (const row of db.prepare(`SELECT * FROM ${quoted} ORDER BY ${order}`).raw(true).iterate() as Iterable<unknown[]>) {
        hash.update(JSON.stringify(row, (_k, v) => (typeof v === 'bigint' ? v.toString() : v instanceof Uint8Array || Buffer.isBuffer(v) ? Buffer.from(v).toString('base64') : v)));
        hash.update('\n');
      }
    }
    return hash.digest('hex');
  } finally {
    db.close();
  }
}

/**
 * A consistent copy of the live database by VACUUM INTO (a read transaction:
 * writers go on meanwhile, the copy is the state when it began), written under
 * a temporary name, checked with PRAGMA integrity_check, then renamed into place.
 */
export function backupDatabase(sourcePath: string, outPath: string): { path: string; bytes: number; check: CheckResult } {
  const target = resolve(outPath);
  if (existsSync(target)) throw new Error(`${target} exists already; choose another name.`);
  mkdirSync(dirname(target), { recursive: true });
  const partial = `${target}.partial`;
  rmSync(partial, { force: true });
  const db = open(sourcePath);
  try {
    db.prepare('VACUUM INTO ?').run(partial);
  } finally {
    db.close();
  }
  const check = checkFile(partial, { foreignKeys: false });
  if (!check.ok) {
    rmSync(partial, { force: true });
    throw new Error(`The copy failed PRAGMA integrity_check: ${check.integrity.slice(0, 5).join('; ')}`);
  }
  renameSync(partial, target);
  return { path: target, bytes: statSync(target).size, check };
}

/**
 * Puts a backup in place of the database file. Refuses a file that fails
 * integrity_check or foreign_key_check, or whose migrations are not a prefix of
 * drizzle/ (a newer version's file, or not ours); an older but known state is
 * fine: npm run db:migrate brings it up to date. The current file is kept beside
 * it as <name>.before-restore-<time>. The server must be stopped.
 */
export function restoreDatabase(backupPath: string, targetPath: string, now = new Date()): { keptAs: string | null; state: MigrationState } {
  const source = resolve(backupPath);
  const check = checkFile(source);
  if (!check.ok) {
    const what = check.integrity[0] !== 'ok' ? `integrity_check: ${check.integrity.slice(0, 5).join('; ')}` : `foreign_key_check: ${check.foreignKeys.length} rows point at missing parents (first: ${check.foreignKeys[0].table} → ${check.foreignKeys[0].parent})`;
    throw new Error(`Refused: ${source} fails ${what}.`);
  }
  const state = migrationState(source);
  if (state.problem) throw new Error(`Refused: ${source} has an unknown migration state (${state.problem}).`);

  const target = resolve(targetPath);
  mkdirSync(dirname(target), { recursive: true });
  const incoming = `${target}.restoring`;
  copyFileSync(source, incoming);
  let keptAs: string | null = null;
  if (existsSync(target)) {
    keptAs = `${target}.before-restore-${now.toISOString().replace(/[:.]/g, '-')}`;
    renameSync(target, keptAs);
  }
  // The old file's write-ahead log and shared-memory index belong to it, not to the restored copy.
  for (const suffix of ['-wal', '-shm', '-journal']) {
    if (existsSync(target + suffix)) {
      if (keptAs) renameSync(target + suffix, keptAs + suffix);
      else rmSync(target + suffix, { force: true });
    }
  }
  renameSync(incoming, target);
  return { keptAs, state };
}
