'use client';
import type { TopLevelSpec } from 'vega-lite';
import { VegaChart } from './vega-chart';

export interface ConvergencePlotPoint {
  material: string;
  method: string;
  parameter: number;
  value: number;
}

export interface ConvergencePlotSummary {
  method: string;
  parameter: number;
  median: number;
  p95?: number;
}

/**
 * One deviation (max |Δ| or mean |Δ|) against the recipe parameter: a thin line per material,
 * the median over materials (and the 95th percentile, when given) per family member, and the
 * tolerance as a dashed rule. The y axis is symmetric-log, since deviations span decades and may be 0; the x axis is
 * logarithmic when every parameter value is positive.
 */
export function convergenceSpec(points: ConvergencePlotPoint[], summary: ConvergencePlotSummary[], tolerance: number | null, xTitle: string, yTitle: string): TopLevelSpec {
  const series = summary.flatMap((s) => [
    { series: 'median over materials', method: s.method, parameter: s.parameter, value: s.median },
    ...(s.p95 === undefined ? [] : [{ series: '95th percentile', method: s.method, parameter: s.parameter, value: s.p95 }]),
  ]);
  const y = { field: 'value', type: 'quantitative' as const, title: yTitle, scale: { type: 'symlog' as const, constant: tolerance ?? 1 } };
  // k-points per reciprocal atom grow with the cube of the grid and with the cell: a log axis keeps the knee readable.
  const positive = [...points, ...summary].every((p) => p.parameter > 0);
  const x = { field: 'parameter', type: 'quantitative' as const, title: xTitle, scale: positive ? { type: 'log' as const } : { zero: false } };
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: 'container',
    height: 280,
    layer: [
      {
        data: { values: points },
        mark: { type: 'line', point: { size: 16 }, strokeWidth: 1, opacity: 0.45 },
        encoding: {
          x,
          y,
          detail: { field: 'material' },
          color: { value: '#8a94a6' },
          tooltip: [{ field: 'material' }, { field: 'method' }, { field: 'parameter', title: xTitle }, { field: 'value', title: yTitle, format: '.3f' }],
        },
      },
      {
        data: { values: series },
        mark: { type: 'line', point: true, strokeWidth: 2.5 },
        encoding: {
          x,
          y,
          color: { field: 'series', type: 'nominal', title: null, scale: { domain: ['median over materials', '95th percentile'], range: ['#1f5fa8', '#b3541e'] } },
          tooltip: [{ field: 'series' }, { field: 'method' }, { field: 'parameter', title: xTitle }, { field: 'value', title: yTitle, format: '.3f' }],
        },
      },
      ...(tolerance === null ? [] : [{ data: { values: [{ tolerance }] }, mark: { type: 'rule' as const, strokeDash: [6, 4], color: '#2b2b2b' }, encoding: { y: { field: 'tolerance', type: 'quantitative' as const } } }]),
    ],
  } as TopLevelSpec;
}

export function ConvergencePlot(props: {
  points: ConvergencePlotPoint[];
  summary: ConvergencePlotSummary[];
  tolerance: number | null;
  xTitle: string;
  yTitle: string;
  ariaLabel: string;
  summaryText: string;
  downloadName: string;
}) {
  return (
    <VegaChart
      spec={convergenceSpec(props.points, props.summary, props.tolerance, props.xTitle, props.yTitle)}
      ariaLabel={props.ariaLabel}
      summary={props.summaryText}
      downloadName={props.downloadName}
    />
  );
}
