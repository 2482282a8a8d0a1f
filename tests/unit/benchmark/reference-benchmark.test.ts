/**
 * Benchmarks against a reference method (reference-pairs.ts, compute.ts referenceSummary) and the
 * convergence view built on them (convergence-view.ts), on worked cases. All frequencies are invented
 * for the tests, shaped like a two-atom diamond-structure cell: three acoustic modes at 0 and a
 * triply degenerate optical mode.
 */
import { describe, expect, it } from 'vitest';
import { computeBenchmark } from '@/lib/benchmark/compute';
import { convergenceView } from '@/lib/benchmark/convergence-view';
import { readRules, scopeSchema } from '@/lib/benchmark/schemas';
import type { BenchmarkInput, ScopeCalculation } from '@/lib/benchmark/types';

let seq = 0;
const row = (methodId: string, materialId: string, value: number, modeIndex: number | null, extra: Partial<ScopeCalculation> = {}): ScopeCalculation => ({
  id: `c${String(++seq).padStart(4, '0')}`,
  materialId,
  methodId,
  sourceId: 'calc',
  importId: null,
  value,
  uncertainty: null,
  temperatureK: null,
  irrep: null,
  branch: null,
  activity: null,
  degeneracy: 1,
  modeIndex,
  ...extra,
});

/** Six modes: indices 1–3 acoustic at `acoustic`, 4–6 optical at `optical`. */
const cell = (methodId: string, materialId: string, acoustic: number, optical: number, options: { index?: boolean; irrep?: string } = {}) =>
  [acoustic, acoustic, acoustic, optical, optical, optical].map((v, i) =>
    row(methodId, materialId, v, options.index === false ? null : i + 1, i >= 3 ? { irrep: options.irrep ?? 'T2g' } : {}),
  );

function input(calculations: ScopeCalculation[], candidates: string[], rules: Record<string, unknown> = {}, materials = ['si', 'ge']): BenchmarkInput {
  return {
    quantity: 'frequency',
    rules: readRules({ bootstrapSamples: 0, ...rules }),
    measurements: [],
    calculations,
    materials: materials.map((id) => ({ id, name: id.toUpperCase(), formula: id === 'si' ? 'Si' : 'Ge', atomsInCell: 2, tags: [id === 'si' ? 'group-iv' : 'group-iv-heavy'] })),
    methods: candidates.map((id) => ({ id, label: `PBEsol ${id}`, kGrid: null, qGrid: null })),
    pins: [],
    decisions: [],
    referenceMethod: { id: 'ref', label: 'PBEsol dense' },
  };
}

describe('pairing against a reference method', () => {
  it('matches complete, indexed lists mode by mode and leaves the acoustic modes out', () => {
    const snap = computeBenchmark(input([...cell('ref', 'si', 0, 517.0), ...cell('k4', 'si', 0.4, 515.5)], ['k4'], {}, ['si']));
    expect(snap.pairs).toHaveLength(3);
    for (const p of snap.pairs) {
      expect(p.basis).toBe('index');
      expect(p.measured).toBe(517.0);
      expect(p.error).toBeCloseTo(-1.5, 12);
    }
    expect(snap.counts.measuredInScope).toBe(3);
    expect(snap.counts.calculations).toBe(6);
    expect(snap.reference).toMatchObject({ methodId: 'ref', label: 'PBEsol dense', tolerance: 1, share: 0.95, matchedBy: { index: 1, pairing: 0 } });
    const k4 = snap.reference!.perMethod[0];
    expect(k4).toMatchObject({ methodId: 'k4', materials: 1, withinTolerance: 0, shareWithin: 0, n: 3 });
    expect(k4.meanAbsolute).toBeCloseTo(1.5, 12);
    expect(k4.maxRelative).toBeCloseTo(1.5 / 517, 12);
  });

  it('falls back to the pairing rules when a list has no indices, with the same N and differences', () => {
    const snap = computeBenchmark(input([...cell('ref', 'si', 0, 517.0), ...cell('k4', 'si', 0.4, 515.5, { index: false })], ['k4'], {}, ['si']));
    expect(snap.reference!.matchedBy).toEqual({ index: 0, pairing: 1 });
    expect(snap.pairs).toHaveLength(3);
    expect(snap.pairs.every((p) => p.basis !== 'index' && Math.abs(p.error + 1.5) < 1e-9)).toBe(true);
    expect(new Set(snap.pairs.flatMap((p) => p.measurementIds)).size).toBe(3);
  });

  it('does not trust indices whose labels disagree', () => {
    const snap = computeBenchmark(input([...cell('ref', 'si', 0, 517.0), ...cell('k4', 'si', 0, 516.0, { irrep: 'Eg' })], ['k4'], {}, ['si']));
    expect(snap.reference!.matchedBy).toEqual({ index: 0, pairing: 1 });
  });

  it('ignores stored activities in the fallback: a Raman-silent reference line still pairs', () => {
    const ref = cell('ref', 'si', 0, 517.0, { index: false }).map((c, i) => (i >= 3 ? { ...c, activity: 'silent' } : c));
    const cand = cell('k4', 'si', 0, 516.0, { index: false }).map((c, i) => (i >= 3 ? { ...c, activity: 'raman' } : c));
    expect(computeBenchmark(input([...ref, ...cand], ['k4'], {}, ['si'])).pairs).toHaveLength(3);
  });

  it('counts a material within tolerance when its largest |Δ| is at most the rule', () => {
    const rows = [...cell('ref', 'si', 0, 517.0), ...cell('k4', 'si', 0, 515.5), ...cell('ref', 'ge', 0, 301.0), ...cell('k4', 'ge', 0, 300.6)];
    const snap = computeBenchmark(input(rows, ['k4'], { referenceTolerance: 1 }));
    expect(snap.reference!.perMethod[0]).toMatchObject({ materials: 2, withinTolerance: 1, shareWithin: 0.5 });
    expect(computeBenchmark(input(rows, ['k4'], { referenceTolerance: 1.5 })).reference!.perMethod[0].withinTolerance).toBe(2);
  });

  it('refuses a reference method that is also a candidate', () => {
    const parsed = scopeSchema.safeParse({ quantity: 'frequency', methodIds: ['a', 'ref'], referenceMethodId: 'ref' });
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues[0]).toMatchObject({ path: ['referenceMethodId'], message: expect.stringMatching(/cannot also be a candidate/) });
  });
});

