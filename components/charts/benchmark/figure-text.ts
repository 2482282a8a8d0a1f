/**
 * The text alternative of a benchmark plot: a short summary (what is plotted, N,
 * the range, the worst points) and the table of the points it draws, built from
 * the same filtered points the spec gets. Pure, so the page, the deck slide and
 * the tests all read the same words.
 */
import { histogramBins, plotNumber, type AgreementLimits, type PairedPoint, type ParityPoint } from './specs';
import { header } from '@/lib/format';

/** A unit after a number, or nothing for a dimensionless quantity. */
const spaced = (unit: string) => (unit ? ` ${unit}` : '');

export type FigureKind = 'parity' | 'residuals' | 'bland-altman' | 'histogram' | 'comparison';

export interface FigureRow {
  /** The pair key, when the row is one point that can be opened. */
  key?: string;
  cells: string[];
  /** What a keyboard cursor announces on this point. */
  spoken?: string;
}

export interface FigureText {
  summary: string;
  table: { caption: string; columns: string[]; rows: FigureRow[] };
  /** Points in the order the arrow keys visit them (left to right along x). */
  navigation: FigureRow[];
}

const WORST = 3;

function range(values: readonly number[], unit: string): string {
  if (!values.length) return 'none';
  return `${plotNumber(Math.min(...values), 1)} to ${plotNumber(Math.max(...values), 1)}${spaced(unit)}`;
}

function methodList(points: readonly { method: string }[]): string[] {
  return [...new Set(points.map((p) => p.method))];
}

function pairName(p: ParityPoint): string {
  return `${p.material} ${p.label} (${p.method})`;
}

function statusText(p: ParityPoint): string {
  return p.excluded ? 'excluded' : p.outlier ? 'flagged outlier' : 'included';
}

function spokenPair(p: ParityPoint, unit: string): string {
  return `${pairName(p)}: measured ${plotNumber(p.measured)}, calculated ${plotNumber(p.calculated)}, error ${plotNumber(p.error, 2, true)}${spaced(unit)}, ${statusText(p)}`;
}

function worstOf(points: readonly ParityPoint[], unit: string): string {
  const worst = [...points].filter((p) => !p.excluded).sort((a, b) => Math.abs(b.error) - Math.abs(a.error)).slice(0, WORST);
  if (!worst.length) return '';
  return ` Largest errors: ${worst.map((p) => `${pairName(p)} ${plotNumber(p.error, 1, true)}${spaced(unit)}`).join('; ')}.`;
}

function counts(points: readonly ParityPoint[]): string {
  const excluded = points.filter((p) => p.excluded).length;
  const flagged = points.filter((p) => p.outlier && !p.excluded).length;
  return `${flagged} flagged as outliers, ${excluded} excluded.`;
}

function pairTable(points: readonly ParityPoint[], unit: string, caption: string, x: (p: ParityPoint) => number): Pick<FigureText, 'table' | 'navigation'> {
  const row = (p: ParityPoint): FigureRow => ({
    key: p.key,
    spoken: spokenPair(p, unit),
    cells: [p.material, p.label, p.method, plotNumber(p.measured), plotNumber(p.calculated), plotNumber(p.error, 2, true), statusText(p), p.citation],
  });
  return {
    table: {
      caption,
      columns: ['Material', 'Mode', 'Method', header(`Measured`, unit), header(`Calculated`, unit), header(`Error`, unit), 'Status', 'Source'],
      rows: [...points].sort((a, b) => Math.abs(b.error) - Math.abs(a.error)).map(row),
    },
    navigation: [...points].sort((a, b) => x(a) - x(b) || a.key.localeCompare(b.key)).map(row),
  };
}

export function parityText(points: readonly ParityPoint[], unit: string): FigureText {
  const methods = methodList(points);
  const summary =
    `Parity plot: calculated against measured for ${points.length} pairs of ${methods.length} ${methods.length === 1 ? 'method' : 'methods'} (${methods.join(', ')}), ` +
    `measured ${range(points.map((p) => p.measured), unit)}, calculated ${range(points.map((p) => p.calculated), unit)}. ${counts(points)}${worstOf(points, unit)}`;
  return { summary, ...pairTable(points, unit, 'Points of the parity plot, largest error first', (p) => p.measured) };
}

export function residualText(points: readonly ParityPoint[], unit: string): FigureText {
  const methods = methodList(points);
  const summary =
    `Residuals: error (calculated − measured) against measured for ${points.length} pairs of ${methods.length} ${methods.length === 1 ? 'method' : 'methods'}, ` +
    `measured ${range(points.map((p) => p.measured), unit)}, errors ${range(points.map((p) => p.error), unit)}. ${counts(points)}${worstOf(points, unit)}`;
  return { summary, ...pairTable(points, unit, 'Points of the residual plot, largest error first', (p) => p.measured) };
}

