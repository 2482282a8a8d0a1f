import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { readAlertThresholds } from '@/lib/benchmark/schemas';
import { unitOf } from '@/lib/benchmark/compute';
import { hasOverride, readWatchThresholds } from '@/lib/alerts/thresholds';
import { listMyWatches } from '@/db/queries/watches';
import { listAlertLog } from '@/db/queries/alerts';
import { EmptyState, Panel } from '@/components/ui/panel';
import { WatchSettingsForm } from '@/app/(app)/w/[workspace]/watches/_components/watch-settings-form';
import { UnwatchButton } from '@/app/(app)/w/[workspace]/watches/_components/unwatch-button';
import { WebhookForm } from '@/app/(app)/w/[workspace]/watches/_components/webhook-form';
import type { BenchmarkQuantity } from '@/lib/benchmark/schemas';

export const metadata: Metadata = { title: 'My watches' };

const when = (d: Date | null) => (d ? d.toISOString().replace('T', ' ').slice(0, 16) + ' UTC' : '—');

const STATUS: Record<string, string> = { pending: 'queued', sending: 'sending', sent: 'sent', failed: 'failed' };

export default async function WatchesPage({ params }: { params: Promise<{ workspace: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'benchmarks:read');
  const watches = await listMyWatches(ctx.workspace.id, ctx.user.id);
  const logs = await Promise.all(watches.map((w) => listAlertLog(ctx.workspace.id, w.id, 20)));
  const active = watches.filter((w) => !w.unsubscribedAt && !w.benchmarkRetractedAt);

  return (
    <div className="space-y-5">
      <header className="space-y-1">
        <h1>My watches</h1>
        <p className="text-sm text-ink-muted">
          Benchmarks you follow. When new data shift one beyond your thresholds, you get an e-mail (or a daily digest), compared with the last revision you were
          told about, and a signed POST to your webhook URL if you give one.
        </p>
      </header>
      {watches.length === 0 ? (
        <EmptyState title="You watch no benchmark yet">
          Open a <Link href={`/w/${ctx.workspace.slug}/benchmarks`}>benchmark</Link> and press “Watch”.
        </EmptyState>
      ) : null}
      {watches.map((w, i) => {
        const stopped = Boolean(w.unsubscribedAt || w.benchmarkRetractedAt);
        const log = logs[i];
        return (
          <Panel
            key={w.id}
            title={
              <Link href={`/w/${ctx.workspace.slug}/benchmarks/${w.benchmarkId}`} className="no-underline">
                {w.benchmarkName}
              </Link>
            }
            actions={
              stopped ? (
                <span className="text-xs text-ink-muted">{w.benchmarkRetractedAt ? 'benchmark retracted' : `stopped ${when(w.unsubscribedAt)}`}</span>
              ) : (
                <UnwatchButton workspaceId={ctx.workspace.id} watchId={w.id} benchmarkName={w.benchmarkName} />
              )
            }
          >
            <div className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]" data-testid={`watch-${w.benchmarkId}`}>
              <div className="space-y-2">
                <p className="text-xs text-ink-muted">
                  Watching since {when(w.createdAt)} · {w.mode === 'digest' ? 'daily digest' : 'an e-mail per shift'} · last revision you were told about:{' '}
                  {w.baselineNumber ?? 'none yet'} · thresholds: {hasOverride(readWatchThresholds(w.thresholds)) ? 'your own' : 'the benchmark’s'}
                </p>
                {stopped ? (
                  <p className="text-sm text-ink-muted">
                    No alerts. {w.benchmarkRetractedAt ? null : 'Press “Watch” on the benchmark page to follow it again.'}
                  </p>
                ) : (
                  <WatchSettingsForm
                    workspaceId={ctx.workspace.id}
                    watch={{ id: w.id, mode: w.mode, thresholds: readWatchThresholds(w.thresholds) }}
                    defaults={readAlertThresholds(w.benchmarkThresholds, w.benchmarkQuantity as BenchmarkQuantity)}
                    unit={unitOf(w.benchmarkQuantity as BenchmarkQuantity)}
                  />
                )}
                {stopped ? null : <WebhookForm workspaceId={ctx.workspace.id} watch={{ id: w.id, url: w.webhookUrl, secretCreatedAt: w.webhookSecretCreatedAt }} />}
              </div>
              <div>
                <h3 className="mb-2 text-[13px] font-medium">Alert log</h3>
                {log.length === 0 ? (
                  <p className="text-sm text-ink-muted">Nothing sent yet: no shift has crossed your thresholds since you started watching.</p>
                ) : (
                  <table className="w-full text-[13px]" data-testid="alert-log">
                    <thead className="text-left text-xs text-ink-muted">
                      <tr>
                        <th className="pb-1 font-medium">Written</th>
                        <th className="pb-1 font-medium">Subject</th>
                        <th className="pb-1 font-medium">Delivery</th>
                      </tr>
                    </thead>
                    <tbody>
                      {log.map((m) => (
                        <tr key={m.id} className="border-t border-rule/70 align-top">
                          <td className="num py-1 pr-2 whitespace-nowrap">{when(m.createdAt)}</td>
                          <td className="py-1 pr-2">
                            {m.channel === 'webhook' ? <span className="mr-1 rounded bg-accent-soft px-1 text-xs text-accent-strong">webhook</span> : null}
                            {m.subject}
                          </td>
                          <td className="py-1 whitespace-nowrap">
                            {STATUS[m.status] ?? m.status}
                            {m.sentAt ? ` ${when(m.sentAt)}` : ''}
                            {m.attempts > 1 ? ` · ${m.attempts} attempts` : ''}
                          </td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                )}
              </div>
            </div>
          </Panel>
        );
      })}
      {watches.length > 0 && active.length === 0 ? <p className="text-sm text-ink-muted">None of your watches is active.</p> : null}
    </div>
  );
}
