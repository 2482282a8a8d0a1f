'use client';
import { startTransition, useActionState, useEffect, type FormEvent } from 'react';
import { useRouter } from 'next/navigation';
import type { ActionState } from '@/lib/action-state';

type RecordAction = (prev: ActionState, formData: FormData) => Promise<ActionState>;

/**
 * The create/edit form of a record: runs the action, keeps what was typed when the
 * server refuses it (submitting through startTransition instead of the form action),
 * and opens the saved record at `${recordPath}/<id>`.
 */
export function useRecordForm(action: RecordAction, recordPath: string) {
  const router = useRouter();
  const [state, dispatch, pending] = useActionState<ActionState, FormData>(action, { ok: false });

  useEffect(() => {
    if (state.ok) router.push(`${recordPath}/${(state.data as { id: string }).id}`);
  }, [state, router, recordPath]);

  const onSubmit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    startTransition(() => dispatch(data));
  };

  return { state, pending, errors: state.fieldErrors ?? {}, onSubmit };
}
