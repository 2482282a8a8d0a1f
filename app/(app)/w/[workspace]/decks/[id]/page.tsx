import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { describeProblem, getDeck } from '@/db/queries/decks';
import { VIEW_KIND_LABELS } from '@/lib/decks/view-kinds';
import { buttonClass } from '@/components/ui/button';
import { EmptyState, Panel } from '@/components/ui/panel';
import { utcMinute } from '@/lib/format';
import { RetitleDeckForm, ViewControls, ViewTextForm } from '../_components/deck-forms';

export const metadata: Metadata = { title: 'Deck' };

export default async function DeckPage({ params }: { params: Promise<{ workspace: string; id: string }> }) {
  const { workspace, id } = await params;
  const ctx = await requirePageMember(workspace, 'decks:read');
  const deck = await getDeck(ctx.workspace.id, id);
  if (!deck) notFound();
  const canEdit = roleCan(ctx.role, 'decks:update');
  const slug = ctx.workspace.slug;
  const base = `/w/${slug}/decks/${deck.id}`;
  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link href={`/w/${slug}/decks`}>← Decks</Link>
      </p>
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1>{deck.title}</h1>
          <p className="text-xs text-ink-muted">
            {deck.views.length} view{deck.views.length === 1 ? '' : 's'} · updated {utcMinute(deck.updatedAt ?? deck.createdAt)}
          </p>
        </div>
        <div className="flex gap-2">
          <Link href={`${base}/present`} className={buttonClass('primary', 'no-underline')}>
            Present
          </Link>
          <Link href={`${base}/print`} className={buttonClass('secondary', 'no-underline')}>
            Print
          </Link>
        </div>
      </header>
      {canEdit ? (
        <Panel className="max-w-2xl">
          <RetitleDeckForm workspaceId={ctx.workspace.id} deckId={deck.id} title={deck.title} />
        </Panel>
      ) : null}
      {deck.views.length === 0 ? (
        <EmptyState title="No views yet">Open a benchmark and choose “Add to deck” on its leaderboard, plots, outliers or method comparison, or on a material page.</EmptyState>
      ) : (
        <ol className="space-y-3" data-testid="deck-views">
          {deck.views.map((v, i) => {
            const newer = v.revision && v.latestNumber !== null && v.latestNumber > v.revision.number;
            return (
              <li key={v.id} className="rounded-lg border border-rule bg-panel p-3" data-testid="deck-view">
                <div className="flex flex-wrap items-start justify-between gap-3">
                  <div>
                    <p className="font-medium">
                      <span className="num mr-2 text-ink-muted">{i + 1}.</span>
                      {v.title ?? VIEW_KIND_LABELS[v.viewKind] ?? v.viewKind}
                    </p>
                    <p className="text-xs text-ink-muted">
                      {VIEW_KIND_LABELS[v.viewKind] ?? v.viewKind}
                      {v.benchmark ? (
                        <>
                          {' · '}
                          <Link href={`/w/${slug}/benchmarks/${v.benchmark.id}${v.revision ? `/revisions/${v.revision.number}` : ''}`}>{v.benchmark.name}</Link>
                        </>
                      ) : null}
                      {v.material ? (
                        <>
                          {' · '}
                          <Link href={`/w/${slug}/materials/${v.material.id}`}>{v.material.name}</Link>
                        </>
                      ) : null}
                      {v.revision ? ` · pinned to revision ${v.revision.number}` : null}
                    </p>
                    {newer ? (
                      <p className="text-xs text-warn" data-testid="newer-revision">
                        A newer revision ({v.latestNumber}) exists.
                      </p>
                    ) : null}
                    {v.problem ? (
                      <p className="text-xs text-bad" data-testid="view-missing">
                        {describeProblem(v.problem)}
                      </p>
                    ) : null}
                  </div>
                  {canEdit ? (
                    <ViewControls workspaceId={ctx.workspace.id} viewId={v.id} first={i === 0} last={i === deck.views.length - 1} canRefresh={!!newer || v.problem?.kind === 'revision-missing'} />
                  ) : null}
                </div>
                {canEdit ? (
                  <div className="mt-2">
                    <ViewTextForm workspaceId={ctx.workspace.id} viewId={v.id} title={v.title} note={v.note} />
                  </div>
                ) : v.note ? (
                  <p className="mt-2 whitespace-pre-wrap text-sm">{v.note}</p>
                ) : null}
              </li>
            );
          })}
        </ol>
      )}
    </div>
  );
}
