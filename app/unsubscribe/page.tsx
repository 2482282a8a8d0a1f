import type { Metadata } from 'next';
import Link from 'next/link';
import { env } from '@/lib/env';
import { TOKEN_REFUSALS, verifyUnsubscribeToken } from '@/lib/alerts/unsubscribe-token';
import { findWatchForUnsubscribe } from '@/db/queries/watches';
import { Notice } from '@/components/ui/notice';
import { buttonClass } from '@/components/ui/button';

export const metadata: Metadata = { title: 'Unsubscribe', robots: { index: false } };

function Shell({ children }: { children: React.ReactNode }) {
  return (
    <main id="main" tabIndex={-1} className="focus:outline-none flex min-h-screen flex-col items-center justify-center px-4 py-12">
      <Link href="/" className="mb-6 text-lg font-semibold tracking-tight text-ink no-underline">
        Lattice Ledger
      </Link>
      <div className="w-full max-w-md space-y-4 rounded-lg border border-rule bg-panel p-6 shadow-sm">{children}</div>
    </main>
  );
}

/** Public: the signed token in the link is the only authority; showing this page changes nothing. */
export default async function UnsubscribePage({ searchParams }: { searchParams: Promise<{ token?: string | string[]; done?: string }> }) {
  const params = await searchParams;
  const token = typeof params.token === 'string' ? params.token : undefined;
  const check = verifyUnsubscribeToken(token, env().BETTER_AUTH_SECRET);
  if (!check.ok) {
    return (
      <Shell>
        <h1 className="text-lg">Unsubscribe</h1>
        <Notice tone="bad">{TOKEN_REFUSALS[check.reason]}</Notice>
      </Shell>
    );
  }
  const watch = await findWatchForUnsubscribe(check.watchId);
  if (!watch) {
    return (
      <Shell>
        <h1 className="text-lg">Unsubscribe</h1>
        <Notice tone="bad">This watch no longer exists. Nothing was changed.</Notice>
      </Shell>
    );
  }
  if (watch.unsubscribedAt) {
    return (
      <Shell>
        <h1 className="text-lg">Unsubscribed</h1>
        <Notice tone="good">
          {params.done ? 'Done. ' : ''}You get no more alerts for “{watch.benchmarkName}” ({watch.workspaceName}). You can watch it again from the benchmark page.
        </Notice>
      </Shell>
    );
  }
  return (
    <Shell>
      <h1 className="text-lg">Unsubscribe from {watch.benchmarkName}?</h1>
      <p className="text-sm text-ink-muted">
        You will get no more alerts or digests for this benchmark of {watch.workspaceName}. No sign-in is needed.
      </p>
      <form method="post" action={`/api/unsubscribe?token=${encodeURIComponent(token!)}`}>
        <input type="hidden" name="List-Unsubscribe" value="One-Click" />
        <input type="hidden" name="return" value="page" />
        <button type="submit" className={buttonClass('primary')}>
          Unsubscribe
        </button>
      </form>
    </Shell>
  );
}
