import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { getMaterial } from '@/db/queries/materials';
import { MaterialForm } from '../../_components/material-form';
import { EditRecordFrame } from '../../../_components/record-pages';

export const metadata: Metadata = { title: 'Edit material' };

export default async function EditMaterialPage({ params }: { params: Promise<{ workspace: string; id: string }> }) {
  const { workspace, id } = await params;
  const ctx = await requirePageMember(workspace, 'materials:update');
  const m = await getMaterial(ctx.workspace.id, id);
  if (!m) notFound();
  const back = `/w/${ctx.workspace.slug}/materials/${m.id}`;
  return (
    <EditRecordFrame backHref={back} name={m.name} noun="material" retracted={Boolean(m.retractedAt)}>
      <MaterialForm
        workspaceId={ctx.workspace.id}
        slug={ctx.workspace.slug}
        initial={{
          id: m.id,
          name: m.name,
          displayName: m.displayName ?? '',
          formula: m.formula,
          spaceGroup: m.spaceGroup?.toString() ?? '',
          atomsInCell: m.atomsInCell?.toString() ?? '',
          externalId: m.externalId ?? '',
          tags: m.tags.join(', '),
          thermalExpansionPerK: m.thermalExpansionPerK?.toString() ?? '',
          bulkModulusGpa: m.bulkModulusGpa?.toString() ?? '',
          molarVolumeCm3: m.molarVolumeCm3?.toString() ?? '',
        }}
      />
    </EditRecordFrame>
  );
}
