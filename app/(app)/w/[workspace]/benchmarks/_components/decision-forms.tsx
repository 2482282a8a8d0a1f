'use client';
import { useActionState, useState } from 'react';
import { decideAction, pinAction, recomputeBenchmarkAction, revertDecisionAction, revokePinAction } from '../actions';
import { focusSoon } from '@/components/ui/focus-soon';
import { inputClass } from '@/components/ui/field';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';
import { buttonClass } from '@/components/ui/button';

interface PairRef {
  workspaceId: string;
  benchmarkId: string;
  methodId: string;
  measurementId: string;
  calculationId: string | null;
}

/** Exclude a pair or its whole measurement, keep it, or pin its pairing — each with a reason. */
export function PairDecisionForm({ pair }: { pair: PairRef }) {
  const [open, setOpen] = useState<null | 'decide' | 'pin'>(null);
  // on success the row loses this form: focus goes to the decisions list, which now holds the new entry
  const [decided, decide] = useActionState(async (prev: Awaited<ReturnType<typeof decideAction>>, form: FormData) => {
    const result = await decideAction(prev, form);
    if (result.ok) focusSoon('#decisions');
    return result;
  }, { ok: false });
  const [pinned, pin] = useActionState(async (prev: Awaited<ReturnType<typeof pinAction>>, form: FormData) => {
    const result = await pinAction(prev, form);
    if (result.ok) focusSoon('#decisions');
    return result;
  }, { ok: false });
  return (
    <div className="relative space-y-1">
      <div className="flex flex-wrap gap-1.5">
        <button type="button" className={buttonClass('secondary', 'px-2 py-0.5 text-xs whitespace-nowrap')} aria-expanded={open === 'decide'} onClick={() => setOpen(open === 'decide' ? null : 'decide')}>
          Exclude / keep…
        </button>
        <button type="button" className={buttonClass('ghost', 'px-2 py-0.5 text-xs')} aria-expanded={open === 'pin'} onClick={() => setOpen(open === 'pin' ? null : 'pin')}>
          Pin…
        </button>
      </div>
      {open === 'decide' ? (
        <form action={decide} className="absolute right-0 z-50 mt-1 w-[30rem] max-w-[calc(100vw-2rem)] space-y-1.5 rounded-md border border-rule-strong bg-panel p-3 text-left shadow-lg">
          <input type="hidden" name="workspaceId" value={pair.workspaceId} />
          <input type="hidden" name="benchmarkId" value={pair.benchmarkId} />
          <input type="hidden" name="measurementId" value={pair.measurementId} />
          <input type="hidden" name="methodId" value={pair.methodId} />
          <select name="kind" className={inputClass} aria-label="Decision" defaultValue="exclude-pair" autoFocus>
            <option value="exclude-pair">Exclude this pair (this method)</option>
            <option value="exclude-measurement">Exclude the measurement (every method)</option>
            <option value="keep">Keep (flag reviewed)</option>
          </select>
          <input name="reason" className={inputClass} placeholder="Reason, e.g. strained thin film" aria-label="Reason" required minLength={3} />
          {decided.fieldErrors?.reason ? <p className="text-xs text-bad">{decided.fieldErrors.reason.join(' ')}</p> : null}
          <SubmitButton pendingLabel="Recording…">Record decision</SubmitButton>
          <FormMessage state={decided} />
        </form>
      ) : null}
      {open === 'pin' ? (
        <form action={pin} className="absolute right-0 z-50 mt-1 w-[30rem] max-w-[calc(100vw-2rem)] space-y-1.5 rounded-md border border-rule-strong bg-panel p-3 text-left shadow-lg">
          <input type="hidden" name="workspaceId" value={pair.workspaceId} />
          <input type="hidden" name="benchmarkId" value={pair.benchmarkId} />
          <input type="hidden" name="measurementId" value={pair.measurementId} />
          <input type="hidden" name="methodId" value={pair.methodId} />
          <select name="calculationId" className={inputClass} aria-label="Pin" defaultValue={pair.calculationId ?? ''} autoFocus>
            {pair.calculationId ? <option value={pair.calculationId}>Pin this pairing (keep it whatever new data arrive)</option> : null}
            <option value="">No counterpart: never pair this measurement under this method</option>
          </select>
          <input name="reason" className={inputClass} placeholder="Reason, e.g. polarised spectra assign it to Eg" aria-label="Reason" required minLength={3} />
          {pinned.fieldErrors?.reason ? <p className="text-xs text-bad">{pinned.fieldErrors.reason.join(' ')}</p> : null}
          <SubmitButton pendingLabel="Pinning…">Pin</SubmitButton>
          <FormMessage state={pinned} />
        </form>
      ) : null}
    </div>
  );
}

/** Revert a decision or remove a pin, with a reason. */
export function RevertForm({ workspaceId, benchmarkId, decisionId, pinId }: { workspaceId: string; benchmarkId: string; decisionId?: string; pinId?: string }) {
  const [open, setOpen] = useState(false);
  const [state, action] = useActionState(decisionId ? revertDecisionAction : revokePinAction, { ok: false });
  if (!open) {
    return (
      <button type="button" className={buttonClass('ghost', 'px-2 py-0.5 text-xs')} onClick={() => setOpen(true)}>
        {decisionId ? 'Revert…' : 'Remove pin…'}
      </button>
    );
  }
  return (
    <form action={action} className="flex flex-wrap items-start gap-1.5">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="benchmarkId" value={benchmarkId} />
      {decisionId ? <input type="hidden" name="decisionId" value={decisionId} /> : <input type="hidden" name="pinId" value={pinId} />}
      <input name="reason" className={`${inputClass} w-56`} placeholder="Why revert?" aria-label="Reason for reverting" required minLength={3} />
      <SubmitButton variant="secondary" pendingLabel="Reverting…">
        Confirm
      </SubmitButton>
      <FormMessage state={state} />
    </form>
  );
}

export function RecomputeButton({ workspaceId, benchmarkId, label = 'Recompute' }: { workspaceId: string; benchmarkId: string; label?: string }) {
  const [state, action] = useActionState(recomputeBenchmarkAction, { ok: false });
  return (
    <form action={action} className="inline-flex items-center gap-2">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="benchmarkId" value={benchmarkId} />
      <SubmitButton variant="secondary" pendingLabel="Queuing…">
        {label}
      </SubmitButton>
      {state.message ? <span className="text-xs text-ink-muted">{state.message}</span> : null}
    </form>
  );
}
