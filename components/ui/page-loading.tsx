/** What a slow feature page shows while its data loads: its name, and a polite busy region for screen readers. */
export function PageLoading({ what }: { what: string }) {
  return (
    <div role="status" aria-live="polite" className="space-y-3">
      <p className="text-sm text-ink-muted">Loading {what}…</p>
      <div aria-hidden className="h-40 animate-pulse rounded-lg border border-rule bg-panel" />
    </div>
  );
}
