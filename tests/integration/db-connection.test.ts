import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { Client } from '@libsql/client';
import { connect } from '@/db/connection';

const dir = mkdtempSync(join(tmpdir(), 'ledger-conn-'));
const clients: Client[] = [];
function open(name: string) {
  const c = connect({ url: `file:${join(dir, name)}` });
  clients.push(c);
  return c;
}
afterAll(() => clients.forEach((c) => c.close()));

async function pragmas(run: (sql: string) => Promise<{ rows: Array<Record<string, unknown>> }>) {
  const value = async (sql: string) => Object.values((await run(sql)).rows[0])[0];
  return {
    journal: await value('PRAGMA journal_mode'),
    synchronous: await value('PRAGMA synchronous'),
    foreignKeys: await value('PRAGMA foreign_keys'),
    busyTimeout: await value('PRAGMA busy_timeout'),
  };
}

// synchronous: FULL = 2 (SQLite documentation, PRAGMA synchronous)
const EXPECTED = { journal: 'wal', synchronous: 2, foreignKeys: 1, busyTimeout: 100 }; // DEFAULT_BUSY_TIMEOUT_MS: short, since SQLite's wait blocks the event loop

describe('database connections', () => {
  it('applies WAL, synchronous=FULL, foreign_keys and busy_timeout on the first connection', async () => {
    const client = open('a.db');
    expect(await pragmas((s) => client.execute(s))).toEqual(EXPECTED);
  });

  it('applies them on the connection a transaction keeps and on the new one opened beside it', async () => {
    const client = open('b.db');
    await client.execute('CREATE TABLE t (id INTEGER PRIMARY KEY)');
    const tx = await client.transaction('read');
    // While the transaction holds its connection, the client must open another one.
    const outside = await pragmas((s) => client.execute(s));
    const inside = await pragmas((s) => tx.execute(s));
    tx.close();
    expect(inside).toEqual(EXPECTED);
    expect(outside).toEqual(EXPECTED);
    const after = await pragmas((s) => client.execute(s));
    expect(after).toEqual(EXPECTED);
  });

  it('enforces foreign keys', async () => {
    const client = open('c.db');
    await client.execute('CREATE TABLE p (id INTEGER PRIMARY KEY)');
    await client.execute('CREATE TABLE ch (id INTEGER PRIMARY KEY, p INTEGER NOT NULL REFERENCES p(id))');
    await expect(client.execute('INSERT INTO ch (id, p) VALUES (1, 42)')).rejects.toThrow(/FOREIGN KEY/);
  });

  it('serialises concurrent writers so none sees SQLITE_BUSY', async () => {
    const client = open('d.db');
    await client.execute('CREATE TABLE n (id INTEGER PRIMARY KEY AUTOINCREMENT, v INTEGER NOT NULL)');
    const writers = Array.from({ length: 60 }, async (_, i) => {
      if (i % 3 === 0) {
        const tx = await client.transaction('write');
        await tx.execute({ sql: 'INSERT INTO n (v) VALUES (?)', args: [i] });
        // yield while holding the write transaction: a naive client would now collide
        await new Promise((r) => setTimeout(r, 2));
        await tx.execute({ sql: 'INSERT INTO n (v) VALUES (?)', args: [i] });
        await tx.commit();
      } else if (i % 3 === 1) {
        await client.batch([{ sql: 'INSERT INTO n (v) VALUES (?)', args: [i] }], 'write');
      } else {
        await client.execute({ sql: 'INSERT INTO n (v) VALUES (?)', args: [i] });
      }
    });
    await Promise.all(writers);
    const { rows } = await client.execute('SELECT count(*) AS c FROM n');
    expect(Number(rows[0].c)).toBe(20 * 2 + 20 + 20);
  });

  it('releases the lock when a transaction rolls back', async () => {
    const client = open('e.db');
    await client.execute('CREATE TABLE r (v INTEGER)');
    const tx = await client.transaction('write');
    await tx.execute('INSERT INTO r VALUES (1)');
    await tx.rollback();
    await client.execute('INSERT INTO r VALUES (2)');
    const { rows } = await client.execute('SELECT v FROM r');
    expect(rows.map((r) => Number(r.v))).toEqual([2]);
  });
});
