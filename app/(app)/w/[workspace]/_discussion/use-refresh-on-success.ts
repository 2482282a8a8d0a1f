'use client';
import { useEffect, useRef } from 'react';
import { useRouter } from 'next/navigation';
import type { ActionState } from '@/lib/action-state';

/** Re-reads the server page after an action succeeded (each new result once), and runs onSuccess. */
export function useRefreshOnSuccess(state: ActionState, onSuccess?: () => void) {
  const router = useRouter();
  const seen = useRef<ActionState | null>(null);
  useEffect(() => {
    if (state.ok && seen.current !== state) {
      seen.current = state;
      onSuccess?.();
      router.refresh();
    }
  }, [state, router, onSuccess]);
}
