import type { Metadata } from 'next';
import Link from 'next/link';
import { headers } from 'next/headers';
import { notFound } from 'next/navigation';
import { isDirectLoopback } from '@/lib/client-address';
import { env, mailboxEnabled } from '@/lib/env';

export const metadata: Metadata = { title: 'Development mailbox' };
export const dynamic = 'force-dynamic';

interface Message {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text?: string;
  html?: string;
}

async function fetchMessages(): Promise<{ messages: Message[]; error?: string }> {
  const base = env().RESEND_BASE_URL;
  if (!base) return { messages: [], error: 'RESEND_BASE_URL is not set: the app is not pointed at the local mail fake.' };
  try {
    const res = await fetch(`${base}/__mailbox`, { cache: 'no-store' });
    if (!res.ok) return { messages: [], error: `The mail fake answered ${res.status}.` };
    return (await res.json()) as { messages: Message[] };
  } catch {
    return { messages: [], error: `The mail fake at ${base} is not running (npm run mail:fake).` };
  }
}

export default async function MailboxPage({ searchParams }: { searchParams: Promise<{ id?: string }> }) {
  // It shows password-reset links: only on this machine, and in production only when explicitly enabled.
  if (!mailboxEnabled() || !isDirectLoopback(await headers())) notFound();
  const { id } = await searchParams;
  const { messages, error } = await fetchMessages();
  const selected = messages.find((m) => m.id === id) ?? messages[0];
  return (
    <main id="main" tabIndex={-1} className="focus:outline-none mx-auto max-w-6xl space-y-4 px-6 py-8">
      <header className="flex items-baseline justify-between">
        <div>
          <p className="text-xs uppercase tracking-wide text-warn">Development only</p>
          <h1>Mailbox</h1>
          <p className="text-sm text-ink-muted">What the local mail fake received. Nothing here left this machine.</p>
        </div>
        <Link href="/w">Back to the app</Link>
      </header>
      {error && <p className="rounded-md border border-bad/30 bg-bad-soft px-3 py-2 text-sm text-bad">{error}</p>}
      <div className="grid gap-4 md:grid-cols-[20rem_minmax(0,1fr)]">
        <ul className="divide-y divide-rule rounded-lg border border-rule bg-panel" aria-label="Messages">
          {messages.length === 0 && <li className="p-3 text-sm text-ink-muted">No messages yet.</li>}
          {messages.map((m) => (
            <li key={m.id}>
              <Link
                href={`/dev/mailbox?id=${m.id}`}
                className={`block px-3 py-2 text-sm no-underline ${selected?.id === m.id ? 'bg-accent-soft' : 'hover:bg-paper'}`}
                data-testid="mailbox-item"
              >
                <span className="block font-medium text-ink">{m.subject}</span>
                <span className="block truncate text-xs text-ink-muted">to {m.to.join(', ')}</span>
                <span className="num block text-xs text-ink-faint">{new Date(m.receivedAt).toLocaleString('en-GB')}</span>
              </Link>
            </li>
          ))}
        </ul>
        {selected && (
          <article className="space-y-3 rounded-lg border border-rule bg-panel p-4" data-testid="mailbox-message">
            <dl className="grid grid-cols-[5rem_1fr] gap-1 text-sm">
              <dt className="text-ink-muted">From</dt>
              <dd>{selected.from}</dd>
              <dt className="text-ink-muted">To</dt>
              <dd>{selected.to.join(', ')}</dd>
              <dt className="text-ink-muted">Subject</dt>
              <dd className="font-medium">{selected.subject}</dd>
            </dl>
            {selected.html && (
              // sandbox without allow-scripts: the HTML is rendered, never executed
              <iframe title="HTML body" sandbox="allow-popups allow-top-navigation-by-user-activation" srcDoc={`<base target="_top">${selected.html}`} className="h-96 w-full rounded border border-rule bg-white" />
            )}
            {selected.text && (
              <details open={!selected.html}>
                <summary className="cursor-pointer text-sm text-ink-muted">Plain text</summary>
                <pre className="mt-2 whitespace-pre-wrap font-mono text-xs" data-testid="mailbox-text">
                  {selected.text}
                </pre>
              </details>
            )}
          </article>
        )}
      </div>
    </main>
  );
}
