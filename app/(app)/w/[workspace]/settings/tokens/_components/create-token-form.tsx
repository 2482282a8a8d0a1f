'use client';
import { useActionState, useState } from 'react';
import { createApiToken } from '../actions';
import { SelectField, TextField } from '@/components/ui/field';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';
import { Button } from '@/components/ui/button';

export function CreateTokenForm({ workspaceId, roles }: { workspaceId: string; roles: string[] }) {
  const [state, action] = useActionState(createApiToken, { ok: false });
  const [copied, setCopied] = useState(false);
  const created = state.ok ? (state.data as { token: string } | undefined) : undefined;
  return (
    <div className="space-y-4">
      <form action={action} className="space-y-3">
        <input type="hidden" name="workspaceId" value={workspaceId} />
        <TextField label="Name" name="name" placeholder="e.g. DFPT pipeline on cluster A" errors={state.fieldErrors?.name} required />
        <SelectField label="Role" name="role" defaultValue={roles.includes('contributor') ? 'contributor' : roles[0]} errors={state.fieldErrors?.role} hint="Never more than your own role.">
          {roles.map((r) => (
            <option key={r} value={r}>
              {r}
            </option>
          ))}
        </SelectField>
        <TextField label="Expires after (days, optional)" name="expiresInDays" type="number" min={1} max={3650} errors={state.fieldErrors?.expiresInDays} />
        <SubmitButton pendingLabel="Creating…">Create token</SubmitButton>
      </form>
      <FormMessage state={state} />
      {created && (
        <div className="space-y-2 rounded-md border border-warn/40 bg-warn-soft p-3" data-testid="new-token">
          <p className="text-sm font-medium text-ink">Your new token — copy it now, it will not be shown again:</p>
          <code className="block break-all rounded bg-panel px-2 py-1.5 font-mono text-xs" aria-label="New API token">
            {created.token}
          </code>
          <Button
            type="button"
            variant="secondary"
            onClick={() => {
              void navigator.clipboard.writeText(created.token).then(() => setCopied(true));
            }}
          >
            {copied ? 'Copied' : 'Copy to clipboard'}
          </Button>
        </div>
      )}
    </div>
  );
}
