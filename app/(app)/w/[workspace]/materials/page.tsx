import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { parseListParams } from '@/lib/catalog/list-params';
import { CRYSTAL_SYSTEMS } from '@/lib/catalog/material-schema';
import { listMaterials, listMaterialTags } from '@/db/queries/materials';
import { buttonClass } from '@/components/ui/button';
import { MaterialsTable } from './_components/materials-table';

export const metadata: Metadata = { title: 'Materials' };

export default async function MaterialsPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const ctx = await requirePageMember((await params).workspace, 'materials:read');
  const list = parseListParams(await searchParams);
  const [{ rows, total, sort }, tags] = await Promise.all([listMaterials(ctx.workspace.id, list), listMaterialTags(ctx.workspace.id)]);
  const slug = ctx.workspace.slug;
  return (
    <div className="space-y-4">
      <header className="flex items-center justify-between gap-3">
        <div>
          <h1>Materials</h1>
          <p className="text-sm text-ink-muted">Crystals with their formula, space group and material classes. Open one to see measured peaks beside each method&apos;s modes.</p>
        </div>
        {roleCan(ctx.role, 'materials:create') && (
          <Link href={`/w/${slug}/materials/new`} className={buttonClass('primary', 'no-underline')}>
            New material
          </Link>
        )}
      </header>
      <MaterialsTable
        slug={slug}
        rows={rows.map(({ retractedAt, ...r }) => ({ ...r, retracted: Boolean(retractedAt) }))}
        rowCount={total}
        state={{ page: list.page, size: list.size, sort, dir: list.dir }}
        tags={tags}
        systems={CRYSTAL_SYSTEMS}
      />
    </div>
  );
}
