/**
 * Vega-Lite specifications of the benchmark plots, as typed pure functions.
 * Every layered x/y plot fixes one shared numeric domain with `zero: false`, so
 * the y = x reference and the ±band span exactly the data and the axes do not
 * start at 0. Colours follow the method order given, the same in every plot.
 */
import type { TopLevelSpec } from 'vega-lite';

export interface ParityPoint {
  key: string;
  method: string;
  material: string;
  label: string;
  measured: number;
  calculated: number;
  error: number;
  mean: number;
  uMeasured: number | null;
  excluded: boolean;
  outlier: boolean;
  citation: string;
}

/** Above this many marks the browser draws on a canvas (SVG with tens of thousands of nodes stalls). */
export const CANVAS_THRESHOLD = 5000;

export function rendererFor(pointCount: number): 'svg' | 'canvas' {
  return pointCount > CANVAS_THRESHOLD ? 'canvas' : 'svg';
}

const PALETTE = ['#1d5a6e', '#c2571a', '#6b4c9a', '#2f7d32', '#a3242c', '#8a6d00', '#1565c0', '#6d4c41', '#00838f', '#ad1457'];

function colour(methods: readonly string[]) {
  return { field: 'method', type: 'nominal' as const, title: 'Method', scale: { domain: [...methods], range: PALETTE.slice(0, Math.max(1, methods.length)) } };
}

function config(pointCount: number) {
  return {
    aria: pointCount <= 1000,
    font: 'Inter, system-ui, sans-serif',
    axis: { labelColor: '#4d5b69', titleColor: '#17212b', gridColor: '#eef1f3', domainColor: '#c3cbd2', tickColor: '#c3cbd2' },
    view: { stroke: '#dde2e6' },
    legend: { labelColor: '#4d5b69', titleColor: '#17212b', orient: 'bottom', direction: 'horizontal', labelLimit: 220 },
  };
}

/** A padded [min, max] over the given values; [0, 1] for none. */
export function sharedDomain(values: readonly number[], padFraction = 0.03): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo === Infinity) return [0, 1];
  const pad = (hi - lo || Math.abs(hi) || 1) * padFraction;
  return [lo - pad, hi + pad];
}

const TOOLTIP = [
  { field: 'material', title: 'Material' },
  { field: 'label', title: 'Mode' },
  { field: 'method', title: 'Method' },
  { field: 'measured', title: 'Measured', format: '.2f' },
  { field: 'calculated', title: 'Calculated', format: '.2f' },
  { field: 'error', title: 'Error', format: '+.2f' },
  { field: 'citation', title: 'Source' },
];

/** The included pairs (excluded ones are drawn hollow and grey, so they stay visible). */
function pointLayer(x: string, y: string, domainX: [number, number], domainY: [number, number], methods: readonly string[], titles: { x: string; y: string }) {
  return {
    mark: { type: 'point' as const, filled: true, size: 36, cursor: 'pointer' as const },
    params: [{ name: 'pick', select: { type: 'point' as const, fields: ['key'], on: 'click' } }],
    encoding: {
      x: { field: x, type: 'quantitative' as const, title: titles.x, scale: { domain: domainX, zero: false, nice: false } },
      y: { field: y, type: 'quantitative' as const, title: titles.y, scale: { domain: domainY, zero: false, nice: false } },
      color: { condition: { test: 'datum.excluded', value: '#b8c0c8' }, ...colour(methods) },
      shape: { condition: { test: 'datum.outlier', value: 'diamond' }, value: 'circle' },
      opacity: { condition: { test: 'datum.excluded', value: 0.45 }, value: 0.85 },
      tooltip: TOOLTIP,
    },
  };
}

export interface ParityOptions {
  unit: string;
  methods: readonly string[];
  /** Half-width of the band around y = x, percent. */
  bandPercent?: number;
  width?: number;
  height?: number;
}

/** Calculated vs measured with y = x, a ±bandPercent band and measured error bars. */
export function parityPlotSpec(points: readonly ParityPoint[], o: ParityOptions): TopLevelSpec {
  const band = (o.bandPercent ?? 5) / 100;
  const domain = sharedDomain(points.flatMap((p) => [p.measured, p.calculated, p.measured - (p.uMeasured ?? 0), p.measured + (p.uMeasured ?? 0)]));
  const [lo, hi] = domain;
  const axis = { domain, zero: false, nice: false };
  const steps = 24;
  const bandValues = Array.from({ length: steps + 1 }, (_, i) => {
    const x = lo + ((hi - lo) * i) / steps;
    return { x, lower: x * (1 - band), upper: x * (1 + band) };
  });
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: o.width ?? 460,
    height: o.height ?? 460,
    config: config(points.length),
    layer: [
      {
        data: { values: bandValues },
        mark: { type: 'area', color: '#1d5a6e', opacity: 0.08 },
        encoding: {
          x: { field: 'x', type: 'quantitative', scale: axis, title: `Measured (${o.unit})` },
          y: { field: 'lower', type: 'quantitative', scale: axis, title: `Calculated (${o.unit})` },
          y2: { field: 'upper' },
        },
      },
      {
        data: { values: [{ x: lo, y: lo }, { x: hi, y: hi }] },
        mark: { type: 'line', color: '#4d5b69', strokeDash: [4, 3], strokeWidth: 1 },
        encoding: {
          x: { field: 'x', type: 'quantitative', scale: axis },
          y: { field: 'y', type: 'quantitative', scale: axis },
        },
      },
      {
        data: { values: points.filter((p) => p.uMeasured).map((p) => ({ ...p, lo: p.measured - p.uMeasured!, hi: p.measured + p.uMeasured! })) },
        mark: { type: 'rule', strokeWidth: 1, opacity: 0.6 },
        encoding: {
          x: { field: 'lo', type: 'quantitative', scale: axis },
          x2: { field: 'hi' },
          y: { field: 'calculated', type: 'quantitative', scale: axis },
          color: colour(o.methods),
        },
      },
      { data: { values: [...points] }, ...pointLayer('measured', 'calculated', domain, domain, o.methods, { x: `Measured (${o.unit})`, y: `Calculated (${o.unit})` }) },
    ],
  } as TopLevelSpec;
}

