'use client';
import { useCallback, useEffect, useState } from 'react';
import { useRouter } from 'next/navigation';
import { buttonClass } from '@/components/ui/button';

const NEXT = new Set(['ArrowRight', 'PageDown']);
const PREVIOUS = new Set(['ArrowLeft', 'PageUp']);

/**
 * Full-screen presenter: one slide at a time (only the current one is mounted,
 * so its plot is drawn at its real size), keyboard ←/→, PageUp/PageDown, Home/End, Esc.
 */
export function Presenter({ title, slides, exitHref, initial = 0 }: { title: string; slides: React.ReactNode[]; exitHref: string; initial?: number }) {
  const router = useRouter();
  const total = slides.length;
  const [index, setIndex] = useState(Math.min(Math.max(0, initial), Math.max(0, total - 1)));

  const go = useCallback(
    (to: number) => {
      const next = Math.min(Math.max(0, to), Math.max(0, total - 1));
      setIndex(next);
      const url = new URL(window.location.href);
      url.searchParams.set('slide', String(next + 1));
      window.history.replaceState(null, '', url);
    },
    [total],
  );

  useEffect(() => {
    function onKey(e: KeyboardEvent) {
      const target = e.target as HTMLElement | null;
      if (target && /^(INPUT|TEXTAREA|SELECT)$/.test(target.tagName)) return;
      if (e.altKey || e.ctrlKey || e.metaKey) return;
      if (NEXT.has(e.key)) go(index + 1);
      else if (PREVIOUS.has(e.key)) go(index - 1);
      else if (e.key === 'Home') go(0);
      else if (e.key === 'End') go(total - 1);
      else if (e.key === 'Escape') {
        if (document.fullscreenElement) return;
        router.push(exitHref);
      } else return;
      e.preventDefault();
    }
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [go, index, total, router, exitHref]);

  return (
    <div className="fixed inset-0 z-50 flex flex-col bg-paper text-ink" role="region" aria-roledescription="presentation" aria-label={title} data-testid="presenter">
      <div className="flex items-center justify-between gap-3 border-b border-rule bg-panel px-6 py-2 text-sm">
        <span className="truncate font-medium">{title}</span>
        <div className="flex items-center gap-2">
          <button type="button" className={buttonClass('ghost', 'px-2 py-0.5')} onClick={() => go(index - 1)} disabled={index === 0} aria-label="Previous slide">
            ←
          </button>
          <span className="num text-base font-semibold" data-testid="slide-number" aria-live="polite">
            {total === 0 ? '0 / 0' : `${index + 1} / ${total}`}
          </span>
          <button type="button" className={buttonClass('ghost', 'px-2 py-0.5')} onClick={() => go(index + 1)} disabled={index >= total - 1} aria-label="Next slide">
            →
          </button>
          <button
            type="button"
            className={buttonClass('secondary', 'px-2 py-0.5 text-xs')}
            onClick={() => (document.fullscreenElement ? document.exitFullscreen() : document.documentElement.requestFullscreen()).catch(() => undefined)}
          >
            Full screen
          </button>
          <button type="button" className={buttonClass('ghost', 'px-2 py-0.5 text-xs')} onClick={() => router.push(exitHref)}>
            Exit (Esc)
          </button>
        </div>
      </div>
      <div role="region" aria-label="Current slide" tabIndex={0} className="min-h-0 flex-1 overflow-auto px-10 py-6">
        {total === 0 ? <p className="text-xl text-ink-muted">This deck has no views yet.</p> : <div key={index} className="mx-auto h-full max-w-[1400px]">{slides[index]}</div>}
      </div>
      <p className="border-t border-rule bg-panel px-6 py-1 text-xs text-ink-faint">← → or PageUp / PageDown to move · Home / End for the first and last slide · Esc to leave</p>
    </div>
  );
}