export function blandAltmanText(points: readonly ParityPoint[], limits: readonly AgreementLimits[], unit: string): FigureText {
  const included = points.filter((p) => !p.excluded);
  const methods = methodList(included);
  const lines = limits
    .map((l) => {
      const outside = included.filter((p) => p.method === l.method && (p.error < l.lower || p.error > l.upper)).length;
      return `${l.method}: bias ${plotNumber(l.bias, 2, true)}${spaced(unit)}, 95 % limits of agreement ${plotNumber(l.lower, 2, true)} to ${plotNumber(l.upper, 2, true)}${spaced(unit)}, ${outside} ${outside === 1 ? 'pair' : 'pairs'} outside them.`;
    })
    .join(' ');
  const summary =
    `Bland–Altman plot for ${methods.join(', ') || 'no method'}: difference (calculated − measured) against the mean of the two for ${included.length} included pairs, ` +
    `means ${range(included.map((p) => p.mean), unit)}. ${lines}${worstOf(included, unit)}`;
  return { summary, ...pairTable(included, unit, 'Points of the Bland–Altman plot, largest difference first', (p) => p.mean) };
}

export function histogramText(points: readonly ParityPoint[], unit: string, methods: readonly string[], maxBins?: number): FigureText {
  const included = points.filter((p) => !p.excluded);
  const { step } = histogramBins(included.map((p) => p.error), maxBins);
  const rows: FigureRow[] = [];
  const parts: string[] = [];
  for (const method of methods) {
    const errors = included.filter((p) => p.method === method).map((p) => p.error);
    if (!errors.length) continue;
    const bins = new Map<number, number>();
    for (const e of errors) {
      const lo = Math.floor(e / step) * step;
      bins.set(lo, (bins.get(lo) ?? 0) + 1);
    }
    const [modeLo, modeN] = [...bins.entries()].sort((a, b) => b[1] - a[1] || a[0] - b[0])[0];
    parts.push(`${method}: ${errors.length} pairs, errors ${range(errors, unit)}, most between ${plotNumber(modeLo, 1)} and ${plotNumber(modeLo + step, 1)} (${modeN})`);
    for (const [lo, n] of [...bins.entries()].sort((a, b) => a[0] - b[0])) rows.push({ cells: [method, `${plotNumber(lo, 1)} to ${plotNumber(lo + step, 1)}`, String(n)] });
  }
  const summary = `Error histogram of ${included.length} included pairs, one panel per method, bins of ${plotNumber(step, step < 1 ? 2 : 0)}${spaced(unit)}. ${parts.join('; ')}.`;
  return { summary, table: { caption: 'Bins of the error histogram', columns: ['Method', header(`Error bin`, unit), 'Pairs'], rows }, navigation: [] };
}

export function comparisonText(points: readonly PairedPoint[], unit: string, a: string, b: string): FigureText {
  const aCloser = points.filter((p) => p.a < p.b).length;
  const bCloser = points.filter((p) => p.b < p.a).length;
  const worst = [...points].sort((x, y) => Math.abs(y.a - y.b) - Math.abs(x.a - x.b)).slice(0, WORST);
  const row = (p: PairedPoint): FigureRow => ({
    key: p.key,
    spoken: `${p.material} ${p.label}: |error| ${a} ${plotNumber(p.a)}, ${b} ${plotNumber(p.b)}${spaced(unit)}`,
    cells: [p.material, p.label, plotNumber(p.a), plotNumber(p.b), plotNumber(p.b - p.a, 2, true)],
  });
  const summary =
    `Method comparison: |error| of ${b} against |error| of ${a} on ${points.length} common pairs, ${range(points.flatMap((p) => [p.a, p.b]), unit)}; ` +
    `${a} closer on ${aCloser}, ${b} closer on ${bCloser}, ${points.length - aCloser - bCloser} tied.` +
    (worst.length ? ` Largest differences: ${worst.map((p) => `${p.material} ${p.label} ${plotNumber(p.b - p.a, 1, true)}${spaced(unit)}`).join('; ')}.` : '');
  return {
    summary,
    table: {
      caption: 'Common pairs of the two methods, largest difference first',
      columns: ['Material', 'Mode', header(`|error| ${a}`, unit), header(`|error| ${b}`, unit), header(`Difference`, unit)],
      rows: [...points].sort((x, y) => Math.abs(y.a - y.b) - Math.abs(x.a - x.b)).map(row),
    },
    navigation: [...points].sort((x, y) => x.a - y.a || x.key.localeCompare(y.key)).map(row),
  };
}
