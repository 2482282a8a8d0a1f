'use client';
import { useActionState } from 'react';
import { unwatchAction } from '@/app/(app)/w/[workspace]/watches/actions';
import { SubmitButton } from '@/components/ui/submit-button';

export function UnwatchButton({ workspaceId, watchId, benchmarkName }: { workspaceId: string; watchId: string; benchmarkName: string }) {
  const [state, action] = useActionState(unwatchAction, { ok: false });
  return (
    <form action={action} className="inline-flex items-center gap-2" aria-label={`Stop watching ${benchmarkName}`}>
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="watchId" value={watchId} />
      <SubmitButton variant="danger" pendingLabel="Stopping…">
        Unwatch
      </SubmitButton>
      {state.message && !state.ok ? <span className="text-xs text-bad">{state.message}</span> : null}
    </form>
  );
}
