import type { ChildProcess } from 'node:child_process';

export const OFF_LOOP_CHANNEL: unique symbol;

export interface WorkerChannel {
  attach(proc: ChildProcess): void;
  available(): boolean;
  request(op: string, payload: unknown): Promise<{ ok: true; value: unknown } | { ok: false; error: { message: string; code?: string } }>;
}

export function createWorkerChannel(): WorkerChannel;
