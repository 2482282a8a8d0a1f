'use client';
import Link from 'next/link';
import { useState } from 'react';
import { authClient } from '@/lib/auth-client';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';

export default function ForgotPasswordPage() {
  const [done, setDone] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const email = String(new FormData(event.currentTarget).get('email') ?? '');
    setPending(true);
    const { error } = await authClient.requestPasswordReset({ email, redirectTo: '/reset-password' });
    setPending(false);
    if (error) {
      setError(error.status === 429 ? 'Too many requests. Wait a minute and try again.' : (error.message ?? 'Request failed.'));
      return;
    }
    setDone(true);
  }

  return (
    <form onSubmit={onSubmit} className="space-y-4">
      <h1>Reset your password</h1>
      {done ? (
        <Notice tone="good">If an account uses this address, a reset link is on its way. It is valid for one hour.</Notice>
      ) : (
        <>
          {error && <Notice tone="bad">{error}</Notice>}
          <TextField label="E-mail" name="email" type="email" autoComplete="email" required />
          <Button type="submit" disabled={pending} className="w-full">
            {pending ? 'Sending…' : 'Send reset link'}
          </Button>
        </>
      )}
      <p className="text-xs text-ink-muted">
        <Link href="/sign-in">Back to sign-in</Link>
      </p>
    </form>
  );
}
