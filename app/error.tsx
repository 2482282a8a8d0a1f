'use client';

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main id="main" tabIndex={-1} className="focus:outline-none mx-auto max-w-lg space-y-3 px-6 py-24 text-center">
      <h1>Something went wrong</h1>
      <p className="text-sm text-ink-muted">
        The page could not be shown. Nothing was changed by this error.{error.digest ? ` Reference: ${error.digest}.` : ''}
      </p>
      <button type="button" onClick={reset} className="text-sm text-accent underline">
        Try again
      </button>
    </main>
  );
}
