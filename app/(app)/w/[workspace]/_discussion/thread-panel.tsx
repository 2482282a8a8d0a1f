'use client';
import { useActionState, useRef } from 'react';
import type { ThreadView } from '@/lib/discussion/thread-view';
import { inputClass } from '@/components/ui/field';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';
import type { ActionState } from '@/lib/action-state';
import { decideFromThreadAction, pinFromThreadAction, postCommentAction, resolveThreadAction } from './actions';
import { CommentBody } from '@/components/discussion/comment-body';
import { useRefreshOnSuccess } from './use-refresh-on-success';

export interface DiscussionSubject {
  kind: 'pair' | 'measurement' | 'calculation-set' | 'material' | 'revision';
  id: string;
  benchmarkId?: string | null;
  /** A pair with one measurement and a calculation in the shown revision: its pairing can be pinned from a thread. */
  pinnable?: boolean;
}

export interface DiscussionPermissions {
  comment: boolean;
  resolve: boolean;
  decide: boolean;
}

const PIN_KINDS = new Set(['pin-pairing', 'no-counterpart']);

const when = (d: Date | string) => new Date(d).toISOString().replace('T', ' ').slice(0, 16) + ' UTC';

function CommentForm({ workspaceId, subject, threadId, label }: { workspaceId: string; subject: DiscussionSubject; threadId?: string; label: string }) {
  const form = useRef<HTMLFormElement>(null);
  const [state, action] = useActionState(postCommentAction, { ok: false });
  useRefreshOnSuccess(state, () => form.current?.reset());
  return (
    <form ref={form} action={action} className="space-y-1.5">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      {threadId ? (
        <input type="hidden" name="threadId" value={threadId} />
      ) : (
        <>
          <input type="hidden" name="subjectKind" value={subject.kind} />
          <input type="hidden" name="subjectId" value={subject.id} />
          {subject.benchmarkId ? <input type="hidden" name="benchmarkId" value={subject.benchmarkId} /> : null}
        </>
      )}
      <textarea
        name="body"
        rows={3}
        required
        maxLength={5000}
        className={inputClass}
        aria-label="Comment"
        placeholder="Plain text; @name.surname notifies a member; http(s) links become clickable."
        aria-invalid={state.fieldErrors?.body ? true : undefined}
      />
      {state.fieldErrors?.body ? <p className="text-xs text-bad">{state.fieldErrors.body.join(' ')}</p> : null}
      <SubmitButton variant="secondary" pendingLabel="Posting…">
        {label}
      </SubmitButton>
      <FormMessage state={state} />
    </form>
  );
}

function ResolveForm({ workspaceId, threadId, resolved }: { workspaceId: string; threadId: string; resolved: boolean }) {
  const [state, action] = useActionState(resolveThreadAction, { ok: false });
  useRefreshOnSuccess(state);
  return (
    <form action={action} className="inline-flex items-center gap-2">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="threadId" value={threadId} />
      <input type="hidden" name="resolved" value={resolved ? 'false' : 'true'} />
      <SubmitButton variant="secondary" pendingLabel="Saving…">
        {resolved ? 'Reopen' : 'Resolve thread'}
      </SubmitButton>
      {!state.ok && state.message ? <span className="text-xs text-bad">{state.message}</span> : null}
    </form>
  );
}

