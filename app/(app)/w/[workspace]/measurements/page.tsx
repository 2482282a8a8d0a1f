import type { Metadata } from 'next';
import { ExportCsvLink } from './_components/export-link';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { buttonClass } from '@/components/ui/button';
import { parseValueListParams } from '@/lib/catalog/value-list-params';
import { QUANTITIES, TECHNIQUES } from '@/db/schema/values';
import { listMeasurementRows } from '@/db/queries/values';
import { ValuesTable } from './_components/values-table';
import { toValueRow } from './_components/value-row';

export const metadata: Metadata = { title: 'Measurements' };

export default async function MeasurementsPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const ctx = await requirePageMember((await params).workspace, 'measurements:read');
  const query = await searchParams;
  const list = parseValueListParams(query);
  const { rows, total, sort } = await listMeasurementRows(ctx.workspace.id, list);
  return (
    <div className="space-y-4">
      <header className="space-y-1">
        <div className="flex items-center justify-between gap-3">
          <h1>Measurements</h1>
          <div className="flex flex-wrap items-center gap-2">
            {roleCan(ctx.role, 'measurements:create') && (
              <Link href={`/w/${ctx.workspace.slug}/measurements/new`} className={buttonClass('secondary', 'no-underline')}>
                Add one measurement
              </Link>
            )}
            <ExportCsvLink workspaceId={ctx.workspace.id} kind="measurements" searchParams={query} />
          </div>
        </div>
        <p className="text-sm text-ink-muted">
          Measured peaks and entropies with their source. The value is shown as entered (with its unit) and in canonical units; every row links to its import and history.
        </p>
      </header>
      <ValuesTable
        slug={ctx.workspace.slug}
        kind="measurements"
        rows={rows.map(toValueRow)}
        rowCount={total}
        state={{ page: list.page, size: list.size, sort, dir: list.dir }}
        filters={[
          { param: 'quantity', label: 'Quantity', options: QUANTITIES.map((q) => ({ value: q, label: q })) },
          { param: 'technique', label: 'Technique', options: TECHNIQUES.map((t) => ({ value: t, label: t })) },
        ]}
      />
    </div>
  );
}
