import type { Metadata } from 'next';
import { SignInForm } from './sign-in-form';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string; verified?: string; reset?: string }> }) {
  const params = await searchParams;
  return <SignInForm next={params.next} notice={params.reset ? 'Password changed. Sign in with the new one.' : undefined} />;
}
