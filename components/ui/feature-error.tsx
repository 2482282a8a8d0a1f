'use client';

/** The error boundary of one feature area: the rest of the workspace (navigation, other pages) keeps working. */
export function FeatureError({ area, error, reset }: { area: string; error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div role="alert" className="mx-auto max-w-xl space-y-3 rounded-lg border border-rule bg-panel px-6 py-10 text-center">
      <h1 className="text-base font-semibold">{area} could not be shown</h1>
      <p className="text-sm text-ink-muted">
        Nothing was changed by this error. Try again; if it persists, tell your workspace owner{error.digest ? ` and quote reference ${error.digest}` : ''}.
      </p>
      <button type="button" onClick={reset} className="rounded border border-rule-strong px-3 py-1.5 text-sm text-accent hover:bg-canvas">
        Try again
      </button>
    </div>
  );
}
