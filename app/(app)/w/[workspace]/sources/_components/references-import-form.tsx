'use client';
import { startTransition, useActionState, useRef } from 'react';
import type { ActionState } from '@/lib/action-state';
import { Button } from '@/components/ui/button';
import { FormMessage } from '@/components/ui/form-message';
import { inputClass } from '@/components/ui/field';
import { importReferencesAction } from '../actions';

/** Paste BibTeX, RIS or CSL-JSON (what a reference manager or a DOI resolver gives you), or pick a file: read in the browser into the same text box. */
export function ReferencesImportForm({ workspaceId }: { workspaceId: string }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(importReferencesAction, { ok: false });
  const text = useRef<HTMLTextAreaElement>(null);
  const problems = state.fieldErrors?.references;
  return (
    <form
      className="space-y-2"
      onSubmit={(e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        startTransition(() => action(data));
      }}
    >
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <div className="flex flex-wrap items-end gap-4">
        <div>
          <label htmlFor="references-file" className="block text-[13px] font-medium">
            File (.bib, .ris, .json)
          </label>
          <input
            id="references-file"
            type="file"
            accept=".bib,.bibtex,.ris,.json,text/x-bibtex,application/x-research-info-systems,application/json,text/plain"
            className="block text-xs"
            onChange={async (e) => {
              const file = e.target.files?.[0];
              if (file && text.current) text.current.value = await file.text();
            }}
          />
        </div>
        <div>
          <label htmlFor="references-format" className="block text-[13px] font-medium">
            Format
          </label>
          <select id="references-format" name="format" defaultValue="auto" className={`${inputClass} w-auto`}>
            <option value="auto">Recognise it</option>
            <option value="bibtex">BibTeX</option>
            <option value="ris">RIS</option>
            <option value="csl-json">CSL-JSON</option>
          </select>
        </div>
      </div>
      <label htmlFor="references-text" className="block text-[13px] font-medium">
        or paste references
      </label>
      <textarea
        id="references-text"
        ref={text}
        name="references"
        rows={8}
        className={`${inputClass} font-mono text-xs`}
        placeholder={'@article{azuhata1995, author = {Azuhata, T. and …}, …}   or   TY  - JOUR …   or   [{"type": "article-journal", …}]'}
        aria-invalid={problems ? true : undefined}
        aria-describedby={problems ? 'references-errors' : 'references-hint'}
      />
      <p id="references-hint" className="text-xs text-ink-faint">
        Articles become journal articles; theses theses; data sets, books, reports and web pages data sets. An entry needs a title; a cite key or a DOI already used by another source is refused.
        Entries already here are reported and skipped. Any problem stops the whole import: nothing is half-imported.
      </p>
      {problems && (
        <ul id="references-errors" role="alert" className="list-disc space-y-0.5 pl-5 text-xs text-bad">
          {problems.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
      )}
      <Button type="submit" variant="secondary" disabled={pending}>
        {pending ? 'Importing…' : 'Import references'}
      </Button>
      <FormMessage state={state} />
    </form>
  );
}
