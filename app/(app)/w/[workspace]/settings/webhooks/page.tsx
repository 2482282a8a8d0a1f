import type { Metadata } from 'next';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { listWebhookDeliveries } from '@/db/queries/mail';
import { privateWebhookTargetsAllowed } from '@/db/queries/settings';
import { Panel } from '@/components/ui/panel';
import { WebhookNetworkForm } from './_components/webhook-network-form';

export const metadata: Metadata = { title: 'Webhooks' };

const STATUS_CLASS: Record<string, string> = {
  sent: 'bg-good-soft text-good',
  pending: 'bg-accent-soft text-accent-strong',
  sending: 'bg-accent-soft text-accent-strong',
  failed: 'bg-bad-soft text-bad',
};

const time = new Intl.DateTimeFormat('en-GB', { dateStyle: 'short', timeStyle: 'medium', timeZone: 'UTC' });

export default async function WebhooksPage({ params }: { params: Promise<{ workspace: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'settings:read');
  const [rows, allowPrivate] = await Promise.all([listWebhookDeliveries(ctx.workspace.id), privateWebhookTargetsAllowed(ctx.workspace.id)]);
  return (
    <div className="space-y-5">
      <Panel title="Where webhooks may go">
        <WebhookNetworkForm workspaceId={ctx.workspace.id} allowPrivate={allowPrivate} canChange={roleCan(ctx.role, 'settings:network')} />
      </Panel>
      <Panel title="Webhook deliveries of this workspace (latest 50)">
        <p className="mb-3 text-sm text-ink-muted">
          A watch with a URL gets each alert as a signed POST, through the same outbox as e-mail: retried with back-off on errors, time-outs and 429, and
          marked <strong>failed</strong> here with the receiver&apos;s last answer after the last attempt. Times are UTC.
        </p>
        {rows.length === 0 ? (
          <p className="text-sm text-ink-muted">No webhook delivery from this workspace yet.</p>
        ) : (
          <table className="w-full text-sm" data-testid="webhook-deliveries">
            <thead className="text-left text-xs text-ink-muted">
              <tr>
                <th className="pb-2 font-medium">Created</th>
                <th className="pb-2 font-medium">URL</th>
                <th className="pb-2 font-medium">Event</th>
                <th className="pb-2 font-medium">Status</th>
                <th className="pb-2 text-right font-medium">Attempts</th>
                <th className="pb-2 font-medium">Last error / answer</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {rows.map((r) => (
                <tr key={r.id} className="align-top">
                  <td className="num py-1.5 pr-3 text-ink-muted">{time.format(r.createdAt)}</td>
                  <td className="max-w-[16rem] break-all py-1.5 pr-3 font-mono text-xs">{r.url}</td>
                  <td className="py-1.5 pr-3">
                    {r.summary}
                    <span className="block font-mono text-[11px] text-ink-faint">{r.id}</span>
                  </td>
                  <td className="py-1.5 pr-3 whitespace-nowrap">
                    <span className={`rounded px-1.5 py-0.5 text-xs font-medium ${STATUS_CLASS[r.status]}`}>{r.status}</span>
                    {r.status === 'pending' && r.attempts > 0 ? <span className="block text-xs text-ink-muted">next {time.format(r.nextAttemptAt)}</span> : null}
                  </td>
                  <td className="num py-1.5 pr-3 text-right">{r.attempts}</td>
                  <td className="py-1.5 text-xs text-ink-muted">{r.status === 'sent' ? (r.response ?? '—') : (r.lastError ?? '—')}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Panel>
    </div>
  );
}
