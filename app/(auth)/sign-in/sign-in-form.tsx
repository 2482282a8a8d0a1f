'use client';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { authClient } from '@/lib/auth-client';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { safeNext } from '../safe-next';

export function SignInForm({ next, notice }: { next?: string; notice?: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [unverified, setUnverified] = useState<string | null>(null);
  const [info, setInfo] = useState<string | null>(notice ?? null);
  const [pending, setPending] = useState(false);

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const email = String(form.get('email') ?? '');
    setPending(true);
    setError(null);
    setUnverified(null);
    const { error } = await authClient.signIn.email({ email, password: String(form.get('password') ?? '') });
    setPending(false);
    if (error) {
      if (error.status === 403) {
        setUnverified(email);
        setError('Confirm your e-mail address first: follow the link we sent you.');
      } else if (error.status === 429) setError('Too many attempts. Wait a minute and try again.');
      else setError(error.message ?? 'Sign-in failed.');
      return;
    }
    router.push(safeNext(next));
    router.refresh();
  }

  async function resend() {
    if (!unverified) return;
    await authClient.sendVerificationEmail({ email: unverified, callbackURL: safeNext(next) });
    setInfo('A new confirmation link is on its way.');
  }

  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <h1>Sign in</h1>
      {info && <Notice tone="good">{info}</Notice>}
      {error && (
        <Notice tone="bad">
          {error}{' '}
          {unverified && (
            <button type="button" className="underline" onClick={resend}>
              Send the link again
            </button>
          )}
        </Notice>
      )}
      <TextField label="E-mail" name="email" type="email" autoComplete="email" required />
      <TextField label="Password" name="password" type="password" autoComplete="current-password" required />
      <Button type="submit" disabled={pending} className="w-full">
        {pending ? 'Signing in…' : 'Sign in'}
      </Button>
      <p className="flex justify-between text-xs text-ink-muted">
        <Link href={`/sign-up${next ? `?next=${encodeURIComponent(next)}` : ''}`}>Create an account</Link>
        <Link href="/forgot-password">Forgot your password?</Link>
      </p>
    </form>
  );
}
