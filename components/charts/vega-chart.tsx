'use client';
import { useId, useRef, useState } from 'react';
import { useVegaEmbed } from 'react-vega';
import type { EmbedOptions, VisualizationSpec } from 'vega-embed';
import { hideMarks } from './benchmark/vega-figure';
import { embedOptions, saveFigure } from './vega-options';

export interface VegaChartProps {
  spec: VisualizationSpec;
  /** SVG by default; use canvas above ~10k marks. */
  renderer?: 'svg' | 'canvas';
  /** When set, SVG and PNG download buttons save "<downloadName>.svg|png". */
  downloadName?: string;
  /** Names the chart for screen readers. */
  ariaLabel: string;
  /** A generated description, shown under the chart and read after its name. */
  summary?: string;
  className?: string;
}

/** The one client wrapper around react-vega: embeds a Vega-Lite spec and offers figure downloads. */
export function VegaChart({ spec, renderer = 'svg', downloadName, ariaLabel, summary, className = '' }: VegaChartProps) {
  const id = useId();
  const ref = useRef<HTMLDivElement>(null);
  const [options] = useState<EmbedOptions>(() => embedOptions(renderer));
  const [failed, setFailed] = useState<string | null>(null);
  const result = useVegaEmbed({ ref, spec, options: { ...options, renderer }, onEmbed: hideMarks, onError: (e) => setFailed(e instanceof Error ? e.message : String(e)) });

  async function download(type: 'svg' | 'png') {
    if (result && downloadName) await saveFigure(result.view, downloadName, type);
  }

  return (
    <figure className={`space-y-1 ${className}`}>
      <div data-plot="" role="img" aria-label={ariaLabel} aria-describedby={summary ? `${id}-summary` : undefined} className="w-full">
        <div ref={ref} aria-hidden="true" className="w-full" />
      </div>
      {summary ? (
        <p id={`${id}-summary`} className="text-xs text-ink-muted" data-testid="plot-summary">
          {summary}
        </p>
      ) : null}
      {failed && <p className="text-xs text-bad">The chart could not be drawn: {failed}</p>}
      {downloadName && (
        <figcaption className="flex justify-end gap-2 text-xs">
          <button type="button" className="text-accent underline underline-offset-2 disabled:opacity-50" disabled={!result} onClick={() => download('svg')}>
            Download SVG
          </button>
          <button type="button" className="text-accent underline underline-offset-2 disabled:opacity-50" disabled={!result} onClick={() => download('png')}>
            Download PNG
          </button>
        </figcaption>
      )}
    </figure>
  );
}
