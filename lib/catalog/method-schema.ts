import { z } from 'zod';
import { APPROACHES } from '@/lib/record-kinds';
import { parseGrid } from './k-point-density';
import { optionalBoolean, optionalPositiveNumber, optionalText, requiredText } from './fields';

export const FUNCTIONAL_SUGGESTIONS = ['LDA', 'PBE', 'PBEsol', 'r2SCAN', 'HSE06'] as const;

export const APPROACH_LABELS: Record<(typeof APPROACHES)[number], string> = {
  perturbation: 'Perturbation theory (DFPT)',
  'finite-displacement': 'Finite displacement',
};

const gridField = (label: string) =>
  z.preprocess(
    (v) => (Array.isArray(v) ? v.join('x') : v),
    optionalText(20).transform((value, ctx) => {
      if (value === undefined) return undefined;
      const grid = parseGrid(value);
      if (!grid) {
        ctx.issues.push({ code: 'custom', message: `${label} must be three positive whole numbers like "8x8x8", got "${value}".`, input: value });
        return z.NEVER;
      }
      return grid;
    }),
  );

export const methodInputSchema = z.object({
  label: requiredText('A label', 100),
  functional: requiredText('A functional', 60),
  dispersion: optionalText(60),
  pseudopotential: optionalText(120),
  cutoffEv: optionalPositiveNumber('The cutoff'),
  kGrid: gridField('The k-point grid'),
  qGrid: gridField('The q-point grid'),
  smearing: optionalText(60),
  approach: z.preprocess((v) => (v === '' || v === null ? undefined : v), z.enum(APPROACHES, 'Choose perturbation or finite displacement.').optional()),
  nonAnalyticCorrection: optionalBoolean,
  notes: optionalText(4000),
});

export type MethodInput = z.infer<typeof methodInputSchema>;
