'use client';
import { startTransition, useActionState } from 'react';
import type { ActionState } from '@/lib/action-state';
import { TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormMessage } from '@/components/ui/form-message';

type Action = (prev: ActionState | undefined, formData: FormData) => Promise<ActionState>;

/** Retract (reason required) or restore (reason optional) one record; nothing is ever deleted. */
export function RetractionForm({ workspaceId, id, mode, action, noun }: { workspaceId: string; id: string; mode: 'retract' | 'restore'; action: Action; noun: string }) {
  const [state, run, pending] = useActionState<ActionState, FormData>(action, { ok: false });
  return (
    <form
      className="space-y-2"
      onSubmit={(e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        startTransition(() => run(data));
      }}
    >
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="id" value={id} />
      <TextField
        label={mode === 'retract' ? `Why retract this ${noun}?` : 'Reason for restoring (optional)'}
        name="reason"
        errors={state.fieldErrors?.reason}
        hint={mode === 'retract' ? 'The record stays in the database and its history; lists hide it.' : undefined}
        required={mode === 'retract'}
      />
      <Button type="submit" variant={mode === 'retract' ? 'danger' : 'secondary'} disabled={pending}>
        {pending ? 'Working…' : mode === 'retract' ? `Retract ${noun}` : `Restore ${noun}`}
      </Button>
      <FormMessage state={state} />
    </form>
  );
}
