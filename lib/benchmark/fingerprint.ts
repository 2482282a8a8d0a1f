/**
 * Fingerprint of a benchmark computation: SHA-256 over the sorted ids and the
 * values of every row used, the scope, the rules, the quality thresholds, the
 * active decisions and pins. Equal fingerprints mean an identical snapshot, so a
 * new Revision is stored only when it changes. Row order never matters.
 */
import { createHash } from 'node:crypto';
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

export function benchmarkFingerprint(input: BenchmarkInput, scope: unknown): string {
  const h = new LineHasher();
  h.add(['scope', canonicalJson(scope), 'rules', canonicalJson(input.rules), canonicalJson(input.qualityThresholds ?? {})]);
  h.add(['entropy', canonicalJson(input.entropyWindow ?? null)]);
  for (const m of byId(input.measurements)) h.add(['M', m.id, m.materialId, m.sourceId, m.value, m.uncertainty, m.temperatureK, m.irrep, m.branch, m.technique]);
  for (const c of byId(input.calculations)) h.add(['C', c.id, c.materialId, c.methodId, c.sourceId, c.value, c.uncertainty, c.temperatureK, c.irrep, c.branch, c.activity, c.degeneracy]);
  for (const m of byId(input.materials)) h.add(['T', m.id, m.name, m.formula, m.atomsInCell, m.spaceGroup, [...m.tags].sort().join(',')]);
  for (const m of byId(input.methods)) h.add(['K', m.id, m.label, m.kGrid?.join('x'), m.qGrid?.join('x'), m.nonAnalyticCorrection === undefined ? undefined : String(m.nonAnalyticCorrection)]);
  for (const d of [...(input.dielectric ?? [])].sort((a, b) => (`${a.materialId}|${a.methodId}` < `${b.materialId}|${b.methodId}` ? -1 : 1))) {
    h.add(['E', d.materialId, d.methodId, d.epsInf, d.eps0, d.bornCharges.join(',')]);
  }
  for (const d of byId(input.decisions)) h.add(['D', d.id, d.kind, d.measurementId, d.methodId, d.reason]);
  for (const p of byId(input.pins)) h.add(['P', p.id, p.methodId, p.measurementId, p.calculationId]);
  return h.digest();
}
