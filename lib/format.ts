/**
 * The one number style of Lattice Ledger, for pages, e-mails, exports and decks.
 *
 * For people (pages, e-mails, decks):
 *   fixed(v, d)          v with d decimals, true minus sign (U+2212), "—" when missing
 *   signed(v, d)         the same with an explicit sign: +1.20, −1.20, ±0.00
 *   stat(kind, v)        fixed decimals chosen per kind of number (DECIMALS below)
 *   significant(v, n)    n significant figures, never in exponent notation
 *   asEntered(v, text)   a converted value with the significant figures of the text it came from
 *   plain(v)             a value with its own digits only (no float noise, no trailing zeros)
 *   count(n)             a whole number with thousands separators (1,234)
 *   pValue(p)            p with 4 decimals, or 2 significant figures in exponent form below 10⁻⁴
 *   withUnit(text, unit) the number and its unit joined by a no-break space
 *   header(label, unit)  a column header with its unit: "MAE (cm⁻¹)"
 *   utcMinute(date)      "2026-03-12 09:41 UTC"
 *   trueMinus(text)      a sentence that already holds numbers ("z-score -5.14") with true minus signs
 * For machines (CSV, JSON):
 *   csvNumber(v)         ASCII minus, no float noise (11.399999999999977 → 11.4), full real precision
 *
 * Moving old helpers over: `fmt(v, d)` → `fixed(v, d)`; `signed(v, d)` → `signed(v, d)`;
 * `when(date)` → `utcMinute(date)`; `v.toFixed(2)` of a statistic → `stat('error', v)`.
 */

export const MINUS = '\u2212';
export const NO_VALUE = '—';
const NBSP = '\u00a0';

type Maybe = number | null | undefined;

const missing = (value: Maybe): value is null | undefined => value === null || value === undefined || !Number.isFinite(value);

/** A JavaScript number string with its sign as a true minus, and "−0.00" written "0.00". */
function typeset(text: string): string {
  if (!text.startsWith('-')) return text;
  return /^-[0.]*$/.test(text) ? text.slice(1) : MINUS + text.slice(1);
}

/** `value` with exactly `decimals` decimals. */
export function fixed(value: Maybe, decimals = 2): string {
  if (missing(value)) return NO_VALUE;
  return typeset(value.toFixed(decimals));
}

/** `value` with an explicit sign (+, −, or ± for zero), for errors and differences. */
export function signed(value: Maybe, decimals = 2): string {
  if (missing(value)) return NO_VALUE;
  const magnitude = Math.abs(value).toFixed(decimals);
  if (/^[0.]*$/.test(magnitude)) return `±${magnitude}`;
  return `${value > 0 ? '+' : MINUS}${magnitude}`;
}

/**
 * Decimals per kind of number, so that the same kind reads the same everywhere.
 * Frequencies and their errors in cm⁻¹, entropies in J mol⁻¹ K⁻¹.
 */
export const DECIMALS = {
  /** A frequency that was computed, not typed (a mean, a converted value without its text). */
  frequency: 1,
  /** Errors, MAE, RMSE, bias, limits of agreement, in the quantity's unit. */
  error: 2,
  entropy: 2,
  /** Modified z-scores and other dimensionless scores. */
  score: 2,
  /** Percentages (MAPE, relative error × 100, shares). */
  percent: 1,
  /** Pearson r, Lin's CCC. */
  correlation: 3,
  /** Least-squares scale factors (0.9712). */
  scaleFactor: 4,
  temperature: 1,
} as const;
export type StatKind = keyof typeof DECIMALS;

/** A number of a known kind with that kind's decimals. */
export function stat(kind: StatKind, value: Maybe): string {
  return fixed(value, DECIMALS[kind]);
}

/** `value` to `figures` significant figures, in positional notation (1300, not 1.3e+3). */
export function significant(value: Maybe, figures: number): string {
  if (missing(value)) return NO_VALUE;
  const n = Math.max(1, Math.min(21, Math.round(figures)));
  const rounded = Number(value.toPrecision(n));
  if (rounded === 0) return fixed(0, Math.max(0, n - 1));
  const magnitude = Math.floor(Math.log10(Math.abs(rounded)));
  return fixed(rounded, Math.min(100, Math.max(0, n - 1 - magnitude)));
}

/** `value` as "3.12 × 10⁻⁵" to `figures` significant figures; plainly when its exponent is between −2 and 3. */
export function scientific(value: Maybe, figures = 3): string {
  if (missing(value)) return NO_VALUE;
  if (value === 0) return '0';
  const [mantissa, exponent] = value.toExponential(Math.max(0, figures - 1)).split('e');
  const power = Number(exponent);
  if (power >= -2 && power <= 3) return significant(value, figures);
  return `${typeset(String(Number(mantissa)))} × 10${superscript(power)}`;
}

/**
 * Significant figures of a number as written. Leading zeros never count; trailing
 * zeros of a whole number ("1300") are taken as significant, since the writer
 * typed them; "1.30e3" has 3.
 */
export function significantFiguresOf(text: string): number {
  const mantissa = text.trim().replace(/^[+\-\u2212]/, '').split(/[eE]/)[0];
  const digits = mantissa.replace('.', '').replace(/^0+/, '');
  return Math.max(1, digits.length);
}

/**
 * A value converted from what was entered, shown with no more significant figures
 * than the entry had ("12.15" THz → 405.3 cm⁻¹, not 405.280). When the value is the
 * entry itself (same unit), pass `sameUnit` and the text comes back as typed, "1.50" included.
 */
