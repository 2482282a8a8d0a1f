'use client';
import { useActionState } from 'react';
import { cancelInvitation, changeMemberRole, leaveWorkspace, removeMember } from '../actions';
import { WORKSPACE_ROLES } from '@/lib/permissions';
import { Button } from '@/components/ui/button';

function InlineError({ message }: { message?: string }) {
  return message ? (
    <span role="alert" className="ml-2 text-xs text-bad">
      {message}
    </span>
  ) : null;
}

export function MemberRoleForm({ workspaceId, memberId, role }: { workspaceId: string; memberId: string; role: string }) {
  const [state, action, pending] = useActionState(changeMemberRole, { ok: false });
  return (
    <form action={action} className="flex items-center gap-1.5">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="memberId" value={memberId} />
      <label className="sr-only" htmlFor={`role-${memberId}`}>
        Role
      </label>
      <select id={`role-${memberId}`} name="role" defaultValue={role} className="rounded border border-rule-strong bg-panel px-1.5 py-0.5 text-sm">
        {WORKSPACE_ROLES.map((r) => (
          <option key={r} value={r}>
            {r}
          </option>
        ))}
      </select>
      <Button type="submit" variant="secondary" className="!px-2 !py-0.5 text-xs" disabled={pending}>
        Save
      </Button>
      {state.ok ? <span className="text-xs text-good">Saved</span> : <InlineError message={state.message} />}
    </form>
  );
}

export function RemoveMemberButton({ workspaceId, memberId, name }: { workspaceId: string; memberId: string; name: string }) {
  const [state, action, pending] = useActionState(removeMember, { ok: false });
  return (
    <form
      action={action}
      onSubmit={(e) => {
        if (!confirm(`Remove ${name} from this workspace?`)) e.preventDefault();
      }}
    >
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="memberId" value={memberId} />
      <Button type="submit" variant="danger" className="!px-2 !py-0.5 text-xs" disabled={pending}>
        Remove
      </Button>
      <InlineError message={state.ok ? undefined : state.message} />
    </form>
  );
}

export function CancelInvitationButton({ workspaceId, invitationId }: { workspaceId: string; invitationId: string }) {
  const [state, action, pending] = useActionState(cancelInvitation, { ok: false });
  return (
    <form action={action}>
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="invitationId" value={invitationId} />
      <Button type="submit" variant="ghost" className="!px-2 !py-0.5 text-xs" disabled={pending}>
        Cancel
      </Button>
      <InlineError message={state.ok ? undefined : state.message} />
    </form>
  );
}

export function LeaveWorkspaceButton({ workspaceId }: { workspaceId: string }) {
  const [state, action, pending] = useActionState(leaveWorkspace, { ok: false });
  return (
    <form
      action={action}
      className="flex items-center"
      onSubmit={(e) => {
        if (!confirm('Leave this workspace?')) e.preventDefault();
      }}
    >
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <InlineError message={state.ok ? undefined : state.message} />
      <Button type="submit" variant="ghost" className="!px-2 !py-0.5 text-xs" disabled={pending}>
        Leave workspace
      </Button>
    </form>
  );
}
