'use server';
import { headers } from 'next/headers';
import { revalidatePath } from 'next/cache';
import { redirect } from 'next/navigation';
import { APIError, isAPIError } from 'better-auth/api';
import { getAuth } from '@/lib/auth';
import { workspaceAction } from '@/lib/action';
import type { ActionState } from '@/lib/action-state';
import { AppError } from '@/lib/errors';
import { listMembers, listPendingInvitations } from '@/db/queries/workspaces';
import { changeRoleSchema, invitationSchema, inviteSchema, memberSchema, workspaceOnlySchema } from './schemas';

/** better-auth's refusals, in our words: its "organization" is our workspace. */
function fromApiError(e: unknown): ActionState {
  if (isAPIError(e) || e instanceof APIError) {
    const message = (e as Error).message.replace(/\borganizations\b/gi, 'workspaces').replace(/\borganization\b/gi, 'workspace');
    return { ok: false, code: 'bad-request', message };
  }
  throw e;
}

async function memberOf(workspaceId: string, memberId: string) {
  const found = (await listMembers(workspaceId)).find((m) => m.memberId === memberId);
  if (!found) throw new AppError('not-found', 'No such member in this workspace.');
  return found;
}

export const inviteMember = workspaceAction('members:invite', inviteSchema, async (input, ctx) => {
  if (input.role === 'owner' && ctx.role !== 'owner') return { ok: false, code: 'forbidden', message: 'Only an owner can invite another owner.' };
  if ((await listMembers(ctx.workspace.id)).some((m) => m.email.toLowerCase() === input.email)) {
    return { ok: false, code: 'conflict', message: `${input.email} is already a member.`, fieldErrors: { email: ['Already a member.'] } };
  }
  try {
    await getAuth().api.createInvitation({
      body: { email: input.email, role: input.role, organizationId: ctx.workspace.id, resend: true },
      headers: await headers(),
    });
  } catch (e) {
    return fromApiError(e);
  }
  revalidatePath(`/w/${ctx.workspace.slug}/settings/members`);
  return { ok: true, message: `Invitation sent to ${input.email} as ${input.role}.` };
});

export const changeMemberRole = workspaceAction('members:update-role', changeRoleSchema, async (input, ctx) => {
  const target = await memberOf(ctx.workspace.id, input.memberId);
  if (target.role === 'owner' && input.role !== 'owner') {
    const owners = (await listMembers(ctx.workspace.id)).filter((m) => m.role === 'owner').length;
    if (owners <= 1) {
      const message =
        target.userId === ctx.user.id
          ? 'You are the only owner of this workspace: make another member an owner before you change your own role.'
          : `${target.name} is the only owner of this workspace: make another member an owner first.`;
      return { ok: false, code: 'conflict', message };
    }
  }
  try {
    await getAuth().api.updateMemberRole({
      body: { memberId: input.memberId, role: input.role, organizationId: ctx.workspace.id },
      headers: await headers(),
    });
  } catch (e) {
    return fromApiError(e);
  }
  revalidatePath(`/w/${ctx.workspace.slug}/settings/members`);
  return { ok: true, message: 'Role changed.' };
});

export const removeMember = workspaceAction('members:remove', memberSchema, async (input, ctx) => {
  await memberOf(ctx.workspace.id, input.memberId);
  try {
    await getAuth().api.removeMember({ body: { memberIdOrEmail: input.memberId, organizationId: ctx.workspace.id }, headers: await headers() });
  } catch (e) {
    return fromApiError(e);
  }
  revalidatePath(`/w/${ctx.workspace.slug}/settings/members`);
  return { ok: true, message: 'Member removed.' };
});

export const cancelInvitation = workspaceAction('members:invite', invitationSchema, async (input, ctx) => {
  if (!(await listPendingInvitations(ctx.workspace.id)).some((i) => i.id === input.invitationId)) {
    return { ok: false, code: 'not-found', message: 'No such pending invitation.' };
  }
  try {
    await getAuth().api.cancelInvitation({ body: { invitationId: input.invitationId }, headers: await headers() });
  } catch (e) {
    return fromApiError(e);
  }
  revalidatePath(`/w/${ctx.workspace.slug}/settings/members`);
  return { ok: true, message: 'Invitation cancelled.' };
});

export const leaveWorkspace = workspaceAction('members:read', workspaceOnlySchema, async (_input, ctx) => {
  try {
    await getAuth().api.leaveOrganization({ body: { organizationId: ctx.workspace.id }, headers: await headers() });
  } catch (e) {
    if (e instanceof APIError && /only owner|without an owner/i.test(e.message)) {
      return { ok: false, code: 'bad-request', message: 'You are the last owner: make someone else an owner before you leave.' };
    }
    return fromApiError(e);
  }
  redirect('/w');
});
