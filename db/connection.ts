import { createClient, type Client, type InStatement, type Transaction, type TransactionMode } from '@libsql/client';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import Database from 'libsql';

/**
 * Short on purpose: SQLite's busy handler sleeps inside the native call, which blocks Node's event
 * loop, so a long wait for another process's lock would freeze every request of this one. The
 * longer wait is retryBusy's, which sleeps with timers.
 */
export const DEFAULT_BUSY_TIMEOUT_MS = 100;
export const DEFAULT_BUSY_RETRY_MS = 30_000;

/** SQLite's own wait for another process's lock, per attempt; set by the first connect() of the process. */
let busyTimeoutMs = DEFAULT_BUSY_TIMEOUT_MS;

/** PRAGMAs that SQLite keeps per connection; journal_mode=WAL is stored in the file itself. */
export function connectionPragmas(): string[] {
  return ['PRAGMA journal_mode = WAL', 'PRAGMA synchronous = FULL', 'PRAGMA foreign_keys = ON', `PRAGMA busy_timeout = ${busyTimeoutMs}`];
}

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
    for (const pragma of connectionPragmas()) originalExec.call(connection, pragma);
  };
  proto.prepare = function (this: object, ...args: unknown[]) {
    ensure(this);
    const statement = originalPrepare.apply(this, args) as object;
    dropConnectionOnBusy(this, statement);
    return statement;
  };
  proto.exec = function (this: object, ...args: unknown[]) {
    ensure(this);
    return originalExec.apply(this, args);
  };
}

const statementConnection = new WeakMap<object, { open: boolean; inTransaction: boolean; close(): void }>();
let statementsPatched = false;

/**
 * A statement that fails with SQLITE_BUSY outside a transaction (BEGIN IMMEDIATE, or an autocommit
 * write) is left un-reset by the native driver, which offers no reset(); SQLite then counts it as
 * "in progress", and the next COMMIT on that connection fails with "cannot commit transaction - SQL
 * statements in progress". So the connection is closed right there, taking the statement with it:
 * the client's pool drops a closed connection when it is released and opens a fresh one.
 */
function dropConnectionOnBusy(connection: object, statement: object): void {
  statementConnection.set(statement, connection as { open: boolean; inTransaction: boolean; close(): void });
  if (statementsPatched) return;
  statementsPatched = true;
  type Method = (this: object, ...args: unknown[]) => unknown;
  const proto = Object.getPrototypeOf(statement) as Record<string, Method>;
  for (const name of ['run', 'get', 'all', 'iterate']) {
    const original = proto[name];
    proto[name] = function (this: object, ...args: unknown[]) {
      try {
        return original.apply(this, args);
      } catch (e) {
        const owner = statementConnection.get(this);
        if (owner && isBusyError(e) && owner.open && !owner.inTransaction) owner.close();
        throw e;
      }
    };
  }
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

/** SQLITE_BUSY (and its extended codes): another process holds the write lock past busy_timeout. */
export function isBusyError(e: unknown): boolean {
  const code = (e as { code?: unknown; rawCode?: unknown } | null)?.code;
  return typeof code === 'string' && code.startsWith('SQLITE_BUSY');
}

/**
 * Runs `fn` again while it fails with SQLITE_BUSY, with back-off from 25 ms doubling to 1 s, until
 * `budgetMs` has passed; then the last error is thrown. Only calls that write nothing when they
 * fail busy are retried: BEGIN IMMEDIATE of a transaction, and autocommit statements and batches
 * (a batch that meets a busy lock is rolled back as a whole).
 */
export async function retryBusy<T>(fn: () => Promise<T>, budgetMs: number, sleep = (ms: number) => new Promise((r) => setTimeout(r, ms))): Promise<T> {
  const started = Date.now();
  for (let delay = 25; ; delay = Math.min(delay * 2, 1000)) {
    try {
      return await fn();
    } catch (e) {
      if (!isBusyError(e) || Date.now() - started + delay > budgetMs) throw e;
      await sleep(delay + Math.random() * delay * 0.5);
    }
  }
}

function sqlOf(stmt: InStatement): string {
  return typeof stmt === 'string' ? stmt : stmt.sql;
}

/**
 * Wraps a client so that writes are serialised in-process: a write
 * transaction holds the lock until it commits, rolls back or closes, so a
 * concurrent request waits here instead of spinning on SQLITE_BUSY. Reads go
 * straight through (WAL lets them run beside a writer). Write transactions
 * begin IMMEDIATE (libSQL's 'write' mode), so the lock of another process is
 * met at BEGIN, where it is waited for (busy_timeout, then retryBusy within
 * `busyRetryMs`), never half-way through a transaction.
 */
export function serialiseWrites(client: Client, lock = new WriteLock(), busyRetryMs = DEFAULT_BUSY_RETRY_MS): Client {
  const withLock = async <T>(fn: () => Promise<T>): Promise<T> => {
    const release = await lock.acquire();
    try {
      return await retryBusy(fn, busyRetryMs);
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
              tx = await retryBusy(() => target.transaction(mode ?? 'write'), busyRetryMs);
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
  /** PRAGMA busy_timeout of every connection of this process (the first connect() decides). */
  busyTimeoutMs?: number;
  /** How long a write retries SQLITE_BUSY in all before the error surfaces. */
  busyRetryMs?: number;
}

/** Opens a client for a file or a libSQL server URL, with the PRAGMAs and the write lock in force. */
export function connect({ url, authToken, busyTimeoutMs: timeout, busyRetryMs = DEFAULT_BUSY_RETRY_MS }: ConnectOptions): Client {
  const isFile = url.startsWith('file:');
  if (isFile) {
    if (!hooked && timeout !== undefined) busyTimeoutMs = timeout;
    hookNativeConnections();
    const path = url.slice('file:'.length).split('?')[0];
    if (path && !path.startsWith(':memory:')) mkdirSync(dirname(path), { recursive: true });
  }
  const client = createClient({ url, authToken: authToken || undefined });
  return serialiseWrites(client, new WriteLock(), busyRetryMs);
}
