import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import type { Permission } from '@/lib/permissions';
import { db } from '@/db/client';
import { listAudit } from '@/db/queries/audit';
import { EmptyState } from '@/components/ui/panel';
import { AuditDiff } from '../../_components/audit-diff';

export const metadata: Metadata = { title: 'History' };

/** Which permission reads the history of each kind of record, and where the record lives. */
const ENTITIES: Record<string, { permission: Permission; noun: string; path?: string }> = {
  material: { permission: 'materials:read', noun: 'Material', path: 'materials' },
  source: { permission: 'sources:read', noun: 'Source', path: 'sources' },
  method: { permission: 'methods:read', noun: 'Method', path: 'methods' },
  measurement: { permission: 'measurements:read', noun: 'Measurement' },
  calculation: { permission: 'calculations:read', noun: 'Calculation' },
  import: { permission: 'imports:read', noun: 'Import', path: 'imports' },
  benchmark: { permission: 'benchmarks:read', noun: 'Benchmark', path: 'benchmarks' },
};

const dateFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'medium' });

const ACTION_TONE: Record<string, string> = {
  create: 'bg-good-soft text-good',
  update: 'bg-accent-soft text-accent-strong',
  retract: 'bg-bad-soft text-bad',
  restore: 'bg-warn-soft text-warn',
};

function recordName(after: unknown, before: unknown): string | null {
  for (const snap of [after, before]) {
    if (snap && typeof snap === 'object') {
      const s = snap as Record<string, unknown>;
      const name = s.name ?? s.citeKey ?? s.label;
      if (typeof name === 'string') return name;
    }
  }
  return null;
}

export default async function HistoryPage({ params }: { params: Promise<{ workspace: string; entityType: string; entityId: string }> }) {
  const { workspace, entityType, entityId } = await params;
  const entity = ENTITIES[entityType] ?? { permission: 'materials:read' as const, noun: entityType };
  const ctx = await requirePageMember(workspace, entity.permission);
  const rows = await listAudit(db, ctx.workspace.id, entityType, entityId);
  const name = rows.length ? recordName(rows[0].after, rows[0].before) : null;
  const back = entity.path ? `/w/${ctx.workspace.slug}/${entity.path}/${entityId}` : null;
  return (
    <div className="space-y-4">
      {back && (
        <p className="text-sm">
          <Link href={back}>← {name ?? entity.noun}</Link>
        </p>
      )}
      <h1>
        History of {entity.noun.toLowerCase()} {name ?? <span className="font-mono text-base">{entityId}</span>}
      </h1>
      {rows.length === 0 ? (
        <EmptyState title="No history">There is no record of this kind with this id in the workspace, or it has never been changed.</EmptyState>
      ) : (
        <ol className="space-y-3">
          {rows.map((r) => (
            <li key={r.id} className="rounded-lg border border-rule bg-panel p-3">
              <p className="mb-2 flex flex-wrap items-center gap-2 text-sm">
                <span className={`rounded px-1.5 py-0.5 text-xs font-medium ${ACTION_TONE[r.action] ?? 'bg-paper text-ink-muted'}`}>{r.action}</span>
                <span className="font-medium">{r.actorName ?? (r.actorTokenId ? 'API token' : 'unknown')}</span>
                <time className="num text-xs text-ink-muted" dateTime={r.createdAt.toISOString()}>
                  {dateFormat.format(r.createdAt)}
                </time>
              </p>
              {r.reason && <p className="mb-2 text-sm">Reason: {r.reason}</p>}
              <AuditDiff before={r.before} after={r.after} />
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}
