/**
 * Vega-Lite specifications of the benchmark plots, as typed pure functions.
 * Every layered x/y plot fixes one shared numeric domain with `zero: false`, so
 * the y = x reference and the ±band span exactly the data and the axes do not
 * start at 0. Colours and shapes follow the method order given, the same in every
 * plot, so a method is told apart by its shape as well as its colour. Marks carry
 * no ARIA labels (config.aria false): the figure around a plot describes it and
 * links a table of its points instead.
 */
import type { TopLevelSpec } from 'vega-lite';
import type { PlotPoint } from '@/lib/benchmark/pairs-export';
import { header } from '@/lib/format';

/** A pair as the plots draw it: the pairs endpoint's plot point; the method id is not drawn. */
export type ParityPoint = Omit<PlotPoint, 'methodId'>;

/** Above this many marks the browser draws on a canvas (SVG with tens of thousands of nodes stalls). */
export const CANVAS_THRESHOLD = 5000;

export function rendererFor(pointCount: number): 'svg' | 'canvas' {
  return pointCount > CANVAS_THRESHOLD ? 'canvas' : 'svg';
}

/**
 * Above this many pairs the parity plot draws a binned density (pairs per cell)
 * instead of one mark per pair, with the flagged outliers and the excluded pairs
 * on top as points; 30,000 marks take seconds to draw and hide each other anyway.
 */
export const DENSITY_THRESHOLD = 5000;
/** Cells per axis of the density layer. */
export const DENSITY_BINS = 60;

export function drawsDensity(pointCount: number): boolean {
  return pointCount > DENSITY_THRESHOLD;
}

/** What the plot draws as a density and what as points, for the line beside the plot; null when it draws every pair. */
export function densityNote(points: readonly ParityPoint[]): string | null {
  if (!drawsDensity(points.length)) return null;
  const flagged = points.filter((p) => p.outlier && !p.excluded).length;
  const excluded = points.filter((p) => p.excluded).length;
  const dense = points.length - flagged - excluded;
  const n = (k: number) => k.toLocaleString('en');
  const onTop = [`the ${n(flagged)} flagged ${flagged === 1 ? 'outlier' : 'outliers'}`, ...(excluded ? [`the ${n(excluded)} excluded ${excluded === 1 ? 'pair' : 'pairs'}`] : [])];
  return `${n(dense)} pairs drawn as a density (pairs per cell); ${onTop.join(' and ')} as points. Above ${n(DENSITY_THRESHOLD)} pairs the parity plot bins them; the data table below lists every pair.`;
}

const PALETTE = ['#1d5a6e', '#c2571a', '#6b4c9a', '#2f7d32', '#a3242c', '#8a6d00', '#1565c0', '#6d4c41', '#00838f', '#ad1457'];
/** Diamonds are not used for methods, and no shape relies on its fill alone. */
export const SHAPES = ['circle', 'square', 'triangle-up', 'cross', 'triangle-down', 'triangle-right', 'triangle-left', 'wedge', 'arrow', 'stroke'];

/** What the marks beside the method symbols mean (their own legend). */
const FLAGGED = 'Flagged outlier';
const EXCLUDED = 'Excluded (hollow)';
const MARKER_INK = { [FLAGGED]: '#a3242c', [EXCLUDED]: '#5f6b77' };

/** The name of the parameter a keyboard cursor sets to the key of the point it is on. */
export const FOCUS_PARAM = 'focusKey';

/** Scale for a method channel: `shown` (default: every method) in the domain, each keeping its place in `methods`. */
function methodScale(methods: readonly string[], range: readonly string[], shown: readonly string[] = methods) {
  const domain = shown.length ? [...shown] : [...methods];
  return { domain, range: domain.map((m) => range[Math.max(0, methods.indexOf(m)) % range.length]) };
}

function colour(methods: readonly string[], shown?: readonly string[]) {
  return { field: 'method', type: 'nominal' as const, title: 'Method', scale: methodScale(methods, PALETTE, shown) };
}

function shape(methods: readonly string[], shown?: readonly string[]) {
  return { field: 'method', type: 'nominal' as const, title: 'Method', scale: methodScale(methods, SHAPES, shown) };
}

