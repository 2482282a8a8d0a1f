'use client';
import { startTransition, useActionState, useRef } from 'react';
import type { ActionState } from '@/lib/action';
import { Button } from '@/components/ui/button';
import { FormMessage } from '@/components/ui/form-message';
import { inputClass } from '@/components/ui/field';
import { importBibtexAction } from '../actions';

/** Paste BibTeX or pick a .bib file (read in the browser into the same text box). */
export function BibtexImportForm({ workspaceId }: { workspaceId: string }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(importBibtexAction, { ok: false });
  const text = useRef<HTMLTextAreaElement>(null);
  const problems = state.fieldErrors?.bibtex;
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
      <label htmlFor="bibtex-file" className="block text-[13px] font-medium">
        .bib file
      </label>
      <input
        id="bibtex-file"
        type="file"
        accept=".bib,.bibtex,text/x-bibtex,text/plain"
        className="block text-xs"
        onChange={async (e) => {
          const file = e.target.files?.[0];
          if (file && text.current) text.current.value = await file.text();
        }}
      />
      <label htmlFor="bibtex-text" className="block text-[13px] font-medium">
        or paste BibTeX
      </label>
      <textarea
        id="bibtex-text"
        ref={text}
        name="bibtex"
        rows={8}
        className={`${inputClass} font-mono text-xs`}
        placeholder="@article{azuhata1995, author = {Azuhata, T. and …}, doi = {10.1088/0953-8984/7/10/002}, …}"
        aria-invalid={problems ? true : undefined}
        aria-describedby={problems ? 'bibtex-errors' : 'bibtex-hint'}
      />
      <p id="bibtex-hint" className="text-xs text-ink-faint">
        @article and most other types become journal articles; @phdthesis and @mastersthesis theses; @dataset, @misc and @online data sets. Cite keys already in the workspace are reported and
        skipped. One bad entry stops the whole import.
      </p>
      {problems && (
        <ul id="bibtex-errors" role="alert" className="list-disc space-y-0.5 pl-5 text-xs text-bad">
          {problems.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
      )}
      <Button type="submit" variant="secondary" disabled={pending}>
        {pending ? 'Importing…' : 'Import BibTeX'}
      </Button>
      <FormMessage state={state} />
    </form>
  );
}
