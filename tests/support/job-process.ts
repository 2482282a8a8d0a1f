// A second (third) app process on a shared SQLite file, for tests/integration/jobs-two-processes.test.ts.
// It runs the real job runner with the real handlers, like a server process does.
// argv[2] is the mode, argv[3] a JSON config:
//   import {workspaceId, userId, files: [{name, csv}], gapMs}  says ready, waits for a line on stdin, imports each CSV in
//                                                             turn (gapMs apart), then waits until
//                                                             no recomputation or announcement is left and exits;
//   hang   {}                                                 claims recomputations with a handler that never ends
//                                                             (a process that dies mid-recompute: the test kills it);
//   work   {workspaceId, benchmarkId}                         runs jobs until that benchmark has none left.
// Prints JSON lines: {"event":"claimed",...} for hang, and a last {"event":"done",...}.
import { registerJobHandler, startJobRunner, whenJobsIdle, jobOwner } from '@/lib/services/jobs/runner';

const [mode, configText] = process.argv.slice(2);
const config = JSON.parse(configText ?? '{}');
const say = (event: Record<string, unknown>) => console.log(JSON.stringify(event));

if (mode === 'hang') {
  registerJobHandler('recompute', async (job) => {
    say({ event: 'claimed', key: job.key, owner: jobOwner(), at: Date.now() });
    await new Promise(() => undefined);
  });
  startJobRunner();
  await new Promise(() => undefined);
}

// The real handlers, registered as a server process registers them at start-up.
await import('@/lib/services/benchmarks/recompute-queue');
await import('@/lib/services/alerts/scheduler');
const kinds = ['recompute', 'announce'];

if (mode === 'import') {
  const { importCsvFile } = await import('@/lib/services/imports/csv-import');
  startJobRunner();
  // Start together with the other importers: wait for a line on stdin.
  say({ event: 'ready' });
  await new Promise<void>((resolve) => process.stdin.once('data', () => resolve()));
  const imported: string[] = [];
  for (const file of config.files as Array<{ name: string; csv: string }>) {
    const outcome = await importCsvFile({
      workspaceId: config.workspaceId,
      actor: { userId: config.userId, tokenId: null },
      via: 'api',
      kind: 'measurements',
      fileName: file.name,
      body: (async function* () {
        yield new TextEncoder().encode(file.csv);
      })(),
    });
    imported.push(outcome.importId!);
    await new Promise((r) => setTimeout(r, config.gapMs ?? 0));
  }
  await whenJobsIdle({ kinds, workspaceId: config.workspaceId }, 120_000);
  say({ event: 'done', owner: jobOwner(), imported });
  process.exit(0);
}

if (mode === 'work') {
  startJobRunner();
  const started = Date.now();
  await whenJobsIdle({ kinds: ['recompute'], key: `${config.workspaceId}|${config.benchmarkId}` }, 120_000);
  say({ event: 'done', owner: jobOwner(), started, finished: Date.now() });
  process.exit(0);
}
