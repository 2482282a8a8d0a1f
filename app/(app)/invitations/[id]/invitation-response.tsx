'use client';
import { useActionState } from 'react';
import { acceptInvitation, declineInvitation } from './actions';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';

export function InvitationResponse({ invitationId }: { invitationId: string }) {
  const [acceptState, accept] = useActionState(acceptInvitation, { ok: false });
  const [declineState, decline] = useActionState(declineInvitation, { ok: false });
  return (
    <div className="space-y-3">
      <div className="flex gap-3">
        <form action={accept}>
          <input type="hidden" name="invitationId" value={invitationId} />
          <SubmitButton pendingLabel="Joining…">Accept and join</SubmitButton>
        </form>
        <form action={decline}>
          <input type="hidden" name="invitationId" value={invitationId} />
          <SubmitButton variant="secondary">Decline</SubmitButton>
        </form>
      </div>
      <FormMessage state={acceptState.message ? acceptState : declineState} />
    </div>
  );
}
