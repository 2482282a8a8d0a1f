import { z } from 'zod';
import type { WatchThresholds } from '@/lib/alerts/thresholds';

const blank = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);
const optionalPositive = (label: string) =>
  z.preprocess(
    blank,
    z.coerce
      .number({ message: `${label} must be a number.` })
      .refine(Number.isFinite, `${label} must be a number.`)
      .refine((v) => v > 0, `${label} must be greater than 0.`)
      .optional(),
  );

export const WATCH_MODES = ['immediate', 'digest'] as const;

export const watchFormSchema = z.object({
  workspaceId: z.string().min(1),
  benchmarkId: z.string().min(1, 'Which benchmark?'),
  mode: z.enum(WATCH_MODES, 'Choose immediate alerts or a daily digest.').default('immediate'),
});

export const watchIdSchema = z.object({ workspaceId: z.string().min(1), watchId: z.string().min(1, 'Which watch?') });

/** The settings form: blank thresholds mean "the benchmark's". Percentages in the form, fractions in storage. */
export const watchSettingsSchema = watchIdSchema.extend({
  mode: z.enum(WATCH_MODES, 'Choose immediate alerts or a daily digest.'),
  maeCm1: optionalPositive('The MAE threshold'),
  maeRelativePercent: optionalPositive('The relative MAE threshold'),
  nRelativePercent: optionalPositive('The N threshold'),
});

export function thresholdsFromForm(f: z.infer<typeof watchSettingsSchema>): WatchThresholds {
  const out: WatchThresholds = {};
  if (f.maeCm1 !== undefined) out.maeCm1 = f.maeCm1;
  if (f.maeRelativePercent !== undefined) out.maeRelative = f.maeRelativePercent / 100;
  if (f.nRelativePercent !== undefined) out.nRelative = f.nRelativePercent / 100;
  return out;
}

/** The webhook form: a URL, or blank to remove the webhook. The URL policy is applied by the service (lib/webhooks/url-policy.ts). */
export const watchWebhookSchema = watchIdSchema.extend({
  webhookUrl: z.string('Give a URL, or leave it blank to remove the webhook.').max(2000, 'A webhook URL has at most 2000 characters.').default(''),
});
