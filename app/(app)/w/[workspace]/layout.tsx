import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { listWorkspacesOfUser } from '@/db/queries/workspaces';
import { WorkspaceNav } from '@/components/shell/workspace-nav';
import { WorkspaceSwitcher } from '@/components/shell/workspace-switcher';
import { SignOutButton } from '@/components/shell/sign-out-button';
import { NavDrawer } from '@/components/shell/nav-drawer';
import { ShortcutButton, ShortcutOverlay } from '@/components/shell/shortcut-overlay';
import { mailboxEnabled } from '@/lib/env';

export default async function WorkspaceLayout({ children, params }: { children: React.ReactNode; params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const ctx = await requirePageMember(slug, 'materials:read');
  const workspaces = await listWorkspacesOfUser(ctx.user.id);
  const brand = (
    <Link href="/w" className="px-2 text-sm font-semibold tracking-tight text-ink no-underline">
      Lattice Ledger
    </Link>
  );
  return (
    <div className="flex min-h-screen flex-col md:flex-row">
      <NavDrawer brand={brand}>
        <WorkspaceSwitcher current={slug} workspaces={workspaces} />
        <WorkspaceNav slug={slug} />
        <div className="mt-auto space-y-2 border-t border-rule px-2 pt-3 text-xs text-ink-muted">
          <p className="truncate" title={ctx.user.email}>
            {ctx.user.name} · <span className="font-medium">{ctx.role}</span>
          </p>
          {mailboxEnabled() && (
            <Link href="/dev/mailbox" className="inline-block py-1">
              Dev mailbox
            </Link>
          )}
          <ShortcutButton />
          <SignOutButton />
        </div>
      </NavDrawer>
      <main id="main" tabIndex={-1} className="min-w-0 flex-1 px-4 py-5 focus:outline-none sm:px-6 md:overflow-x-clip lg:px-8 lg:py-6 print:px-0">
        {children}
      </main>
      <ShortcutOverlay slug={slug} />
    </div>
  );
}
