import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { minutesOf } from '@/db/queries/comments';
import { parseDateRange } from '@/lib/discussion/date-range';
import { threadPath } from '@/lib/discussion/thread-url';
import { CommentBody } from '@/components/discussion/comment-body';
import { buttonClass } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { Panel } from '@/components/ui/panel';
import { utcMinute } from '@/lib/format';

export const metadata: Metadata = { title: 'Minutes' };

const KIND: Record<string, string> = { 'exclude-pair': 'Excluded pair', 'exclude-measurement': 'Excluded measurement', keep: 'Kept' };

export default async function MinutesPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<{ from?: string; to?: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'comments:read');
  const q = await searchParams;
  const range = parseDateRange(q.from, q.to);
  const slug = ctx.workspace.slug;
  const fallback = parseDateRange(undefined, undefined);
  const shown = range.ok ? range : fallback.ok ? fallback : null;
  const data = shown ? await minutesOf(ctx.workspace.id, shown.from, shown.to) : null;
  const exportHref = shown ? `/api/workspaces/${ctx.workspace.id}/minutes?from=${shown.fromText}&to=${shown.toText}` : null;
  return (
    <div className="space-y-5">
      <header>
        <h1>Minutes</h1>
        <p className="text-sm text-ink-muted">Decisions recorded and discussion threads resolved in a date range (UTC days, both ends included).</p>
      </header>
      <form className="flex flex-wrap items-end gap-3" method="get">
        <label className="space-y-1 text-sm">
          <span className="block text-[13px] font-medium">From</span>
          <input type="date" name="from" defaultValue={shown?.fromText} className={inputClass} />
        </label>
        <label className="space-y-1 text-sm">
          <span className="block text-[13px] font-medium">To</span>
          <input type="date" name="to" defaultValue={shown?.toText} className={inputClass} />
        </label>
        <button type="submit" className={buttonClass('secondary')}>
          Show
        </button>
        {exportHref ? (
          <a href={exportHref} className={buttonClass('primary', 'no-underline')} download>
            Export as Markdown
          </a>
        ) : null}
      </form>
      {!range.ok ? <Notice tone="bad">{range.message} Showing the last seven days instead.</Notice> : null}
      {data ? (
        <>
          <Panel title={`Decisions (${data.decisions.length})`}>
            {data.decisions.length === 0 ? (
              <p className="text-sm text-ink-muted">No decision was recorded in this period.</p>
            ) : (
              <ul className="space-y-2 text-sm" data-testid="minutes-decisions">
                {data.decisions.map((d) => (
                  <li key={d.id} className={d.revertedAt ? 'text-ink-faint line-through' : ''}>
                    <span className="font-medium">{KIND[d.kind] ?? d.kind}</span>: {d.subject}
                    {d.methodLabel ? ` · ${d.methodLabel}` : ''}
                    {d.benchmarkName && d.benchmarkId ? (
                      <>
                        {' · '}
                        <Link href={`/w/${slug}/benchmarks/${d.benchmarkId}`}>{d.benchmarkName}</Link>
                      </>
                    ) : null}{' '}
                    — “{d.reason}” · {d.by ?? 'unknown'}, {utcMinute(d.at)}
                    {d.threadId ? <span className="text-xs text-ink-muted"> · from a discussion</span> : null}
                  </li>
                ))}
              </ul>
            )}
          </Panel>
          <Panel title={`Resolved threads (${data.threads.length})`}>
            {data.threads.length === 0 ? (
              <p className="text-sm text-ink-muted">No thread was resolved in this period.</p>
            ) : (
              <ul className="space-y-4 text-sm" data-testid="minutes-threads">
                {data.threads.map((t) => (
                  <li key={t.id} className="space-y-1">
                    <p>
                      <Link href={threadPath(slug, t)} className="font-medium">
                        {t.subject}
                      </Link>
                      {t.benchmarkName ? <span className="text-ink-muted"> · {t.benchmarkName}</span> : null}
                      <span className="text-xs text-ink-muted">
                        {' '}
                        · resolved by {t.resolvedByName ?? 'unknown'}, {utcMinute(t.resolvedAt!)}
                      </span>
                    </p>
                    <ol className="space-y-1 border-l-2 border-rule pl-3">
                      {t.comments.map((c) => (
                        <li key={c.id}>
                          <span className="text-xs text-ink-muted">
                            {c.authorName ?? 'former member'}, {utcMinute(c.createdAt)}
                          </span>
                          <CommentBody body={c.body} />
                        </li>
                      ))}
                    </ol>
                  </li>
                ))}
              </ul>
            )}
          </Panel>
        </>
      ) : null}
    </div>
  );
}
