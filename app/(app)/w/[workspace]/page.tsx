import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { workspaceOverview } from '@/db/queries/overview';
import { listBenchmarks } from '@/db/queries/benchmarks';
import { listImports } from '@/db/queries/imports';
import { Panel } from '@/components/ui/panel';
import { ROLE_DESCRIPTIONS } from '@/lib/permissions';
import { count, stat, withUnit } from '@/lib/format';
import { QUANTITY_UNIT } from '@/lib/benchmark/quantities';
import type { BenchmarkQuantity } from '@/lib/benchmark/schemas';

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });

export default async function OverviewPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const ctx = await requirePageMember(slug, 'materials:read');
  const [o, benchmarks, imports] = await Promise.all([workspaceOverview(ctx.workspace.id), listBenchmarks(ctx.workspace.id), listImports(ctx.workspace.id, { page: 1, size: 6 })]);
  const counts = [
    { label: 'Materials', value: o.materials, href: 'materials' },
    { label: 'Sources', value: o.sources, href: 'sources' },
    { label: 'Methods', value: o.methods, href: 'methods' },
    { label: 'Measurements', value: o.measurements, href: 'measurements' },
    { label: 'Calculations', value: o.calculations, href: 'calculations' },
    { label: 'Members', value: o.members, href: 'settings/members' },
  ];
  const flagged = benchmarks.filter((b) => b.outlierCount + b.qualityFlagCount > 0);
  return (
    <div className="space-y-6">
      <header>
        <p className="text-xs uppercase tracking-wide text-ink-faint">Workspace</p>
        <h1>{ctx.workspace.name}</h1>
        <p className="text-sm text-ink-muted">
          You are <strong>{ctx.role}</strong>: {ROLE_DESCRIPTIONS[ctx.role]}
        </p>
      </header>
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6">
        {counts.map((c) => (
          <div key={c.label} className="relative rounded-lg border border-rule bg-panel px-4 py-3 focus-within:border-accent hover:border-accent/50">
            <dt className="text-xs">
              {/* the link covers the whole card, so the card stays one click target */}
              <Link href={`/w/${slug}/${c.href}`} className="text-ink-muted no-underline after:absolute after:inset-0 after:content-['']">
                {c.label}
              </Link>
            </dt>
            <dd className="num text-2xl font-semibold text-ink">{count(c.value)}</dd>
          </div>
        ))}
      </dl>
      <div className="grid gap-4 lg:grid-cols-3">
        <Panel title="Benchmarks">
          {benchmarks.length === 0 ? (
            <p className="text-sm text-ink-muted">
              No benchmark yet. <Link href={`/w/${slug}/benchmarks/new`}>Define one</Link>: a scope of measurements and methods, and the rules that pair them.
            </p>
          ) : (
            <ul className="space-y-2 text-sm">
              {benchmarks.map((b) => (
                <li key={b.id}>
                  <Link href={`/w/${slug}/benchmarks/${b.id}`} className="font-medium">
                    {b.name}
                  </Link>
                  <span className="block text-xs text-ink-muted">
                    {b.best ? (
                      <>
                        best MAE <span className="num">{withUnit(stat('error', b.best.mae), QUANTITY_UNIT[b.quantity as BenchmarkQuantity] ?? '')}</span> ({b.best.label},{' '}
                        {b.best.common ? `on the N = ${count(b.best.n)} pairs the ${b.best.ranked} ranked methods share` : `N = ${count(b.best.n)}`}
                        {b.best.coverage != null ? `, coverage ${Math.round(100 * b.best.coverage)} %` : ''}) · {b.best.ranked} of {b.methodCount} methods ranked · revision {b.revisionNumber}
                      </>
                    ) : (
                      'no statistics yet'
                    )}
                  </span>
                </li>
              ))}
            </ul>
          )}
        </Panel>
        <Panel title="Recent imports">
          {imports.items.length === 0 ? (
            <p className="text-sm text-ink-muted">
              No import yet. <Link href={`/w/${slug}/imports/new`}>Import measurements or calculations</Link> from a CSV file.
            </p>
          ) : (
            <ul className="space-y-2 text-sm">
              {imports.items.map((i) => (
                <li key={i.id}>
                  <Link href={`/w/${slug}/imports/${i.id}`}>{i.fileName ?? i.kind}</Link>
                  <span className="block text-xs text-ink-muted">
                    <span className="num">{count(i.insertedCount)}</span> {i.kind} · {i.creatorName ?? i.tokenName ?? 'a pipeline'} · {when.format(i.createdAt)} UTC
                    {i.status === 'undone' ? ' · undone' : ''}
                  </span>
                </li>
              ))}
            </ul>
          )}
        </Panel>
        <Panel title="Open flags">
          {flagged.length === 0 ? (
            <p className="text-sm text-ink-muted">No outlier or quality warning in the latest revisions.</p>
          ) : (
            <ul className="space-y-2 text-sm">
              {flagged.map((b) => (
                <li key={b.id}>
                  <Link href={`/w/${slug}/benchmarks/${b.id}`}>{b.name}</Link>
                  <span className="block text-xs text-ink-muted">
                    <span className="num">{b.outlierCount}</span> outliers flagged · <span className="num">{b.qualityFlagCount}</span> quality flags
                  </span>
                </li>
              ))}
            </ul>
          )}
        </Panel>
      </div>
    </div>
  );
}
