import type { ActionState } from '@/lib/action-state';
import { Notice } from './notice';

export function FormMessage({ state }: { state: ActionState | undefined }) {
  if (!state?.message) return null;
  return <Notice tone={state.ok ? 'good' : 'bad'}>{state.message}</Notice>;
}
