import { createClient, type Client, type InStatement, type Transaction, type TransactionMode } from '@libsql/client';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import Database from 'libsql';

/** PRAGMAs that SQLite keeps per connection; journal_mode=WAL is stored in the file itself. */
export const CONNECTION_PRAGMAS = [
  'PRAGMA journal_mode = WAL',
  'PRAGMA synchronous = FULL',
  'PRAGMA foreign_keys = ON',
  'PRAGMA busy_timeout = 5000',
];

const initialised = new WeakSet<object>();
let hooked = false;

/**
 * @libsql/client keeps a pool of native connections and opens new ones on its
 * own (a transaction() keeps its connection, the next call opens another).
 * It offers no "on connect" hook, so we wrap the native prepare/exec: the
 * first statement on any connection first applies the PRAGMAs above.
 */
function hookNativeConnections(): void {
  if (hooked) return;
  hooked = true;
  type Method = (this: object, ...args: unknown[]) => unknown;
  const proto = (Database as unknown as { prototype: Record<string, Method> }).prototype;
  const originalPrepare = proto.prepare;
  const originalExec = proto.exec;
  const ensure = (connection: object) => {
    if (initialised.has(connection)) return;
    initialised.add(connection);
    for (const pragma of CONNECTION_PRAGMAS) originalExec.call(connection, pragma);
  };
  proto.prepare = function (this: object, ...args: unknown[]) {
    ensure(this);
    return originalPrepare.apply(this, args);
  };
  proto.exec = function (this: object, ...args: unknown[]) {
    ensure(this);
    return originalExec.apply(this, args);
  };
}

/** A FIFO async mutex: every write in this process goes through it, one at a time. */
export class WriteLock {
  private tail: Promise<void> = Promise.resolve();
  private waiting = 0;

  async acquire(): Promise<() => void> {
    let release!: () => void;
    const next = new Promise<void>((resolve) => (release = resolve));
    const previous = this.tail;
    this.tail = previous.then(() => next);
    this.waiting++;
    await previous;
    this.waiting--;
    let released = false;
    return () => {
      if (!released) {
        released = true;
        release();
      }
    };
  }

  get queued(): number {
    return this.waiting;
  }
}

const READ_ONLY = /^\s*(select|explain)\b/i;

function sqlOf(stmt: InStatement): string {
  return typeof stmt === 'string' ? stmt : stmt.sql;
}

/**
 * Wraps a client so that writes are serialised in-process: a write
 * transaction holds the lock until it commits, rolls back or closes, so a
 * concurrent request waits here instead of spinning on SQLITE_BUSY. Reads go
 * straight through (WAL lets them run beside a writer).
 */
export function serialiseWrites(client: Client, lock = new WriteLock()): Client {
  const withLock = async <T>(fn: () => Promise<T>): Promise<T> => {
    const release = await lock.acquire();
    try {
      return await fn();
    } finally {
      release();
    }
  };

  return new Proxy(client, {
    get(target, prop, receiver) {
      switch (prop) {
        case 'execute':
          return (stmt: InStatement, args?: unknown) => {
            const call = () => (args === undefined ? target.execute(stmt) : target.execute(stmt as string, args as never));
            return READ_ONLY.test(sqlOf(stmt)) ? call() : withLock(call);
          };
        case 'batch':
          return (stmts: InStatement[], mode?: TransactionMode) =>
            mode === 'read' ? target.batch(stmts, mode) : withLock(() => target.batch(stmts, mode));
        case 'migrate':
          return (stmts: InStatement[]) => withLock(() => target.migrate(stmts));
        case 'executeMultiple':
          return (sql: string) => withLock(() => target.executeMultiple(sql));
        case 'transaction':
          return async (mode?: TransactionMode): Promise<Transaction> => {
            if (mode === 'read') return target.transaction(mode);
            const release = await lock.acquire();
            let tx: Transaction;
            try {
              tx = await target.transaction(mode ?? 'write');
            } catch (e) {
              release();
              throw e;
            }
            return wrapTransaction(tx, release);
          };
        default: {
          const value = Reflect.get(target, prop, receiver);
          return typeof value === 'function' ? value.bind(target) : value;
        }
      }
    },
  });
}

function wrapTransaction(tx: Transaction, release: () => void): Transaction {
  return new Proxy(tx, {
    get(target, prop, receiver) {
      if (prop === 'commit' || prop === 'rollback') {
        return async () => {
          try {
            await (target[prop] as () => Promise<void>).call(target);
          } finally {
            release();
          }
        };
      }
      if (prop === 'close') {
        return () => {
          try {
            target.close();
          } finally {
            release();
          }
        };
      }
      const value = Reflect.get(target, prop, receiver);
      return typeof value === 'function' ? value.bind(target) : value;
    },
  });
}

export interface ConnectOptions {
  url: string;
  authToken?: string;
}

/** Opens a client for a file or a libSQL server URL, with the PRAGMAs and the write lock in force. */
export function connect({ url, authToken }: ConnectOptions): Client {
  const isFile = url.startsWith('file:');
  if (isFile) {
    hookNativeConnections();
    const path = url.slice('file:'.length).split('?')[0];
    if (path && !path.startsWith(':memory:')) mkdirSync(dirname(path), { recursive: true });
  }
  const client = createClient({ url, authToken: authToken || undefined });
  return serialiseWrites(client);
}
