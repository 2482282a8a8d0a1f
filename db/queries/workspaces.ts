import 'server-only';
import { and, asc, eq, gt } from 'drizzle-orm';
import { db } from '@/db/client';
import { invitation, member, organization, user, workspaceSettings } from '@/db/schema';

export async function findMembership(workspaceId: string, userId: string) {
  const rows = await db
    .select({ memberId: member.id, role: member.role, workspaceId: organization.id, name: organization.name, slug: organization.slug })
    .from(member)
    .innerJoin(organization, eq(member.organizationId, organization.id))
    .where(and(eq(member.organizationId, workspaceId), eq(member.userId, userId)))
    .limit(1);
  return rows[0] ?? null;
}

export async function findWorkspaceIdBySlug(slug: string): Promise<string | null> {
  const rows = await db.select({ id: organization.id }).from(organization).where(eq(organization.slug, slug)).limit(1);
  return rows[0]?.id ?? null;
}

export async function listWorkspacesOfUser(userId: string) {
  return db
    .select({ id: organization.id, name: organization.name, slug: organization.slug, role: member.role })
    .from(member)
    .innerJoin(organization, eq(member.organizationId, organization.id))
    .where(eq(member.userId, userId))
    .orderBy(asc(organization.name));
}

export async function listMembers(workspaceId: string) {
  return db
    .select({ memberId: member.id, userId: user.id, name: user.name, email: user.email, role: member.role, joinedAt: member.createdAt })
    .from(member)
    .innerJoin(user, eq(member.userId, user.id))
    .where(eq(member.organizationId, workspaceId))
    .orderBy(asc(user.name));
}

export async function listPendingInvitations(workspaceId: string) {
  return db
    .select({ id: invitation.id, email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt, createdAt: invitation.createdAt })
    .from(invitation)
    .where(and(eq(invitation.organizationId, workspaceId), eq(invitation.status, 'pending'), gt(invitation.expiresAt, new Date())))
    .orderBy(asc(invitation.email));
}

/** An invitation with its workspace name, for the acceptance page (any signed-in user may look at one by id). */
export async function findInvitation(invitationId: string) {
  const rows = await db
    .select({
      id: invitation.id,
      email: invitation.email,
      role: invitation.role,
      status: invitation.status,
      expiresAt: invitation.expiresAt,
      workspaceId: organization.id,
      workspaceName: organization.name,
      workspaceSlug: organization.slug,
    })
    .from(invitation)
    .innerJoin(organization, eq(invitation.organizationId, organization.id))
    .where(eq(invitation.id, invitationId))
    .limit(1);
  return rows[0] ?? null;
}

export async function ensureWorkspaceSettings(workspaceId: string) {
  await db.insert(workspaceSettings).values({ workspaceId }).onConflictDoNothing();
}
