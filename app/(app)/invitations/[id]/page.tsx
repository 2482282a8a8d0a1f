import type { Metadata } from 'next';
import Link from 'next/link';
import { redirect } from 'next/navigation';
import { getSession } from '@/lib/session';
import { findInvitation } from '@/db/queries/workspaces';
import { Notice } from '@/components/ui/notice';
import { InvitationResponse } from './invitation-response';

export const metadata: Metadata = { title: 'Invitation' };

export default async function InvitationPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const session = await getSession();
  if (!session) redirect(`/sign-in?next=${encodeURIComponent(`/invitations/${id}`)}`);
  const invitation = await findInvitation(id);
  const valid = invitation && invitation.status === 'pending' && invitation.expiresAt > new Date();
  const mine = invitation && invitation.email.toLowerCase() === session.user.email.toLowerCase();

  return (
    <main id="main" tabIndex={-1} className="focus:outline-none mx-auto max-w-lg space-y-4 px-6 py-16">
      <h1>Invitation</h1>
      {!invitation || !mine ? (
        <Notice tone="bad">
          This invitation does not exist or was sent to another address. You are signed in as {session.user.email}; sign in with the invited
          address to accept it.
        </Notice>
      ) : !valid ? (
        <Notice tone="bad">This invitation has expired or was already answered. Ask a workspace owner or curator for a new one.</Notice>
      ) : (
        <>
          <p className="text-sm">
            You are invited to <strong>{invitation.workspaceName}</strong> as <strong>{invitation.role}</strong>.
          </p>
          <InvitationResponse invitationId={invitation.id} />
        </>
      )}
      <p className="text-sm">
        <Link href="/w">Your workspaces</Link>
      </p>
    </main>
  );
}
