'use client';
import { useState } from 'react';
import { SelectField, TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormMessage } from '@/components/ui/form-message';
import { useRecordForm } from '@/components/ui/use-record-form';
import { createSourceAction, updateSourceAction } from '../actions';

export interface SourceFormValues {
  id?: string;
  kind: string;
  citeKey: string;
  doi: string;
  title: string;
  authors: string;
  year: string;
  venue: string;
  url: string;
  notebookRef: string;
  instrument: string;
  operator: string;
  recordedOn: string;
}

export function SourceForm({ workspaceId, slug, initial, kinds }: { workspaceId: string; slug: string; initial: SourceFormValues; kinds: Array<{ value: string; label: string }> }) {
  const editing = Boolean(initial.id);
  const { state, pending, errors, onSubmit } = useRecordForm(editing ? updateSourceAction : createSourceAction, `/w/${slug}/sources`);
  const [kind, setKind] = useState(initial.kind);
  const notebook = kind === 'in-house-notebook';


  return (
    <form
      className="grid max-w-3xl gap-4 sm:grid-cols-2"
      noValidate
      onSubmit={onSubmit}
    >
      <input type="hidden" name="workspaceId" value={workspaceId} />
      {initial.id && <input type="hidden" name="id" value={initial.id} />}
      <SelectField label="Kind" name="kind" value={kind} onChange={(e) => setKind(e.target.value)} errors={errors.kind}>
        {kinds.map((k) => (
          <option key={k.value} value={k.value}>
            {k.label}
          </option>
        ))}
      </SelectField>
      <TextField label="Cite key (unique)" name="citeKey" defaultValue={initial.citeKey} errors={errors.citeKey} hint='Used by imports, e.g. "azuhata1995".' required />
      {notebook ? (
        <>
          <TextField label="Notebook reference" name="notebookRef" defaultValue={initial.notebookRef} errors={errors.notebookRef} hint="e.g. LN-3 p. 41" required />
          <TextField label="Date recorded" name="recordedOn" type="date" defaultValue={initial.recordedOn} errors={errors.recordedOn} />
          <TextField label="Instrument" name="instrument" defaultValue={initial.instrument} errors={errors.instrument} />
          <TextField label="Operator" name="operator" defaultValue={initial.operator} errors={errors.operator} />
          <div className="sm:col-span-2">
            <TextField label="Title (optional)" name="title" defaultValue={initial.title} errors={errors.title} />
          </div>
        </>
      ) : (
        <>
          <TextField label="DOI" name="doi" defaultValue={initial.doi} errors={errors.doi} hint="10.NNNN/… — a https://doi.org/ or doi: prefix is removed." />
          <TextField label="Year" name="year" inputMode="numeric" defaultValue={initial.year} errors={errors.year} />
          <div className="sm:col-span-2">
            <TextField label="Title" name="title" defaultValue={initial.title} errors={errors.title} />
          </div>
          <div className="sm:col-span-2">
            <TextField label="Authors" name="authors" defaultValue={initial.authors} errors={errors.authors} hint='BibTeX style: "Family, Given and Family, Given".' />
          </div>
          <TextField label="Venue (journal, publisher, school)" name="venue" defaultValue={initial.venue} errors={errors.venue} />
          <TextField label="URL" name="url" type="url" defaultValue={initial.url} errors={errors.url} />
        </>
      )}
      <div className="flex items-center gap-3 sm:col-span-2">
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : editing ? 'Save source' : 'Create source'}
        </Button>
        {!state.ok && <FormMessage state={state} />}
      </div>
    </form>
  );
}
