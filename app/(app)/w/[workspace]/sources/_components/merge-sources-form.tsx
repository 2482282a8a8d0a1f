'use client';
import { startTransition, useActionState, useState } from 'react';
import type { ActionState } from '@/lib/action-state';
import { Button } from '@/components/ui/button';
import { FormMessage } from '@/components/ui/form-message';
import { mergeSourcesAction } from '../actions';

interface Candidate {
  id: string;
  citeKey: string;
  title: string | null;
  valueCount: number;
}

/** Two or more sources with one DOI: choose the one to keep; the values of the others move to it (one merge at a time, audited). */
export function MergeSourcesForm({ workspaceId, doi, candidates }: { workspaceId: string; doi: string; candidates: Candidate[] }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(mergeSourcesAction, { ok: false });
  const [keep, setKeep] = useState(candidates[0].id);
  const merge = candidates.find((c) => c.id !== keep)!;
  return (
    <form
      className="space-y-2 rounded-md border border-rule p-3"
      data-testid="doi-duplicate"
      onSubmit={(e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        startTransition(() => action(data));
      }}
    >
      <fieldset>
        <legend className="text-sm font-medium">
          DOI <span className="font-mono">{doi}</span>: keep
        </legend>
        {candidates.map((c) => (
          <label key={c.id} className="flex items-center gap-2 text-sm">
            <input type="radio" name="keepId" value={c.id} checked={keep === c.id} onChange={() => setKeep(c.id)} />
            <span className="font-mono">{c.citeKey}</span> {c.title ? `— ${c.title}` : ''} <span className="text-xs text-ink-muted">({c.valueCount} values)</span>
          </label>
        ))}
      </fieldset>
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="mergeId" value={merge.id} />
      <div className="flex flex-wrap items-center gap-2">
        <Button type="submit" variant="secondary" disabled={pending}>
          {pending ? 'Merging…' : `Merge ${merge.citeKey} into the kept source`}
        </Button>
        <span className="text-xs text-ink-muted">Its values will cite the kept source; it is retracted as merged, with an audit entry.</span>
      </div>
      <FormMessage state={state} />
    </form>
  );
}
