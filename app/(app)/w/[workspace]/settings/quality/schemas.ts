import { z } from 'zod';
import { THRESHOLD_FIELDS, type ThresholdKey } from './fields';

function thresholdNumber(label: string, max: number) {
  return z.preprocess(
    (v) => (typeof v === 'string' ? (v.trim() === '' ? undefined : Number(v.trim())) : v),
    z
      .number({ error: (issue) => (issue.input === undefined ? `Enter the ${label.toLowerCase()}.` : 'Enter a number.') })
      .refine(Number.isFinite, 'Enter a finite number.')
      .gt(0, 'Must be greater than 0.')
      .max(max, `At most ${max.toLocaleString('en-GB')}.`),
  );
}

const shape = Object.fromEntries(THRESHOLD_FIELDS.map((f) => [f.key, thresholdNumber(f.label, f.max)])) as Record<ThresholdKey, ReturnType<typeof thresholdNumber>>;

export const qualityThresholdsSchema = z.object({ workspaceId: z.string().min(1), ...shape });
