/** The browser side of bench:plot: draws a Vega-Lite spec as the benchmark page does (canvas, CSP-safe interpreter) and times it to the first frame. */
import { compile, type TopLevelSpec } from 'vega-lite';
import { parse, View } from 'vega';
import { expressionInterpreter } from 'vega-interpreter';

async function draw(spec: TopLevelSpec, renderer: 'svg' | 'canvas'): Promise<number> {
  const el = document.getElementById('plot')!;
  el.replaceChildren();
  const start = performance.now();
  const view = new View(parse(compile(spec).spec, undefined, { ast: true }), { expr: expressionInterpreter, renderer, container: el, hover: true });
  await view.runAsync();
  // the frame after the scene is drawn: two animation frames later the browser has painted it
  await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
  const ms = performance.now() - start;
  view.finalize();
  return ms;
}

(window as unknown as { drawSpec: typeof draw }).drawSpec = draw;
