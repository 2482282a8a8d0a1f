import type { Metadata } from 'next';
import { requirePageMember } from '@/lib/session';
import { listOutbox } from '@/db/queries/mail';
import { Panel } from '@/components/ui/panel';

export const metadata: Metadata = { title: 'Mail delivery' };

const STATUS_CLASS: Record<string, string> = {
  sent: 'bg-good-soft text-good',
  pending: 'bg-accent-soft text-accent-strong',
  sending: 'bg-accent-soft text-accent-strong',
  failed: 'bg-bad-soft text-bad',
};

const time = new Intl.DateTimeFormat('en-GB', { dateStyle: 'short', timeStyle: 'medium' });

export default async function MailPage({ params }: { params: Promise<{ workspace: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'settings:read');
  const rows = await listOutbox(ctx.workspace.id);
  return (
    <Panel title="Outbox of this workspace (latest 50)">
      <p className="mb-3 text-sm text-ink-muted">
        Every e-mail is written to the outbox with the change that caused it, then delivered with retries. A message that still fails after all
        attempts is marked <strong>failed</strong> here with the provider&apos;s last answer.
      </p>
      {rows.length === 0 ? (
        <p className="text-sm text-ink-muted">No e-mail sent from this workspace yet.</p>
      ) : (
        <table className="w-full text-sm">
          <thead className="text-left text-xs text-ink-muted">
            <tr>
              <th className="pb-2 font-medium">Created</th>
              <th className="pb-2 font-medium">To</th>
              <th className="pb-2 font-medium">Subject</th>
              <th className="pb-2 font-medium">Status</th>
              <th className="pb-2 text-right font-medium">Attempts</th>
              <th className="pb-2 font-medium">Last error</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-rule">
            {rows.map((r) => (
              <tr key={r.id}>
                <td className="num py-1.5 pr-3 text-ink-muted">{time.format(r.createdAt)}</td>
                <td className="py-1.5 pr-3">{r.toAddress}</td>
                <td className="py-1.5 pr-3">{r.subject}</td>
                <td className="py-1.5 pr-3">
                  <span className={`rounded px-1.5 py-0.5 text-xs font-medium ${STATUS_CLASS[r.status]}`}>{r.status}</span>
                </td>
                <td className="num py-1.5 pr-3 text-right">{r.attempts}</td>
                <td className="py-1.5 text-xs text-ink-muted">{r.lastError ?? '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </Panel>
  );
}
