import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { requirePageMember } from '@/lib/session';
import { roleCan } from '@/lib/permissions';
import { SOURCE_KIND_LABELS } from '@/lib/catalog/source-schema';
import { doiUrl } from '@/lib/catalog/doi';
import { formatAuthors } from '@/lib/citations/authors';
import { describeGaps } from '@/lib/citations/completeness';
import { EXPORT_FORMAT_NAMES, EXPORT_FORMATS } from '@/lib/citations/formats';
import { CITATION_STYLES, howToCiteSource, type CitationStyle } from '@/lib/citations/how-to-cite';
import { namesToReview } from '@/lib/citations/names';
import { getSource } from '@/db/queries/sources';
import { buttonClass } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { FieldList } from '@/components/ui/field-list';
import { Panel } from '@/components/ui/panel';
import { IncompleteMark } from '@/components/citations/incomplete-mark';
import { RetractionForm } from '../../history/_components/retraction-form';
import { restoreSourceAction, retractSourceAction } from '../actions';
import { RetractedNotice } from '../../_components/record-pages';

export const metadata: Metadata = { title: 'Source' };

export default async function SourcePage({ params }: { params: Promise<{ workspace: string; id: string }> }) {
  const { workspace, id } = await params;
  const ctx = await requirePageMember(workspace, 'sources:read');
  const s = await getSource(ctx.workspace.id, id);
  if (!s) notFound();
  const slug = ctx.workspace.slug;
  const notebook = s.kind === 'in-house-notebook';
  const dash = (v: string | number | null) => v ?? '–';
  const link = (href: string | null, text: string | null) =>
    href ? (
      <a key={href} href={href} target="_blank" rel="noreferrer noopener">
        {text}
      </a>
    ) : (
      '–'
    );
  const people: Array<[string, React.ReactNode]> = [['Authors', formatAuthors(s.authorList) || '–']];
  if (s.editorList?.length) people.push(['Editors', formatAuthors(s.editorList)]);
  const fields: Array<[string, React.ReactNode]> = notebook
    ? [
        ['Notebook reference', s.notebookRef],
        ['Date recorded', dash(s.recordedOn)],
        ['Instrument', dash(s.instrument)],
        ['Operator', dash(s.operator)],
        ['Title', dash(s.title)],
        ...people,
      ]
    : [
        ['Title', dash(s.title)],
        ...people,
        ['Year', dash(s.year)],
        [s.kind === 'journal-article' ? 'Journal' : 'Container', dash(s.venue)],
        ['Volume · issue', [s.volume, s.issue].filter(Boolean).join(' · ') || '–'],
        ['Pages', dash(s.pages ?? (s.articleNumber ? `article ${s.articleNumber}` : null))],
        [s.kind === 'thesis' ? 'School' : 'Publisher', dash(s.publisher)],
        ['DOI', link(s.doi ? doiUrl(s.doi) : null, s.doi)],
        ['URL', link(s.url, s.url)],
        ['Accessed on', dash(s.accessedOn)],
      ];
  if (s.note) fields.push(['Note', s.note]);
  const gaps = describeGaps(s.gaps);
  const review = namesToReview([...(s.authorList ?? []), ...(s.editorList ?? [])]);
  const exportBase = `/api/workspaces/${ctx.workspace.id}/sources/export?ids=${s.id}`;
  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link href={`/w/${slug}/sources`}>← Sources</Link>
      </p>
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1>{s.citeKey}</h1>
          <p className="text-sm text-ink-muted">
            {SOURCE_KIND_LABELS[s.kind]}
            <IncompleteMark gaps={s.gaps} />
          </p>
        </div>
        <div className="flex gap-2">
          {EXPORT_FORMAT_NAMES.map((f) => (
            <a key={f} href={`${exportBase}&format=${f}`} className={buttonClass('ghost', 'no-underline')} download>
              {EXPORT_FORMATS[f].label}
            </a>
          ))}
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
      <RetractedNotice at={s.retractedAt} reason={s.retractionReason} />
      {gaps && (
        <Notice tone="warn">
          {gaps} Values citing it are marked in tables and benchmarks until it is completed.
          {review.length ? ` Names kept as written: ${review.map((n) => n.literal).join('; ')} — edit the source to split them.` : ''}
        </Notice>
      )}
      <Panel title="Citation">
        <FieldList fields={fields} columns="sm:grid-cols-2" />
      </Panel>
      <Panel title="How to cite">
        <dl className="space-y-2 text-sm" data-testid="how-to-cite-source">
          {(Object.keys(CITATION_STYLES) as CitationStyle[]).map((style) => (
            <div key={style}>
              <dt className="text-xs text-ink-muted">{CITATION_STYLES[style]}</dt>
              <dd>{howToCiteSource(s, style)}</dd>
            </div>
          ))}
        </dl>
      </Panel>
      {roleCan(ctx.role, 'sources:retract') && (
        <Panel title={s.retractedAt ? 'Restore' : 'Retract'} className="max-w-xl">
          <RetractionForm workspaceId={ctx.workspace.id} id={s.id} mode={s.retractedAt ? 'restore' : 'retract'} action={s.retractedAt ? restoreSourceAction : retractSourceAction} noun="source" />
        </Panel>
      )}
    </div>
  );
}
