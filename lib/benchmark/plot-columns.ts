/**
 * The plot points of a revision in columns: one array per field, and every text
 * that repeats (method, material, mode label, citation, the measurement part of
 * the pair key) sent once in a lookup table and referenced by its index. The old
 * row shape sent each citation on every point (12 MB for 30,000 points); the
 * client rebuilds exactly those rows with decodePlotColumns. Pure, so the server
 * encodes and the browser decodes with the same code.
 */
import { Interner } from './interner';
import type { PlotPoint } from './pairs-export';

export const PLOT_COLUMNS_FORMAT = 'plot-columns/1';

/** Bits of the flags column. */
export const FLAG_EXCLUDED = 1;
export const FLAG_OUTLIER = 2;
/** The key did not start with "<method id>|": keys[] holds the whole key, not its tail. */
export const FLAG_WHOLE_KEY = 4;

export interface PlotColumns {
  format: typeof PLOT_COLUMNS_FORMAT;
  revision: number;
  unit: string;
  count: number;
  methods: Array<{ id: string; label: string }>;
  materials: string[];
  labels: string[];
  citations: string[];
  /** Pair keys without their "<method id>|" prefix (the same measurement is paired once per method). */
  keys: string[];
  columns: {
    method: number[];
    material: number[];
    label: number[];
    citation: number[];
    key: number[];
    measured: number[];
    calculated: number[];
    uMeasured: Array<number | null>;
    /** Omitted (null) when every error is exactly calculated − measured, as the pairing computes it. */
    error: number[] | null;
    flags: number[];
  };
}

export function encodePlotColumns(points: readonly PlotPoint[], meta: { revision: number; unit: string }): PlotColumns {
  const methods: Array<{ id: string; label: string }> = [];
  const methodIndex = new Map<string, number>();
  const materials = new Interner();
  const labels = new Interner();
  const citations = new Interner();
  const keys = new Interner();
  const n = points.length;
  const c: PlotColumns['columns'] = {
    method: new Array(n),
    material: new Array(n),
    label: new Array(n),
    citation: new Array(n),
    key: new Array(n),
    measured: new Array(n),
    calculated: new Array(n),
    uMeasured: new Array(n),
    error: null,
    flags: new Array(n),
  };
  let derivable = true;
  points.forEach((p, i) => {
    // a method id with two labels would not survive one table entry per id: give each (id, label) its own entry
    const methodKey = `${p.methodId}\u0000${p.method}`;
    let m = methodIndex.get(methodKey);
    if (m === undefined) {
      m = methods.length;
      methods.push({ id: p.methodId, label: p.method });
      methodIndex.set(methodKey, m);
    }
    const prefix = `${p.methodId}|`;
    const whole = !p.key.startsWith(prefix);
    c.method[i] = m;
    c.material[i] = materials.of(p.material);
    c.label[i] = labels.of(p.label);
    c.citation[i] = citations.of(p.citation);
    c.key[i] = keys.of(whole ? p.key : p.key.slice(prefix.length));
    c.measured[i] = p.measured;
    c.calculated[i] = p.calculated;
    c.uMeasured[i] = p.uMeasured;
    c.flags[i] = (p.excluded ? FLAG_EXCLUDED : 0) | (p.outlier ? FLAG_OUTLIER : 0) | (whole ? FLAG_WHOLE_KEY : 0);
    if (derivable && !Object.is(p.error, p.calculated - p.measured)) derivable = false;
    // mean is (measured + calculated) / 2 in plotPoints; a point that differs cannot be sent in this format
    if (!Object.is(p.mean, (p.measured + p.calculated) / 2)) throw new Error(`Plot point ${p.key}: mean is not (measured + calculated) / 2.`);
  });
  if (!derivable) c.error = points.map((p) => p.error);
  return {
    format: PLOT_COLUMNS_FORMAT,
    revision: meta.revision,
    unit: meta.unit,
    count: n,
    methods,
    materials: materials.values,
    labels: labels.values,
    citations: citations.values,
    keys: keys.values,
    columns: c,
  };
}

/** The rows the plots, tooltips and figure texts read, rebuilt from the columns. */
export function decodePlotColumns(payload: PlotColumns): PlotPoint[] {
  if (payload.format !== PLOT_COLUMNS_FORMAT) throw new Error(`Unknown plot payload format "${String(payload.format)}".`);
  const c = payload.columns;
  const out: PlotPoint[] = new Array(payload.count);
  for (let i = 0; i < payload.count; i++) {
    const method = payload.methods[c.method[i]];
    const flags = c.flags[i];
    const keyPart = payload.keys[c.key[i]];
    const measured = c.measured[i];
    const calculated = c.calculated[i];
    out[i] = {
      key: flags & FLAG_WHOLE_KEY ? keyPart : `${method.id}|${keyPart}`,
      methodId: method.id,
      method: method.label,
      material: payload.materials[c.material[i]],
      label: payload.labels[c.label[i]],
      measured,
      calculated,
      error: c.error ? c.error[i] : calculated - measured,
      mean: (measured + calculated) / 2,
      uMeasured: c.uMeasured[i],
      excluded: (flags & FLAG_EXCLUDED) !== 0,
      outlier: (flags & FLAG_OUTLIER) !== 0,
      citation: payload.citations[c.citation[i]],
    };
  }
  return out;
}
