import type { HTMLAttributes } from 'react';

/**
 * A box that may scroll (a wide table, a long list): focusable, so the keyboard
 * can scroll it, and labelled, so a screen reader says what it holds.
 */
export function ScrollRegion({ label, className = 'overflow-x-auto', children, ...props }: { label: string } & HTMLAttributes<HTMLDivElement>) {
  return (
    <div role="region" aria-label={label} tabIndex={0} className={className} {...props}>
      {children}
    </div>
  );
}
