import Link from 'next/link';
import type { ReferenceRecord } from '@/lib/benchmark/types';
import { buttonClass } from '@/components/ui/button';
import { counted, header, percentOf, stat } from '@/lib/format';

/** Against a reference method: per candidate, |Δ| and |Δ|/ref and the share of materials within the tolerance. */
export function ReferencePanel({ reference, unit, convergenceHref }: { reference: ReferenceRecord; unit: string; convergenceHref: string }) {
  const { matchedBy } = reference;
  return (
    <div className="space-y-2">
      <p className="text-xs text-ink-muted">
        Δ = candidate − reference ({reference.label}). A material is within tolerance when its largest |Δ| is at most {reference.tolerance}
        {unit ? ` ${unit}` : ''}. Mode lists matched by mode index: {counted(matchedBy.index, 'material × method', 'material × method pairs')}; by the pairing rules with activities
        ignored: {matchedBy.pairing}. Acoustic modes of the reference are left out.
      </p>
      <div className="overflow-x-auto">
        <table className="w-full text-sm" data-testid="reference-table">
          <caption className="sr-only">Candidate methods against the reference method</caption>
          <thead>
            <tr className="text-left">
              <th scope="col">Method</th>
              <th scope="col" className="text-right">N pairs</th>
              <th scope="col" className="text-right">{header('Mean |Δ|', unit)}</th>
              <th scope="col" className="text-right">{header('Max |Δ|', unit)}</th>
              <th scope="col" className="text-right">Mean |Δ|/ref (%)</th>
              <th scope="col" className="text-right">Max |Δ|/ref (%)</th>
              <th scope="col" className="text-right">Materials within tolerance</th>
            </tr>
          </thead>
          <tbody>
            {reference.perMethod.map((m) => (
              <tr key={m.methodId} className="border-t border-line">
                <th scope="row" className="text-left font-normal">{m.label}</th>
                <td className="text-right tabular-nums">{m.n}</td>
                <td className="text-right tabular-nums">{stat('error', m.meanAbsolute)}</td>
                <td className="text-right tabular-nums">{stat('error', m.maxAbsolute)}</td>
                <td className="text-right tabular-nums">{m.meanRelative === null ? '—' : stat('percent', 100 * m.meanRelative)}</td>
                <td className="text-right tabular-nums">{m.maxRelative === null ? '—' : stat('percent', 100 * m.maxRelative)}</td>
                <td className="text-right tabular-nums">
                  {m.withinTolerance} of {m.materials}
                  {m.shareWithin === null ? '' : ` (${percentOf(m.shareWithin)})`}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p>
        <Link href={convergenceHref} className={buttonClass('secondary')}>
          Convergence view
        </Link>
      </p>
    </div>
  );
}
