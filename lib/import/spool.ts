import 'server-only';
import { createHash } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { mkdtemp, readdir, rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { once } from 'node:events';

/**
 * Uploads are spooled to `<tmp>/ledger-import-<pid>-<random>/`. The pid in the name
 * lets a server starting up tell the folders of a process that died mid-import
 * (killed, out of memory, power cut: its `finally` never ran) from the folders of
 * another server that is still importing.
 */
const PREFIX = 'ledger-import-';
/** Folders from before the pid was in the name are removed once they are this old. */
const UNNAMED_MAX_AGE_MS = 24 * 60 * 60 * 1000;

export interface Spooled {
  path: string;
  sha256: string;
  byteCount: number;
  cleanup: () => Promise<void>;
}

/**
 * Writes the upload to a temporary file while hashing it, so the database
 * transaction that follows never waits on a slow client.
 */
export async function spool(chunks: AsyncIterable<Uint8Array>, base = tmpdir()): Promise<Spooled> {
  const dir = await mkdtemp(join(base, `${PREFIX}${process.pid}-`));
  const cleanup = () => rm(dir, { recursive: true, force: true });
  const path = join(dir, 'upload.csv');
  const out = createWriteStream(path);
  const hash = createHash('sha256');
  let byteCount = 0;
  try {
    for await (const chunk of chunks) {
      hash.update(chunk);
      byteCount += chunk.byteLength;
      if (!out.write(chunk)) await once(out, 'drain');
    }
    out.end();
    await once(out, 'close');
  } catch (e) {
    out.destroy();
    await cleanup();
    throw e;
  }
  return { path, sha256: hash.digest('hex'), byteCount, cleanup };
}

function isAlive(pid: number): boolean {
  if (pid === process.pid) return true;
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    // EPERM: the process exists but belongs to someone else.
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Removes the spool folders left by imports whose process is gone. Run at start-up
 * (instrumentation.ts); returns the folders removed.
 */
export async function removeStaleSpools(base = tmpdir(), now = Date.now()): Promise<string[]> {
  let names: string[];
  try {
    names = await readdir(base);
  } catch {
    return [];
  }
  const removed: string[] = [];
  for (const name of names) {
    if (!name.startsWith(PREFIX)) continue;
    const path = join(base, name);
    const pid = /^ledger-import-(\d+)-/.exec(name)?.[1];
    let stale: boolean;
    if (pid !== undefined) stale = !isAlive(Number(pid));
    else stale = await stat(path).then((s) => now - s.mtimeMs > UNNAMED_MAX_AGE_MS, () => false);
    if (!stale) continue;
    await rm(path, { recursive: true, force: true });
    removed.push(path);
  }
  return removed;
}
