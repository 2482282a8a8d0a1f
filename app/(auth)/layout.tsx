import Link from 'next/link';
import { mailboxEnabled } from '@/lib/env';

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main id="main" tabIndex={-1} className="focus:outline-none flex min-h-screen flex-col items-center justify-center px-4 py-12">
      <Link href="/" className="mb-6 text-lg font-semibold tracking-tight text-ink no-underline">
        Lattice Ledger
      </Link>
      <div className="w-full max-w-sm rounded-lg border border-rule bg-panel p-6 shadow-sm">{children}</div>
      {mailboxEnabled() && (
        <p className="mt-4 text-xs text-ink-faint">
          Development: e-mails land in the <Link href="/dev/mailbox">mailbox</Link>.
        </p>
      )}
    </main>
  );
}
