'use client';
import { useRef, useState } from 'react';
import { useVegaEmbed } from 'react-vega';
import type { Result } from 'vega-embed';
import type { TopLevelSpec } from 'vega-lite';
import { buttonClass } from '@/components/ui/button';

/**
 * One Vega-Lite figure with SVG and PNG downloads (rendered by the view itself,
 * so the file matches the screen). A click on a mark that carries a pair key calls onPick.
 */
export function VegaFigure({
  spec,
  renderer,
  fileName,
  title,
  onPick,
}: {
  spec: TopLevelSpec;
  renderer: 'svg' | 'canvas';
  fileName: string;
  title: string;
  onPick?: (key: string) => void;
}) {
  const ref = useRef<HTMLDivElement>(null);
  const [error, setError] = useState<string | null>(null);
  const result = useVegaEmbed({
    ref,
    spec,
    options: { renderer, actions: false, tooltip: { theme: 'light' } },
    onEmbed: (r: Result) => {
      if (!onPick) return;
      r.view.addEventListener('click', (_event, item) => {
        const datum = (item as { datum?: { key?: unknown } } | null | undefined)?.datum;
        if (datum && typeof datum.key === 'string') onPick(datum.key);
      });
    },
    onError: (e) => setError(e instanceof Error ? e.message : String(e)),
  });

  async function download(type: 'svg' | 'png') {
    if (!result) return;
    const url = await result.view.toImageURL(type, type === 'png' ? 2 : 1);
    const a = document.createElement('a');
    a.href = url;
    a.download = `${fileName}.${type}`;
    document.body.appendChild(a);
    a.click();
    a.remove();
  }

  return (
    <figure className="space-y-2">
      <div className="flex items-center justify-between gap-2">
        <figcaption className="text-[13px] font-medium text-ink">{title}</figcaption>
        <div className="flex gap-1.5">
          <button type="button" className={buttonClass('secondary', 'px-2 py-0.5 text-xs')} onClick={() => download('svg')} disabled={!result}>
            SVG
          </button>
          <button type="button" className={buttonClass('secondary', 'px-2 py-0.5 text-xs')} onClick={() => download('png')} disabled={!result}>
            PNG
          </button>
        </div>
      </div>
      {error ? <p className="text-sm text-bad">The plot could not be drawn: {error}</p> : null}
      <div ref={ref} className="overflow-x-auto" />
    </figure>
  );
}
