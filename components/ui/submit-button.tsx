'use client';
import { useFormStatus } from 'react-dom';
import { Button } from './button';

export function SubmitButton({ children, pendingLabel, variant }: { children: React.ReactNode; pendingLabel?: string; variant?: 'primary' | 'secondary' | 'danger' }) {
  const { pending } = useFormStatus();
  return (
    <Button type="submit" variant={variant} disabled={pending} aria-disabled={pending}>
      {pending ? (pendingLabel ?? 'Working…') : children}
    </Button>
  );
}
