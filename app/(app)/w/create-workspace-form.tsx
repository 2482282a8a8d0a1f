'use client';
import { useActionState } from 'react';
import { createWorkspace } from './actions';
import { TextField } from '@/components/ui/field';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';

export function CreateWorkspaceForm() {
  const [state, action] = useActionState(createWorkspace, { ok: false });
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-2">
      <TextField label="Name" name="name" placeholder="Phonon group, Dept. of Physics" errors={state.fieldErrors?.name} required />
      <TextField label="Address" name="slug" placeholder="phonon-group" hint="Used in links: /w/phonon-group" errors={state.fieldErrors?.slug} required />
      <div className="flex items-center gap-3 sm:col-span-2">
        <SubmitButton>Create workspace</SubmitButton>
        <FormMessage state={state.fieldErrors ? undefined : state} />
      </div>
    </form>
  );
}
