'use client';
import { useEffect, useState } from 'react';
import { buttonClass } from '@/components/ui/button';

/** Plots are drawn in the browser: printing waits until every plot slot holds its drawing (or gave up after 30 s). */
const GIVE_UP_MS = 30_000;

function plotsDrawn(): boolean {
  return [...document.querySelectorAll('[data-plot-slot]')].every((slot) => slot.querySelector('svg.marks, canvas.marks, [data-plot-empty]'));
}

export function PrintButton() {
  const [ready, setReady] = useState(false);
  useEffect(() => {
    const started = Date.now();
    const timer = setInterval(() => {
      if (plotsDrawn() || Date.now() - started > GIVE_UP_MS) {
        setReady(true);
        document.querySelector('[data-print-root]')?.setAttribute('data-print-ready', 'true');
        clearInterval(timer);
      }
    }, 200);
    return () => clearInterval(timer);
  }, []);
  return (
    <button type="button" className={buttonClass('primary')} onClick={() => window.print()} disabled={!ready} aria-disabled={!ready}>
      {ready ? 'Print or save as PDF' : 'Drawing the plots…'}
    </button>
  );
}
