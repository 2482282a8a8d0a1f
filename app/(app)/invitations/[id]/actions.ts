'use server';
import { headers } from 'next/headers';
import { redirect } from 'next/navigation';
import { APIError } from 'better-auth/api';
import { z } from 'zod';
import { getAuth } from '@/lib/auth';
import { userAction } from '@/lib/action';
import { findInvitation } from '@/db/queries/workspaces';

const schema = z.object({ invitationId: z.string().min(1) });

export const acceptInvitation = userAction(schema, async ({ invitationId }, user) => {
  const invitation = await findInvitation(invitationId);
  if (!invitation || invitation.status !== 'pending' || invitation.expiresAt < new Date()) {
    return { ok: false, code: 'not-found', message: 'This invitation is no longer valid.' };
  }
  if (invitation.email.toLowerCase() !== user.email.toLowerCase()) {
    return { ok: false, code: 'forbidden', message: `This invitation was sent to another address; you are signed in as ${user.email}.` };
  }
  try {
    await getAuth().api.acceptInvitation({ body: { invitationId }, headers: await headers() });
  } catch (e) {
    if (e instanceof APIError) return { ok: false, code: 'bad-request', message: e.message };
    throw e;
  }
  redirect(`/w/${invitation.workspaceSlug}`);
});

export const declineInvitation = userAction(schema, async ({ invitationId }, user) => {
  const invitation = await findInvitation(invitationId);
  if (!invitation || invitation.email.toLowerCase() !== user.email.toLowerCase()) {
    return { ok: false, code: 'not-found', message: 'This invitation is not yours.' };
  }
  try {
    await getAuth().api.rejectInvitation({ body: { invitationId }, headers: await headers() });
  } catch (e) {
    if (e instanceof APIError) return { ok: false, code: 'bad-request', message: e.message };
    throw e;
  }
  redirect('/w');
});
