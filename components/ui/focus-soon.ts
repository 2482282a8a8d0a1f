/**
 * Moves focus to the element matching `selector` once it is on the page (after a
 * server action re-renders it), so focus does not fall back to the document when
 * the control that had it goes away. Gives up after `timeoutMs`.
 */
export function focusSoon(selector: string, timeoutMs = 3000) {
  const until = Date.now() + timeoutMs;
  const attempt = () => {
    const el = document.querySelector<HTMLElement>(selector);
    if (el && el.isConnected) {
      if (!el.hasAttribute('tabindex')) el.setAttribute('tabindex', '-1');
      el.focus();
      if (document.activeElement === el) return;
    }
    if (Date.now() < until) window.setTimeout(attempt, 50);
  };
  window.setTimeout(attempt, 0);
}
