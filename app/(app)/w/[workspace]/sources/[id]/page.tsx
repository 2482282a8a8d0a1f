import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { SOURCE_KIND_LABELS } from '@/lib/catalog/source-schema';
import { doiUrl } from '@/lib/catalog/doi';
import { getSource } from '@/db/queries/sources';
import { buttonClass } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { FieldList } from '@/components/ui/field-list';
import { Panel } from '@/components/ui/panel';
import { RetractionForm } from '../../history/_components/retraction-form';
import { restoreSourceAction, retractSourceAction } from '../actions';

export const metadata: Metadata = { title: 'Source' };

const dateFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

export default async function SourcePage({ params }: { params: Promise<{ workspace: string; id: string }> }) {
  const { workspace, id } = await params;
  const ctx = await requirePageMember(workspace, 'sources:read');
  const s = await getSource(ctx.workspace.id, id);
  if (!s) notFound();
  const slug = ctx.workspace.slug;
  const notebook = s.kind === 'in-house-notebook';
  const fields: Array<[string, React.ReactNode]> = notebook
    ? [
        ['Notebook reference', s.notebookRef],
        ['Date recorded', s.recordedOn ?? '–'],
        ['Instrument', s.instrument ?? '–'],
        ['Operator', s.operator ?? '–'],
        ['Title', s.title ?? '–'],
      ]
    : [
        ['Title', s.title ?? '–'],
        ['Authors', s.authors ?? '–'],
        ['Year', s.year ?? '–'],
        ['Venue', s.venue ?? '–'],
        [
          'DOI',
          s.doi ? (
            <a key="doi" href={doiUrl(s.doi)} target="_blank" rel="noreferrer noopener">
              {s.doi}
            </a>
          ) : (
            '–'
          ),
        ],
        [
          'URL',
          s.url ? (
            <a key="url" href={s.url} target="_blank" rel="noreferrer noopener">
              {s.url}
            </a>
          ) : (
            '–'
          ),
        ],
      ];
  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link href={`/w/${slug}/sources`}>← Sources</Link>
      </p>
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1>{s.citeKey}</h1>
          <p className="text-sm text-ink-muted">{SOURCE_KIND_LABELS[s.kind]}</p>
        </div>
        <div className="flex gap-2">
          <a href={`/api/workspaces/${ctx.workspace.id}/sources/bibtex?ids=${s.id}`} className={buttonClass('ghost', 'no-underline')} download>
            BibTeX
          </a>
          {!s.retractedAt && roleCan(ctx.role, 'sources:update') && (
            <Link href={`/w/${slug}/sources/${s.id}/edit`} className={buttonClass('secondary', 'no-underline')}>
              Edit
            </Link>
          )}
          <Link href={`/w/${slug}/history/source/${s.id}`} className={buttonClass('ghost', 'no-underline')}>
            History
          </Link>
        </div>
      </header>
      {s.retractedAt && (
        <Notice tone="warn">
          Retracted {dateFormat.format(s.retractedAt)}: {s.retractionReason}
        </Notice>
      )}
      <Panel title="Citation">
        <FieldList fields={fields} columns="sm:grid-cols-2" />
      </Panel>
      {roleCan(ctx.role, 'sources:retract') && (
        <Panel title={s.retractedAt ? 'Restore' : 'Retract'} className="max-w-xl">
          <RetractionForm workspaceId={ctx.workspace.id} id={s.id} mode={s.retractedAt ? 'restore' : 'retract'} action={s.retractedAt ? restoreSourceAction : retractSourceAction} noun="source" />
        </Panel>
      )}
    </div>
  );
}
