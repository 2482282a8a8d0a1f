import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { SOURCE_KIND_LABELS } from '@/lib/catalog/source-schema';
import { EMPTY_SOURCE, SourceForm } from '../_components/source-form';

export const metadata: Metadata = { title: 'New source' };

export default async function NewSourcePage({ params }: { params: Promise<{ workspace: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'sources:create');
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link href={`/w/${ctx.workspace.slug}/sources`}>← Sources</Link>
      </p>
      <h1>New source</h1>
      <SourceForm
        workspaceId={ctx.workspace.id}
        slug={ctx.workspace.slug}
        kinds={Object.entries(SOURCE_KIND_LABELS).map(([value, label]) => ({ value, label }))}
        initial={EMPTY_SOURCE}
      />
    </div>
  );
}
