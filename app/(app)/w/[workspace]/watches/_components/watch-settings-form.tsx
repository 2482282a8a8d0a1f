'use client';
import { useActionState } from 'react';
import { updateWatchAction } from '@/app/(app)/w/[workspace]/watches/actions';
import { SelectField, TextField } from '@/components/ui/field';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';

export interface WatchSettingsValue {
  id: string;
  mode: 'immediate' | 'digest';
  /** The watcher's overrides (fractions for the relative ones); absent = the benchmark's. */
  thresholds: { maeCm1?: number; maeRelative?: number; nRelative?: number };
}

export interface BenchmarkThresholds {
  maeCm1: number;
  maeRelative: number;
  nRelative: number;
}

const pct = (v: number | undefined) => (v === undefined ? '' : String(Math.round(v * 10_000) / 100));

/** Mode and personal thresholds of one watch; blank fields follow the benchmark's defaults, shown as placeholders. */
export function WatchSettingsForm({ workspaceId, watch, defaults, unit }: { workspaceId: string; watch: WatchSettingsValue; defaults: BenchmarkThresholds; unit: string }) {
  const [state, action] = useActionState(updateWatchAction, { ok: false });
  const errors = state.fieldErrors ?? {};
  return (
    <form action={action} className="space-y-3" aria-label="Alert settings">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="watchId" value={watch.id} />
      <SelectField label="Delivery" name="mode" id={`mode-${watch.id}`} defaultValue={watch.mode} errors={errors.mode}>
        <option value="immediate">An e-mail when it shifts</option>
        <option value="digest">A daily digest</option>
      </SelectField>
      <fieldset className="space-y-2">
        <legend className="text-[13px] font-medium text-ink">Your thresholds (blank: the benchmark’s)</legend>
        <div className="grid grid-cols-3 gap-2">
          <TextField
            label={`MAE change, ${unit}`}
            name="maeCm1"
            id={`maeCm1-${watch.id}`}
            inputMode="decimal"
            defaultValue={watch.thresholds.maeCm1 ?? ''}
            placeholder={String(defaults.maeCm1)}
            errors={errors.maeCm1}
          />
          <TextField
            label="MAE change, %"
            name="maeRelativePercent"
            id={`maeRelativePercent-${watch.id}`}
            inputMode="decimal"
            defaultValue={pct(watch.thresholds.maeRelative)}
            placeholder={pct(defaults.maeRelative)}
            errors={errors.maeRelativePercent}
          />
          <TextField
            label="N change, %"
            name="nRelativePercent"
            id={`nRelativePercent-${watch.id}`}
            inputMode="decimal"
            defaultValue={pct(watch.thresholds.nRelative)}
            placeholder={pct(defaults.nRelative)}
            errors={errors.nRelativePercent}
          />
        </div>
        <p className="text-xs text-ink-faint">
          An MAE shift must exceed both the absolute and the relative change. Rank changes, new outliers and methods entering or leaving the leaderboard always
          count.
        </p>
      </fieldset>
      <div className="flex items-center gap-3">
        <SubmitButton variant="secondary" pendingLabel="Saving…">
          Save settings
        </SubmitButton>
      </div>
      <FormMessage state={state} />
    </form>
  );
}
