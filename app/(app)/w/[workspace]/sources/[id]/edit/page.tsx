import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { SOURCE_KIND_LABELS } from '@/lib/catalog/source-schema';
import { getSource } from '@/db/queries/sources';
import { SourceForm, type SourceFormValues } from '../../_components/source-form';
import { EditRecordFrame } from '../../../_components/record-pages';

const TEXT_FIELDS = ['doi', 'title', 'venue', 'volume', 'issue', 'pages', 'articleNumber', 'publisher', 'url', 'accessedOn', 'notebookRef', 'instrument', 'operator', 'recordedOn', 'note'] as const;

export const metadata: Metadata = { title: 'Edit source' };

export default async function EditSourcePage({ params }: { params: Promise<{ workspace: string; id: string }> }) {
  const { workspace, id } = await params;
  const ctx = await requirePageMember(workspace, 'sources:update');
  const s = await getSource(ctx.workspace.id, id);
  if (!s) notFound();
  return (
    <EditRecordFrame backHref={`/w/${ctx.workspace.slug}/sources/${s.id}`} name={s.citeKey} noun="source" retracted={Boolean(s.retractedAt)}>
      <SourceForm
        workspaceId={ctx.workspace.id}
        slug={ctx.workspace.slug}
        kinds={Object.entries(SOURCE_KIND_LABELS).map(([value, label]) => ({ value, label }))}
        initial={{
          id: s.id,
          kind: s.kind,
          citeKey: s.citeKey,
          authors: s.authorList ?? [],
          editors: s.editorList ?? [],
          year: s.year?.toString() ?? '',
          ...Object.fromEntries(TEXT_FIELDS.map((k) => [k, s[k] ?? ''])),
        } as SourceFormValues}
      />
    </EditRecordFrame>
  );
}
