'use client';
import { useActionState, useEffect, useId, useRef, useState } from 'react';
import Link from 'next/link';
import { addToDeckAction, listDecksAction } from '@/app/(app)/w/[workspace]/decks/actions';
import { buttonClass } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';
import { VIEW_KIND_LABELS, type ViewFilters, type ViewKind } from '@/lib/decks/view-kinds';

/** w-80 */
const DIALOG_WIDTH_PX = 320;

type DeckOption = { id: string; title: string; views: number };

/**
 * "Add to deck": saves the current view (kind, filters, the revision shown) to
 * an existing deck or a new one, with a title and a note for the slide.
 */
export function AddToDeck({
  workspaceId,
  kinds,
  benchmarkId,
  revisionNumber,
  filters = {},
  defaultTitle,
}: {
  workspaceId: string;
  /** The views this place can save; the first is the default. */
  kinds: readonly ViewKind[];
  benchmarkId?: string;
  revisionNumber?: number;
  filters?: ViewFilters;
  defaultTitle?: string;
}) {
  const id = useId();
  const [open, setOpen] = useState(false);
  // The dialog opens leftwards from its button; near the left edge of the page it opens rightwards instead,
  // or its left part would be clipped by the page and lie under the workspace menu.
  const [opensRight, setOpensRight] = useState(false);
  const [decks, setDecks] = useState<{ list: DeckOption[]; canCreate: boolean } | null>(null);
  const [loadError, setLoadError] = useState<string | null>(null);
  const [deckId, setDeckId] = useState('');
  const [state, action] = useActionState(addToDeckAction, { ok: false });
  const trigger = useRef<HTMLButtonElement>(null);
  const firstField = useRef<HTMLSelectElement>(null);
  const close = () => {
    setOpen(false);
    trigger.current?.focus();
  };

  const added = state.ok ? (state.data as { deckId: string; href: string } | undefined) : undefined;

  // Loads the decks when the dialog opens, and again after a view went into a new deck (which is then selected).
  useEffect(() => {
    if (!open) return;
    if (decks && !(added && !decks.list.some((d) => d.id === added.deckId))) return;
    const form = new FormData();
    form.set('workspaceId', workspaceId);
    listDecksAction(undefined, form).then(
      (r) => {
        if (!r.ok) return setLoadError(r.message ?? 'Could not load the decks.');
        const data = r.data as { decks: DeckOption[]; canCreate: boolean };
        setDecks({ list: data.decks, canCreate: data.canCreate });
        setDeckId(added?.deckId ?? data.decks[0]?.id ?? '');
      },
      () => setLoadError('Could not load the decks.'),
    );
  }, [open, decks, workspaceId, added]);

  const href = added?.href;
  const loaded = decks !== null;
  useEffect(() => {
    if (open && loaded) firstField.current?.focus();
  }, [open, loaded]);

  return (
    <div className="relative inline-block text-left print:hidden">
      <button ref={trigger} type="button" className={buttonClass('secondary', 'px-2 py-0.5 text-xs')} aria-expanded={open} aria-controls={`${id}-dialog`} onClick={() => {
          const button = trigger.current?.getBoundingClientRect();
          const page = trigger.current?.closest('main')?.getBoundingClientRect();
          setOpensRight(Boolean(button && button.right - DIALOG_WIDTH_PX < (page?.left ?? 0) + 8));
          setOpen(!open);
        }}>
        Add to deck
      </button>
      {open ? (
        <div
          id={`${id}-dialog`}
          role="dialog"
          aria-label="Add this view to a deck"
          className={`absolute ${opensRight ? 'left-0' : 'right-0'} z-50 mt-1 w-80 max-w-[calc(100vw-2rem)] space-y-2 rounded-md border border-rule-strong bg-panel p-3 text-sm shadow-lg`}
          onKeyDown={(e) => {
            if (e.key === 'Escape') close();
          }}
        >
          {loadError ? <p className="text-bad">{loadError}</p> : null}
          {!decks && !loadError ? <p className="text-ink-muted">Loading decks…</p> : null}
          {decks ? (
            <form action={action} className="space-y-2">
              <input type="hidden" name="workspaceId" value={workspaceId} />
              {benchmarkId ? <input type="hidden" name="benchmarkId" value={benchmarkId} /> : null}
              {revisionNumber ? <input type="hidden" name="revisionNumber" value={revisionNumber} /> : null}
              <input type="hidden" name="filters" value={JSON.stringify(filters)} />
              <label className="block space-y-1">
                <span className="text-[13px] font-medium">Deck</span>
                <select ref={firstField} name="deckId" className={inputClass} value={deckId} onChange={(e) => setDeckId(e.target.value)}>
                  {decks.list.map((d) => (
                    <option key={d.id} value={d.id}>
                      {d.title} ({d.views})
                    </option>
                  ))}
                  {decks.canCreate ? <option value="">New deck…</option> : null}
                </select>
              </label>
              {deckId === '' ? (
                <label className="block space-y-1">
                  <span className="text-[13px] font-medium">New deck title</span>
                  <input name="newDeckTitle" className={inputClass} required maxLength={120} placeholder="Group meeting, 12 March" />
                </label>
              ) : null}
              <label className="block space-y-1">
                <span className="text-[13px] font-medium">View</span>
                <select name="viewKind" className={inputClass} defaultValue={kinds[0]}>
                  {kinds.map((k) => (
                    <option key={k} value={k}>
                      {VIEW_KIND_LABELS[k]}
                    </option>
                  ))}
                </select>
              </label>
              <label className="block space-y-1">
                <span className="text-[13px] font-medium">Slide title</span>
                <input name="title" className={inputClass} maxLength={160} defaultValue={defaultTitle} />
              </label>
              <label className="block space-y-1">
                <span className="text-[13px] font-medium">Note</span>
                <textarea name="note" rows={2} maxLength={2000} className={inputClass} placeholder="What to look at on this slide" />
              </label>
              {revisionNumber ? <p className="text-xs text-ink-faint">Pinned to revision {revisionNumber}.</p> : null}
              <div className="flex items-center gap-2">
                <SubmitButton pendingLabel="Adding…">Add view</SubmitButton>
                <button type="button" className={buttonClass('ghost')} onClick={close}>
                  Close
                </button>
              </div>
              <FormMessage state={state} />
              {href ? (
                <p className="text-xs">
                  <Link href={href}>Open the deck</Link>
                </p>
              ) : null}
            </form>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
