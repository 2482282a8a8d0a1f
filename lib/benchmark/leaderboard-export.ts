/**
 * The leaderboard of a revision as a file: CSV for a spreadsheet (machine numbers, full
 * precision, formula-injection safe) and a LaTeX table for a paper (the page's decimals,
 * minus signs as $-$, every special character escaped). Both carry what the rank rests
 * on: N, coverage, the common-pair MAE and N, the interval, outliers and exclusions.
 */
import { toCsv } from '@/lib/csv';
import { MINUS, fixed, header, signed, stat } from '@/lib/format';
import type { BenchmarkSnapshot, MethodResult } from './types';

export interface LeaderboardExportContext {
  benchmarkName: string;
  revisionNumber: number;
  fingerprint: string;
}

export const LEADERBOARD_CSV_COLUMNS = [
  'rank',
  'method',
  'n',
  'coverage_percent',
  'paired',
  'unpaired_measurements',
  'common_n',
  'common_mae',
  'mae',
  'mae_interval_lower',
  'mae_interval_upper',
  'interval_confidence',
  'interval_resampled',
  'mean_signed_error',
  'rmse',
  'outliers',
  'quality_flags',
  'excluded',
  'unit',
  'not_ranked_because',
] as const;

/** One line per method in the page's order; numbers as the machine reads them. */
export function leaderboardCsv(snapshot: BenchmarkSnapshot): string {
  const rows = snapshot.methods.map((m) => {
    const s = m.statistics;
    return [
      m.rank,
      m.label,
      m.n,
      m.coverage === null || m.coverage === undefined ? null : 100 * m.coverage,
      m.paired ?? null,
      m.unpairedMeasurements,
      m.common?.n ?? null,
      m.common?.meanAbsoluteError ?? null,
      s?.meanAbsoluteError ?? null,
      s?.bootstrap?.meanAbsoluteError[0] ?? null,
      s?.bootstrap?.meanAbsoluteError[1] ?? null,
      s?.bootstrap?.confidence ?? null,
      s?.bootstrap ? (s.bootstrap.resampled ?? 'pairs') : null,
      s?.meanSignedError ?? null,
      s?.rootMeanSquareError ?? null,
      m.outliers,
      m.qualityFlags,
      m.excluded,
      snapshot.unit,
      m.unranked ?? null,
    ];
  });
  return toCsv(LEADERBOARD_CSV_COLUMNS, rows);
}

const LATEX_SPECIAL: Record<string, string> = {
  '\\': '\\textbackslash{}',
  '{': '\\{',
  '}': '\\}',
  $: '\\$',
  '&': '\\&',
  '#': '\\#',
  '%': '\\%',
  _: '\\_',
  '^': '\\textasciicircum{}',
  '~': '\\textasciitilde{}',
  '<': '\\textless{}',
  '>': '\\textgreater{}',
  '·': '\\textperiodcentered{}',
  [MINUS]: '$-$',
  '–': '--',
  '—': '---',
  '±': '$\\pm$',
  '×': '$\\times$',
  '²': '$^{2}$',
  'χ': '$\\chi$',
  'λ': '$\\lambda$',
  'Γ': '$\\Gamma$',
  'σ': '$\\sigma$',
  'ε': '$\\varepsilon$',
  'ω': '$\\omega$',
  'ν': '$\\nu$',
};

const SUPERSCRIPT_RUN = /[⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+/g;
const SUPERSCRIPT_DIGIT: Record<string, string> = { '⁻': '-', '⁰': '0', '¹': '1', '²': '2', '³': '3', '⁴': '4', '⁵': '5', '⁶': '6', '⁷': '7', '⁸': '8', '⁹': '9' };

/** Text for a LaTeX document: special characters escaped, true minus as $-$, unit superscripts as math ("cm⁻¹" → "cm$^{-1}$"). */
export function latexText(text: string): string {
  let out = '';
  let last = 0;
  for (const match of text.matchAll(SUPERSCRIPT_RUN)) {
    out += escapeRun(text.slice(last, match.index));
    out += `$^{${[...match[0]].map((c) => SUPERSCRIPT_DIGIT[c]).join('')}}$`;
    last = match.index + match[0].length;
  }
  return out + escapeRun(text.slice(last));
}

function escapeRun(text: string): string {
  return [...text].map((c) => LATEX_SPECIAL[c] ?? (c === '\u00a0' ? '~' : c)).join('');
}

function interval(m: MethodResult): string {
  const b = m.statistics?.bootstrap;
  return b ? `[${stat('error', b.meanAbsoluteError[0])}, ${stat('error', b.meanAbsoluteError[1])}]` : '---';
}

/** A tabular of the leaderboard with a caption naming the benchmark, revision, unit and interval; needs the booktabs package. */
export function leaderboardLatex(snapshot: BenchmarkSnapshot, ctx: LeaderboardExportContext): string {
  const unit = latexText(snapshot.unit);
  const boot = snapshot.methods.find((m) => m.statistics?.bootstrap)?.statistics?.bootstrap;
  const level = boot ? Math.round(100 * boot.confidence) : 95;
  const head = ['Rank', 'Method', '$N$', 'Coverage (\\%)', header('MAE, common pairs', unit), 'Common $N$', header('MAE', unit), `${level}\\,\\% interval`, header('MSE', unit), header('RMSE', unit), 'Outliers', 'Excluded'];
  const cell = (v: string) => latexText(v);
  const rows = snapshot.methods.map((m) => {
    const s = m.statistics;
    return [
      m.rank === null ? '---' : String(m.rank),
      cell(m.label),
      String(m.n),
      m.coverage === null || m.coverage === undefined ? '---' : cell(fixed(100 * m.coverage, 0)),
      m.common ? cell(stat('error', m.common.meanAbsoluteError)) : '---',
      m.common ? String(m.common.n) : '---',
      s ? cell(stat('error', s.meanAbsoluteError)) : '---',
      s ? cell(interval(m)) : '---',
      s ? cell(signed(s.meanSignedError)) : '---',
      s ? cell(stat('error', s.rootMeanSquareError)) : '---',
      String(m.outliers),
      String(m.excluded),
    ].join(' & ');
  });
  const resampled = boot?.resampled === 'clusters' ? 'resampling whole materials' : 'resampling single pairs';
  const ranking = snapshot.ranking;
  const basis = ranking && ranking.rankedMethods > 0 ? `Ranked on the ${ranking.commonN} pairs all ${ranking.rankedMethods} ranked methods share. ` : '';
  const caption =
    `${latexText(ctx.benchmarkName)}, revision ${ctx.revisionNumber} (sha256:${ctx.fingerprint.slice(0, 16)}). ${basis}` +
    `Errors are ${snapshot.reference ? `candidate $-$ reference (${latexText(snapshot.reference.label)})` : 'calculated $-$ measured'}${unit ? `, in ${unit}` : ' (dimensionless)'}; MAE intervals from a bootstrap ${resampled}. Methods without a rank are listed, not ranked.`;
  return [
    '% Lattice Ledger leaderboard export; needs \\usepackage{booktabs}',
    '\\begin{table}',
    '\\centering',
    `\\caption{${caption}}`,
    `\\begin{tabular}{rl${'r'.repeat(head.length - 2)}}`,
    '\\toprule',
    `${head.join(' & ')} \\\\`,
    '\\midrule',
    ...rows.map((r) => `${r} \\\\`),
    '\\bottomrule',
    '\\end{tabular}',
    '\\end{table}',
    '',
  ].join('\n');
}
