'use client';
import { useActionState, useState } from 'react';
import { createWorkspace } from './actions';
import { TextField } from '@/components/ui/field';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';
import { SLUG_MAX, slugFromName } from '@/lib/slug';

/** The address follows the name until someone edits it by hand. */
export function CreateWorkspaceForm() {
  const [state, action] = useActionState(createWorkspace, { ok: false });
  const [name, setName] = useState('');
  const [slug, setSlug] = useState<string | null>(null);
  const address = slug ?? slugFromName(name);
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-2">
      <TextField label="Name" name="name" placeholder="Phonon group, Dept. of Physics" value={name} onChange={(e) => setName(e.target.value)} errors={state.fieldErrors?.name} required />
      <TextField
        label="Address"
        name="slug"
        placeholder="phonon-group-dept-of-physics"
        value={address}
        onChange={(e) => setSlug(e.target.value)}
        maxLength={SLUG_MAX}
        hint={`Used in links: /w/${address || 'phonon-group'}${slug === null ? ' · follows the name until you edit it' : ''}`}
        errors={state.fieldErrors?.slug}
        required
      />
      <div className="flex items-center gap-3 sm:col-span-2">
        <SubmitButton>Create workspace</SubmitButton>
        <FormMessage state={state.fieldErrors ? undefined : state} />
      </div>
    </form>
  );
}
