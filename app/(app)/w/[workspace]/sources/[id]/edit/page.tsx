import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { SOURCE_KIND_LABELS } from '@/lib/catalog/source-schema';
import { getSource } from '@/db/queries/sources';
import { Notice } from '@/components/ui/notice';
import { SourceForm, type SourceFormValues } from '../../_components/source-form';

const TEXT_FIELDS = ['doi', 'title', 'venue', 'volume', 'issue', 'pages', 'articleNumber', 'publisher', 'url', 'accessedOn', 'notebookRef', 'instrument', 'operator', 'recordedOn', 'note'] as const;

export const metadata: Metadata = { title: 'Edit source' };

export default async function EditSourcePage({ params }: { params: Promise<{ workspace: string; id: string }> }) {
  const { workspace, id } = await params;
  const ctx = await requirePageMember(workspace, 'sources:update');
  const s = await getSource(ctx.workspace.id, id);
  if (!s) notFound();
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link href={`/w/${ctx.workspace.slug}/sources/${s.id}`}>← {s.citeKey}</Link>
      </p>
      <h1>Edit {s.citeKey}</h1>
      {s.retractedAt ? (
        <Notice tone="warn">This source is retracted. Restore it on its page before editing.</Notice>
      ) : (
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
      )}
    </div>
  );
}
