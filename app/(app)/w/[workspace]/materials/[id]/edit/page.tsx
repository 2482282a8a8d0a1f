import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { getMaterial } from '@/db/queries/materials';
import { Notice } from '@/components/ui/notice';
import { MaterialForm } from '../../_components/material-form';

export const metadata: Metadata = { title: 'Edit material' };

export default async function EditMaterialPage({ params }: { params: Promise<{ workspace: string; id: string }> }) {
  const { workspace, id } = await params;
  const ctx = await requirePageMember(workspace, 'materials:update');
  const m = await getMaterial(ctx.workspace.id, id);
  if (!m) notFound();
  const back = `/w/${ctx.workspace.slug}/materials/${m.id}`;
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link href={back}>← {m.name}</Link>
      </p>
      <h1>Edit {m.name}</h1>
      {m.retractedAt ? (
        <Notice tone="warn">This material is retracted. Restore it on its page before editing.</Notice>
      ) : (
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
          }}
        />
      )}
    </div>
  );
}
