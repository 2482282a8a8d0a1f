import Link from 'next/link';

export default function NotFound() {
  return (
    <main id="main" tabIndex={-1} className="focus:outline-none mx-auto max-w-lg space-y-3 px-6 py-24 text-center">
      <p className="text-xs uppercase tracking-wide text-ink-faint">404</p>
      <h1>Not found</h1>
      <p className="text-sm text-ink-muted">This page does not exist, or it belongs to a workspace you are not a member of.</p>
      <p className="text-sm">
        <Link href="/w">Your workspaces</Link>
      </p>
    </main>
  );
}
