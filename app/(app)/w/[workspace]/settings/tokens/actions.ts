'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { roleCan } from '@/lib/permissions';
import { roleAtMost } from '@/lib/api/auth';
import { generateApiToken } from '@/lib/api/tokens';
import { insertApiToken, revokeApiToken } from '@/db/queries/tokens';
import { createTokenSchema, revokeTokenSchema } from './schemas';

/** Creates a token; its secret is in the returned state once and never stored. */
export const createApiToken = workspaceAction('tokens:create', createTokenSchema, async (input, ctx) => {
  if (!roleAtMost(input.role, ctx.role)) {
    return { ok: false, code: 'forbidden', message: `A token cannot have more rights than you: your role is ${ctx.role}.`, fieldErrors: { role: ['Above your own role.'] } };
  }
  const { token, prefix, hash } = generateApiToken();
  const expiresAt = input.expiresInDays ? new Date(Date.now() + input.expiresInDays * 86_400_000) : null;
  await insertApiToken({ workspaceId: ctx.workspace.id, name: input.name, role: input.role, prefix, tokenHash: hash, createdBy: ctx.user.id, expiresAt });
  revalidatePath(`/w/${ctx.workspace.slug}/settings/tokens`);
  return { ok: true, message: `Token "${input.name}" created. Copy it now: it is shown only once.`, data: { token, prefix } };
});

/** Curators and owners revoke any token of the workspace; others only their own. */
export const revokeApiTokenAction = workspaceAction('tokens:revoke', revokeTokenSchema, async (input, ctx) => {
  const onlyOwn = roleCan(ctx.role, 'settings:update') ? null : ctx.user.id;
  await revokeApiToken(ctx.workspace.id, input.tokenId, ctx.user.id, onlyOwn);
  revalidatePath(`/w/${ctx.workspace.slug}/settings/tokens`);
  return { ok: true, message: 'Token revoked.' };
});
