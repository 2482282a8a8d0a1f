import Link from 'next/link';
import type { HistoryEntry } from '@/db/queries/revisions';
import { signed, stat, utcMinute as when } from '@/lib/format';

/** Timeline of revisions, newest first: what changed and the per-method deltas against the revision before. */
export function RevisionHistory({
  history,
  base,
  current,
  imports,
  decisions,
}: {
  history: HistoryEntry[];
  base: string;
  current: number;
  imports: Map<string, { fileName: string | null; by: string | null; status: string }>;
  decisions: Map<string, { kind: string; reason: string; by: string | null }>;
}) {
  return (
    <ol className="space-y-3" data-testid="revision-history">
      {history.map((h, i) => {
        const older = history[i + 1];
        const before = new Map(older?.methods.map((m) => [m.methodId, m]) ?? []);
        const c = h.cause;
        const rows = c?.rows;
        return (
          <li key={h.id} className={`rounded-md border px-3 py-2 text-sm ${h.number === current ? 'border-accent/50 bg-accent-soft/40' : 'border-rule'}`}>
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <Link href={`${base}/revisions/${h.number}`} className="font-medium">
                Revision {h.number}
              </Link>
              <span className="text-xs text-ink-muted">
                {when(h.createdAt)} · sha256:{h.fingerprint.slice(0, 12)}
              </span>
            </div>
            <ul className="mt-1 list-disc space-y-0.5 pl-5 text-ink-muted">
              {!older ? <li>First revision.</li> : null}
              {rows && (rows.measurementsAdded || rows.measurementsRemoved || rows.calculationsAdded || rows.calculationsRemoved) ? (
                <li>
                  Measurements +{rows.measurementsAdded} / −{rows.measurementsRemoved}; calculations +{rows.calculationsAdded} / −{rows.calculationsRemoved} (removed: retracted or out of scope)
                </li>
              ) : null}
              {c?.imports.map((imp) => {
                const meta = imports.get(imp.id);
                return (
                  <li key={imp.id}>
                    Import {meta?.fileName ?? imp.id.slice(0, 8)} by {meta?.by ?? 'a pipeline'}: {imp.rows} rows{meta?.status === 'undone' ? ' (since undone)' : ''}
                  </li>
                );
              })}
              {c?.decisions.added.map((id) => (
                <li key={`d+${id}`}>
                  Decision: {decisions.get(id)?.kind ?? 'decision'} — “{decisions.get(id)?.reason ?? id}” by {decisions.get(id)?.by ?? 'someone'}
                </li>
              ))}
              {c?.decisions.reverted.map((id) => (
                <li key={`d-${id}`}>
                  Reverted: {decisions.get(id)?.kind ?? 'decision'} — “{decisions.get(id)?.reason ?? id}”
                </li>
              ))}
              {c && (c.pins.added.length || c.pins.revoked.length) ? (
                <li>
                  Pins: +{c.pins.added.length} / −{c.pins.revoked.length}
                </li>
              ) : null}
              {c?.reported.some((r) => r.trigger === 'benchmark-updated') ? <li>Scope or rules edited.</li> : null}
            </ul>
            {older ? (
              <table className="mt-2 text-xs">
                <tbody>
                  {h.methods.map((m) => {
                    const was = before.get(m.methodId);
                    const dMae = m.mae !== null && was?.mae !== null && was?.mae !== undefined ? m.mae - was.mae : null;
                    return (
                      <tr key={m.methodId}>
                        <td className="pr-3 font-medium">{m.label}</td>
                        <td className="num pr-3">
                          N {was ? `${was.n} → ` : ''}
                          {m.n}
                        </td>
                        <td className="num pr-3">
                          MAE {was ? `${stat('error', was.mae)} → ` : ''}
                          {stat('error', m.mae)} {dMae !== null && Math.abs(dMae) > 0 ? `(${signed(dMae, 3)})` : ''}
                        </td>
                        <td className="num">
                          excluded {was ? `${was.excluded} → ` : ''}
                          {m.excluded}
                        </td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            ) : null}
          </li>
        );
      })}
    </ol>
  );
}
