'use client';
import Link from 'next/link';
import { useState } from 'react';
import { z } from 'zod';
import { authClient } from '@/lib/auth-client';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { safeNext } from '../safe-next';
import { PASSWORD_RULE } from '../password-rule';

const signUpSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name.').max(120),
  email: z.email('Enter a valid e-mail address.'),
  password: z.string().min(10, 'Use at least 10 characters.').max(128, 'Use at most 128 characters.'),
});

type FieldErrors = Partial<Record<keyof z.infer<typeof signUpSchema>, string[]>>;

export function SignUpForm({ next, email }: { next?: string; email?: string }) {
  const [errors, setErrors] = useState<FieldErrors>({});
  const [error, setError] = useState<string | null>(null);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const parsed = signUpSchema.safeParse(Object.fromEntries(new FormData(event.currentTarget)));
    if (!parsed.success) {
      setErrors(z.flattenError(parsed.error).fieldErrors);
      return;
    }
    setErrors({});
    setError(null);
    setPending(true);
    const { error } = await authClient.signUp.email({ ...parsed.data, callbackURL: safeNext(next) });
    setPending(false);
    if (error) {
      if (error.status === 429) setError('Too many attempts. Wait a minute and try again.');
      else if (error.code === 'PASSWORD_TOO_COMMON') setErrors({ password: [error.message ?? 'Choose a less common password.'] });
      else if (error.code === 'USER_ALREADY_EXISTS' || error.code === 'USER_ALREADY_EXISTS_USE_ANOTHER_EMAIL' || error.status === 422)
        setError('An account with this e-mail address already exists. Sign in instead, or reset your password.');
      else setError(error.message ?? 'Sign-up failed.');
      return;
    }
    setSentTo(parsed.data.email);
  }

  if (sentTo) {
    return (
      <div className="space-y-3">
        <h1>Check your e-mail</h1>
        <p className="text-sm text-ink-muted">
          We sent a message to <strong className="text-ink">{sentTo}</strong>: a confirmation link to finish creating your account or, if
          this address already has an account, a note on how to sign in or reset the password.
        </p>
      </div>
    );
  }

  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <h1>Create an account</h1>
      {error && <Notice tone="bad">{error}</Notice>}
      <TextField label="Name" name="name" autoComplete="name" errors={errors.name} required />
      <TextField label="E-mail" name="email" type="email" autoComplete="email" defaultValue={email} errors={errors.email} required />
      <TextField label="Password" name="password" type="password" autoComplete="new-password" hint={PASSWORD_RULE} errors={errors.password} required />
      <Button type="submit" disabled={pending} className="w-full">
        {pending ? 'Creating…' : 'Create account'}
      </Button>
      <p className="text-xs text-ink-muted">
        Already have one? <Link href={`/sign-in${next ? `?next=${encodeURIComponent(next)}` : ''}`}>Sign in</Link>
      </p>
    </form>
  );
}