export function asEntered(value: Maybe, text: string, sameUnit = false): string {
  if (sameUnit && /^[+-]?(?:\d+\.?\d*|\.\d+)$/.test(text.trim())) return typeset(text.trim().replace(/^\+/, ''));
  return significant(value, significantFiguresOf(text));
}

/** Doubles carry 15–17 digits; every input here carries far fewer, so 10 keep them all and drop a subtraction's noise. */
const CLEAN_DIGITS = 10;

function clean(value: number): number {
  return Number.isInteger(value) ? value : Number(value.toPrecision(CLEAN_DIGITS));
}

/** A value with its own digits only: 11.399999999999977 → "11.4", 569 → "569", true minus. */
export function plain(value: Maybe): string {
  if (missing(value)) return NO_VALUE;
  return typeset(String(clean(value)));
}

/** A number for a CSV or JSON export: machine-readable (ASCII minus, no separators), without float noise. */
export function csvNumber(value: number): string {
  if (!Number.isFinite(value)) return '';
  const v = clean(value);
  return Object.is(v, -0) ? '0' : String(v);
}

const COUNT = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });

/** A count: 1,234. */
export function count(value: Maybe): string {
  if (missing(value)) return NO_VALUE;
  return typeset(COUNT.format(value).replace('\u2212', '-'));
}

/** A p-value: 4 decimals, or 2 significant figures in exponent form below 0.0001 (3.2 × 10⁻⁶). */
export function pValue(p: Maybe): string {
  if (missing(p)) return NO_VALUE;
  if (p === 0 || p >= 0.0001) return fixed(p, 4);
  const [mantissa, exponent] = p.toExponential(1).split('e');
  return `${mantissa} × 10${superscript(Number(exponent))}`;
}

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };
function superscript(n: number): string {
  return [...String(n)].map((c) => SUPERSCRIPT[c] ?? c).join('');
}

/** A number and its unit, kept on one line; a missing number has no unit. */
export function withUnit(text: string, unit: string | null | undefined): string {
  if (!unit || text === NO_VALUE) return text;
  return `${text}${NBSP}${unit}`;
}

/** A numeric column header with its unit in parentheses. */
export function header(label: string, unit: string | null | undefined): string {
  return unit ? `${label} (${unit})` : label;
}

/** Display symbols of the unit codes used in files and in storage. */
export const UNIT_SYMBOL: Record<string, string> = {
  'cm-1': 'cm⁻¹',
  THz: 'THz',
  meV: 'meV',
  'J/mol/K': 'J mol⁻¹ K⁻¹',
  'J/mol-atom/K': 'J mol⁻¹ K⁻¹ per atom',
  'kB/atom': 'k_B per atom',
  'kB/fu': 'k_B per formula unit',
  'cal/mol/K': 'cal mol⁻¹ K⁻¹',
  // dimensionless (dielectric constants)
  '1': '',
};

/** The display symbol of a unit code ("cm-1" → "cm⁻¹"); unknown codes come back unchanged. */
export function unitSymbol(code: string | null | undefined): string {
  if (!code) return '';
  return UNIT_SYMBOL[code] ?? code;
}

/** Canonical (stored) unit per quantity, as a display symbol. */
export const CANONICAL_UNIT_SYMBOL: Record<string, string> = {
  frequency: 'cm⁻¹',
  entropy: 'J mol⁻¹ K⁻¹',
  'heat-capacity': 'J mol⁻¹ K⁻¹',
  'eps-inf': '',
  'eps-static': '',
  'born-charge': 'e',
};

/** Canonical unit codes of the quantities the importer converts. */
const CANONICAL_UNIT_CODE: Record<string, string> = { frequency: 'cm-1', entropy: 'J/mol/K', 'heat-capacity': 'J/mol/K', 'eps-inf': '1', 'eps-static': '1', 'born-charge': 'e' };

/**
 * A stored value as people should read it: the text as typed when it was typed in
 * the canonical unit, else the canonical value with the typed significant figures;
 * with the canonical unit.
 */
export function storedValue(row: { quantity: string; value: number; valueText: string; unit: string }): string {
  const same = CANONICAL_UNIT_CODE[row.quantity] === row.unit;
  return withUnit(asEntered(row.value, row.valueText, same), CANONICAL_UNIT_SYMBOL[row.quantity]);
}

/** Hyphen-minus signs of the numbers in a text ("modified z-score -5.14 beyond ±3.5") as true minus signs; hyphens in words stay. */
export function trueMinus(text: string): string {
  return text.replace(/(^|[^\w.\-])-(?=\.?\d)/g, `$1${MINUS}`);
}

/** "2026-03-12 09:41 UTC": minutes, in UTC, so every reader sees the same time. */
export function utcMinute(date: Date | number): string {
  return new Date(date).toISOString().replace('T', ' ').slice(0, 16) + ' UTC';
}

/** A count with its noun in the right number: "1 mode", "6 modes", "1,200 pairs" (irregular plurals given). */
export function counted(value: number, singular: string, plural = `${singular}s`): string {
  return `${count(value)} ${value === 1 ? singular : plural}`;
}

/** A fraction as a percentage with a no-break space: 0.92 → "92 %", with `decimals` decimals. */
export function percentOf(fraction: Maybe, decimals = 0): string {
  if (missing(fraction)) return NO_VALUE;
  return `${fixed(100 * fraction, decimals)}${NBSP}%`;
}
