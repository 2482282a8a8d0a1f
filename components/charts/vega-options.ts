import { expressionInterpreter } from 'vega-interpreter';
import type { EmbedOptions } from 'vega-embed';

/**
 * Vega compiles its expressions with `new Function` unless told to interpret
 * them: the Content-Security-Policy (proxy.ts) allows no 'unsafe-eval', so every
 * chart parses expressions to an AST and runs them with vega-interpreter.
 */
export const CSP_SAFE_VEGA: Pick<EmbedOptions, 'ast' | 'expr'> = { ast: true, expr: expressionInterpreter };
