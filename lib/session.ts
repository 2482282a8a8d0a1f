import 'server-only';
import { cache } from 'react';
import { headers } from 'next/headers';
import { notFound, redirect } from 'next/navigation';
import { getAuth } from '@/lib/auth';
import { AppError } from '@/lib/errors';
import { roleCan, type Permission, type WorkspaceRole } from '@/lib/permissions';
import { findMembership, findWorkspaceIdBySlug } from '@/db/queries/workspaces';

export type SessionUser = { id: string; name: string; email: string; emailVerified: boolean };

/** The signed-in user of this request, or null (cached per request). */
export const getSession = cache(async (): Promise<{ user: SessionUser; sessionId: string } | null> => {
  const result = await getAuth().api.getSession({ headers: await headers() });
  if (!result) return null;
  const { user, session } = result;
  return { user: { id: user.id, name: user.name, email: user.email, emailVerified: user.emailVerified }, sessionId: session.id };
});

export async function requireUser(): Promise<SessionUser> {
  const session = await getSession();
  if (!session) throw new AppError('unauthorized', 'Sign in first.');
  return session.user;
}

export interface MemberContext {
  user: SessionUser;
  workspace: { id: string; name: string; slug: string };
  role: WorkspaceRole;
  memberId: string;
}

/**
 * The one gate for every page, action and handler: the signed-in user must be a
 * member of this workspace (else 404, so ids of other workspaces reveal nothing)
 * and their role must grant the permission (else 403).
 */
export async function requireMember(workspaceId: string, permission: Permission): Promise<MemberContext> {
  const user = await requireUser();
  const membership = await findMembership(workspaceId, user.id);
  if (!membership) throw new AppError('not-found', 'No such workspace.');
  if (!roleCan(membership.role, permission)) {
    throw new AppError('forbidden', `Your role (${membership.role}) does not allow ${permission.replace(':', ' → ')}.`);
  }
  return {
    user,
    workspace: { id: membership.workspaceId, name: membership.name, slug: membership.slug },
    role: membership.role as WorkspaceRole,
    memberId: membership.memberId,
  };
}

/** For pages: resolves the slug in the URL and maps refusals to sign-in redirects and 404s. */
export async function requirePageMember(slug: string, permission: Permission): Promise<MemberContext> {
  const workspaceId = await findWorkspaceIdBySlug(slug);
  try {
    if (!workspaceId) {
      await requireUser();
      notFound();
    }
    return await requireMember(workspaceId, permission);
  } catch (e) {
    if (e instanceof AppError) {
      if (e.code === 'unauthorized') redirect(`/sign-in?next=${encodeURIComponent(`/w/${slug}`)}`);
      notFound();
    }
    throw e;
  }
}
