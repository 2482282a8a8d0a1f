/**
 * The one error type of the science module. Its message names the argument
 * that was wrong and why, so that callers can show it to a person unchanged.
 */
export class ScienceInputError extends Error {
  /** Name of the offending argument (e.g. "temperatureK", "pairs[3].measured"). */
  readonly argument: string;

  constructor(argument: string, reason: string) {
    super(`${argument}: ${reason}`);
    this.name = 'ScienceInputError';
    this.argument = argument;
  }
}

/** Throws unless `value` is a finite number. */
export function requireFinite(argument: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new ScienceInputError(argument, `must be a finite number, got ${String(value)}`);
  }
}

/** Throws unless `value` is a finite number > 0. */
export function requirePositive(argument: string, value: number): void {
  requireFinite(argument, value);
  if (value <= 0) throw new ScienceInputError(argument, `must be greater than 0, got ${value}`);
}

/** Throws unless `value` is a finite number ≥ 0. */
export function requireNonNegative(argument: string, value: number): void {
  requireFinite(argument, value);
  if (value < 0) throw new ScienceInputError(argument, `must not be negative, got ${value}`);
}

/** Throws unless `values` is an array of at least `minLength` finite numbers. */
export function requireFiniteArray(argument: string, values: readonly number[], minLength = 1): void {
  if (!Array.isArray(values)) throw new ScienceInputError(argument, 'must be an array of numbers');
  if (values.length < minLength) {
    throw new ScienceInputError(argument, `needs at least ${minLength} value${minLength === 1 ? '' : 's'}, got ${values.length}`);
  }
  for (let i = 0; i < values.length; i++) requireFinite(`${argument}[${i}]`, values[i]);
}
