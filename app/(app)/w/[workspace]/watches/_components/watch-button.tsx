'use client';
import { useActionState } from 'react';
import Link from 'next/link';
import { watchAction } from '@/app/(app)/w/[workspace]/watches/actions';
import { SubmitButton } from '@/components/ui/submit-button';
import { buttonClass } from '@/components/ui/button';
import { UnwatchButton } from './unwatch-button';
import { WatchSettingsForm, type BenchmarkThresholds, type WatchSettingsValue } from './watch-settings-form';

/**
 * Watch / Unwatch for the benchmark page. Watching shows a settings popover
 * (a native <details>, so it works without script and with the keyboard).
 */
export function WatchButton({
  workspaceId,
  workspaceSlug,
  benchmarkId,
  benchmarkName,
  watch,
  defaults,
  unit,
}: {
  workspaceId: string;
  workspaceSlug: string;
  benchmarkId: string;
  benchmarkName: string;
  /** The user's active watch, or null. */
  watch: WatchSettingsValue | null;
  defaults: BenchmarkThresholds;
  unit: string;
}) {
  const [state, action] = useActionState(watchAction, { ok: false });
  if (!watch) {
    return (
      <form action={action} className="inline-flex items-center gap-2" aria-label={`Watch ${benchmarkName}`}>
        <input type="hidden" name="workspaceId" value={workspaceId} />
        <input type="hidden" name="benchmarkId" value={benchmarkId} />
        <input type="hidden" name="mode" value="immediate" />
        <SubmitButton variant="secondary" pendingLabel="Watching…">
          Watch
        </SubmitButton>
        {state.message && !state.ok ? <span className="text-xs text-bad">{state.message}</span> : null}
      </form>
    );
  }
  return (
    <details className="relative" data-testid="watch-settings">
      <summary className={buttonClass('secondary', 'cursor-pointer list-none')}>
        Watching · {watch.mode === 'digest' ? 'daily digest' : 'alerts'}
        <span className="sr-only"> (alert settings)</span>
      </summary>
      <div className="absolute right-0 z-20 mt-1 w-[26rem] space-y-3 rounded-lg border border-rule bg-panel p-4 shadow-lg">
        <p className="text-sm text-ink-muted">
          You get an e-mail when this benchmark shifts beyond your thresholds. <Link href={`/w/${workspaceSlug}/watches`}>All my watches</Link>
        </p>
        <WatchSettingsForm workspaceId={workspaceId} watch={watch} defaults={defaults} unit={unit} />
        <div className="border-t border-rule pt-3">
          <UnwatchButton workspaceId={workspaceId} watchId={watch.id} benchmarkName={benchmarkName} />
        </div>
      </div>
    </details>
  );
}