const AXIS_TEXT = { labelColor: '#4d5b69', titleColor: '#17212b', gridColor: '#eef1f3', domainColor: '#c3cbd2', tickColor: '#c3cbd2' };

function config() {
  return {
    aria: false,
    font: 'Inter, system-ui, sans-serif',
    // labels never overlap: thinned when they would, kept inside the plot at the ends (print included)
    axis: { ...AXIS_TEXT, labelOverlap: 'greedy' as const, labelSeparation: 6, labelFlush: true, tickCount: 6, labelFontSize: 11, titleFontSize: 11 },
    view: { stroke: '#dde2e6' },
    legend: { labelColor: '#4d5b69', titleColor: '#17212b', orient: 'bottom', direction: 'horizontal', labelLimit: 220 },
  };
}

/** Numbers as the plots print them: a true minus sign and a sign on request. */
export function plotNumber(value: number, digits = 2, sign = false): string {
  const text = Math.abs(value).toFixed(digits);
  if (value < 0 && Number(text) !== 0) return `−${text}`;
  return sign ? `+${text}` : text;
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

function tooltip(unit: string) {
  return [
    { field: 'material', title: 'Material' },
    { field: 'label', title: 'Mode' },
    { field: 'method', title: 'Method' },
    { field: 'measured', title: header(`Measured`, unit), format: '.2f' },
    { field: 'calculated', title: header(`Calculated`, unit), format: '.2f' },
    { field: 'error', title: header(`Error`, unit), format: '+.2f' },
    { field: 'status', title: 'Status' },
    { field: 'citation', title: 'Source' },
  ];
}

type Axes = { x: string; y: string; domainX: [number, number]; domainY: [number, number]; titles: { x: string; y: string } };

function statusOf(p: ParityPoint): string {
  return p.excluded ? 'excluded' : p.outlier ? 'flagged outlier' : 'included';
}

/**
 * The pairs: included ones filled, in the method's colour and shape; excluded ones
 * hollow and grey (still visible); flagged outliers ringed, with a legend entry for
 * each marker; and a dark ring on the point a keyboard cursor is on.
 */
function pointLayers(points: readonly ParityPoint[], axes: Axes, methods: readonly string[], unit: string, shown?: readonly string[], density = false) {
  const x = (title?: string) => ({ field: axes.x, type: 'quantitative' as const, title, scale: { domain: axes.domainX, zero: false, nice: false } });
  const y = (title?: string) => ({ field: axes.y, type: 'quantitative' as const, title, scale: { domain: axes.domainY, zero: false, nice: false } });
  const rows = points.map((p) => ({ ...p, status: statusOf(p), marker: p.excluded ? EXCLUDED : p.outlier ? FLAGGED : null }));
  // the markers' legend sits above the plot, the methods' below, so neither runs off the side
  const markers = { field: 'marker', type: 'nominal' as const, title: null, legend: { orient: 'top' as const }, scale: { domain: [FLAGGED, EXCLUDED], range: [MARKER_INK[FLAGGED], MARKER_INK[EXCLUDED]] } };
  const pick = { name: 'pick', select: { type: 'point' as const, fields: ['key'], on: 'click' } };
  return [
    ...(density ? [densityLayer(points, axes)] : []),
    {
      // as a density, only the flagged outliers among the included pairs are drawn one by one
      data: { values: rows.filter((p) => !p.excluded && (!density || p.outlier)) },
      mark: { type: 'point' as const, filled: true, size: 40, opacity: 0.85, cursor: 'pointer' as const },
      params: [pick],
      encoding: { x: x(axes.titles.x), y: y(axes.titles.y), color: colour(methods, shown), shape: shape(methods, shown), tooltip: tooltip(unit) },
    },
    {
      data: { values: rows.filter((p) => p.excluded) },
      mark: { type: 'point' as const, filled: false, size: 40, strokeWidth: 1.2, opacity: 0.9, cursor: 'pointer' as const },
      encoding: { x: x(), y: y(), stroke: markers, shape: shape(methods, shown), tooltip: tooltip(unit) },
    },
    {
      data: { values: rows.filter((p) => p.outlier && !p.excluded) },
      mark: { type: 'point' as const, shape: 'circle', filled: false, size: 190, strokeWidth: 1.6 },
      encoding: { x: x(), y: y(), stroke: markers, tooltip: tooltip(unit) },
    },
    {
      // the keyboard ring needs every pair's place, not its text
      data: { values: points.map((p) => ({ key: p.key, [axes.x]: (p as unknown as Record<string, number>)[axes.x], [axes.y]: (p as unknown as Record<string, number>)[axes.y] })) },
      transform: [{ filter: `${FOCUS_PARAM} !== null && datum.key === ${FOCUS_PARAM}` }],
      mark: { type: 'point' as const, shape: 'circle', filled: false, size: 420, strokeWidth: 2.5, color: '#17212b' },
      encoding: { x: x(), y: y() },
    },
  ];
}

/**
 * The included, unflagged pairs as a heat map of pairs per cell (equal cells over
 * the shared domain, a log colour scale so sparse cells stay visible); every other
 * layer (outliers, excluded, cursor ring) draws on top.
 */
function densityLayer(points: readonly ParityPoint[], axes: Axes) {
  const step = (axes.domainX[1] - axes.domainX[0]) / DENSITY_BINS || 1;
  const stepY = (axes.domainY[1] - axes.domainY[0]) / DENSITY_BINS || 1;
  const dense = points.filter((p) => !p.excluded && !p.outlier).map((p) => ({ [axes.x]: (p as unknown as Record<string, number>)[axes.x], [axes.y]: (p as unknown as Record<string, number>)[axes.y] }));
  const binX = { step, extent: axes.domainX, nice: false };
  const binY = { step: stepY, extent: axes.domainY, nice: false };
  return {
    data: { values: dense },
    mark: { type: 'rect' as const, clip: true },
    encoding: {
      x: { field: axes.x, type: 'quantitative' as const, bin: binX, title: axes.titles.x, scale: { domain: axes.domainX, zero: false, nice: false } },
      y: { field: axes.y, type: 'quantitative' as const, bin: binY, title: axes.titles.y, scale: { domain: axes.domainY, zero: false, nice: false } },
      // fill, not color: its own scale and legend, apart from the methods' colours
      fill: { aggregate: 'count' as const, type: 'quantitative' as const, title: 'Pairs per cell', scale: { type: 'log' as const, range: ['#dbe9ee', '#0d3b4a'] }, legend: { orient: 'right' as const, direction: 'vertical' as const } },
      tooltip: [
        { field: axes.x, bin: binX, type: 'quantitative' as const, title: axes.titles.x, format: '.1f' },
        { field: axes.y, bin: binY, type: 'quantitative' as const, title: axes.titles.y, format: '.1f' },
        { aggregate: 'count' as const, type: 'quantitative' as const, title: 'Pairs' },
      ],
    },
  };
}

const FOCUS = { name: FOCUS_PARAM, value: null };

export interface ParityOptions {
  unit: string;
  methods: readonly string[];
  /** Half-width of the band around y = x, percent. */
  bandPercent?: number;
  width?: number;
  height?: number;
  /** Draw the pairs as a density: by default above DENSITY_THRESHOLD pairs (false forces one mark per pair, for bench:plot's comparison). */
  density?: boolean;
}

/** Calculated vs measured with y = x, a ±bandPercent band and measured error bars. */
export function parityPlotSpec(points: readonly ParityPoint[], o: ParityOptions): TopLevelSpec {
  const band = (o.bandPercent ?? 5) / 100;
  const density = o.density ?? drawsDensity(points.length);
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
    config: config(),
    params: [FOCUS],
    layer: [
      {
        data: { values: bandValues },
        mark: { type: 'area', color: '#1d5a6e', opacity: 0.08, clip: true },
        encoding: {
          x: { field: 'x', type: 'quantitative', scale: axis, title: header(`Measured`, o.unit) },
          y: { field: 'lower', type: 'quantitative', scale: axis, title: header(`Calculated`, o.unit) },
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
        // as a density, error bars only on the pairs drawn as points
        data: { values: points.filter((p) => p.uMeasured && (!density || p.outlier || p.excluded)).map((p) => ({ ...p, lo: p.measured - p.uMeasured!, hi: p.measured + p.uMeasured! })) },
        mark: { type: 'rule', strokeWidth: 1, opacity: 0.6 },
        encoding: {
          x: { field: 'lo', type: 'quantitative', scale: axis },
          x2: { field: 'hi' },
          y: { field: 'calculated', type: 'quantitative', scale: axis },
          color: colour(o.methods),
        },
      },
      ...pointLayers(points, { x: 'measured', y: 'calculated', domainX: domain, domainY: domain, titles: { x: header(`Measured`, o.unit), y: header(`Calculated`, o.unit) } }, o.methods, o.unit, undefined, density),
    ],
  } as TopLevelSpec;
}

/** A 1–2–5 step near `raw`. */
function niceStep(raw: number): number {
  if (!(raw > 0)) return 1;
  const power = 10 ** Math.floor(Math.log10(raw));
  const f = raw / power;
  return (f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10) * power;
}

/**
 * Bins whose edges are multiples of one step (so zero is an edge whenever the
 * errors straddle it) and axis ticks on multiples of a coarser step, zero among them.
 */
export function histogramBins(errors: readonly number[], maxBins = 30): { step: number; extent: [number, number]; ticks: number[] } {
  const finite = errors.filter(Number.isFinite);
  let lo = finite.length ? Math.min(...finite) : -1;
  let hi = finite.length ? Math.max(...finite) : 1;
  if (lo === hi) {
    lo -= 1;
    hi += 1;
  }
  const step = niceStep((hi - lo) / maxBins);
  const extent: [number, number] = [Math.floor(lo / step) * step, Math.max(Math.ceil(hi / step), Math.floor(lo / step) + 1) * step];
  const tickStep = niceStep((extent[1] - extent[0]) / 6);
  const ticks: number[] = [];
  for (let t = Math.ceil(extent[0] / tickStep) * tickStep; t <= extent[1] + tickStep * 1e-9; t += tickStep) ticks.push(Number(t.toFixed(10)));
  return { step, extent: [Number(extent[0].toFixed(10)), Number(extent[1].toFixed(10))], ticks };
}

/** Histogram of the errors, one panel per method, with the zero line. */
export function errorHistogramSpec(points: readonly ParityPoint[], o: { unit: string; methods: readonly string[]; maxBins?: number }): TopLevelSpec {
  const included = points.filter((p) => !p.excluded);
  const bins = histogramBins(included.map((p) => p.error), o.maxBins ?? 30);
  const x = { field: 'error', type: 'quantitative' as const, title: header(`Error`, o.unit), scale: { domain: bins.extent, nice: false, zero: false } };
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    config: config(),
    data: { values: included },
    facet: { field: 'method', type: 'nominal', title: null, sort: [...o.methods] },
    columns: 3,
    spec: {
      width: 220,
      height: 140,
      layer: [
        {
          mark: { type: 'bar', opacity: 0.85 },
          encoding: {
            x: { ...x, bin: { step: bins.step, extent: bins.extent }, axis: { values: bins.ticks } },
            y: { aggregate: 'count', type: 'quantitative', title: 'Pairs' },
            color: { ...colour(o.methods), legend: null },
            tooltip: [
              { field: 'error', type: 'quantitative', bin: { step: bins.step, extent: bins.extent }, title: header(`Error`, o.unit), format: '.1f' },
              { aggregate: 'count', title: 'Pairs' },
            ],
          },
        },
        { mark: { type: 'rule', color: '#17212b', strokeDash: [3, 2] }, encoding: { x: { datum: 0, type: 'quantitative', scale: x.scale } } },
      ],
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
    config: config(),
    params: [FOCUS],
    layer: [
      {
        data: { values: [{ y: 0 }] },
        mark: { type: 'rule', color: '#4d5b69', strokeDash: [4, 3] },
        encoding: { y: { field: 'y', type: 'quantitative', scale: { domain: domainY, zero: false, nice: false } } },
      },
      ...pointLayers(points, { x: 'measured', y: 'error', domainX, domainY, titles: { x: header(`Measured`, o.unit), y: header(`Error, calculated − measured`, o.unit) } }, o.methods, o.unit),
    ],
  } as TopLevelSpec;
}

export interface AgreementLimits {
  method: string;
  bias: number;
  lower: number;
  upper: number;
}

const LIMIT_KINDS = ['bias', 'upper limit', 'lower limit'] as const;

/**
 * Bland–Altman: difference vs mean of measured and calculated, with each plotted
 * method's bias and 95 % limits, each line labelled with its value. The legend
 * lists only the methods drawn.
 */
export function blandAltmanSpec(points: readonly ParityPoint[], limits: readonly AgreementLimits[], o: { unit: string; methods: readonly string[] }): TopLevelSpec {
  const included = points.filter((p) => !p.excluded);
  const shown = o.methods.filter((m) => included.some((p) => p.method === m) || limits.some((l) => l.method === m));
  const domainX = sharedDomain(included.map((p) => p.mean));
  const domainY = sharedDomain([...included.map((p) => p.error), ...limits.flatMap((l) => [l.lower, l.upper])]);
  const lines = limits.flatMap((l) =>
    LIMIT_KINDS.map((kind) => {
      const y = kind === 'bias' ? l.bias : kind === 'lower limit' ? l.lower : l.upper;
      return { method: l.method, y, kind, text: `${kind === 'bias' ? 'bias' : kind === 'upper limit' ? 'upper 95 % limit' : 'lower 95 % limit'} ${plotNumber(y, 2, true)} ${o.unit}` };
    }),
  );
  const yScale = { domain: domainY, zero: false, nice: false };
  const axes = { x: 'mean', y: 'error', domainX, domainY, titles: { x: header(`Mean of measured and calculated`, o.unit), y: header(`Calculated − measured`, o.unit) } };
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: 460,
    height: 300,
    config: config(),
    params: [FOCUS],
    layer: [
      {
        data: { values: lines },
        mark: { type: 'rule', strokeWidth: 1.2 },
        encoding: {
          y: { field: 'y', type: 'quantitative', scale: yScale },
          color: colour(o.methods, shown),
          strokeDash: { field: 'kind', type: 'nominal', scale: { domain: [...LIMIT_KINDS], range: [[1, 0], [5, 3], [5, 3]] }, legend: null },
          tooltip: [{ field: 'method', title: 'Method' }, { field: 'text', title: 'Line' }],
        },
      },
      {
        data: { values: lines },
        mark: { type: 'text', align: 'right', baseline: 'bottom', dx: -4, dy: -3, fontSize: 11, color: '#17212b' },
        encoding: {
          x: { datum: domainX[1], type: 'quantitative', scale: { domain: domainX, zero: false, nice: false } },
          y: { field: 'y', type: 'quantitative', scale: yScale },
          text: { field: 'text' },
        },
      },
      ...pointLayers(included, axes, o.methods, o.unit, shown),
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
    config: config(),
    params: [FOCUS],
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
          x: { field: 'a', type: 'quantitative', scale: axis, title: header(`|error| ${o.a}`, o.unit) },
          y: { field: 'b', type: 'quantitative', scale: axis, title: header(`|error| ${o.b}`, o.unit) },
          tooltip: [
            { field: 'material', title: 'Material' },
            { field: 'label', title: 'Mode' },
            { field: 'a', title: header(`|error| ${o.a}`, o.unit), format: '.2f' },
            { field: 'b', title: header(`|error| ${o.b}`, o.unit), format: '.2f' },
          ],
        },
      },
      {
        data: { values: [...points] },
        transform: [{ filter: `${FOCUS_PARAM} !== null && datum.key === ${FOCUS_PARAM}` }],
        mark: { type: 'point', shape: 'circle', filled: false, size: 420, strokeWidth: 2.5, color: '#17212b' },
        encoding: { x: { field: 'a', type: 'quantitative', scale: axis }, y: { field: 'b', type: 'quantitative', scale: axis } },
      },
    ],
  } as TopLevelSpec;
}
