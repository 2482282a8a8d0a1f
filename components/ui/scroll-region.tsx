'use client';
import { useEffect, useRef, useState, type HTMLAttributes } from 'react';

/** Which edges of a box have content out of sight (a cue to scroll). */
export function useHiddenContent(ref: React.RefObject<HTMLDivElement | null>): { right: boolean; below: boolean } {
  const [hidden, setHidden] = useState({ right: false, below: false });
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const check = () => {
      const right = el.scrollLeft + el.clientWidth < el.scrollWidth - 4;
      const below = el.scrollTop + el.clientHeight < el.scrollHeight - 4;
      setHidden((h) => (h.right === right && h.below === below ? h : { right, below }));
    };
    check();
    const observer = new ResizeObserver(check);
    observer.observe(el);
    if (el.firstElementChild) observer.observe(el.firstElementChild);
    el.addEventListener('scroll', check, { passive: true });
    return () => {
      observer.disconnect();
      el.removeEventListener('scroll', check);
    };
  }, [ref]);
  return hidden;
}

/**
 * A box that may scroll (a wide table, a long list): focusable, so the keyboard
 * can scroll it, and labelled, so a screen reader says what it holds. While some
 * of its content is out of sight, a cue at that edge says so (hidden in print,
 * where nothing scrolls).
 */
export function ScrollRegion({ label, className = 'overflow-x-auto', children, ...props }: { label: string } & HTMLAttributes<HTMLDivElement>) {
  const ref = useRef<HTMLDivElement>(null);
  const hidden = useHiddenContent(ref);
  return (
    <div className="relative min-w-0">
      <div ref={ref} role="region" aria-label={label} tabIndex={0} className={`${className} print:max-h-none print:overflow-visible`} {...props}>
        {children}
      </div>
      {hidden.right ? (
        <div
          aria-hidden
          className="pointer-events-none absolute top-0 right-0 z-20 flex h-9 items-center rounded-tr-md bg-gradient-to-l from-panel via-panel/90 to-transparent pr-2 pl-8 text-[11px] font-medium text-accent print:hidden"
          data-testid="scroll-cue"
        >
          more columns →
        </div>
      ) : null}
      {hidden.below ? (
        <div
          aria-hidden
          className="pointer-events-none absolute right-0 bottom-0 left-0 z-20 flex h-7 items-end justify-center bg-gradient-to-t from-panel via-panel/90 to-transparent pb-0.5 text-[11px] font-medium text-accent print:hidden"
          data-testid="scroll-cue-below"
        >
          more below ↓
        </div>
      ) : null}
    </div>
  );
}
