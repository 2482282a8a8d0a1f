/** A titled box. With an `id`, it can take focus (a place to send focus after an action). */
export function Panel({ title, actions, children, className = '', id }: { title?: React.ReactNode; actions?: React.ReactNode; children: React.ReactNode; className?: string; id?: string }) {
  return (
    <section id={id} tabIndex={id ? -1 : undefined} aria-label={id && typeof title === 'string' ? title : undefined} className={`min-w-0 rounded-lg border border-rule bg-panel focus:outline-none focus-visible:ring-2 focus-visible:ring-accent ${className}`}>
      {(title || actions) && (
        <header className="flex items-center justify-between gap-3 border-b border-rule px-4 py-2.5">
          {title ? <h2 className="text-sm font-semibold">{title}</h2> : <span />}
          {actions}
        </header>
      )}
      <div className="p-4">{children}</div>
    </section>
  );
}

export function EmptyState({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-rule-strong bg-panel/60 px-6 py-10 text-center">
      <p className="text-sm font-semibold text-ink">{title}</p>
      <div className="mx-auto mt-2 max-w-xl text-sm text-ink-muted">{children}</div>
    </div>
  );
}
