'use client';
import { useActionState, useState } from 'react';
import { TextField } from '@/components/ui/field';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';
import { updateQualityThresholdsAction } from '../actions';
import type { ThresholdField, ThresholdKey } from '../fields';

/** Controlled inputs, so that what was typed survives a refused submission. */
export function QualityThresholdsForm({ workspaceId, fields, current }: { workspaceId: string; fields: readonly ThresholdField[]; current: Record<ThresholdKey, number> }) {
  const [state, action] = useActionState(updateQualityThresholdsAction, { ok: false });
  const [values, setValues] = useState<Record<string, string>>(() => Object.fromEntries(fields.map((f) => [f.key, String(current[f.key])])));
  return (
    <form action={action} className="space-y-4">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <div className="grid gap-4 sm:grid-cols-2">
        {fields.map((f) => (
          <TextField
            key={f.key}
            label={`${f.label} (${f.unit})`}
            name={f.key}
            type="number"
            inputMode="decimal"
            step={f.step}
            min={0}
            max={f.max}
            required
            value={values[f.key]}
            onChange={(e) => setValues((v) => ({ ...v, [f.key]: e.target.value }))}
            errors={state.fieldErrors?.[f.key]}
            hint={`Default ${f.defaultValue}. ${f.explanation}`}
          />
        ))}
      </div>
      <div className="flex items-center gap-3">
        <SubmitButton pendingLabel="Saving…">Save thresholds</SubmitButton>
        <button
          type="button"
          className="text-sm text-ink-muted underline hover:text-ink"
          onClick={() => setValues(Object.fromEntries(fields.map((f) => [f.key, String(f.defaultValue)])))}
        >
          Fill in the defaults
        </button>
      </div>
      <FormMessage state={state} />
    </form>
  );
}
