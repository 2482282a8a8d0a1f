import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { listWorkspacesOfUser } from '@/db/queries/workspaces';
import { WorkspaceNav } from '@/components/shell/workspace-nav';
import { WorkspaceSwitcher } from '@/components/shell/workspace-switcher';
import { SignOutButton } from '@/components/shell/sign-out-button';
import { mailboxEnabled } from '@/lib/env';

export default async function WorkspaceLayout({ children, params }: { children: React.ReactNode; params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const ctx = await requirePageMember(slug, 'materials:read');
  const workspaces = await listWorkspacesOfUser(ctx.user.id);
  return (
    <div className="flex min-h-screen">
      <aside className="sticky top-0 flex h-screen w-56 shrink-0 flex-col gap-4 border-r border-rule bg-panel px-3 py-4">
        <Link href="/w" className="px-2 text-sm font-semibold tracking-tight text-ink no-underline">
          Lattice Ledger
        </Link>
        <WorkspaceSwitcher current={slug} workspaces={workspaces} />
        <WorkspaceNav slug={slug} />
        <div className="mt-auto space-y-2 border-t border-rule px-2 pt-3 text-xs text-ink-muted">
          <p className="truncate" title={ctx.user.email}>
            {ctx.user.name} · <span className="font-medium">{ctx.role}</span>
          </p>
          {mailboxEnabled() && <Link href="/dev/mailbox">Dev mailbox</Link>}
          <SignOutButton />
        </div>
      </aside>
      <main className="min-w-0 flex-1 px-8 py-6">{children}</main>
    </div>
  );
}
