import type { Metadata } from 'next';
import { requirePageMember } from '@/lib/session';
import { listMembers, listPendingInvitations } from '@/db/queries/workspaces';
import { roleCan, ROLE_DESCRIPTIONS, WORKSPACE_ROLES } from '@/lib/permissions';
import { Panel } from '@/components/ui/panel';
import { InviteForm } from './_components/invite-form';
import { CancelInvitationButton, LeaveWorkspaceButton, MemberRoleForm, RemoveMemberButton } from './_components/member-forms';

export const metadata: Metadata = { title: 'Members' };

const dateFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium' });

export default async function MembersPage({ params }: { params: Promise<{ workspace: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'members:read');
  const [members, invitations] = await Promise.all([listMembers(ctx.workspace.id), listPendingInvitations(ctx.workspace.id)]);
  const canChangeRoles = roleCan(ctx.role, 'members:update-role');
  const canRemove = roleCan(ctx.role, 'members:remove');
  const canInvite = roleCan(ctx.role, 'members:invite');
  const workspaceId = ctx.workspace.id;

  return (
    <div className="grid gap-5 xl:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
      <div className="space-y-5">
        <Panel title={`Members (${members.length})`} actions={<LeaveWorkspaceButton workspaceId={workspaceId} />}>
          <table className="w-full text-sm">
            <thead className="text-left text-xs text-ink-muted">
              <tr>
                <th className="pb-2 font-medium">Name</th>
                <th className="pb-2 font-medium">E-mail</th>
                <th className="pb-2 font-medium">Role</th>
                <th className="pb-2 font-medium">Joined</th>
                {canRemove && <th className="pb-2" />}
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {members.map((m) => (
                <tr key={m.memberId} data-testid={`member-${m.email}`}>
                  <td className="py-2 pr-3 font-medium">
                    {m.name}
                    {m.userId === ctx.user.id && <span className="ml-1 text-xs text-ink-faint">(you)</span>}
                  </td>
                  <td className="py-2 pr-3 text-ink-muted">{m.email}</td>
                  <td className="py-2 pr-3">
                    {canChangeRoles ? <MemberRoleForm workspaceId={workspaceId} memberId={m.memberId} role={m.role} /> : <span>{m.role}</span>}
                  </td>
                  <td className="num py-2 pr-3 text-ink-muted">{dateFormat.format(m.joinedAt)}</td>
                  {canRemove && <td className="py-2 text-right">{m.userId !== ctx.user.id && <RemoveMemberButton workspaceId={workspaceId} memberId={m.memberId} name={m.name} />}</td>}
                </tr>
              ))}
            </tbody>
          </table>
        </Panel>
        <Panel title={`Pending invitations (${invitations.length})`}>
          {invitations.length === 0 ? (
            <p className="text-sm text-ink-muted">No pending invitations.</p>
          ) : (
            <ul className="divide-y divide-rule text-sm">
              {invitations.map((i) => (
                <li key={i.id} className="flex items-center justify-between py-2">
                  <span>
                    {i.email} · <span className="text-ink-muted">{i.role}</span> · <span className="num text-xs text-ink-faint">expires {dateFormat.format(i.expiresAt)}</span>
                  </span>
                  {canInvite && <CancelInvitationButton workspaceId={workspaceId} invitationId={i.id} />}
                </li>
              ))}
            </ul>
          )}
        </Panel>
      </div>
      <div className="space-y-5">
        {canInvite && (
          <Panel title="Invite a member">
            <InviteForm workspaceId={workspaceId} roles={ctx.role === 'owner' ? [...WORKSPACE_ROLES] : WORKSPACE_ROLES.filter((r) => r !== 'owner')} />
          </Panel>
        )}
        <Panel title="Roles">
          <dl className="space-y-2 text-sm">
            {WORKSPACE_ROLES.map((r) => (
              <div key={r}>
                <dt className="font-medium">{r}</dt>
                <dd className="text-ink-muted">{ROLE_DESCRIPTIONS[r]}</dd>
              </div>
            ))}
          </dl>
        </Panel>
      </div>
    </div>
  );
}
