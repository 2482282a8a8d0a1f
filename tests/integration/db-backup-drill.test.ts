import { spawn } from 'node:child_process';
import { copyFileSync, existsSync, mkdtempSync, openSync, readFileSync, statSync, writeSync, closeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { once } from 'node:events';
import { beforeAll, describe, expect, it } from 'vitest';
import Database from 'libsql';
import { contentHash, filePathOf, journalMigrations, tableCounts } from '@/db/backup';
import { createWorkspaceWith } from '../support/users';

// Issue 11, item 10: the restore drill. Back up while another process writes, restore, compare.

const live = filePathOf(process.env.DATABASE_URL!);
const dir = mkdtempSync(join(tmpdir(), 'ledger-drill-'));

function cli(args: string[], databasePath = live): Promise<{ code: number | null; out: string }> {
  const child = spawn(process.execPath, ['node_modules/tsx/dist/cli.mjs', 'db/backup-cli.ts', ...args], {
    env: { ...process.env, DATABASE_URL: `file:${databasePath}` },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  child.stdout.on('data', (d: Buffer) => (out += d.toString()));
  child.stderr.on('data', (d: Buffer) => (out += d.toString()));
  return once(child, 'exit').then(([code]) => ({ code: code as number | null, out }));
}

function count(path: string, sql: string): number {
  const db = new Database(path);
  try {
    return Number((db.prepare(sql).get() as { n: number }).n);
  } finally {
    db.close();
  }
}

beforeAll(async () => {
  // Real rows across related tables, and enough bulk that VACUUM INTO takes a while.
  await createWorkspaceWith(['curator', 'reviewer']);
  const db = new Database(live);
  const insert = db.prepare('INSERT INTO verification (id, identifier, value, expires_at, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?)');
  db.transaction(() => {
    for (let i = 0; i < 60_000; i++) insert.run(`bulk-${i}`, `bulk-${i % 11}`, `bulk value ${i} ${'y'.repeat(i % 300)}`, 2_000_000_000, 1_700_000_000, 1_700_000_000);
  })();
  db.close();
});

describe('backup and restore drill', () => {
  it('backs up a consistent copy while another process writes, and restores it with equal row counts and content hash', async () => {
    const writer = spawn(process.execPath, ['node_modules/tsx/dist/cli.mjs', 'tests/support/backup-writer.ts', live], { stdio: ['ignore', 'pipe', 'inherit'] });
    let writerOut = '';
    writer.stdout.on('data', (d: Buffer) => (writerOut += d.toString()));
    await new Promise<void>((resolve, reject) => {
      writer.stdout.on('data', () => writerOut.includes('writing') && resolve());
      writer.on('exit', (code) => reject(new Error(`writer exited early (${code})`)));
    });
    const before = count(live, "SELECT count(*) AS n FROM verification WHERE id LIKE 'drill-%'");
    const backupFile = join(dir, 'backup.db');
    const backup = await cli(['backup', backupFile]);
    const during = count(live, "SELECT count(*) AS n FROM verification WHERE id LIKE 'drill-%'");
    writer.kill('SIGTERM');
    await once(writer, 'exit');
    expect(backup.out).toMatch(/integrity_check ok/);
    expect(backup.code).toBe(0);

    // The writer went on while the backup ran, and the copy holds whole transactions only (batches of 50).
    const inBackup = count(backupFile, "SELECT count(*) AS n FROM verification WHERE id LIKE 'drill-%'");
    expect(during).toBeGreaterThan(before);
    expect(inBackup).toBeGreaterThanOrEqual(before);
    expect(inBackup).toBeLessThanOrEqual(during);
    expect(inBackup % 50).toBe(0);
    expect(Number(/stopped (\d+)/.exec(writerOut)?.[1])).toBeGreaterThan(inBackup);

    // Restore into a fresh location (as on a new machine), then compare with the backup.
    const target = join(dir, 'restored', 'ledger.db');
    const restore = await cli(['restore', backupFile], target);
    expect(restore.out).toMatch(/^Restored /);
    expect(restore.code).toBe(0);
    const counts = tableCounts(target);
    expect(counts).toEqual(tableCounts(backupFile));
    expect(counts.verification).toBeGreaterThan(60_000);
    expect(counts.organization).toBeGreaterThan(0);
    expect(contentHash(target)).toBe(contentHash(backupFile));
    expect(contentHash(target)).not.toBe(contentHash(live));

    const check = await cli(['check'], target);
    expect(check.out).toMatch(/integrity_check: ok/);
    expect(check.out).toMatch(/foreign_key_check: ok/);
    expect(check.out).toMatch(new RegExp(`migrations: ${journalMigrations().length} of ${journalMigrations().length}`));
    expect(check.code).toBe(0);

    // Restoring over an existing file keeps the old one beside it.
    const again = await cli(['restore', backupFile], target);
    expect(again.code).toBe(0);
    const kept = /kept as (.+)\.$/m.exec(again.out)?.[1];
    expect(kept && existsSync(kept)).toBe(true);
  });

  it('refuses a damaged file and a file with an unknown migration state, and leaves the database as it was', async () => {
    const good = join(dir, 'good.db');
    expect((await cli(['backup', good])).code).toBe(0);
    const target = join(dir, 'target.db');
    copyFileSync(good, target);
    const targetHash = contentHash(target);

    // Damage: overwrite bytes in the middle of the file (table pages).
    const damaged = join(dir, 'damaged.db');
    copyFileSync(good, damaged);
    const fd = openSync(damaged, 'r+');
    const size = statSync(damaged).size;
    for (let offset = 8192; offset < size - 4096; offset += Math.floor(size / 16)) writeSync(fd, Buffer.alloc(512, 0xa5), 0, 512, offset);
    closeSync(fd);
    const refusedDamaged = await cli(['restore', damaged], target);
    expect(refusedDamaged.code).toBe(1);
    expect(refusedDamaged.out).toMatch(/Refused: .* fails integrity_check/);

    // A migration this checkout does not know (from a newer version).
    const newer = join(dir, 'newer.db');
    copyFileSync(good, newer);
    const db = new Database(newer);
    db.prepare('INSERT INTO __drizzle_migrations (hash, created_at) VALUES (?, ?)').run('f'.repeat(64), Date.now() + 1e9);
    db.close();
    const refusedNewer = await cli(['restore', newer], target);
    expect(refusedNewer.code).toBe(1);
    expect(refusedNewer.out).toMatch(/unknown migration state .*newer version/);

    // Not a database at all.
    const text = join(dir, 'notes.txt');
    copyFileSync('README.md', text);
    expect((await cli(['restore', text], target)).out).toMatch(/Refused: .*integrity_check: file is not a database/);

    expect(contentHash(target)).toBe(targetHash);
    expect(readFileSync(target).subarray(0, 15).toString()).toBe('SQLite format 3');
  });

  it('db:check reports a broken foreign key', async () => {
    const broken = join(dir, 'broken.db');
    expect((await cli(['backup', broken])).code).toBe(0);
    const db = new Database(broken);
    db.exec('PRAGMA foreign_keys = OFF');
    db.prepare("UPDATE member SET organization_id = 'gone' WHERE rowid = (SELECT min(rowid) FROM member)").run();
    db.close();
    const check = await cli(['check'], broken);
    expect(check.code).toBe(1);
    expect(check.out).toMatch(/foreign_key_check: 1 rows point at missing parents/);
  });
});
