'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { setPrivateWebhookTargets } from '@/db/queries/settings';
import { webhookNetworkSchema } from './schemas';

/** Owners only (settings:network): whether this workspace's webhooks may reach private networks. */
export const updateWebhookNetworkAction = workspaceAction('settings:network', webhookNetworkSchema, async (input, ctx) => {
  const { changed } = await setPrivateWebhookTargets(ctx.workspace.id, { userId: ctx.user.id }, input.allowPrivate);
  revalidatePath(`/w/${ctx.workspace.slug}/settings/webhooks`);
  if (!changed) return { ok: true, message: 'Nothing changed.' };
  return {
    ok: true,
    message: input.allowPrivate
      ? 'Webhooks of this workspace may now target private networks.'
      : 'Webhooks of this workspace may no longer target private networks; deliveries to them fail from now on.',
  };
});
