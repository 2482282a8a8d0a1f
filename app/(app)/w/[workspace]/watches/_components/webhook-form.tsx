'use client';
import { useActionState, useState } from 'react';
import { rotateWatchWebhookSecretAction, saveWatchWebhookAction } from '@/app/(app)/w/[workspace]/watches/actions';
import type { ActionState } from '@/lib/action-state';
import { TextField } from '@/components/ui/field';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';
import { Button } from '@/components/ui/button';

export interface WatchWebhookValue {
  id: string;
  url: string | null;
  secretCreatedAt: Date | null;
}

const when = (d: Date | null) => (d ? d.toISOString().replace('T', ' ').slice(0, 16) + ' UTC' : '—');

function NewSecret({ state, watchId }: { state: ActionState; watchId: string }) {
  const [copied, setCopied] = useState(false);
  const secret = state.ok ? (state.data as { secret?: string } | undefined)?.secret : undefined;
  if (!secret) return null;
  return (
    <div className="space-y-2 rounded-md border border-warn/40 bg-warn-soft p-3" data-testid={`webhook-secret-${watchId}`}>
      <p className="text-sm font-medium text-ink">Signing secret — copy it now, it will not be shown again:</p>
      <code className="block break-all rounded bg-panel px-2 py-1.5 font-mono text-xs" aria-label="New webhook signing secret">
        {secret}
      </code>
      <Button type="button" variant="secondary" onClick={() => void navigator.clipboard.writeText(secret).then(() => setCopied(true))}>
        {copied ? 'Copied' : 'Copy to clipboard'}
      </Button>
    </div>
  );
}

/** The watch's webhook: URL (blank removes it), and a new signing secret on demand. Each secret is shown once. */
export function WebhookForm({ workspaceId, watch }: { workspaceId: string; watch: WatchWebhookValue }) {
  const [saved, save] = useActionState(saveWatchWebhookAction, { ok: false });
  const [rotated, rotate] = useActionState(rotateWatchWebhookSecretAction, { ok: false });
  const fieldId = `webhookUrl-${watch.id}`;
  return (
    <div className="space-y-3 border-t border-rule/70 pt-3">
      <form action={save} className="space-y-2" aria-label="Webhook">
        <input type="hidden" name="workspaceId" value={workspaceId} />
        <input type="hidden" name="watchId" value={watch.id} />
        <TextField
          label="Also deliver to a URL (webhook)"
          name="webhookUrl"
          id={fieldId}
          type="text"
          inputMode="url"
          autoComplete="off"
          spellCheck={false}
          defaultValue={watch.url ?? ''}
          placeholder="https://hooks.example.org/ledger"
          hint="https only. Each alert is POSTed as signed JSON (see the README, “Webhooks”). Leave blank to remove."
          errors={saved.fieldErrors?.webhookUrl}
        />
        <div className="flex items-center gap-3">
          <SubmitButton variant="secondary" pendingLabel="Checking…">
            Save webhook
          </SubmitButton>
          {watch.url ? <span className="text-xs text-ink-muted">Secret made {when(watch.secretCreatedAt)}</span> : null}
        </div>
        <FormMessage state={saved} />
        <NewSecret state={saved} watchId={watch.id} />
      </form>
      {watch.url ? (
        <form action={rotate} className="space-y-2" aria-label="Rotate the webhook signing secret">
          <input type="hidden" name="workspaceId" value={workspaceId} />
          <input type="hidden" name="watchId" value={watch.id} />
          <SubmitButton variant="secondary" pendingLabel="Rotating…">
            Rotate signing secret
          </SubmitButton>
          <FormMessage state={rotated} />
          <NewSecret state={rotated} watchId={watch.id} />
        </form>
      ) : null}
    </div>
  );
}
