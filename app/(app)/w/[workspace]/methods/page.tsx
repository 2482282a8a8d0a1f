import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { parseListParams } from '@/lib/catalog/list-params';
import { formatGrid } from '@/lib/catalog/k-point-density';
import { APPROACH_LABELS } from '@/lib/catalog/method-schema';
import { listMethods } from '@/db/queries/methods';
import { buttonClass } from '@/components/ui/button';
import { MethodsTable } from './_components/methods-table';

export const metadata: Metadata = { title: 'Methods' };

function yesNo(v: boolean | null): string {
  return v == null ? '–' : v ? 'yes' : 'no';
}

export default async function MethodsPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const ctx = await requirePageMember((await params).workspace, 'methods:read');
  const list = parseListParams(await searchParams);
  const { rows, total, sort } = await listMethods(ctx.workspace.id, list);
  const slug = ctx.workspace.slug;
  return (
    <div className="space-y-4">
      <header className="flex items-center justify-between gap-3">
        <div>
          <h1>Methods</h1>
          <p className="text-sm text-ink-muted">Computational recipes: functional, pseudopotentials, cutoff, grids and how the phonons were obtained.</p>
        </div>
        {roleCan(ctx.role, 'methods:create') && (
          <Link href={`/w/${slug}/methods/new`} className={buttonClass('primary', 'no-underline')}>
            New method
          </Link>
        )}
      </header>
      <MethodsTable
        slug={slug}
        rows={rows.map(({ retractedAt, kGrid, qGrid, approach, nonAnalyticCorrection, ...r }) => ({
          ...r,
          kGrid: formatGrid(kGrid) || '–',
          qGrid: formatGrid(qGrid) || '–',
          approach: approach ? APPROACH_LABELS[approach] : '–',
          lotoCorrection: yesNo(nonAnalyticCorrection),
          retracted: Boolean(retractedAt),
        }))}
        rowCount={total}
        state={{ page: list.page, size: list.size, sort, dir: list.dir }}
      />
    </div>
  );
}
