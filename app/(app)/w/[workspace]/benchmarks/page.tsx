import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { listBenchmarks } from '@/db/queries/benchmarks';
import { EmptyState } from '@/components/ui/panel';
import { buttonClass } from '@/components/ui/button';
import { CANONICAL_UNIT_SYMBOL, count, header, stat, withUnit } from '@/lib/format';
import { QUANTITY_TITLE } from '@/lib/benchmark/quantities';
import type { BenchmarkQuantity } from '@/lib/benchmark/schemas';

export const metadata = { title: 'Benchmarks' };

export default async function BenchmarksPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const ctx = await requirePageMember(slug, 'benchmarks:read');
  const rows = await listBenchmarks(ctx.workspace.id);
  const canCreate = roleCan(ctx.role, 'benchmarks:create');
  // MAE is in the unit of each benchmark's quantity: one unit in the header when every row shares it
  const units = [...new Set(rows.map((b) => CANONICAL_UNIT_SYMBOL[b.quantity]))];
  const oneUnit = units.length === 1 ? units[0] : null;
  return (
    <div className="space-y-4">
      <div className="flex items-center justify-between gap-3">
        <h1>Benchmarks</h1>
        {canCreate ? (
          <Link href={`/w/${slug}/benchmarks/new`} className={buttonClass('primary')}>
            New benchmark
          </Link>
        ) : null}
      </div>
      {rows.length === 0 ? (
        <EmptyState title="No benchmark yet">
          A benchmark is a saved comparison: a scope (quantity, techniques, temperature window, material classes, methods) and rules (pairing window, outlier rule).
          {canCreate ? ' Create one to see its leaderboard and plots.' : ' A curator or owner can create one.'}
        </EmptyState>
      ) : (
        <table className="min-w-full border-collapse rounded-lg border border-rule bg-panel text-sm">
          <thead className="border-b border-rule text-left text-ink-muted">
            <tr>
              <th className="px-3 py-2 font-medium">Name</th>
              <th className="px-3 py-2 font-medium">Quantity</th>
              <th className="px-3 py-2 font-medium">Latest revision</th>
              <th className="px-3 py-2 font-medium">Methods · pairs</th>
              <th className="px-3 py-2 font-medium">{oneUnit ? header('Best MAE', oneUnit) : 'Best MAE (unit of the quantity)'}</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((b) => (
              <tr key={b.id} className="border-b border-rule/70">
                <td className="px-3 py-2">
                  <Link href={`/w/${slug}/benchmarks/${b.id}`} className="font-medium">
                    {b.name}
                  </Link>
                  {b.purpose ? <span className="block text-xs text-ink-muted">{b.purpose}</span> : null}
                </td>
                <td className="px-3 py-2">{QUANTITY_TITLE[b.quantity as BenchmarkQuantity] ?? b.quantity}</td>
                <td className="num px-3 py-2">{b.revisionNumber ?? '—'}</td>
                <td className="num px-3 py-2">
                  {b.methodCount} · {count(b.pairCount)}
                </td>
                <td className="num px-3 py-2" data-stat="best-mae">
                  {b.best ? (
                    <>
                      {oneUnit ? stat('error', b.best.mae) : withUnit(stat('error', b.best.mae), CANONICAL_UNIT_SYMBOL[b.quantity])}{' '}
                      <span className="text-ink-muted">
                        ({b.best.label}, {b.best.common ? 'common ' : ''}N = {b.best.n})
                      </span>
                    </>
                  ) : (
                    '—'
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </div>
  );
}
