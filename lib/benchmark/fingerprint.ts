/**
 * Fingerprint of a benchmark computation: SHA-256 over the sorted ids and the
 * values of every row used, the scope, the rules, the quality thresholds, the
 * active decisions and pins. Equal fingerprints mean an identical snapshot, so a
 * new Revision is stored only when it changes. Row order never matters.
 */
import { createHash } from 'node:crypto';
import type { BenchmarkInput } from './types';

function byId<T extends { id: string }>(rows: readonly T[]): T[] {
  return [...rows].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
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

export function benchmarkFingerprint(input: BenchmarkInput, scope: unknown): string {
  const hash = createHash('sha256');
  hash.update(line(['scope', canonicalJson(scope), 'rules', canonicalJson(input.rules), canonicalJson(input.qualityThresholds ?? {})]));
  hash.update(line(['entropy', canonicalJson(input.entropyWindow ?? null)]));
  for (const m of byId(input.measurements)) {
    hash.update(line(['M', m.id, m.materialId, m.sourceId, m.value, m.uncertainty, m.temperatureK, m.irrep, m.branch, m.technique]));
  }
  for (const c of byId(input.calculations)) {
    hash.update(line(['C', c.id, c.materialId, c.methodId, c.sourceId, c.value, c.uncertainty, c.temperatureK, c.irrep, c.branch, c.activity, c.degeneracy]));
  }
  for (const m of byId(input.materials)) hash.update(line(['T', m.id, m.name, m.atomsInCell, [...m.tags].sort().join(',')]));
  for (const m of byId(input.methods)) hash.update(line(['K', m.id, m.label, m.kGrid?.join('x'), m.qGrid?.join('x')]));
  for (const d of byId(input.decisions)) hash.update(line(['D', d.id, d.kind, d.measurementId, d.methodId, d.reason]));
  for (const p of byId(input.pins)) hash.update(line(['P', p.id, p.methodId, p.measurementId, p.calculationId]));
  return hash.digest('hex');
}
