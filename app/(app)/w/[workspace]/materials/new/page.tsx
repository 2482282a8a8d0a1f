import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { MaterialForm } from '../_components/material-form';

export const metadata: Metadata = { title: 'New material' };

export default async function NewMaterialPage({ params }: { params: Promise<{ workspace: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'materials:create');
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link href={`/w/${ctx.workspace.slug}/materials`}>← Materials</Link>
      </p>
      <h1>New material</h1>
      <MaterialForm
        workspaceId={ctx.workspace.id}
        slug={ctx.workspace.slug}
        initial={{ name: '', displayName: '', formula: '', spaceGroup: '', atomsInCell: '', externalId: '', tags: '', thermalExpansionPerK: '', bulkModulusGpa: '', molarVolumeCm3: '' }}
      />
    </div>
  );
}
