import { spawn } from 'node:child_process';
import { mkdir, mkdtemp, readdir, rm, utimes, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { once } from 'node:events';
import { afterAll, describe, expect, it } from 'vitest';
import { removeStaleSpools, spool } from '@/lib/import/spool';

// Issue 11, item 8: the temporary file of an import killed mid-way is removed when a server starts.

const base = await mkdtemp(join(tmpdir(), 'spool-test-'));
afterAll(() => rm(base, { recursive: true, force: true }));

describe('spool folders of interrupted imports', () => {
  it('are removed at start-up when their process is gone, and kept while it runs', async () => {
    const child = spawn(process.execPath, ['--conditions=react-server', '--import', 'tsx', 'tests/support/spool-child.ts', base], { stdio: ['ignore', 'pipe', 'inherit'] });
    await new Promise<void>((resolve, reject) => {
      child.stdout.on('data', (d: Buffer) => d.toString().includes('spooling') && resolve());
      child.on('exit', (code) => reject(new Error(`child exited early (${code})`)));
    });
    const [left] = (await readdir(base)).filter((n) => n.startsWith(`ledger-import-${child.pid}-`));
    expect(left).toBeDefined();
    // While the importing process lives, its folder stays.
    expect(await removeStaleSpools(base)).toEqual([]);
    child.kill('SIGKILL');
    await once(child, 'exit');
    expect(await readdir(join(base, left))).toEqual(['upload.csv']);

    // This process's own spool in progress, and a folder from before the pid was in the name (two days old).
    const ours = await spool((async function* () { yield new Uint8Array([1]); })(), base);
    const unnamed = join(base, 'ledger-import-Ab12Cd');
    await mkdir(unnamed);
    await writeFile(join(unnamed, 'upload.csv'), 'x');
    const twoDaysAgo = new Date(Date.now() - 2 * 24 * 3600 * 1000);
    await utimes(unnamed, twoDaysAgo, twoDaysAgo);

    const removed = await removeStaleSpools(base);
    expect(removed.sort()).toEqual([join(base, left), unnamed].sort());
    expect(await readdir(base)).toEqual([ours.path.split('/').at(-2)]);
    await ours.cleanup();
  });

});
