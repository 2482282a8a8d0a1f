import { z } from 'zod';
import { notANumberReason, parseDecimal } from '@/lib/import/numbers';

/** Form fields arrive as strings; an empty one means "not given". JSON callers may send null. */
function blankToUndefined(value: unknown): unknown {
  if (value === null) return undefined;
  if (typeof value === 'string' && value.trim() === '') return undefined;
  return typeof value === 'string' ? value.trim() : value;
}

const NO_NUL = (s: string) => !s.includes('\u0000');
const NUL_MESSAGE = 'Remove the NUL byte (character code 0).';

export const optionalText = (max = 500) =>
  z.preprocess(blankToUndefined, z.string().max(max, `At most ${max} characters.`).refine(NO_NUL, NUL_MESSAGE).optional());

export const requiredText = (label: string, max = 200) =>
  z.preprocess((v) => (typeof v === 'string' ? v.trim() : v), z.string(`${label} is required.`).min(1, `${label} is required.`).max(max, `At most ${max} characters.`).refine(NO_NUL, NUL_MESSAGE));

export const optionalInteger = (label: string, min: number, max: number) =>
  z.preprocess(
    blankToUndefined,
    z.coerce
      .number(`${label} must be a whole number.`)
      .int(`${label} must be a whole number.`)
      .min(min, `${label} must be between ${min} and ${max}.`)
      .max(max, `${label} must be between ${min} and ${max}.`)
      .optional(),
  );

export const optionalPositiveNumber = (label: string) =>
  z.preprocess(blankToUndefined, z.coerce.number(`${label} must be a number.`).positive(`${label} must be greater than 0.`).optional());

/**
 * A real number: a JSON number, or text as the import files write it (decimal point, optional exponent;
 * a decimal comma is refused with a hint). `check` returns why an otherwise valid number is refused.
 */
export const optionalDecimal = (label: string, check?: (n: number) => string | null) =>
  z.preprocess(
    blankToUndefined,
    z
      .union([z.number(), z.string()], `${label} must be a number.`)
      .optional()
      .transform((value, ctx) => {
        if (value === undefined) return undefined;
        const n = typeof value === 'number' ? (Number.isFinite(value) ? value : null) : parseDecimal(value);
        const problem = n === null ? `${label} must be a number${typeof value === 'string' ? `: ${notANumberReason(value)}` : '.'}` : (check?.(n) ?? null);
        if (problem) {
          ctx.issues.push({ code: 'custom', message: problem, input: value });
          return z.NEVER;
        }
        return n as number;
      }),
  );

/** Checkbox / select yes-no: "on", "yes", "true", true → true; "no", "false", false → false; blank → undefined. */
export const optionalBoolean = z.preprocess((v) => {
  const b = blankToUndefined(v);
  if (b === undefined || typeof b === 'boolean') return b;
  if (['on', 'yes', 'true', '1'].includes(String(b).toLowerCase())) return true;
  if (['no', 'false', '0', 'off'].includes(String(b).toLowerCase())) return false;
  return b;
}, z.boolean('Choose yes or no.').optional());

export const workspaceIdField = z.string().min(1);
export const reasonField = requiredText('A reason', 500);
