import 'server-only';
import { getClient } from '@/db/client';

/** Whether the database answers a trivial query within `timeoutMs`; the latency in ms, or the reason it did not. */
export async function databaseAnswers(timeoutMs: number): Promise<{ ok: true; latencyMs: number } | { ok: false; detail: string }> {
  const started = performance.now();
  try {
    await Promise.race([
      getClient().execute('SELECT 1'),
      new Promise((_, reject) => setTimeout(() => reject(new Error(`no answer within ${timeoutMs} ms`)), timeoutMs).unref()),
    ]);
    return { ok: true, latencyMs: Math.round(performance.now() - started) };
  } catch (e) {
    return { ok: false, detail: e instanceof Error ? e.message : String(e) };
  }
}
