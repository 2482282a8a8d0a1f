/**
 * A watcher's own alert thresholds, merged over the benchmark's defaults.
 * Units are those of detectShift: the benchmark's unit (cm⁻¹ or J mol⁻¹ K⁻¹) for
 * maeAbsolute (maeCm1 is its older name, still accepted), fractions (0.05 = 5 %) for
 * the relative ones.
 */
import { z } from 'zod';
import type { ShiftThresholds } from '@/lib/science';

export const watchThresholdsSchema = z.object({
  maeAbsolute: z.number().positive().optional(),
  maeCm1: z.number().positive().optional(),
  maeRelative: z.number().positive().optional(),
  nRelative: z.number().positive().optional(),
});

export type WatchThresholds = z.infer<typeof watchThresholdsSchema>;

/** Reads stored JSON; a row that no longer parses counts as "no override" rather than breaking every alert. */
export function readWatchThresholds(value: unknown): WatchThresholds {
  const parsed = watchThresholdsSchema.safeParse(value ?? {});
  return parsed.success ? parsed.data : {};
}

export type EffectiveThresholds = Required<Pick<ShiftThresholds, 'maeAbsolute' | 'maeRelative' | 'nRelative'>>;

/** The thresholds one watch uses: each override the watcher set, the benchmark's value otherwise. */
export function effectiveThresholds(
  benchmark: { maeAbsolute?: number; maeCm1?: number; maeRelative: number; nRelative: number },
  override: WatchThresholds,
): EffectiveThresholds {
  return {
    maeAbsolute: override.maeAbsolute ?? override.maeCm1 ?? benchmark.maeAbsolute ?? benchmark.maeCm1 ?? 0.5,
    maeRelative: override.maeRelative ?? benchmark.maeRelative,
    nRelative: override.nRelative ?? benchmark.nRelative,
  };
}

/** True when the watch has at least one override. */
export function hasOverride(override: WatchThresholds): boolean {
  return override.maeAbsolute !== undefined || override.maeCm1 !== undefined || override.maeRelative !== undefined || override.nRelative !== undefined;
}
