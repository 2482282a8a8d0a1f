import { describe, expect, it } from 'vitest';
import { and, desc, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { invitation, mailOutbox, member, organization } from '@/db/schema';
import { createWorkspace } from '@/app/(app)/w/actions';
import { changeMemberRole, inviteMember, leaveWorkspace, removeMember } from '@/app/(app)/w/[workspace]/settings/members/actions';
import { acceptInvitation } from '@/app/(app)/invitations/[id]/actions';
import { createVerifiedUser, createWorkspaceWith, signInAs } from '../support/users';
import { callAction } from '../support/actions';

async function memberRole(workspaceId: string, userId: string) {
  const [row] = await db.select().from(member).where(and(eq(member.organizationId, workspaceId), eq(member.userId, userId)));
  return row?.role;
}

describe('workspaces', () => {
  it('refuses an invitation to an invalid e-mail address with a field error, sending nothing', async () => {
    const { workspaceId, owner } = await createWorkspaceWith();
    await signInAs(owner.email);
    const bad = await callAction(inviteMember, { workspaceId, email: 'not-an-address', role: 'reviewer' });
    expect(bad.state).toMatchObject({ ok: false, fieldErrors: { email: ['Enter a valid e-mail address.'] } });
    expect(await db.select().from(invitation).where(eq(invitation.organizationId, workspaceId))).toHaveLength(0);
  });

  it('creates a workspace whose creator is its owner, and refuses a taken address', async () => {
    const u = await createVerifiedUser('Founder');
    await signInAs(u.email);
    const created = await callAction(createWorkspace, { name: 'Raman Lab', slug: 'raman-lab' });
    expect(created.redirect).toBe('/w/raman-lab');
    const [ws] = await db.select().from(organization).where(eq(organization.slug, 'raman-lab'));
    expect(await memberRole(ws.id, u.id)).toBe('owner');

    const again = await callAction(createWorkspace, { name: 'Other', slug: 'raman-lab' });
    expect(again.state?.ok).toBe(false);
    expect(again.state?.fieldErrors?.slug).toBeDefined();
    expect(await db.select().from(organization).where(eq(organization.name, 'Other'))).toHaveLength(0);
  });

  it('invites by e-mail through the outbox; only the invited address can accept', async () => {
    const { workspaceId, owner } = await createWorkspaceWith();
    const invitee = await createVerifiedUser('Invitee');
    const stranger = await createVerifiedUser('Stranger');
    await signInAs(owner.email);
    const sent = await callAction(inviteMember, { workspaceId, email: invitee.email, role: 'contributor' });
    expect(sent.state).toMatchObject({ ok: true });
    const [mail] = await db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, invitee.email)).orderBy(desc(mailOutbox.createdAt));
    expect(mail.kind).toBe('invitation');
    expect(mail.workspaceId).toBe(workspaceId);
    const [inv] = await db.select().from(invitation).where(eq(invitation.email, invitee.email));
    expect(mail.textBody).toContain(`/invitations/${inv.id}`);

    await signInAs(stranger.email);
    const foreign = await callAction(acceptInvitation, { invitationId: inv.id });
    expect(foreign.state).toMatchObject({ ok: false, code: 'forbidden' });
    expect(await memberRole(workspaceId, stranger.id)).toBeUndefined();

    await signInAs(invitee.email);
    const accepted = await callAction(acceptInvitation, { invitationId: inv.id });
    expect(accepted.redirect).toMatch(/^\/w\//);
    expect(await memberRole(workspaceId, invitee.id)).toBe('contributor');
  });

  it('refuses an expired invitation', async () => {
    const { workspaceId, owner } = await createWorkspaceWith();
    const invitee = await createVerifiedUser('Late');
    await signInAs(owner.email);
    await callAction(inviteMember, { workspaceId, email: invitee.email, role: 'reviewer' });
    const [inv] = await db.select().from(invitation).where(eq(invitation.email, invitee.email));
    await db.update(invitation).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitation.id, inv.id));
    await signInAs(invitee.email);
    const res = await callAction(acceptInvitation, { invitationId: inv.id });
    expect(res.state).toMatchObject({ ok: false, code: 'not-found' });
    expect(await memberRole(workspaceId, invitee.id)).toBeUndefined();
  });

  it('lets only an owner change roles; a curator cannot invite an owner', async () => {
    const { workspaceId, owner, members } = await createWorkspaceWith(['curator', 'reviewer']);
    const reviewerMember = (await db.select().from(member).where(eq(member.userId, members.reviewer.id)))[0];

    await signInAs(members.curator.email);
    const byCurator = await callAction(changeMemberRole, { workspaceId, memberId: reviewerMember.id, role: 'curator' });
    expect(byCurator.state).toMatchObject({ ok: false, code: 'forbidden' });
    expect(await memberRole(workspaceId, members.reviewer.id)).toBe('reviewer');
    const ownerInvite = await callAction(inviteMember, { workspaceId, email: 'boss@example.org', role: 'owner' });
    expect(ownerInvite.state).toMatchObject({ ok: false, code: 'forbidden' });
    expect(await db.select().from(invitation).where(eq(invitation.email, 'boss@example.org'))).toHaveLength(0);

    await signInAs(members.reviewer.email);
    const reviewerInvite = await callAction(inviteMember, { workspaceId, email: 'friend@example.org', role: 'reviewer' });
    expect(reviewerInvite.state).toMatchObject({ ok: false, code: 'forbidden' });

    await signInAs(owner.email);
    const byOwner = await callAction(changeMemberRole, { workspaceId, memberId: reviewerMember.id, role: 'contributor' });
    expect(byOwner.state).toMatchObject({ ok: true });
    expect(await memberRole(workspaceId, members.reviewer.id)).toBe('contributor');
  });

  it('keeps at least one owner: the last owner can neither leave nor be demoted', async () => {
    const { workspaceId, owner, members } = await createWorkspaceWith(['contributor']);
    await signInAs(owner.email);
    const leave = await callAction(leaveWorkspace, { workspaceId });
    expect(leave.state).toMatchObject({ ok: false });
    expect(leave.state?.message).toMatch(/last owner/);
    expect(await memberRole(workspaceId, owner.id)).toBe('owner');
    const ownerMember = (await db.select().from(member).where(and(eq(member.userId, owner.id), eq(member.organizationId, workspaceId))))[0];
    const demote = await callAction(changeMemberRole, { workspaceId, memberId: ownerMember.id, role: 'reviewer' });
    expect(demote.state?.ok).toBe(false);
    // our words, not the auth library's ("organization")
    expect(demote.state?.message).toBe('You are the only owner of this workspace: make another member an owner before you change your own role.');
    expect(await memberRole(workspaceId, owner.id)).toBe('owner');

    const contributorMember = (await db.select().from(member).where(eq(member.userId, members.contributor.id)))[0];
    expect((await callAction(removeMember, { workspaceId, memberId: contributorMember.id })).state).toMatchObject({ ok: true });
    expect(await memberRole(workspaceId, members.contributor.id)).toBeUndefined();

    // a member who is not the last owner may leave
    const second = await createWorkspaceWith(['reviewer']);
    await signInAs(second.members.reviewer.email);
    expect((await callAction(leaveWorkspace, { workspaceId: second.workspaceId })).redirect).toBe('/w');
    expect(await memberRole(second.workspaceId, second.members.reviewer.id)).toBeUndefined();
  });

  it('refuses a member id of another workspace', async () => {
    const a = await createWorkspaceWith(['reviewer']);
    const b = await createWorkspaceWith();
    const memberOfA = (await db.select().from(member).where(eq(member.userId, a.members.reviewer.id)))[0];
    await signInAs(b.owner.email);
    const res = await callAction(removeMember, { workspaceId: b.workspaceId, memberId: memberOfA.id });
    expect(res.state).toMatchObject({ ok: false, code: 'not-found' });
    expect(await memberRole(a.workspaceId, a.members.reviewer.id)).toBe('reviewer');
  });
});
