import { z } from 'zod';

export const VIEW_KINDS = ['leaderboard', 'parity', 'histogram', 'residuals', 'bland-altman', 'comparison', 'outliers', 'material'] as const;
export type ViewKind = (typeof VIEW_KINDS)[number];

export const VIEW_KIND_LABELS: Record<ViewKind, string> = {
  leaderboard: 'Leaderboard',
  parity: 'Parity plot',
  histogram: 'Error histogram',
  residuals: 'Residuals',
  'bland-altman': 'Bland–Altman',
  comparison: 'Method comparison',
  outliers: 'Outlier table',
  material: 'Material page',
};

export const PLOT_KINDS = ['parity', 'histogram', 'residuals', 'bland-altman'] as const satisfies readonly ViewKind[];

/** What a saved view remembers of the screen it was saved from; every field optional. */
export const viewFiltersSchema = z
  .object({
    hiddenMethods: z.array(z.string().min(1).max(100)).max(100).optional(),
    bandPercent: z.number().min(0.5).max(50).optional(),
    showExcluded: z.boolean().optional(),
    /** Bland–Altman method, or the method shown on a material slide. */
    methodId: z.string().min(1).max(100).optional(),
    methodA: z.string().min(1).max(100).optional(),
    methodB: z.string().min(1).max(100).optional(),
    materialId: z.string().min(1).max(100).optional(),
  })
  .strict();
export type ViewFilters = z.infer<typeof viewFiltersSchema>;

/** Reads stored filters leniently: a view saved by an older version still opens. */
export function readFilters(value: unknown): ViewFilters {
  const parsed = viewFiltersSchema.safeParse(value ?? {});
  return parsed.success ? parsed.data : {};
}
