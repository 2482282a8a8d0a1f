import Link from 'next/link';
import type { MemberContext } from '@/lib/session';
import type { ImportableKind } from '@/lib/import/columns';
import { loadImportReferences } from '@/db/queries/imports';
import { Panel } from '@/components/ui/panel';
import { SingleEntryForm } from './single-entry-form';

const byName = (a: string, b: string) => a.localeCompare(b, 'en', { numeric: true });

/** The page around the single-entry form of measurements or calculations. */
export async function SingleEntryPage({ ctx, kind, material }: { ctx: MemberContext; kind: ImportableKind; material?: string }) {
  const refs = await loadImportReferences(ctx.workspace.id);
  const choices = {
    materials: [...refs.materials].map(([name, m]) => ({ id: m.id, name })).sort((a, b) => byName(a.name, b.name)),
    sources: [...refs.sources].map(([citeKey, id]) => ({ id, citeKey })).sort((a, b) => byName(a.citeKey, b.citeKey)),
    methods: [...refs.methods].map(([label, id]) => ({ id, label })).sort((a, b) => byName(a.label, b.label)),
  };
  const slug = ctx.workspace.slug;
  const measured = kind === 'measurements';
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link href={`/w/${slug}/${kind}`}>← {measured ? 'Measurements' : 'Calculations'}</Link>
      </p>
      <header className="space-y-1">
        <h1>{measured ? 'Add one measurement' : 'Add one calculation'}</h1>
        <p className="max-w-3xl text-sm text-ink-muted">
          {measured ? 'A measured peak position or an entropy, with its source.' : 'A computed mode or entropy of one method.'} For more than a few rows, a{' '}
          <Link href={`/w/${slug}/imports/new`}>CSV import</Link> is quicker; both go through the same checks, and both recompute the benchmarks and alert their watchers.
        </p>
      </header>
      <Panel>
        <SingleEntryForm workspaceId={ctx.workspace.id} slug={slug} kind={kind} choices={choices} initialMaterial={material && refs.materials.has(material) ? material : ''} />
      </Panel>
    </div>
  );
}
