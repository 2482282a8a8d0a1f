'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { unwatch, updateWatchSettings, watchBenchmark } from '@/db/queries/watches';
import { rotateWatchWebhookSecret, setWatchWebhook } from '@/lib/services/alerts/webhooks';
import { isAppError } from '@/lib/errors';
import { thresholdsFromForm, watchFormSchema, watchIdSchema, watchSettingsSchema, watchWebhookSchema } from './schemas';

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

/**
 * One's own watch only. The first URL makes the signing secret, returned in the
 * state once (it is stored encrypted and never shown again); blank removes the webhook.
 */
export const saveWatchWebhookAction = workspaceAction('benchmarks:read', watchWebhookSchema, async (input, ctx) => {
  try {
    const { secret, url } = await setWatchWebhook(ctx.workspace.id, input.watchId, ctx.user.id, input.webhookUrl);
    revalidatePath(`/w/${ctx.workspace.slug}/watches`);
    if (!url) return { ok: true, message: 'Webhook removed: alerts go by e-mail only.' };
    return {
      ok: true,
      message: secret ? 'Webhook saved. Copy the signing secret now: it is shown only once.' : 'Webhook URL saved; the signing secret is unchanged.',
      data: secret ? { secret } : undefined,
    };
  } catch (e) {
    if (isAppError(e) && (e.details as { field?: string } | undefined)?.field === 'webhookUrl') {
      return { ok: false, code: e.code, message: 'Check the webhook URL.', fieldErrors: { webhookUrl: [e.message] } };
    }
    throw e;
  }
});

/** A new signing secret for one's own watch's webhook, shown once; the old one stops working at once. */
export const rotateWatchWebhookSecretAction = workspaceAction('benchmarks:read', watchIdSchema, async (input, ctx) => {
  const { secret } = await rotateWatchWebhookSecret(ctx.workspace.id, input.watchId, ctx.user.id);
  revalidatePath(`/w/${ctx.workspace.slug}/watches`);
  return { ok: true, message: 'New signing secret made: copy it now, it is shown only once. The old one no longer verifies.', data: { secret } };
});
