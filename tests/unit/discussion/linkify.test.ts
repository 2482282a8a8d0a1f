import { describe, expect, it } from 'vitest';
import { safeHref, tokenizeComment } from '@/lib/discussion/linkify';

describe('linkify', () => {
  it('links only absolute http(s) URLs', () => {
    expect(safeHref('https://doi.org/10.1103/PhysRevB.1')).toBe('https://doi.org/10.1103/PhysRevB.1');
    expect(safeHref('javascript:alert(1)')).toBeNull();
    expect(safeHref('data:text/html,<b>x</b>')).toBeNull();
    const tokens = tokenizeComment('see javascript:alert(1) and https://example.org/a?b=1.');
    expect(tokens.filter((t) => t.kind === 'link')).toEqual([{ kind: 'link', text: 'https://example.org/a?b=1', href: 'https://example.org/a?b=1' }]);
    expect(tokens.at(-1)).toEqual({ kind: 'text', text: '.' });
  });

  it('keeps balanced brackets and drops an enclosing one', () => {
    const links = (s: string) => tokenizeComment(s).flatMap((t) => (t.kind === 'link' ? [t.text] : []));
    expect(links('(see https://en.wikipedia.org/wiki/Raman_(disambiguation))')).toEqual(['https://en.wikipedia.org/wiki/Raman_(disambiguation)']);
    expect(links('(https://example.org/x)')).toEqual(['https://example.org/x']);
  });

  it('leaves HTML as text and marks mentions', () => {
    const tokens = tokenizeComment('<img src=x onerror=alert(1)> @lena.okafor');
    expect(tokens).toEqual([
      { kind: 'text', text: '<img src=x onerror=alert(1)> ' },
      { kind: 'mention', text: '@lena.okafor', handle: 'lena.okafor' },
    ]);
  });

  it('reassembles to the original text', () => {
    const body = 'Eg at 144 cm-1 (https://doi.org/10.1000/x), ask @tomas — <b>strained</b> film? http://a.b/c.';
    expect(tokenizeComment(body).map((t) => t.text).join('')).toBe(body);
  });
});