/** Histogram of the errors, one panel per method. */
export function errorHistogramSpec(points: readonly ParityPoint[], o: { unit: string; methods: readonly string[]; maxBins?: number }): TopLevelSpec {
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    config: config(points.length),
    data: { values: points.filter((p) => !p.excluded) },
    facet: { field: 'method', type: 'nominal', title: null, sort: [...o.methods] },
    columns: 3,
    spec: {
      width: 220,
      height: 140,
      mark: { type: 'bar', opacity: 0.85 },
      encoding: {
        x: { field: 'error', type: 'quantitative', bin: { maxbins: o.maxBins ?? 30 }, title: `Error (${o.unit})` },
        y: { aggregate: 'count', type: 'quantitative', title: 'Pairs' },
        color: { ...colour(o.methods), legend: null },
        tooltip: [{ aggregate: 'count', title: 'Pairs' }],
      },
    },
  } as TopLevelSpec;
}

/** Error vs measured value, with the zero line. */
export function residualSpec(points: readonly ParityPoint[], o: { unit: string; methods: readonly string[] }): TopLevelSpec {
  const domainX = sharedDomain(points.map((p) => p.measured));
  const domainY = sharedDomain([0, ...points.map((p) => p.error)]);
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: 460,
    height: 300,
    config: config(points.length),
    layer: [
      {
        data: { values: [{ y: 0 }] },
        mark: { type: 'rule', color: '#4d5b69', strokeDash: [4, 3] },
        encoding: { y: { field: 'y', type: 'quantitative', scale: { domain: domainY, zero: false, nice: false } } },
      },
      { data: { values: [...points] }, ...pointLayer('measured', 'error', domainX, domainY, o.methods, { x: `Measured (${o.unit})`, y: `Error, calculated − measured (${o.unit})` }) },
    ],
  } as TopLevelSpec;
}

export interface AgreementLimits {
  method: string;
  bias: number;
  lower: number;
  upper: number;
}

/** Bland–Altman: difference vs mean of measured and calculated, with each method's bias and 95 % limits. */
export function blandAltmanSpec(points: readonly ParityPoint[], limits: readonly AgreementLimits[], o: { unit: string; methods: readonly string[] }): TopLevelSpec {
  const included = points.filter((p) => !p.excluded);
  const domainX = sharedDomain(included.map((p) => p.mean));
  const domainY = sharedDomain([...included.map((p) => p.error), ...limits.flatMap((l) => [l.lower, l.upper])]);
  const lines = limits.flatMap((l) => [
    { method: l.method, y: l.bias, kind: 'bias' },
    { method: l.method, y: l.lower, kind: 'lower limit' },
    { method: l.method, y: l.upper, kind: 'upper limit' },
  ]);
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: 460,
    height: 300,
    config: config(points.length),
    layer: [
      {
        data: { values: lines },
        mark: { type: 'rule', strokeWidth: 1.2 },
        encoding: {
          y: { field: 'y', type: 'quantitative', scale: { domain: domainY, zero: false, nice: false } },
          color: colour(o.methods),
          strokeDash: { field: 'kind', type: 'nominal', scale: { domain: ['bias', 'lower limit', 'upper limit'], range: [[1, 0], [5, 3], [5, 3]] }, legend: null },
          tooltip: [{ field: 'method' }, { field: 'kind' }, { field: 'y', format: '+.2f', title: o.unit }],
        },
      },
      { data: { values: included }, ...pointLayer('mean', 'error', domainX, domainY, o.methods, { x: `Mean of measured and calculated (${o.unit})`, y: `Calculated − measured (${o.unit})` }) },
    ],
  } as TopLevelSpec;
}

export interface PairedPoint {
  key: string;
  material: string;
  label: string;
  a: number;
  b: number;
}

/** |error| of method A vs |error| of method B on their common pairs, with y = x (below it: B closer). */
export function pairedScatterSpec(points: readonly PairedPoint[], o: { unit: string; a: string; b: string }): TopLevelSpec {
  const domain = sharedDomain(points.flatMap((p) => [p.a, p.b]));
  const axis = { domain, zero: false, nice: false };
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: 360,
    height: 360,
    config: config(points.length),
    layer: [
      {
        data: { values: [{ x: domain[0], y: domain[0] }, { x: domain[1], y: domain[1] }] },
        mark: { type: 'line', color: '#4d5b69', strokeDash: [4, 3], strokeWidth: 1 },
        encoding: { x: { field: 'x', type: 'quantitative', scale: axis }, y: { field: 'y', type: 'quantitative', scale: axis } },
      },
      {
        data: { values: [...points] },
        mark: { type: 'point', filled: true, size: 36, color: '#1d5a6e', opacity: 0.8 },
        encoding: {
          x: { field: 'a', type: 'quantitative', scale: axis, title: `|error| ${o.a} (${o.unit})` },
          y: { field: 'b', type: 'quantitative', scale: axis, title: `|error| ${o.b} (${o.unit})` },
          tooltip: [
            { field: 'material', title: 'Material' },
            { field: 'label', title: 'Mode' },
            { field: 'a', title: `|e| ${o.a}`, format: '.2f' },
            { field: 'b', title: `|e| ${o.b}`, format: '.2f' },
          ],
        },
      },
    ],
  } as TopLevelSpec;
}
