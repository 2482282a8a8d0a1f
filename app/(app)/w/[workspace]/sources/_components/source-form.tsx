'use client';
import { useState } from 'react';
import { SelectField, TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormMessage } from '@/components/ui/form-message';
import { useRecordForm } from '@/components/ui/use-record-form';
import type { PersonName } from '@/lib/citations/names';
import { createSourceAction, updateSourceAction } from '../actions';
import { NameListField } from './name-list-field';

export interface SourceFormValues {
  id?: string;
  kind: string;
  citeKey: string;
  doi: string;
  title: string;
  authors: PersonName[];
  editors: PersonName[];
  year: string;
  venue: string;
  volume: string;
  issue: string;
  pages: string;
  articleNumber: string;
  publisher: string;
  url: string;
  accessedOn: string;
  notebookRef: string;
  instrument: string;
  operator: string;
  recordedOn: string;
  note: string;
}

export const EMPTY_SOURCE: SourceFormValues = {
  kind: 'journal-article',
  citeKey: '',
  doi: '',
  title: '',
  authors: [],
  editors: [],
  year: '',
  venue: '',
  volume: '',
  issue: '',
  pages: '',
  articleNumber: '',
  publisher: '',
  url: '',
  accessedOn: '',
  notebookRef: '',
  instrument: '',
  operator: '',
  recordedOn: '',
  note: '',
};

/** Errors of a list field and of its items ("authors.2.family"). */
function listErrors(errors: Record<string, string[]>, name: string): string[] | undefined {
  const out = Object.entries(errors)
    .filter(([k]) => k === name || k.startsWith(`${name}.`))
    .flatMap(([k, v]) => (k === name ? v : v.map((m) => `Name ${Number(k.split('.')[1]) + 1}: ${m}`)));
  return out.length ? out : undefined;
}

export function SourceForm({ workspaceId, slug, initial, kinds }: { workspaceId: string; slug: string; initial: SourceFormValues; kinds: Array<{ value: string; label: string }> }) {
  const editing = Boolean(initial.id);
  const { state, pending, errors, onSubmit } = useRecordForm(editing ? updateSourceAction : createSourceAction, `/w/${slug}/sources`);
  const [kind, setKind] = useState(initial.kind);
  const notebook = kind === 'in-house-notebook';
  const text = (label: string, name: Exclude<keyof SourceFormValues, 'id' | 'authors' | 'editors'>, extra: Partial<React.ComponentProps<typeof TextField>> = {}) => (
    <TextField label={label} name={name} defaultValue={initial[name]} errors={errors[name]} {...extra} />
  );

  return (
    <form className="grid max-w-3xl gap-4 sm:grid-cols-2" noValidate onSubmit={onSubmit}>
      <input type="hidden" name="workspaceId" value={workspaceId} />
      {initial.id && <input type="hidden" name="id" value={initial.id} />}
      <SelectField label="Kind" name="kind" value={kind} onChange={(e) => setKind(e.target.value)} errors={errors.kind}>
        {kinds.map((k) => (
          <option key={k.value} value={k.value}>
            {k.label}
          </option>
        ))}
      </SelectField>
      {text('Cite key (unique)', 'citeKey', { hint: 'Used by imports, e.g. "azuhata1995".', required: true })}
      {notebook ? (
        <>
          {text('Notebook reference', 'notebookRef', { hint: 'e.g. LN-3 p. 41', required: true })}
          {text('Date recorded', 'recordedOn', { type: 'date' })}
          {text('Instrument', 'instrument')}
          {text('Operator', 'operator')}
          <div className="sm:col-span-2">{text('Title (optional)', 'title')}</div>
          <div className="sm:col-span-2">
            <NameListField label="Authors (optional)" name="authors" initial={initial.authors} errors={listErrors(errors, 'authors')} />
          </div>
        </>
      ) : (
        <>
          {text('DOI', 'doi', { hint: '10.NNNN/… — a https://doi.org/ or doi: prefix is removed; stored lower-case.' })}
          {text('Year', 'year', { inputMode: 'numeric' })}
          <div className="sm:col-span-2">{text('Title', 'title', { required: true })}</div>
          <div className="sm:col-span-2">
            <NameListField label="Authors" name="authors" initial={initial.authors} errors={listErrors(errors, 'authors')} />
          </div>
          {text(kind === 'journal-article' ? 'Journal' : 'Container (series, journal or collection)', 'venue')}
          {text(kind === 'thesis' ? 'School' : 'Publisher', 'publisher')}
          <div className="grid grid-cols-2 gap-4 sm:col-span-2 sm:grid-cols-4">
            {text('Volume', 'volume')}
            {text('Issue', 'issue')}
            {text('Pages', 'pages', { hint: 'e.g. 712–716 or L129' })}
            {text('Article number', 'articleNumber')}
          </div>
          {text('URL', 'url', { type: 'url' })}
          {text('Accessed on', 'accessedOn', { type: 'date', hint: 'For web pages and data sets.' })}
          <div className="sm:col-span-2">
            <NameListField label="Editors" name="editors" initial={initial.editors} errors={listErrors(errors, 'editors')} hint="Only for a chapter or a collection; same forms as the authors." />
          </div>
        </>
      )}
      <div className="sm:col-span-2">{text('Note', 'note', { hint: 'What a reader should know, e.g. “values read from Fig. 3”.' })}</div>
      <div className="flex items-center gap-3 sm:col-span-2">
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : editing ? 'Save source' : 'Create source'}
        </Button>
        {!state.ok && <FormMessage state={state} />}
      </div>
    </form>
  );
}