describe('the convergence view', () => {
  // Si converges from k = 6³ (KPPRA 432 for 2 atoms), Ge never does (its densest member is 1.2 cm⁻¹ off).
  const rows = [
    ...cell('ref', 'si', 0, 517.0),
    ...cell('k4', 'si', 0, 514.0),
    ...cell('k6', 'si', 0, 516.5),
    ...cell('k8', 'si', 0, 517.2),
    ...cell('ref', 'ge', 0, 301.0),
    ...cell('k4', 'ge', 0, 305.0),
    ...cell('k6', 'ge', 0, 302.5),
    ...cell('k8', 'ge', 0, 302.2),
  ];
  const snap = computeBenchmark(input(rows, ['k4', 'k6', 'k8']));
  const methods = [4, 6, 8].map((k) => ({ id: `k${k}`, label: `PBEsol k${k}`, kGrid: [k, k, k] as [number, number, number], qGrid: null, cutoffEv: null, smearing: null }));
  const materials = snap.materialRows!.map((r) => ({ id: r.materialId, name: r.name, atomsInCell: 2, tags: [r.materialId === 'si' ? 'group-iv' : 'group-iv-heavy'] }));

  it('reads k-points per reciprocal atom, finds each material’s point and flags the one that never converges', () => {
    const view = convergenceView(snap, 'kppra', methods, materials)!;
    expect(view.points.filter((p) => p.materialId === 'si').map((p) => p.parameter)).toEqual([128, 432, 1024]);
    const all = view.classes.find((c) => c.group === 'all materials')!;
    // Two materials at 95 %: both must converge, and Ge does not.
    expect(all).toMatchObject({ n: 2, converged: 1, needed: 2, value: null });
    expect(view.classes.find((c) => c.group === 'group-iv')!.value).toBe(432);
    expect(view.neverConverged.map((m) => m.materialId)).toEqual(['ge']);
    expect(view.neverConverged[0].bestMaxAbsolute).toBeCloseTo(1.2, 9);
    const k8 = view.distribution.find((d) => d.method === 'PBEsol k8')!;
    expect(k8.parameter).toBe(1024);
    expect(k8.medianMax).toBeCloseTo((0.2 + 1.2) / 2, 9);
  });

  it('names the methods that lack the parameter', () => {
    const view = convergenceView(snap, 'cutoff', methods, materials)!;
    expect(view.methodsLacking).toEqual(['PBEsol k4', 'PBEsol k6', 'PBEsol k8']);
    expect(view.points).toHaveLength(0);
  });
});

describe('other quantities against a reference method', () => {
  const perMaterial = (methodId: string, materialId: string, value: number, temperatureK: number | null) => row(methodId, materialId, value, null, { temperatureK, irrep: null });

  it('pairs heat capacities at each reference temperature with the candidate nearest in T', () => {
    // q-grid convergence of a harmonic Cv(T): the reference at 100, 200 and 298.15 K; the candidate 0.3, 0.1 and 0.05 J mol⁻¹ K⁻¹ off.
    const rows = [
      perMaterial('ref', 'si', 7.27, 100), perMaterial('ref', 'si', 15.63, 200), perMaterial('ref', 'si', 19.79, 298.15),
      perMaterial('q2', 'si', 6.97, 100), perMaterial('q2', 'si', 15.53, 200.4), perMaterial('q2', 'si', 19.74, 298.15),
    ];
    const snap = computeBenchmark({ ...input(rows, ['q2'], {}, ['si']), quantity: 'heat-capacity', entropyWindow: { temperatureK: null, toleranceK: 1 } });
    expect(snap.pairs.map((p) => [p.temperatureK, Number(p.error.toFixed(2))])).toEqual([
      [100, -0.3],
      [200, -0.1],
      [298.15, -0.05],
    ]);
    // Tolerance 0.1 J mol⁻¹ K⁻¹ by default: the material's largest |Δ| is 0.3, so it is not within.
    expect(snap.reference).toMatchObject({ tolerance: 0.1, perMethod: [{ materials: 1, withinTolerance: 0, n: 3 }] });
    expect(snap.reference!.perMethod[0].maxAbsolute).toBeCloseTo(0.3, 9);
    // Both sides are Cv: the caution about calorimetric Cp does not apply.
    expect(snap.caution).toBeNull();
  });

  it('pairs one dielectric constant per material and method', () => {
    const rows = [perMaterial('ref', 'si', 12.1, null), perMaterial('k4', 'si', 12.4, null), perMaterial('ref', 'ge', 16.5, null), perMaterial('k4', 'ge', 16.52, null)];
    const snap = computeBenchmark({ ...input(rows, ['k4']), quantity: 'eps-inf' });
    expect(snap.pairs.map((p) => Number(p.error.toFixed(2))).sort()).toEqual([0.02, 0.3]);
    // Tolerance 0.05 by default: Ge within, Si not.
    expect(snap.reference!.perMethod[0]).toMatchObject({ materials: 2, withinTolerance: 1, shareWithin: 0.5 });
  });
});
