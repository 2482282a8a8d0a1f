import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { listDecks } from '@/db/queries/decks';
import { EmptyState, Panel } from '@/components/ui/panel';
import { utcMinute } from '@/lib/format';
import { CreateDeckForm } from './_components/deck-forms';

export const metadata: Metadata = { title: 'Decks' };

export default async function DecksPage({ params }: { params: Promise<{ workspace: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'decks:read');
  const decks = await listDecks(ctx.workspace.id);
  const base = `/w/${ctx.workspace.slug}/decks`;
  return (
    <div className="space-y-5">
      <header>
        <h1>Decks</h1>
        <p className="text-sm text-ink-muted">Ordered saved views for the group meeting, each pinned to a benchmark revision. Add views with “Add to deck” on a benchmark or material page.</p>
      </header>
      {roleCan(ctx.role, 'decks:create') ? (
        <Panel title="New deck" className="max-w-xl">
          <CreateDeckForm workspaceId={ctx.workspace.id} />
        </Panel>
      ) : null}
      {decks.length === 0 ? (
        <EmptyState title="No deck yet">Create one here, or choose “Add to deck” on a benchmark’s leaderboard, plots, outliers or comparison.</EmptyState>
      ) : (
        <Panel title={`Decks (${decks.length})`}>
          <ul className="divide-y divide-rule" data-testid="decks">
            {decks.map((d) => (
              <li key={d.id} className="flex flex-wrap items-center justify-between gap-3 py-2">
                <div>
                  <Link href={`${base}/${d.id}`} className="font-medium">
                    {d.title}
                  </Link>
                  <p className="text-xs text-ink-muted">
                    {d.views} view{d.views === 1 ? '' : 's'} · {d.createdBy ?? 'unknown'}, {utcMinute(d.updatedAt ?? d.createdAt)}
                  </p>
                </div>
                <div className="flex gap-3 text-sm">
                  <Link href={`${base}/${d.id}/present`}>Present</Link>
                  <Link href={`${base}/${d.id}/print`}>Print</Link>
                </div>
              </li>
            ))}
          </ul>
        </Panel>
      )}
    </div>
  );
}
