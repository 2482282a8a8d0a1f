/**
 * Fingerprint of a benchmark computation: SHA-256 over the scope, the rules, the
 * quality thresholds, the materials and methods in scope (their fields), the
 * dielectric rows, the active decisions and pins, the workspace's count of source
 * merges (when not zero), and the row set: the sequence
 * numbers of the measurements and calculations used (row-set.ts encoding). Equal
 * fingerprints mean an identical snapshot, so a new Revision is stored only when
 * it changes. Row order never matters.
 *
 * A row's sequence number stands for its content: measurement and calculation
 * rows are never edited once written (a correction is a retraction and a new
 * row; the database refuses an edit, drizzle/0010), and a sequence number is
 * never reused. The one exception is a source merge, which re-points rows to the
 * kept source: hence the merge count. So the row set can be hashed
 * without reading the rows, which is what lets the recomputation tell "nothing
 * changed" from one cheap query.
 *
 * Rows without a sequence number (inputs built by hand) and revisions stored
 * before row sets use the content fingerprint (every row's values):
 * contentFingerprint, kept so those revisions can still be reproduced.
 */
import { createHash } from 'node:crypto';
import { encodeRowSet, type RowSet } from './row-set';
import type { BenchmarkInput } from './types';

/** Rows in id order. Sorting the id strings natively and mapping back is about twice as fast as sorting rows with a comparator. */
function byId<T extends { id: string }>(rows: readonly T[]): T[] {
  const index = new Map(rows.map((r) => [r.id, r]));
  return rows
    .map((r) => r.id)
    .sort()
    .map((id) => index.get(id)!);
}

function line(values: ReadonlyArray<string | number | null | undefined>): string {
  return values.map((v) => (v === null || v === undefined ? '∅' : String(v))).join('\u001f') + '\n';
}

/** Stable JSON: object keys sorted, so equal values hash equally. */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (value && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
  }
  return JSON.stringify(value ?? null);
}

/** Feeds lines to the hash in batches: one update per line would cross into native code 230,000 times. */
class LineHasher {
  private readonly hash = createHash('sha256');
  private buffer: string[] = [];

  add(values: ReadonlyArray<string | number | null | undefined>): void {
    this.buffer.push(line(values));
    if (this.buffer.length >= 4096) this.flush();
  }

  private flush(): void {
    this.hash.update(this.buffer.join(''));
    this.buffer = [];
  }

  digest(): string {
    this.flush();
    return this.hash.digest('hex');
  }
}

/** Everything but the rows that a fingerprint covers. */
export type FingerprintParts = Pick<BenchmarkInput, 'rules' | 'qualityThresholds' | 'entropyWindow' | 'materials' | 'methods' | 'dielectric' | 'decisions' | 'pins' | 'sourceMerges'>;

function addParts(h: LineHasher, parts: FingerprintParts, scope: unknown, rowLines?: () => void): void {
  h.add(['scope', canonicalJson(scope), 'rules', canonicalJson(parts.rules), canonicalJson(parts.qualityThresholds ?? {})]);
  h.add(['entropy', canonicalJson(parts.entropyWindow ?? null)]);
  // only when there was one, so a workspace without merges keeps its fingerprints
  if (parts.sourceMerges) h.add(['source-merges', parts.sourceMerges]);
  rowLines?.();
  for (const m of byId(parts.materials)) h.add(['T', m.id, m.name, m.formula, m.atomsInCell, m.spaceGroup, [...m.tags].sort().join(',')]);
  for (const m of byId(parts.methods)) h.add(['K', m.id, m.label, m.kGrid?.join('x'), m.qGrid?.join('x'), m.nonAnalyticCorrection === undefined ? undefined : String(m.nonAnalyticCorrection)]);
  for (const d of [...(parts.dielectric ?? [])].sort((a, b) => (`${a.materialId}|${a.methodId}` < `${b.materialId}|${b.methodId}` ? -1 : 1))) {
    h.add(['E', d.materialId, d.methodId, d.epsInf, d.eps0, d.bornCharges.map((z) => (typeof z === 'number' ? z : z.join(' '))).join(',')]);
  }
  // Only under the Cp − Cv rule, so every other benchmark keeps its fingerprint.
  if (parts.rules.heatCapacityCorrection === 'cp-minus-cv') {
    for (const m of byId(parts.materials)) h.add(['C', m.id, m.thermalExpansionPerK, m.bulkModulusGpa, m.molarVolumeCm3]);
  }
  for (const d of byId(parts.decisions)) h.add(['D', d.id, d.kind, d.measurementId, d.methodId, d.reason]);
  for (const p of byId(parts.pins)) h.add(['P', p.id, p.methodId, p.measurementId, p.calculationId]);
}

/** The fingerprint of a computation over exactly these rows (module header). */
export function rowSetFingerprint(parts: FingerprintParts, scope: unknown, rows: RowSet): string {
  const h = new LineHasher();
  h.add(['rows', Buffer.from(encodeRowSet(rows)).toString('base64')]);
  addParts(h, parts, scope);
  return h.digest();
}

/** The rows' sequence numbers, sorted; null when a row has none. */
export function rowSetOf(input: Pick<BenchmarkInput, 'measurements' | 'calculations'>): RowSet | null {
  const seqs = (rows: ReadonlyArray<{ seq?: number }>) => {
    const out: number[] = [];
    for (const r of rows) {
      if (r.seq === undefined) return null;
      out.push(r.seq);
    }
    return out.sort((a, b) => a - b);
  };
  const measurements = seqs(input.measurements);
  const calculations = seqs(input.calculations);
  return measurements && calculations ? { measurements, calculations } : null;
}

/** The fingerprint of a full input: by row set when every row has a sequence number, else by content. */
export function benchmarkFingerprint(input: BenchmarkInput, scope: unknown): string {
  const rows = rowSetOf(input);
  return rows ? rowSetFingerprint(input, scope, rows) : contentFingerprint(input, scope);
}

/** The fingerprint over every row's values (module header): revisions stored before row sets, and hand-built inputs. */
export function contentFingerprint(input: BenchmarkInput, scope: unknown): string {
  const h = new LineHasher();
  addParts(h, input, scope, () => {
    for (const m of byId(input.measurements)) h.add(['M', m.id, m.materialId, m.sourceId, m.value, m.uncertainty, m.temperatureK, m.irrep, m.branch, m.technique]);
    for (const c of byId(input.calculations)) h.add(['C', c.id, c.materialId, c.methodId, c.sourceId, c.value, c.uncertainty, c.temperatureK, c.irrep, c.branch, c.activity, c.degeneracy, ...(c.modeIndex != null ? [c.modeIndex] : [])]);
  });
  return h.digest();
}
