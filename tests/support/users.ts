import { getAuth } from '@/lib/auth';
import { requestContext } from './request-context';

let counter = 0;

export const TEST_PASSWORD = 'correct-horse-battery';

/** A verified user with a password, created the way the demo seed does. */
export async function createVerifiedUser(name = 'Test User'): Promise<{ id: string; email: string; name: string }> {
  counter++;
  const email = `user${counter}-${Date.now()}@example.org`;
  const ctx = await getAuth().$context;
  const user = await ctx.internalAdapter.createUser({ name, email, emailVerified: true }, { method: 'admin' });
  await ctx.internalAdapter.linkAccount({ userId: user.id, providerId: 'credential', accountId: user.id, password: await ctx.password.hash(TEST_PASSWORD) });
  return { id: user.id, email, name };
}

/** Signs in through better-auth and makes the session the current request's. */
export async function signInAs(email: string, password = TEST_PASSWORD): Promise<string[]> {
  const res = await getAuth().api.signInEmail({ body: { email, password }, asResponse: true });
  if (!res.ok) throw new Error(`sign-in failed: ${res.status} ${await res.text()}`);
  const cookies = res.headers.getSetCookie();
  requestContext.useSetCookies(cookies);
  return cookies;
}

/** A workspace owned by a fresh user, plus members in the given roles. */
export async function createWorkspaceWith(roles: Array<'curator' | 'contributor' | 'reviewer' | 'owner'> = []) {
  const owner = await createVerifiedUser('Owner');
  const slug = `ws-${counter}-${Math.random().toString(36).slice(2, 8)}`;
  const workspace = await getAuth().api.createOrganization({ body: { name: `Workspace ${slug}`, slug, userId: owner.id } });
  const members: Record<string, { id: string; email: string }> = {};
  for (const role of roles) {
    const u = await createVerifiedUser(role);
    await getAuth().api.addMember({ body: { userId: u.id, role, organizationId: workspace.id } });
    members[role] = u;
  }
  return { workspaceId: workspace.id, slug, owner, members };
}
