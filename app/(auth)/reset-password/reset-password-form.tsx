'use client';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { authClient } from '@/lib/auth-client';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { PASSWORD_RULE } from '../password-rule';

export function ResetPasswordForm({ token, linkError }: { token?: string; linkError?: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  if (!token || linkError) {
    return (
      <div className="space-y-3">
        <h1>Reset link not valid</h1>
        <Notice tone="bad">This reset link is invalid or has expired.</Notice>
        <Link href="/forgot-password">Ask for a new link</Link>
      </div>
    );
  }

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const password = String(new FormData(event.currentTarget).get('password') ?? '');
    if (password.length < 10) {
      setError('Use at least 10 characters.');
      return;
    }
    setPending(true);
    const { error } = await authClient.resetPassword({ newPassword: password, token });
    setPending(false);
    if (error) {
      setError(error.message ?? 'The reset failed; ask for a new link.');
      return;
    }
    router.push('/sign-in?reset=1');
  }

  return (
    <form onSubmit={onSubmit} className="space-y-4">
      <h1>Choose a new password</h1>
      {error && <Notice tone="bad">{error}</Notice>}
      <TextField label="New password" name="password" type="password" autoComplete="new-password" hint={`${PASSWORD_RULE} You will be signed out everywhere.`} required />
      <Button type="submit" disabled={pending} className="w-full">
        {pending ? 'Saving…' : 'Set password'}
      </Button>
    </form>
  );
}
