'use client';
import { useActionState } from 'react';
import { inviteMember } from '../actions';
import { SelectField, TextField } from '@/components/ui/field';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';

export function InviteForm({ workspaceId, roles }: { workspaceId: string; roles: string[] }) {
  const [state, action] = useActionState(inviteMember, { ok: false });
  return (
    // noValidate: the server's answer (a field error, or the success) always replaces the previous one;
    // the browser's own check would block the submit silently and leave an earlier success on screen.
    <form action={action} className="space-y-3" aria-label="Invite a member" noValidate>
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <TextField label="E-mail" name="email" type="email" errors={state.fieldErrors?.email} required />
      <SelectField label="Role" name="role" defaultValue="contributor" errors={state.fieldErrors?.role}>
        {roles.map((r) => (
          <option key={r} value={r}>
            {r}
          </option>
        ))}
      </SelectField>
      <SubmitButton pendingLabel="Sending…">Send invitation</SubmitButton>
      <FormMessage state={state} />
    </form>
  );
}
