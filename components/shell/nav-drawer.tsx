'use client';
import { useEffect, useId, useRef, useState } from 'react';
import { usePathname } from 'next/navigation';

/**
 * The workspace sidebar: always shown from 768 px up; below that, a top bar with a
 * Menu button that opens it over the page (Esc or a navigation closes it, and
 * focus goes back to the button).
 */
export function NavDrawer({ brand, children }: { brand: React.ReactNode; children: React.ReactNode }) {
  const id = useId();
  const [open, setOpen] = useState(false);
  const button = useRef<HTMLButtonElement>(null);
  const pathname = usePathname();
  const [shownFor, setShownFor] = useState(pathname);
  if (shownFor !== pathname) {
    // a link in the menu was followed: close it on the new page
    setShownFor(pathname);
    setOpen(false);
  }

  useEffect(() => {
    if (!open) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key !== 'Escape') return;
      setOpen(false);
      button.current?.focus();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [open]);

  return (
    <>
      <div className="sticky top-0 z-40 flex items-center justify-between gap-2 border-b border-rule bg-panel px-4 py-2 md:hidden print:hidden">
        {brand}
        <button
          ref={button}
          type="button"
          className="rounded-md border border-rule-strong px-3 py-1.5 text-sm font-medium text-ink"
          aria-expanded={open}
          aria-controls={id}
          onClick={() => setOpen(!open)}
        >
          {open ? 'Close menu' : 'Menu'}
        </button>
      </div>
      <aside
        id={id}
        aria-label="Workspace menu"
        className={`${open ? 'flex' : 'hidden'} fixed inset-x-0 top-[49px] bottom-0 z-40 flex-col gap-4 overflow-y-auto border-r border-rule bg-panel px-3 py-4 md:sticky md:top-0 md:flex md:h-screen md:w-56 md:shrink-0 print:hidden`}
      >
        <div className="hidden md:block">{brand}</div>
        {children}
      </aside>
    </>
  );
}
