'use client';
import type { TopLevelSpec } from 'vega-lite';
import { VegaChart } from './vega-chart';

export interface SpectrumLine {
  frequencyCm1: number;
  /** Irreducible representation or mode label, if any. */
  label: string | null;
  /** Source cite key (measured) or "mode N" (computed). */
  detail: string | null;
}

const MEASURED = 'Measured';

/** Label rows above (measured) or below (computed) the lines; a label that fits in none is left to the tooltip. */
const LABEL_LEVELS = 3;
const LEVEL_STEP = 0.3;
/** The plot's usual drawn width, and a label's width per character, in px (10 px sans-serif). */
const ASSUMED_WIDTH_PX = 640;
const CHAR_PX = 6;

/**
 * Staggers labels that would collide: each label goes on the lowest row whose last
 * label ends left of it, at the plot's usual width; past the last row it is thinned.
 * Returns the row per line index (null: no label drawn).
 */
export function labelLevels(lines: readonly SpectrumLine[], domain: [number, number], widthPx = ASSUMED_WIDTH_PX): Array<number | null> {
  const pxPerUnit = widthPx / Math.max(1e-9, domain[1] - domain[0]);
  const order = lines.map((l, i) => ({ l, i })).filter(({ l }) => l.label).sort((a, b) => a.l.frequencyCm1 - b.l.frequencyCm1);
  const rowEnds: number[] = Array(LABEL_LEVELS).fill(-Infinity);
  const levels: Array<number | null> = lines.map(() => null);
  for (const { l, i } of order) {
    const centre = (l.frequencyCm1 - domain[0]) * pxPerUnit;
    const half = ((l.label?.length ?? 0) * CHAR_PX + 6) / 2;
    const row = rowEnds.findIndex((end) => end <= centre - half);
    if (row === -1) continue;
    rowEnds[row] = centre + half;
    levels[i] = row;
  }
  return levels;
}

/**
 * Measured lines point up, the method's computed lines point down, on one
 * frequency axis, so a shifted or missing mode shows at a glance.
 */
export function stickSpectrumSpec(measured: SpectrumLine[], computed: SpectrumLine[], computedName: string): TopLevelSpec {
  const all = [...measured, ...computed].map((r) => r.frequencyCm1);
  const hi = all.length ? Math.max(...all) : 100;
  const lo = all.length ? Math.min(0, ...all) : 0;
  const domain: [number, number] = [lo, Math.ceil((hi * 1.05) / 50) * 50];
  const placed = (lines: SpectrumLine[], series: string, sign: 1 | -1) => {
    const levels = labelLevels(lines, domain);
    return lines.map((l, i) => ({
      ...l,
      series,
      base: 0,
      height: sign,
      // a label whose row is taken by its neighbours is not drawn (the tooltip keeps it)
      shownLabel: levels[i] === null ? null : l.label,
      labelY: sign * (1.15 + (levels[i] ?? 0) * LEVEL_STEP),
    }));
  };
  const rows = [...placed(measured, MEASURED, 1), ...placed(computed, computedName, -1)];
  const yDomain = [-(1.3 + (LABEL_LEVELS - 1) * LEVEL_STEP), 1.3 + (LABEL_LEVELS - 1) * LEVEL_STEP];
  const x = { field: 'frequencyCm1', type: 'quantitative' as const, title: 'Frequency (cm⁻¹)', scale: { domain, nice: false } };
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: 'container',
    height: 220,
    data: { values: rows },
    config: { aria: false, view: { stroke: null }, axis: { labelFont: 'sans-serif', titleFont: 'sans-serif', grid: false, domainColor: '#c3cbd2' }, legend: { orient: 'top', labelFont: 'sans-serif', titleFont: 'sans-serif' } },
    layer: [
      { data: { values: [{ base: 0 }] }, mark: { type: 'rule', color: '#c3cbd2' }, encoding: { y: { field: 'base', type: 'quantitative', axis: null } } },
      {
        mark: { type: 'rule', strokeWidth: 2 },
        encoding: {
          x,
          y: { field: 'base', type: 'quantitative', scale: { domain: yDomain }, axis: null },
          y2: { field: 'height' },
          color: { field: 'series', type: 'nominal', title: null, scale: { domain: [MEASURED, computedName], range: ['#1d5a6e', '#a3242c'] } },
          tooltip: [
            { field: 'series', type: 'nominal', title: 'Series' },
            { field: 'frequencyCm1', type: 'quantitative', title: 'cm⁻¹', format: '.1f' },
            { field: 'label', type: 'nominal', title: 'Label' },
            { field: 'detail', type: 'nominal', title: 'Source / mode' },
          ],
        },
      },
      {
        // acoustic and unlabelled lines carry no text (a null label would print "null")
        transform: [{ filter: 'isValid(datum.shownLabel) && datum.shownLabel !== ""' }],
        mark: { type: 'text', fontSize: 10, baseline: 'middle' },
        encoding: {
          x,
          y: { field: 'labelY', type: 'quantitative', scale: { domain: yDomain }, axis: null },
          text: { field: 'shownLabel' },
          color: { field: 'series', type: 'nominal', legend: null },
        },
      },
    ],
  };
}

function lineRange(lines: readonly SpectrumLine[]): string {
  if (!lines.length) return 'none';
  const f = lines.map((l) => l.frequencyCm1);
  return `${lines.length} from ${Math.min(...f).toFixed(1)} to ${Math.max(...f).toFixed(1)} cm⁻¹`;
}

/** What the spectrum shows, in words: counts, ranges and the closest measured–computed line pairs. */
export function stickSpectrumSummary(measured: readonly SpectrumLine[], computed: readonly SpectrumLine[], computedName: string): string {
  const nearest = measured
    .filter((m) => m.label)
    .map((m) => {
      const c = computed.filter((l) => l.label && l.label === m.label).sort((a, b) => Math.abs(a.frequencyCm1 - m.frequencyCm1) - Math.abs(b.frequencyCm1 - m.frequencyCm1))[0];
      return c ? `${m.label} ${(c.frequencyCm1 - m.frequencyCm1 >= 0 ? '+' : '−') + Math.abs(c.frequencyCm1 - m.frequencyCm1).toFixed(1)}` : null;
    })
    .filter((x): x is string => x !== null);
  return (
    `Stick spectrum: measured lines (up) ${lineRange(measured)}; lines computed with ${computedName} (down) ${lineRange(computed)}.` +
    (nearest.length ? ` Computed minus measured for lines with the same label, cm⁻¹: ${nearest.join(', ')}.` : '') +
    ' Every line is listed in the tables above.'
  );
}

export function StickSpectrum({ measured, computed, computedName, downloadName }: { measured: SpectrumLine[]; computed: SpectrumLine[]; computedName: string; downloadName?: string }) {
  return (
    <VegaChart
      spec={stickSpectrumSpec(measured, computed, computedName)}
      downloadName={downloadName}
      ariaLabel={`Stick spectrum of ${measured.length} measured and ${computed.length} computed (${computedName}) lines`}
      summary={stickSpectrumSummary(measured, computed, computedName)}
    />
  );
}
