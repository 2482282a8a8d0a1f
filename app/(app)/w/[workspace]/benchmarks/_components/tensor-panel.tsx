import type { TensorComparisonRecord } from '@/lib/benchmark/types';
import { header, stat } from '@/lib/format';

/** Born charges: the full-tensor difference ‖ΔZ‖_F per method, where both sides hold a tensor. */
export function TensorPanel({ tensors, pairsByMethod }: { tensors: TensorComparisonRecord[]; pairsByMethod: Map<string, number> }) {
  return (
    <div className="space-y-2">
      <p className="text-xs text-ink-muted">
        ‖ΔZ‖ = √Σ(Z_method − Z_reference)² over the nine components, for the pairs whose two sides both hold a full tensor (N here may be smaller than the leaderboard&apos;s N, which counts every
        pair by the mean of the diagonal). Both tensors must be written in the same Cartesian axes.
      </p>
      <table className="w-full max-w-2xl text-sm" data-testid="tensor-table">
        <caption className="sr-only">Frobenius difference of the Born-charge tensors per method</caption>
        <thead>
          <tr className="text-left">
            <th scope="col">Method</th>
            <th scope="col" className="text-right">N with tensors</th>
            <th scope="col" className="text-right">{header('Mean ‖ΔZ‖', 'e')}</th>
            <th scope="col" className="text-right">{header('Max ‖ΔZ‖', 'e')}</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {tensors.map((t) => (
            <tr key={t.methodId}>
              <td>{t.label}</td>
              <td className="num text-right">
                {t.n} of {pairsByMethod.get(t.methodId) ?? 0}
              </td>
              <td className="num text-right">{stat('error', t.meanFrobenius)}</td>
              <td className="num text-right">{stat('error', t.maxFrobenius)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
