'use client';
import { useActionState } from 'react';
import { revokeApiTokenAction } from '../actions';
import { SubmitButton } from '@/components/ui/submit-button';

export function RevokeTokenButton({ workspaceId, tokenId, name }: { workspaceId: string; tokenId: string; name: string }) {
  const [state, action] = useActionState(revokeApiTokenAction, { ok: false });
  return (
    <form
      action={action}
      onSubmit={(e) => {
        if (!window.confirm(`Revoke "${name}"? Pipelines using it stop working at once.`)) e.preventDefault();
      }}
      className="inline-flex items-center gap-2"
    >
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="tokenId" value={tokenId} />
      <SubmitButton variant="danger" pendingLabel="Revoking…">
        Revoke
      </SubmitButton>
      {state.message && !state.ok && <span className="text-xs text-bad">{state.message}</span>}
    </form>
  );
}
