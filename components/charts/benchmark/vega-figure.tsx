'use client';
import { useEffect, useId, useRef, useState } from 'react';
import { useVegaEmbed } from 'react-vega';
import type { Result } from 'vega-embed';
import type { TopLevelSpec } from 'vega-lite';
import { buttonClass } from '@/components/ui/button';
import type { FigureText } from './figure-text';
import { embedOptions, saveFigure } from '../vega-options';
import { FOCUS_PARAM } from './specs';

/**
 * One Vega-Lite figure with SVG and PNG downloads (rendered by the view itself,
 * so the file matches the screen), its generated summary, and a data table of
 * the points it draws. The plot takes focus: arrow keys move a ring from point to
 * point (announced), Enter opens the pair; a click on a point opens it too.
 */
export function VegaFigure({
  spec,
  renderer,
  fileName,
  title,
  text,
  note,
  onPick,
}: {
  spec: TopLevelSpec;
  renderer: 'svg' | 'canvas';
  fileName: string;
  title: string;
  text: FigureText;
  /** How the plot draws its data when that is not one mark per point (a density above a threshold), shown beside it. */
  note?: string | null;
  onPick?: (key: string) => void;
}) {
  const id = useId();
  const ref = useRef<HTMLDivElement>(null);
  const [error, setError] = useState<string | null>(null);
  const [cursor, setCursor] = useState<number | null>(null);
  const [tableOpen, setTableOpen] = useState(false);
  const pickRef = useRef(onPick);
  useEffect(() => {
    pickRef.current = onPick;
  }, [onPick]);
  const result = useVegaEmbed({
    ref,
    spec,
    options: embedOptions(renderer),
    onEmbed: (r: Result) => {
      hideMarks(r);
      r.view.addEventListener('click', (_event, item) => {
        const datum = (item as { datum?: { key?: unknown } } | null | undefined)?.datum;
        if (datum && typeof datum.key === 'string') pickRef.current?.(datum.key);
      });
    },
    onError: (e) => setError(e instanceof Error ? e.message : String(e)),
  });

  const nav = text.navigation;
  const current = cursor !== null && cursor < nav.length ? nav[cursor] : null;

  useEffect(() => {
    if (!result) return;
    try {
      result.view.signal(FOCUS_PARAM, current?.key ?? null).runAsync();
    } catch {
      // a plot without a cursor parameter (the histogram)
    }
  }, [result, current]);

  function onKeyDown(e: React.KeyboardEvent) {
    if (!nav.length) return;
    const last = nav.length - 1;
    const step = e.shiftKey ? 10 : 1;
    const at = cursor ?? -1;
    let next: number | null = null;
    if (e.key === 'ArrowRight' || e.key === 'ArrowDown') next = Math.min(last, at + step);
    else if (e.key === 'ArrowLeft' || e.key === 'ArrowUp') next = Math.max(0, at < 0 ? 0 : at - step);
    else if (e.key === 'Home') next = 0;
    else if (e.key === 'End') next = last;
    else if ((e.key === 'Enter' || e.key === ' ') && current?.key && onPick) {
      e.preventDefault();
      onPick(current.key);
      return;
    } else if (e.key === 'Escape' && cursor !== null) next = null;
    else return;
    e.preventDefault();
    setCursor(next);
  }

  async function download(type: 'svg' | 'png') {
    if (result) await saveFigure(result.view, fileName, type);
  }

  const hint = nav.length ? `Arrow keys move between the ${nav.length} points${onPick ? ', Enter opens a pair' : ''}.` : '';
  return (
    <figure className="min-w-0 space-y-2" aria-labelledby={`${id}-title`}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <figcaption id={`${id}-title`} className="text-[13px] font-medium text-ink">
          {title}
        </figcaption>
        <div className="flex gap-1.5 print:hidden">
          <button type="button" className={buttonClass('secondary', 'px-2 py-0.5 text-xs')} onClick={() => download('svg')} disabled={!result} aria-label={`Download ${title} as SVG`}>
            SVG
          </button>
          <button type="button" className={buttonClass('secondary', 'px-2 py-0.5 text-xs')} onClick={() => download('png')} disabled={!result} aria-label={`Download ${title} as PNG`}>
            PNG
          </button>
        </div>
      </div>
      {error ? <p className="text-sm text-bad">The plot could not be drawn: {error}</p> : null}
      {note ? (
        <p id={`${id}-note`} className="text-xs text-ink-muted" data-testid="plot-density-note">
          {note}
        </p>
      ) : null}
      <div
        data-plot=""
        role="img"
        tabIndex={0}
        aria-label={`${title}. ${hint}`}
        aria-describedby={note ? `${id}-note ${id}-summary` : `${id}-summary`}
        onKeyDown={onKeyDown}
        onBlur={(e) => {
          if (!e.currentTarget.contains(e.relatedTarget as Node | null)) setCursor(null);
        }}
        className="max-w-full overflow-x-auto rounded-sm"
      >
        {/* vega-embed labels its own container; the wrapper's name and summary speak for the plot */}
        <div ref={ref} aria-hidden="true" />
      </div>
      <p className="text-xs text-ink-muted print:hidden" aria-live="polite" data-testid="plot-cursor">
        {current?.spoken ? `Point ${(cursor ?? 0) + 1} of ${nav.length}: ${current.spoken}` : ''}
      </p>
      <p id={`${id}-summary`} className="text-xs text-ink-muted" data-testid="plot-summary">
        {text.summary}
      </p>
      <details className="text-xs print:hidden" onToggle={(e) => setTableOpen(e.currentTarget.open)}>
        <summary className="cursor-pointer text-accent">Data table of these {text.table.rows.length.toLocaleString('en')} rows</summary>
        {tableOpen ? <FigureTable table={text.table} onPick={onPick} /> : null}
      </details>
    </figure>
  );
}

/** The figure's name, summary and table speak for the plot; its marks are hidden from assistive technology. */
export function hideMarks(r: Result) {
  r.view.container()?.querySelector('svg')?.setAttribute('aria-hidden', 'true');
}

function FigureTable({ table, onPick }: { table: FigureText['table']; onPick?: (key: string) => void }) {
  const openable = !!onPick && table.rows.some((r) => r.key);
  return (
    <div role="region" aria-label={table.caption} tabIndex={0} className="mt-1 max-h-80 overflow-auto rounded-md border border-rule">
      <table className="w-full border-collapse">
        <caption className="sr-only">{table.caption}</caption>
        <thead className="sticky top-0 bg-panel text-left text-ink-muted">
          <tr>
            {table.columns.map((c) => (
              <th key={c} scope="col" className="px-2 py-1 font-medium whitespace-nowrap">
                {c}
              </th>
            ))}
            {openable ? (
              <th scope="col" className="px-2 py-1 font-medium">
                <span className="sr-only">Open</span>
              </th>
            ) : null}
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {table.rows.map((r, i) => (
            <tr key={r.key ?? i}>
              {r.cells.map((c, j) => (
                <td key={j} className="num px-2 py-1 whitespace-nowrap">
                  {c}
                </td>
              ))}
              {openable ? (
                <td className="px-2 py-1">
                  {r.key ? (
                    <button type="button" className="text-accent underline underline-offset-2" onClick={() => onPick?.(r.key!)} aria-label={`Open pair ${r.cells.slice(0, 3).join(' ')}`}>
                      Open
                    </button>
                  ) : null}
                </td>
              ) : null}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
