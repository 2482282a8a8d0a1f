'use client';
import { useActionState } from 'react';
import { updateWebhookNetworkAction } from '../actions';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';

/** The owner's switch for private-network webhook targets; others see its state, read-only. */
export function WebhookNetworkForm({ workspaceId, allowPrivate, canChange }: { workspaceId: string; allowPrivate: boolean; canChange: boolean }) {
  const [state, action] = useActionState(updateWebhookNetworkAction, { ok: false });
  const errors = state.fieldErrors?.allowPrivate;
  return (
    <form action={action} className="space-y-3" aria-label="Webhook network">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <div className="flex items-start gap-2">
        <input
          id="allowPrivate"
          name="allowPrivate"
          type="checkbox"
          defaultChecked={allowPrivate}
          disabled={!canChange}
          aria-describedby={errors?.length ? 'allowPrivate-error' : 'allowPrivate-hint'}
          aria-invalid={errors?.length ? true : undefined}
          className="mt-1"
        />
        <div>
          <label htmlFor="allowPrivate" className="text-[13px] font-medium text-ink">
            Allow webhooks to private networks
          </label>
          <p id="allowPrivate-hint" className="text-xs text-ink-faint">
            RFC 1918 (10/8, 172.16/12, 192.168/16), link-local (169.254/16, fe80::/10), carrier-grade NAT (100.64/10), unique-local IPv6 (fc00::/7) and
            reserved ranges. The cloud metadata address, multicast, the unspecified address and IPv4-mapped IPv6 stay refused.
            {canChange ? '' : ' Only an owner of the workspace can change this.'}
          </p>
          {errors?.length ? (
            <p id="allowPrivate-error" role="alert" className="text-xs text-bad">
              {errors.join(' ')}
            </p>
          ) : null}
        </div>
      </div>
      {canChange ? (
        <SubmitButton variant="secondary" pendingLabel="Saving…">
          Save
        </SubmitButton>
      ) : null}
      <FormMessage state={state} />
    </form>
  );
}
