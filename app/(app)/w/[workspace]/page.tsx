import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { workspaceOverview } from '@/db/queries/overview';
import { Panel } from '@/components/ui/panel';
import { ROLE_DESCRIPTIONS } from '@/lib/permissions';

export default async function OverviewPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const ctx = await requirePageMember(slug, 'materials:read');
  const o = await workspaceOverview(ctx.workspace.id);
  const counts = [
    { label: 'Materials', value: o.materials, href: 'materials' },
    { label: 'Sources', value: o.sources, href: 'sources' },
    { label: 'Methods', value: o.methods, href: 'methods' },
    { label: 'Measurements', value: o.measurements, href: 'materials' },
    { label: 'Calculations', value: o.calculations, href: 'materials' },
    { label: 'Members', value: o.members, href: 'settings/members' },
  ];
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
          <Link key={c.label} href={`/w/${slug}/${c.href}`} className="rounded-lg border border-rule bg-panel px-4 py-3 no-underline hover:border-accent/50">
            <dt className="text-xs text-ink-muted">{c.label}</dt>
            <dd className="num text-2xl font-semibold text-ink">{c.value.toLocaleString('en')}</dd>
          </Link>
        ))}
      </dl>
      <div className="grid gap-4 lg:grid-cols-3">
        <Panel title="Benchmarks">
          <p className="text-sm text-ink-muted">
            Saved comparisons of methods against measurements, with their headline MAE and N, will be listed here once a benchmark exists.
          </p>
        </Panel>
        <Panel title="Recent imports">
          <p className="text-sm text-ink-muted">Upload batches of measurements and calculations, newest first, will appear here.</p>
        </Panel>
        <Panel title="Open flags">
          <p className="text-sm text-ink-muted">Outliers and quality warnings awaiting a curator&apos;s decision will appear here.</p>
        </Panel>
      </div>
    </div>
  );
}
