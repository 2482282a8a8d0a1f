'use client';
import { useEffect, useRef } from 'react';
import { useRouter } from 'next/navigation';

/** "g" then one of these keys opens a section of the workspace. */
export const GO_KEYS: ReadonlyArray<readonly [key: string, path: string, label: string]> = [
  ['o', '', 'Overview'],
  ['b', '/benchmarks', 'Benchmarks'],
  ['m', '/materials', 'Materials'],
  ['s', '/sources', 'Sources'],
  ['t', '/methods', 'Methods'],
  ['e', '/measurements', 'Measurements'],
  ['c', '/calculations', 'Calculations'],
  ['i', '/imports', 'Imports'],
  ['d', '/decks', 'Decks'],
];

const GENERAL: ReadonlyArray<readonly [string, string]> = [
  ['?', 'Show or hide this list'],
  ['/', 'Move to the filter box of a table'],
  ['Tab, Shift + Tab', 'Next, previous control; the first Tab offers “Skip to main content”'],
  ['Enter on a column header', 'Sort by that column (again: reverse)'],
  ['Enter on a plot point', 'Open that pair'],
  ['← → PageUp PageDown Home End', 'Move through a deck in the presenter; Esc leaves it'],
  ['Esc', 'Close a dialog or the menu'],
];

const OPEN_EVENT = 'ledger:shortcuts';

/** A button that opens the shortcut list (for those who do not know "?" yet). */
export function ShortcutButton() {
  return (
    <button type="button" className="block py-1 text-left text-xs text-ink-muted underline decoration-ink-muted/40 underline-offset-2 hover:text-ink" onClick={() => window.dispatchEvent(new Event(OPEN_EVENT))}>
      Keyboard shortcuts <kbd className="font-mono">?</kbd>
    </button>
  );
}

function typing(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  return !!el && (/^(INPUT|TEXTAREA|SELECT)$/.test(el.tagName) || el.isContentEditable);
}

/** The keyboard shortcuts of the workspace, listed in a dialog that "?" opens. */
export function ShortcutOverlay({ slug }: { slug: string }) {
  const dialog = useRef<HTMLDialogElement>(null);
  const back = useRef<HTMLElement | null>(null);
  const router = useRouter();

  useEffect(() => {
    const open = () => {
      const d = dialog.current;
      if (!d || d.open) return;
      back.current = document.activeElement as HTMLElement | null;
      d.showModal();
    };
    window.addEventListener(OPEN_EVENT, open);
    return () => window.removeEventListener(OPEN_EVENT, open);
  }, []);

  useEffect(() => {
    let pendingGo = 0;
    const onKey = (e: KeyboardEvent) => {
      if (e.altKey || e.ctrlKey || e.metaKey || typing(e.target) || e.defaultPrevented) return;
      const d = dialog.current;
      if (!d) return;
      if (e.key === '?') {
        e.preventDefault();
        if (d.open) d.close();
        else {
          back.current = document.activeElement as HTMLElement | null;
          d.showModal();
        }
        return;
      }
      if (d.open) return;
      if (e.key === '/') {
        const filter = document.querySelector<HTMLInputElement>('main input[type="search"], main [data-shortcut="filter"]');
        if (filter) {
          e.preventDefault();
          filter.focus();
        }
        return;
      }
      if (e.key === 'g') {
        pendingGo = window.setTimeout(() => (pendingGo = 0), 1200);
        return;
      }
      if (pendingGo) {
        window.clearTimeout(pendingGo);
        pendingGo = 0;
        const go = GO_KEYS.find(([key]) => key === e.key);
        if (go) {
          e.preventDefault();
          router.push(`/w/${slug}${go[1]}`);
        }
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [router, slug]);

  return (
    <dialog
      ref={dialog}
      aria-labelledby="shortcut-title"
      className="m-auto w-[min(36rem,calc(100vw-2rem))] rounded-lg border border-rule-strong bg-panel p-5 text-sm text-ink shadow-lg backdrop:bg-ink/30"
      onClose={() => back.current?.focus()}
    >
      <div className="mb-3 flex items-center justify-between gap-3">
        <h2 id="shortcut-title">Keyboard shortcuts</h2>
        <button type="button" className="rounded-md border border-rule-strong px-2 py-1 text-xs font-medium" onClick={() => dialog.current?.close()}>
          Close
        </button>
      </div>
      <table className="w-full border-collapse">
        <caption className="sr-only">Keys and what they do</caption>
        <thead className="sr-only">
          <tr>
            <th scope="col">Keys</th>
            <th scope="col">Action</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {GENERAL.map(([keys, what]) => (
            <tr key={keys}>
              <td className="py-1.5 pr-4 align-top font-mono text-xs whitespace-nowrap">{keys}</td>
              <td className="py-1.5">{what}</td>
            </tr>
          ))}
          {GO_KEYS.map(([key, , label]) => (
            <tr key={key}>
              <td className="py-1.5 pr-4 font-mono text-xs whitespace-nowrap">g then {key}</td>
              <td className="py-1.5">Go to {label}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </dialog>
  );
}
