import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageMember } from '@/lib/session';
import { ImportWizard } from '@/components/import/import-wizard';

export const metadata: Metadata = { title: 'New import' };

export default async function NewImportPage({ params }: { params: Promise<{ workspace: string }> }) {
  const ctx = await requirePageMember((await params).workspace, 'imports:create');
  return (
    <div className="space-y-5">
      <header className="space-y-1">
        <p className="text-xs text-ink-muted">
          <Link href={`/w/${ctx.workspace.slug}/imports`}>Imports</Link> /
        </p>
        <h1>New import</h1>
        <p className="max-w-3xl text-sm text-ink-muted">
          Every measurement or calculation row needs a material, a source and (for calculations) a method that already exist in this workspace, or, for
          calculations, the choice to create missing materials and methods from the row’s catalogue columns. Materials, methods and sources themselves can be
          imported in bulk too. The file is checked in your browser, then again on the server; it is imported completely or not at all. Only one value to add? Use the single-entry form for a{' '}
          <Link href={`/w/${ctx.workspace.slug}/measurements/new`}>measurement</Link> or a <Link href={`/w/${ctx.workspace.slug}/calculations/new`}>calculation</Link>.
        </p>
      </header>
      <ImportWizard workspaceId={ctx.workspace.id} slug={ctx.workspace.slug} />
    </div>
  );
}
