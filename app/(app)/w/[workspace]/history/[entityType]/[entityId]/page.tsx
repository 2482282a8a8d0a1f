import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import type { Permission } from '@/lib/permissions';
import { storedValue, unitSymbol, withUnit } from '@/lib/format';
import { listRecordHistory } from '@/db/queries/audit';
import { getValueRecord, type ValueRecord } from '@/db/queries/values';
import { EmptyState } from '@/components/ui/panel';
import { AuditDiff } from '../../_components/audit-diff';

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

/** "GaN-wz E2(high) 569 cm⁻¹ (azuhata1995)": a measured or computed value named by what it is. */
function valueName(v: ValueRecord): string {
  const what = v.quantity === 'frequency' ? (v.irrep ?? 'frequency') : v.quantity;
  const at = v.temperatureK !== null && v.quantity !== 'frequency' ? ` at ${v.temperatureK} K` : '';
  return `${v.materialName} ${what} ${storedValue(v)}${at}${v.methodLabel ? ` · ${v.methodLabel}` : ''} (${v.citeKey})`;
}

const VIA: Record<string, string> = { wizard: 'the import wizard', api: 'the API', form: 'the single-entry form' };

interface Event {
  key: string;
  action: string;
  who: string;
  at: Date;
  body: React.ReactNode;
}

/** A value row's own events: created (by an import or directly) and retracted; its import keeps the audit rows. */
function valueEvents(v: ValueRecord, slug: string): Event[] {
  const events: Event[] = [
    {
      key: 'created',
      action: 'create',
      who: v.contributorName ?? 'unknown',
      at: v.createdAt,
      body: v.importId ? (
        <p className="text-sm">
          Created by the import <Link href={`/w/${slug}/imports/${v.importId}`}>{v.importFileName ?? v.importId.slice(0, 8)}</Link>
          {v.importVia ? ` through ${VIA[v.importVia] ?? v.importVia}` : ''}, as {withUnit(v.valueText, unitSymbol(v.unit))}
          {v.uncertaintyText ? ` ± ${v.uncertaintyText}` : ''}.
        </p>
      ) : (
        <p className="text-sm">
          Created directly, not through an import, as {withUnit(v.valueText, unitSymbol(v.unit))}
          {v.uncertaintyText ? ` ± ${v.uncertaintyText}` : ''}.
        </p>
      ),
    },
  ];
  if (v.retractedAt) {
    events.push({ key: 'retracted', action: 'retract', who: v.retractedByName ?? 'unknown', at: v.retractedAt, body: <p className="text-sm">Reason: {v.retractionReason ?? '—'}</p> });
  }
  return events;
}

export async function generateMetadata({ params }: { params: Promise<{ entityType: string }> }): Promise<Metadata> {
  const { entityType } = await params;
  return { title: `History of a ${(ENTITIES[entityType]?.noun ?? 'record').toLowerCase()}` };
}

export default async function HistoryPage({ params }: { params: Promise<{ workspace: string; entityType: string; entityId: string }> }) {
  const { workspace, entityType, entityId } = await params;
  const entity = ENTITIES[entityType] ?? { permission: 'materials:read' as const, noun: entityType };
  const ctx = await requirePageMember(workspace, entity.permission);
  const slug = ctx.workspace.slug;
  const isValue = entityType === 'measurement' || entityType === 'calculation';
  const [rows, value] = await Promise.all([listRecordHistory(ctx.workspace.id, entityType, entityId), isValue ? getValueRecord(ctx.workspace.id, entityType, entityId) : null]);
  const audited: Event[] = rows.map((r) => ({
    key: r.id,
    action: r.action,
    who: r.actorName ?? (r.actorTokenId ? 'API token' : 'unknown'),
    at: r.createdAt,
    body: (
      <>
        {r.reason && <p className="mb-2 text-sm">Reason: {r.reason}</p>}
        <AuditDiff before={r.before} after={r.after} />
      </>
    ),
  }));
  const events = [...audited, ...(value ? valueEvents(value, slug) : [])].sort((a, b) => b.at.getTime() - a.at.getTime());
  const name = value ? valueName(value) : rows.length ? recordName(rows[0].after, rows[0].before) : null;
  const back = value ? { href: `/w/${slug}/materials/${value.materialId}`, label: value.materialName } : entity.path ? { href: `/w/${slug}/${entity.path}/${entityId}`, label: name ?? entity.noun } : null;
  return (
    <div className="space-y-4">
      {back && (
        <p className="text-sm">
          <Link href={back.href}>← {back.label}</Link>
        </p>
      )}
      <header className="space-y-1">
        <p className="text-xs uppercase tracking-wide text-ink-faint">History of a {entity.noun.toLowerCase()}</p>
        <h1 data-testid="history-title">{name ?? `${entity.noun} not found`}</h1>
        {!name && <p className="font-mono text-xs text-ink-faint">{entityId}</p>}
      </header>
      {events.length === 0 ? (
        <EmptyState title="No history">There is no {entity.noun.toLowerCase()} with this id in the workspace.</EmptyState>
      ) : (
        <ol className="space-y-3" data-testid="history-events">
          {events.map((e) => (
            <li key={e.key} className="rounded-lg border border-rule bg-panel p-3" data-action={e.action}>
              <p className="mb-2 flex flex-wrap items-center gap-2 text-sm">
                <span className={`rounded px-1.5 py-0.5 text-xs font-medium ${ACTION_TONE[e.action] ?? 'bg-paper text-ink-muted'}`}>{e.action}</span>
                <span className="font-medium">{e.who}</span>
                <time className="num text-xs text-ink-muted" dateTime={e.at.toISOString()}>
                  {dateFormat.format(e.at)}
                </time>
              </p>
              {e.body}
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}
