import { expressionInterpreter } from 'vega-interpreter';
import type { EmbedOptions } from 'vega-embed';

/**
 * Vega compiles its expressions with `new Function` unless told to interpret
 * them: the Content-Security-Policy (proxy.ts) allows no 'unsafe-eval', so every
 * chart parses expressions to an AST and runs them with vega-interpreter.
 */
export const CSP_SAFE_VEGA: Pick<EmbedOptions, 'ast' | 'expr'> = { ast: true, expr: expressionInterpreter };

/** What every chart embeds with: no Vega action menu, our tooltip theme, the CSP-safe interpreter. */
export function embedOptions(renderer: 'svg' | 'canvas'): EmbedOptions {
  return { renderer, actions: false, tooltip: { theme: 'light' }, ...CSP_SAFE_VEGA };
}

/** Saves the figure as the view renders it (so the file matches the screen): SVG at 1×, PNG at 2×. */
export async function saveFigure(view: { toImageURL(type: string, scale?: number): Promise<string> }, fileName: string, type: 'svg' | 'png'): Promise<void> {
  const url = await view.toImageURL(type, type === 'png' ? 2 : 1);
  const a = document.createElement('a');
  a.href = url;
  a.download = `${fileName}.${type}`;
  document.body.appendChild(a);
  a.click();
  a.remove();
}
