import Link from 'next/link';
import { Panel } from '@/components/ui/panel';
import type { MethodQuality } from '@/lib/benchmark/material-quality';
import { counted, trueMinus } from '@/lib/format';

const SEVERITY_CLASS = { error: 'bg-bad-soft text-bad', warning: 'bg-warn-soft text-warn' } as const;

/** Per method, the quality flags of its calculation set of this material (code, severity, message). */
export function QualityFlags({ slug, results, thresholdsHref }: { slug: string; results: MethodQuality[]; thresholdsHref: string }) {
  if (results.length === 0) return null;
  return (
    <Panel
      title="Quality checks of the computed modes"
      actions={
        <Link href={thresholdsHref} className="text-xs">
          Thresholds
        </Link>
      }
    >
      <ul className="divide-y divide-rule text-sm" aria-label="Quality flags per method">
        {results.map((r) => (
          <li key={r.methodId} className="py-2" data-testid={`quality-${r.methodId}`}>
            <p className="font-medium">
              <Link href={`/w/${slug}/methods/${r.methodId}`}>{r.methodLabel}</Link>{' '}
              <span className="num text-xs font-normal text-ink-muted">({counted(r.modeCount, 'mode')})</span>
            </p>
            {r.flags.length === 0 ? (
              <p className="text-good">No flags.</p>
            ) : (
              <ul className="mt-1 space-y-1">
                {r.flags.map((f) => (
                  <li key={f.code} className="flex flex-wrap items-baseline gap-2">
                    <span className={`rounded px-1.5 text-xs font-medium ${SEVERITY_CLASS[f.severity]}`}>{f.severity}</span>
                    <code className="font-mono text-xs text-ink-muted">{f.code}</code>
                    <span>{trueMinus(f.message)}</span>
                  </li>
                ))}
              </ul>
            )}
            {r.skipped.length > 0 && <p className="mt-1 text-xs text-ink-faint">Not checked — {r.skipped.join('; ')}.</p>}
          </li>
        ))}
      </ul>
    </Panel>
  );
}
