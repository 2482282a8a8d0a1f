import 'server-only';
/**
 * Heavy request work handed to the worker process, so the web server's event
 * loop stays free for other requests while a 200,000-row file is validated and
 * stored: value files (CSV), JSON import bodies, and DOS files (parsed and
 * integrated there). Catalogue files stay in the web process (small by their
 * limits). scripts/server.mjs starts the worker (scripts/job-worker.ts) with an
 * IPC channel and puts a requester on globalThis under OFF_LOOP_CHANNEL; the
 * worker answers with serveOffLoop. Without a channel (`npm run dev`, tests,
 * JOB_WORKER=inline, or while a dead worker is restarted) the work runs in this
 * process, as before. An error crosses back with its kind and facts (an import's
 * row errors included), so the caller's answer is the same either way. A worker
 * that dies mid-import leaves nothing: its write transaction never committed.
 */
import { AppError, type AppErrorCode } from '@/lib/errors';
import { commitSpooledDos } from './imports/dos-commit';
import { commitJsonBody } from './imports/json-body';
import { commitSpooledValues } from './imports/spooled-values';

const OPS = {
  'import-values': commitSpooledValues,
  'import-json': commitJsonBody,
  'import-dos': commitSpooledDos,
};

export type OffLoopOp = keyof typeof OPS;
type Payload<K extends OffLoopOp> = Parameters<(typeof OPS)[K]>[0];
type Result<K extends OffLoopOp> = Awaited<ReturnType<(typeof OPS)[K]>>;

export const OFF_LOOP_CHANNEL = Symbol.for('lattice-ledger.off-loop');

export interface OffLoopRequest {
  id: number;
  op: string;
  payload: unknown;
}

interface WireError {
  message: string;
  code?: AppErrorCode;
  details?: unknown;
  errors?: AppError['errors'];
  errorCount?: number;
  retryAfterSeconds?: number;
}

type Outcome = { ok: true; value: unknown } | { ok: false; error: WireError };
export type OffLoopReply = Outcome & { id: number };

interface Channel {
  available(): boolean;
  request(op: string, payload: unknown): Promise<Outcome>;
}

function channel(): Channel | undefined {
  return (globalThis as Record<symbol, Channel | undefined>)[OFF_LOOP_CHANNEL];
}

function toWire(e: unknown): WireError {
  if (e instanceof AppError) {
    return { message: e.message, code: e.code, details: e.details, errors: e.errors, errorCount: e.errorCount, retryAfterSeconds: e.retryAfterSeconds };
  }
  return { message: e instanceof Error ? e.message : String(e) };
}

function fromWire(w: WireError): Error {
  if (!w.code) return new Error(w.message);
  return new AppError(w.code, w.message, w.details, { errors: w.errors, errorCount: w.errorCount, retryAfterSeconds: w.retryAfterSeconds });
}

/** Runs `op` in the worker process when there is one, else here. */
export async function offLoop<K extends OffLoopOp>(op: K, payload: Payload<K>): Promise<Result<K>> {
  const c = channel();
  if (!c?.available()) return (OPS[op] as (p: Payload<K>) => Promise<Result<K>>)(payload);
  const reply = await c.request(op, payload);
  if (!reply.ok) throw fromWire(reply.error);
  return reply.value as Result<K>;
}

/** The worker's side: runs one request and returns the reply to send back. */
export async function serveOffLoop(request: OffLoopRequest): Promise<OffLoopReply> {
  try {
    const run = OPS[request.op as OffLoopOp] as ((p: unknown) => Promise<unknown>) | undefined;
    if (!run) throw new Error(`The worker has no operation "${request.op}".`);
    return { id: request.id, ok: true, value: await run(request.payload) };
  } catch (e) {
    if (!(e instanceof AppError)) console.error(`Off-loop ${request.op} failed:`, e);
    return { id: request.id, ok: false, error: toWire(e) };
  }
}
