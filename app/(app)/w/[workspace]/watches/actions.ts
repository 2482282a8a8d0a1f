'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { unwatch, updateWatchSettings, watchBenchmark } from '@/db/queries/watches';
import { thresholdsFromForm, watchFormSchema, watchIdSchema, watchSettingsSchema } from './schemas';

/** Any member may watch, reviewers included: watching reads the benchmark and mails only the watcher. */
export const watchAction = workspaceAction('benchmarks:read', watchFormSchema, async (input, ctx) => {
  const { id } = await watchBenchmark(ctx.workspace.id, input.benchmarkId, ctx.user.id, input.mode);
  revalidatePath(`/w/${ctx.workspace.slug}/benchmarks/${input.benchmarkId}`);
  revalidatePath(`/w/${ctx.workspace.slug}/watches`);
  return {
    ok: true,
    message: input.mode === 'digest' ? 'Watching: you get a daily digest when it shifts.' : 'Watching: you get an e-mail when it shifts.',
    data: { id },
  };
});

export const unwatchAction = workspaceAction('benchmarks:read', watchIdSchema, async (input, ctx) => {
  await unwatch(ctx.workspace.id, input.watchId, ctx.user.id);
  revalidatePath(`/w/${ctx.workspace.slug}/watches`);
  revalidatePath(`/w/${ctx.workspace.slug}/benchmarks`, 'layout');
  return { ok: true, message: 'Stopped watching: no more alerts.' };
});

/** Only one's own watch: the benchmark's default thresholds are changed on the benchmark (benchmarks:update), never here. */
export const updateWatchAction = workspaceAction('benchmarks:read', watchSettingsSchema, async (input, ctx) => {
  await updateWatchSettings(ctx.workspace.id, input.watchId, ctx.user.id, { mode: input.mode, thresholds: thresholdsFromForm(input) });
  revalidatePath(`/w/${ctx.workspace.slug}/watches`);
  revalidatePath(`/w/${ctx.workspace.slug}/benchmarks`, 'layout');
  return { ok: true, message: 'Saved your alert settings.' };
});
