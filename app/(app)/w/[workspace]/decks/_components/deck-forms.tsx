'use client';
import { useActionState, useEffect } from 'react';
import { useRouter } from 'next/navigation';
import { TextField, inputClass } from '@/components/ui/field';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';
import { buttonClass } from '@/components/ui/button';
import { createDeckAction, moveViewAction, refreshViewAction, removeViewAction, retitleDeckAction, updateViewAction } from '../actions';

export function CreateDeckForm({ workspaceId }: { workspaceId: string }) {
  const router = useRouter();
  const [state, action] = useActionState(createDeckAction, { ok: false });
  useEffect(() => {
    const href = state.ok ? (state.data as { href: string }).href : null;
    if (href) router.push(href);
  }, [state, router]);
  return (
    <form action={action} className="flex flex-wrap items-end gap-2" aria-label="Create a deck">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <div className="min-w-64 flex-1">
        <TextField label="Title" name="title" required maxLength={120} placeholder="Group meeting, 12 March" errors={state.fieldErrors?.title} />
      </div>
      <SubmitButton pendingLabel="Creating…">Create deck</SubmitButton>
      <FormMessage state={state.ok ? undefined : state} />
    </form>
  );
}

export function RetitleDeckForm({ workspaceId, deckId, title }: { workspaceId: string; deckId: string; title: string }) {
  const [state, action] = useActionState(retitleDeckAction, { ok: false });
  return (
    <form action={action} className="flex flex-wrap items-end gap-2" aria-label="Retitle the deck">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="deckId" value={deckId} />
      <div className="min-w-64 flex-1">
        <TextField label="Deck title" name="title" required maxLength={120} defaultValue={title} errors={state.fieldErrors?.title} />
      </div>
      <SubmitButton variant="secondary" pendingLabel="Saving…">
        Save title
      </SubmitButton>
      <FormMessage state={state} />
    </form>
  );
}

/** Small one-button forms (move, refresh, remove) that report in place. */
function ViewButton({
  workspaceId,
  viewId,
  action: serverAction,
  label,
  fields = {},
  variant = 'ghost',
  ariaLabel,
  disabled,
}: {
  workspaceId: string;
  viewId: string;
  action: typeof moveViewAction;
  label: string;
  fields?: Record<string, string>;
  variant?: 'ghost' | 'secondary' | 'danger';
  ariaLabel?: string;
  disabled?: boolean;
}) {
  const [state, action, pending] = useActionState(serverAction, { ok: false });
  return (
    <form action={action} className="inline">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="viewId" value={viewId} />
      {Object.entries(fields).map(([k, v]) => (
        <input key={k} type="hidden" name={k} value={v} />
      ))}
      <button type="submit" className={buttonClass(variant, 'px-2 py-0.5 text-xs')} disabled={disabled || pending} aria-label={ariaLabel}>
        {label}
      </button>
      {!state.ok && state.message ? <span className="ml-1 text-xs text-bad">{state.message}</span> : null}
    </form>
  );
}

export function ViewControls({ workspaceId, viewId, first, last, canRefresh }: { workspaceId: string; viewId: string; first: boolean; last: boolean; canRefresh: boolean }) {
  return (
    <div className="flex flex-wrap items-center gap-1">
      <ViewButton workspaceId={workspaceId} viewId={viewId} action={moveViewAction} fields={{ direction: 'up' }} label="↑ Up" ariaLabel="Move up" disabled={first} />
      <ViewButton workspaceId={workspaceId} viewId={viewId} action={moveViewAction} fields={{ direction: 'down' }} label="↓ Down" ariaLabel="Move down" disabled={last} />
      {canRefresh ? <ViewButton workspaceId={workspaceId} viewId={viewId} action={refreshViewAction} label="Refresh to latest" variant="secondary" /> : null}
      <ViewButton workspaceId={workspaceId} viewId={viewId} action={removeViewAction} label="Remove" variant="danger" />
    </div>
  );
}

export function ViewTextForm({ workspaceId, viewId, title, note }: { workspaceId: string; viewId: string; title: string | null; note: string | null }) {
  const [state, action] = useActionState(updateViewAction, { ok: false });
  return (
    <form action={action} className="grid gap-2 sm:grid-cols-[minmax(0,1fr)_minmax(0,2fr)_auto] sm:items-end">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="viewId" value={viewId} />
      <label className="block space-y-1">
        <span className="text-xs text-ink-muted">Slide title</span>
        <input name="title" className={inputClass} maxLength={160} defaultValue={title ?? ''} placeholder="(automatic)" />
      </label>
      <label className="block space-y-1">
        <span className="text-xs text-ink-muted">Note</span>
        <textarea name="note" rows={1} className={inputClass} maxLength={2000} defaultValue={note ?? ''} />
      </label>
      <div className="flex items-center gap-2">
        <SubmitButton variant="secondary" pendingLabel="Saving…">
          Save
        </SubmitButton>
        {state.message ? <span className={`text-xs ${state.ok ? 'text-good' : 'text-bad'}`}>{state.message}</span> : null}
      </div>
    </form>
  );
}
