'use client';
import { useActionState } from 'react';
import { undoImportAction } from '../actions';
import { TextField } from '@/components/ui/field';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';
import { count } from '@/lib/format';

export function UndoImportForm({ workspaceId, importId, rowCount }: { workspaceId: string; importId: string; rowCount: number }) {
  const [state, action] = useActionState(undoImportAction, { ok: false });
  return (
    <form action={action} className="space-y-3">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="importId" value={importId} />
      <p className="text-sm text-ink-muted">
        Retracts the {count(rowCount)} rows of this import. They stay in the history with your reason; nothing is deleted.
      </p>
      <TextField label="Reason" name="reason" required minLength={3} maxLength={500} errors={state.fieldErrors?.reason} placeholder="e.g. wrong calibration file" />
      <SubmitButton variant="danger" pendingLabel="Undoing…">
        Undo this import
      </SubmitButton>
      <FormMessage state={state} />
    </form>
  );
}
