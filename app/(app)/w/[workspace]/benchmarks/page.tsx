import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { listBenchmarks } from '@/db/queries/benchmarks';
import { EmptyState } from '@/components/ui/panel';
import { buttonClass } from '@/components/ui/button';

export const metadata = { title: 'Benchmarks' };

export default async function BenchmarksPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const ctx = await requirePageMember(slug, 'benchmarks:read');
  const rows = await listBenchmarks(ctx.workspace.id);
  const canCreate = roleCan(ctx.role, 'benchmarks:create');
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
              <th className="px-3 py-2 font-medium">Best MAE</th>
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
                <td className="px-3 py-2">{b.quantity === 'frequency' ? 'Γ-point frequency' : 'Vibrational entropy'}</td>
                <td className="num px-3 py-2">{b.revisionNumber ?? '—'}</td>
                <td className="num px-3 py-2">
                  {b.methodCount} · {b.pairCount.toLocaleString('en')}
                </td>
                <td className="num px-3 py-2">{b.best ? `${b.best.mae.toFixed(2)} (${b.best.label}, ${b.best.common ? "common " : ""}N = ${b.best.n})` : "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </div>
  );
}
