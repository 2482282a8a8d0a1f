'use client';
import { useFormStatus } from 'react-dom';
import { Button } from './button';

export function SubmitButton({ children, pendingLabel, variant }: { children: React.ReactNode; pendingLabel?: string; variant?: 'primary' | 'secondary' | 'danger' }) {
  const { pending } = useFormStatus();
  return (
    // not `disabled` while pending: a disabled button drops the focus to the page
    <Button type="submit" variant={variant} aria-disabled={pending} className={pending ? 'cursor-wait opacity-60' : ''} onClick={(e) => pending && e.preventDefault()}>
      {pending ? (pendingLabel ?? 'Working…') : children}
    </Button>
  );
}