function DecisionForm({ workspaceId, threadId, subject }: { workspaceId: string; threadId: string; subject: DiscussionSubject }) {
  // Exclude/keep are decisions, the two pin kinds are pins: one form, routed by the chosen kind.
  const [state, action] = useActionState(
    (prev: ActionState, form: FormData) => (PIN_KINDS.has(String(form.get('kind'))) ? pinFromThreadAction(prev, form) : decideFromThreadAction(prev, form)),
    { ok: false },
  );
  useRefreshOnSuccess(state);
  return (
    <form action={action} className="space-y-1.5 rounded-md border border-rule bg-paper p-2" aria-label="Record a decision from this thread">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="threadId" value={threadId} />
      <p className="text-xs font-medium text-ink-muted">Decision (recorded with a link to this thread)</p>
      <select name="kind" className={inputClass} aria-label="Decision" defaultValue={subject.kind === 'pair' ? 'exclude-pair' : 'exclude-measurement'}>
        {subject.kind === 'pair' ? <option value="exclude-pair">Exclude this pair (this method)</option> : null}
        <option value="exclude-measurement">Exclude the measurement (every method)</option>
        {subject.kind === 'pair' ? <option value="keep">Keep (flag reviewed)</option> : null}
        {subject.kind === 'pair' && subject.pinnable ? (
          <>
            <option value="pin-pairing">Pin this pairing (keep it whatever new data arrive)</option>
            <option value="no-counterpart">No counterpart: never pair this measurement under this method</option>
          </>
        ) : null}
      </select>
      <input name="reason" className={inputClass} aria-label="Reason for the decision" placeholder="Reason, e.g. strained thin film" required minLength={3} maxLength={1000} />
      {state.fieldErrors?.reason ? <p className="text-xs text-bad">{state.fieldErrors.reason.join(' ')}</p> : null}
      <SubmitButton pendingLabel="Recording…">Record decision</SubmitButton>
      <FormMessage state={state} />
    </form>
  );
}

/** The threads on one subject: comments, linked decisions, reply / resolve / decide, or a form to open a thread. */
export function ThreadPanel({
  workspaceId,
  subject,
  title,
  threads,
  can,
}: {
  workspaceId: string;
  subject: DiscussionSubject;
  title: string;
  threads: ThreadView[];
  can: DiscussionPermissions;
}) {
  const open = threads.filter((t) => !t.resolvedAt);
  const decidable = can.decide && !!subject.benchmarkId && (subject.kind === 'pair' || subject.kind === 'measurement');
  return (
    <section aria-label={`Discussion of ${title}`} className="space-y-3 rounded-md border border-rule bg-panel p-3 text-sm" data-testid="thread-panel">
      <h3 className="text-[13px] font-semibold">
        Discussion · {title} <span className="font-normal text-ink-muted">({open.length} open)</span>
      </h3>
      {threads.map((t) => (
        <article key={t.id} className={`space-y-2 border-l-2 pl-3 ${t.resolvedAt ? 'border-rule text-ink-muted' : 'border-accent'}`} data-testid="thread">
          {t.resolvedAt ? (
            <p className="text-xs">
              Resolved {when(t.resolvedAt)}
              {t.resolvedByName ? ` by ${t.resolvedByName}` : ''}
            </p>
          ) : null}
          <ol className="space-y-2">
            {t.comments.map((c) => (
              <li key={c.id}>
                <p className="text-xs text-ink-muted">
                  <span className="font-medium text-ink">{c.authorName ?? 'former member'}</span> · {when(c.createdAt)}
                </p>
                <CommentBody body={c.body} />
              </li>
            ))}
          </ol>
          {t.decisions.length ? (
            <ul className="space-y-1 text-xs" data-testid="thread-decisions">
              {t.decisions.map((d) => (
                <li key={d.id} className={d.revertedAt ? 'line-through' : ''}>
                  Decision: <span className="font-medium">{d.kind}</span> — “{d.reason}” · {d.byName ?? 'unknown'}, {when(d.createdAt)}
                </li>
              ))}
            </ul>
          ) : null}
          {!t.resolvedAt && can.comment ? <CommentForm workspaceId={workspaceId} subject={subject} threadId={t.id} label="Reply" /> : null}
          {!t.resolvedAt && decidable ? <DecisionForm workspaceId={workspaceId} threadId={t.id} subject={subject} /> : null}
          {can.resolve ? <ResolveForm workspaceId={workspaceId} threadId={t.id} resolved={!!t.resolvedAt} /> : null}
        </article>
      ))}
      {open.length === 0 && can.comment ? <CommentForm workspaceId={workspaceId} subject={subject} label={threads.length ? 'Open a new thread' : 'Post comment'} /> : null}
      {!can.comment && threads.length === 0 ? <p className="text-ink-muted">No discussion yet.</p> : null}
    </section>
  );
}
