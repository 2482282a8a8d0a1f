import type { Metadata } from 'next';
import { ExportCsvLink } from '../measurements/_components/export-link';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { buttonClass } from '@/components/ui/button';
import { parseValueListParams } from '@/lib/catalog/value-list-params';
import { QUANTITIES } from '@/db/schema/values';
import { listCalculationRows, listMethodChoices } from '@/db/queries/values';
import { ValuesTable } from '../measurements/_components/values-table';
import { toValueRow } from '../measurements/_components/value-row';

export const metadata: Metadata = { title: 'Calculations' };

export default async function CalculationsPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const ctx = await requirePageMember((await params).workspace, 'calculations:read');
  const query = await searchParams;
  const list = parseValueListParams(query);
  const [{ rows, total, sort }, methods] = await Promise.all([listCalculationRows(ctx.workspace.id, list), listMethodChoices(ctx.workspace.id)]);
  return (
    <div className="space-y-4">
      <header className="space-y-1">
        <div className="flex items-center justify-between gap-3">
          <h1>Calculations</h1>
          <div className="flex flex-wrap items-center gap-2">
            {roleCan(ctx.role, 'calculations:create') && (
              <Link href={`/w/${ctx.workspace.slug}/calculations/new`} className={buttonClass('secondary', 'no-underline')}>
                Add one calculation
              </Link>
            )}
            <ExportCsvLink workspaceId={ctx.workspace.id} kind="calculations" searchParams={query} />
          </div>
        </div>
        <p className="text-sm text-ink-muted">
          Computed modes and entropies, one row per value, with the method that produced them. The value is shown as entered (with its unit) and in canonical units.
        </p>
      </header>
      <ValuesTable
        slug={ctx.workspace.slug}
        kind="calculations"
        rows={rows.map(toValueRow)}
        rowCount={total}
        state={{ page: list.page, size: list.size, sort, dir: list.dir }}
        filters={[
          { param: 'quantity', label: 'Quantity', options: QUANTITIES.map((q) => ({ value: q, label: q })) },
          { param: 'method', label: 'Method', options: methods.map((m) => ({ value: m.id, label: m.label })) },
        ]}
      />
    </div>
  );
}
