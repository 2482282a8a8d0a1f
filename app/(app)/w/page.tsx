import type { Metadata } from 'next';
import Link from 'next/link';
import { redirect } from 'next/navigation';
import { getSession } from '@/lib/session';
import { listWorkspacesOfUser } from '@/db/queries/workspaces';
import { Panel } from '@/components/ui/panel';
import { CreateWorkspaceForm } from './create-workspace-form';
import { SignOutButton } from '@/components/shell/sign-out-button';

export const metadata: Metadata = { title: 'Workspaces' };

export default async function WorkspacesPage() {
  const session = await getSession();
  if (!session) redirect('/sign-in?next=/w');
  const workspaces = await listWorkspacesOfUser(session.user.id);
  return (
    <main id="main" tabIndex={-1} className="focus:outline-none mx-auto max-w-3xl space-y-6 px-6 py-10">
      <header className="flex items-center justify-between">
        <div>
          <p className="text-xs uppercase tracking-wide text-ink-faint">Lattice Ledger</p>
          <h1>Your workspaces</h1>
        </div>
        <div className="flex items-center gap-3 text-sm text-ink-muted">
          {session.user.email}
          <SignOutButton />
        </div>
      </header>
      <Panel title="Workspaces">
        {workspaces.length === 0 ? (
          <p className="text-sm text-ink-muted">You are not in any workspace yet. Create one below, or open an invitation someone sent you.</p>
        ) : (
          <ul className="divide-y divide-rule">
            {workspaces.map((w) => (
              <li key={w.id} className="flex items-center justify-between py-2">
                <Link href={`/w/${w.slug}`} className="font-medium">
                  {w.name}
                </Link>
                <span className="text-xs text-ink-muted">{w.role}</span>
              </li>
            ))}
          </ul>
        )}
      </Panel>
      <Panel title="Create a workspace">
        <CreateWorkspaceForm />
      </Panel>
    </main>
  );
}
