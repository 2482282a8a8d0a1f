/**
 * The benchmark computation on worked cases: ranking on common ground, coverage, the
 * ranking rule, outliers from a minimum N on the relative scale, the LO–TO flag of a
 * method, clustered intervals, per-material rows, breakdowns and the entropy basis.
 * Measured values are published ones (named); computed values are invented for the tests.
 */
import { describe, expect, it } from 'vitest';
import { computeBenchmark } from '@/lib/benchmark/compute';
import { outlierScaleOf, readRules } from '@/lib/benchmark/schemas';
import type { BenchmarkInput, ScopeCalculation, ScopeMeasurement } from '@/lib/benchmark/types';

let seq = 0;
const meas = (materialId: string, value: number, irrep: string | null, extra: Partial<ScopeMeasurement> = {}): ScopeMeasurement => ({
  id: `m${String(++seq).padStart(4, '0')}`,
  materialId,
  sourceId: 'src',
  importId: null,
  value,
  uncertainty: null,
  temperatureK: 295,
  irrep,
  branch: null,
  technique: 'raman',
  ...extra,
});
const calc = (methodId: string, materialId: string, value: number, irrep: string | null, extra: Partial<ScopeCalculation> = {}): ScopeCalculation => ({
  id: `c${String(++seq).padStart(4, '0')}`,
  materialId,
  methodId,
  sourceId: 'calc',
  importId: null,
  value,
  uncertainty: null,
  temperatureK: null,
  irrep,
  branch: null,
  activity: 'raman',
  degeneracy: 1,
  ...extra,
});

/** Twelve invented materials with four Raman lines each (values invented, 200–800 cm⁻¹). */
function world() {
  const materials = Array.from({ length: 12 }, (_, i) => ({ id: `mat${String(i).padStart(2, '0')}`, name: `Crystal ${i}`, formula: 'MgO', atomsInCell: 8, tags: [] as string[] }));
  const measurements: ScopeMeasurement[] = [];
  const lines = ['A1g', 'Eg', 'T2g', 'B1g'];
  for (const m of materials) lines.forEach((l, k) => measurements.push(meas(m.id, 200 + 150 * k + 3 * Number(m.id.slice(3)), l)));
  return { materials, measurements };
}

function input(over: Partial<BenchmarkInput>): BenchmarkInput {
  return {
    quantity: 'frequency',
    rules: readRules({ bootstrapSamples: 200 }),
    measurements: [],
    calculations: [],
    materials: [],
    methods: [],
    pins: [],
    decisions: [],
    ...over,
  };
}

describe('ranking on common ground', () => {
  const { materials, measurements } = world();
  // A: 3 % low everywhere (MAE ≈ 12); B: 1.5 % low everywhere; C: an optical-only set for two materials, 0.2 % off.
  const calculations = [
    ...measurements.map((m) => calc('A', m.materialId, m.value * 0.97, m.irrep)),
    ...measurements.map((m) => calc('B', m.materialId, m.value * 0.985, m.irrep)),
    ...measurements.filter((m) => m.materialId <= 'mat01').map((m) => calc('C', m.materialId, m.value * 0.998, m.irrep)),
  ];
  const methods = ['A', 'B', 'C'].map((id) => ({ id, label: `Method ${id}`, kGrid: null, qGrid: null }));
  const snap = computeBenchmark(input({ materials, measurements, calculations, methods }));
  const by = new Map(snap.methods.map((m) => [m.methodId, m]));

  it('every line of the optical-only set pairs, yet the method with N = 8 is listed, not ranked', () => {
    expect(by.get('C')!.n).toBe(8);
    expect(by.get('C')!.paired).toBe(8);
    expect(by.get('C')!.coverage).toBeCloseTo(8 / 48, 12);
    expect(by.get('C')!.rank).toBeNull();
    expect(by.get('C')!.unranked).toBe("N = 8 is below the benchmark's minimum of 10");
    expect(by.get('B')!.rank).toBe(1);
    expect(by.get('A')!.rank).toBe(2);
    expect(snap.methods.map((m) => m.methodId)).toEqual(['B', 'A', 'C']);
  });

  it('ranks on the pairs every ranked method shares, shows that N and each method’s own statistics beside', () => {
    expect(snap.ranking).toMatchObject({ commonN: 48, rankedMethods: 2, minN: 10, minCoverage: 0.5, note: null });
    expect(by.get('A')!.common!.n).toBe(48);
    expect(by.get('A')!.common!.meanAbsoluteError).toBeCloseTo(by.get('A')!.statistics!.meanAbsoluteError, 12);
  });

  it('with the ranking rule off, the ranking rests on the pairs all three share (two materials)', () => {
    const open = computeBenchmark(input({ materials, measurements, calculations, methods, rules: readRules({ bootstrapSamples: 0, ranking: { minN: 0, minCoverage: 0 } }) }));
    expect(open.ranking!.commonN).toBe(8);
    const c = open.methods.find((m) => m.methodId === 'C')!;
    expect(c.rank).toBe(1);
    expect(c.common!.n).toBe(8);
  });

  it('clusters the interval by material and leaves one material out for the scaled RMSE', () => {
    const s = by.get('A')!.statistics!;
    expect(s.bootstrap!.resampled).toBe('clusters');
    expect(s.bootstrap!.clusterCount).toBe(12);
    expect(s.clusterCount).toBe(12);
    expect(s.rmseAfterScalingOutOfSample).toBeGreaterThanOrEqual(s.rmseAfterScaling!);
  });

  it('lists each material of a method, worst first, and breaks down by species, branch and technique', () => {
    const rowsA = snap.materialRows!.filter((r) => r.methodId === 'A');
    expect(rowsA).toHaveLength(12);
    expect(rowsA[0].meanAbsoluteError).toBeGreaterThanOrEqual(rowsA[11].meanAbsoluteError!);
    expect(rowsA[0].n).toBe(4);
    expect(new Set(snap.species!.map((r) => r.group))).toEqual(new Set(['A1g', 'Eg', 'T2g', 'B1g']));
    expect(snap.branches!.map((r) => r.group)).toEqual(['no branch given', 'no branch given', 'no branch given']);
    expect(snap.techniques!.every((r) => r.group === 'raman')).toBe(true);
  });
});

describe('outliers', () => {
  it('at N = 3 nothing is flagged (a −2.55 cm⁻¹ error was flagged by the modified z-score)', () => {
    // Si 520.45 (Itoh & Shirono 2020), Ge 300.7 (Parker et al. 1967), diamond 1332.7 (PRB 2000).
    const materials = ['si', 'ge', 'c'].map((id) => ({ id, name: id, formula: 'Si', atomsInCell: 2, tags: [] }));
    const measurements = [meas('si', 520.45, 'T2g'), meas('ge', 300.7, 'T2g'), meas('c', 1332.7, 'T2g')];
    const calculations = [calc('A', 'si', 520.15, 'T2g'), calc('A', 'ge', 300.45, 'T2g'), calc('A', 'c', 1330.15, 'T2g')];
    const run = (outlierRule: object) =>
      computeBenchmark(input({ materials, measurements, calculations, methods: [{ id: 'A', label: 'A', kGrid: null, qGrid: null }], rules: readRules({ bootstrapSamples: 0, outlierRule }) }));
    expect(run({}).pairs.filter((p) => p.outlier)).toEqual([]);
    expect(run({ minN: 1, scale: 'absolute' }).pairs.filter((p) => p.outlier).map((p) => p.materialId)).toEqual(['c']);
  });

  it('frequency benchmarks use the relative scale by default: a uniform bias flags no high line', () => {
    const { materials, measurements } = world();
    const highs = [meas('mat00', 1332.7, 'F2g'), meas('mat01', 1306, 'A1')];
    const all = [...measurements, ...highs];
    const calculations = all.map((m, i) => calc('A', m.materialId, m.value * (1 - 0.035 + 0.001 * Math.sin(i)), m.irrep));
    const methods = [{ id: 'A', label: 'A', kGrid: null, qGrid: null }];
    const relative = computeBenchmark(input({ materials, measurements: all, calculations, methods }));
    expect(relative.outlierScale).toBe('relative');
    expect(relative.pairs.filter((p) => p.outlier)).toEqual([]);
    const absolute = computeBenchmark(input({ materials, measurements: all, calculations, methods, rules: readRules({ bootstrapSamples: 0, outlierRule: { scale: 'absolute' } }) }));
    expect(absolute.pairs.filter((p) => p.outlier).map((p) => p.measured)).toEqual(expect.arrayContaining([1332.7, 1306]));
  });
});

describe('the method’s LO–TO flag and the acoustic rule reach pairing', () => {
  // GaAs LO 297.3, TO 273.3 cm⁻¹ (Hass & Henvis 1962); computed TO 265 is invented.
  const materials = [{ id: 'gaas', name: 'GaAs', formula: 'GaAs', atomsInCell: 2, tags: [] }];
  const measurements = [meas('gaas', 297.3, null, { branch: 'LO' }), meas('gaas', 273.3, null, { branch: 'TO', technique: 'ir-reflectance' })];
  const calculations = [calc('A', 'gaas', 265, 'T2', { activity: 'raman+ir', degeneracy: 3 })];

  it('a method without the correction pairs the TO peak only; an unknown flag pairs both', () => {
    const run = (nonAnalyticCorrection: boolean | null) =>
      computeBenchmark(input({ materials, measurements, calculations, methods: [{ id: 'A', label: 'A', kGrid: null, qGrid: null, nonAnalyticCorrection }] }));
    const without = run(false);
    expect(without.pairs.map((p) => p.measured)).toEqual([273.3]);
    expect(without.methods[0].unpairedMeasurements).toBe(1);
    // The set is optical-only (3 of 6 modes, no acoustic rows) and its line still pairs. Unknown (null): the LO
    // peak pairs with the TO line too, as before (each spectrum pairs on its own).
    expect(run(null).pairs.map((p) => p.measured).sort()).toEqual([273.3, 297.3]);
  });
});

describe('entropy basis', () => {
  // S°(298.15 K): Al 28.30, Al2O3 50.92 J mol⁻¹ K⁻¹ (CODATA Key Values, Cox, Wagman & Medvedev 1989); computed values invented.
  const materials = [
    { id: 'al', name: 'Al', formula: 'Al', atomsInCell: 1, tags: [] },
    { id: 'al2o3', name: 'Al2O3', formula: 'Al4O6', atomsInCell: 10, tags: [] },
    { id: 'ag', name: 'Ag', formula: 'Ag', atomsInCell: 1, tags: [] },
  ];
  const measurements = [meas('al', 28.3, null, { temperatureK: 298.15, technique: 'calorimetry' }), meas('al2o3', 50.92, null, { temperatureK: 298.15, technique: 'calorimetry' }), meas('ag', 42.55, null, { temperatureK: 298.15, technique: 'calorimetry' })];
  const calculations = [calc('A', 'al', 27.3, null, { temperatureK: 298.15, activity: null }), calc('A', 'al2o3', 45.92, null, { temperatureK: 298.15, activity: null }), calc('A', 'ag', 41.55, null, { temperatureK: 298.15, activity: null })];
  const run = (entropyBasis: 'formula-unit' | 'atom') =>
    computeBenchmark(input({ quantity: 'entropy', materials, measurements, calculations, methods: [{ id: 'A', label: 'A', kGrid: null, qGrid: null }], rules: readRules({ bootstrapSamples: 0, entropyBasis }), entropyWindow: { temperatureK: 298.15, toleranceK: 1 } }));

  it('per atom divides by the atoms of the reduced formula (Al4O6 → Al2O3: 5), so Al2O3 no longer weighs five times Al', () => {
    const fu = run('formula-unit');
    const atom = run('atom');
    expect(fu.methods[0].statistics!.meanAbsoluteError).toBeCloseTo((1 + 5 + 1) / 3, 12);
    expect(atom.methods[0].statistics!.meanAbsoluteError).toBeCloseTo((1 + 1 + 1) / 3, 12);
    expect(atom.entropyBasis).toBe('atom');
  });

  it('the caution names the terms a harmonic value leaves out', () => {
    const caution = run('formula-unit').caution!;
    for (const term of ['Cp − Cv', 'electronic', 'magnetic', 'configurational']) expect(caution).toContain(term);
  });
});

describe('a group whose measured values are all equal', () => {
  it('still gets its statistics, with Pearson r absent and the reason, instead of failing the recomputation', () => {
    // Three invented materials whose one line was measured at the same 520 cm⁻¹; errors −10, −5, +5.
    const materials = ['a', 'b', 'c'].map((id) => ({ id, name: `Crystal ${id}`, formula: 'Si', atomsInCell: 2, tags: [] as string[] }));
    const measurements = materials.map((m) => meas(m.id, 520, 'T2g'));
    const calculations = materials.map((m, i) => calc('A', m.id, [510, 515, 525][i], 'T2g'));
    const snap = computeBenchmark(input({ materials, measurements, calculations, methods: [{ id: 'A', label: 'Method A', kGrid: null, qGrid: null }] }));
    const s = snap.methods[0].statistics!;
    expect(s.meanAbsoluteError).toBeCloseTo(20 / 3, 12);
    expect(s.pearsonR).toBeUndefined();
    expect(s.correlationUndefined).toMatch(/measured values are all equal/);
  });
});

describe('a group whose calculated values are all 0', () => {
  it('gets its statistics without a scale factor, and the reason, instead of poisoning the recomputation', () => {
    // Entropies (frequency pairing drops computed values ≤ 0, entropy pairing keeps them). Measured S°(298.15 K):
    // Al 28.30, Ag 42.55, Cu 33.15 J mol⁻¹ K⁻¹ (CODATA Key Values, Cox, Wagman & Medvedev 1989; Cu from memory);
    // the computed 0s are invented.
    const materials = [
      { id: 'al', name: 'Al', formula: 'Al', atomsInCell: 1, tags: [] },
      { id: 'ag', name: 'Ag', formula: 'Ag', atomsInCell: 1, tags: [] },
      { id: 'cu', name: 'Cu', formula: 'Cu', atomsInCell: 1, tags: [] },
    ];
    const measured = { al: 28.3, ag: 42.55, cu: 33.15 };
    const measurements = materials.map((m) => meas(m.id, measured[m.id as keyof typeof measured], null, { temperatureK: 298.15, technique: 'calorimetry' }));
    const calculations = materials.map((m) => calc('Z', m.id, 0, null, { temperatureK: 298.15, activity: null }));
    const snap = computeBenchmark(
      input({ quantity: 'entropy', materials, measurements, calculations, methods: [{ id: 'Z', label: 'Method Z', kGrid: null, qGrid: null }], rules: readRules({ bootstrapSamples: 0 }), entropyWindow: { temperatureK: 298.15, toleranceK: 1 } }),
    );
    const s = snap.methods[0].statistics!;
    expect(snap.methods[0].n).toBe(3);
    expect(s.meanAbsoluteError).toBeCloseTo((28.3 + 42.55 + 33.15) / 3, 12);
    expect(s.meanSignedError).toBeCloseTo(-(28.3 + 42.55 + 33.15) / 3, 12);
    expect(s.scaleFactor).toBeUndefined();
    expect(s.rmseAfterScaling).toBeUndefined();
    expect(s.scaleFactorUndefined).toMatch(/every calculated value is 0/);
  });
});

describe('heat capacity', () => {
  // Cp°(298.15 K): Al 24.20, Ag 25.35, MgO 37.24 J mol⁻¹ K⁻¹ (NIST-JANAF, Chase 1998; from memory); computed Cv invented.
  const materials = [
    { id: 'al', name: 'Al', formula: 'Al', atomsInCell: 1, tags: [] },
    { id: 'ag', name: 'Ag', formula: 'Ag', atomsInCell: 1, tags: [] },
    { id: 'mgo', name: 'MgO', formula: 'Mg2O2', atomsInCell: 2, tags: [] },
  ];
  const cp = { al: 24.2, ag: 25.35, mgo: 37.24 };
  const measurements = materials.map((m) => meas(m.id, cp[m.id as keyof typeof cp], null, { temperatureK: 298.15, technique: 'calorimetry' }));
  // Cv 1, 0.5 and 2 J mol⁻¹ K⁻¹ below Cp; a Cv at 400 K (outside the window) must not pair
  const calculations = [
    calc('A', 'al', 23.2, null, { temperatureK: 298.15, activity: null }),
    calc('A', 'ag', 24.85, null, { temperatureK: 298.15, activity: null }),
    calc('A', 'mgo', 35.24, null, { temperatureK: 298.15, activity: null }),
    calc('A', 'mgo', 41.0, null, { temperatureK: 400, activity: null }),
  ];
  const run = (entropyBasis: 'formula-unit' | 'atom') =>
    computeBenchmark(
      input({ quantity: 'heat-capacity', materials, measurements, calculations, methods: [{ id: 'A', label: 'A', kGrid: null, qGrid: null }], rules: readRules({ bootstrapSamples: 0, entropyBasis }), entropyWindow: { temperatureK: 298.15, toleranceK: 1 } }),
    );

  it('pairs one Cp with the Cv of the same material at the benchmark temperature, in J mol⁻¹ K⁻¹, with the Cp/Cv caution', () => {
    const snap = run('formula-unit');
    const s = snap.methods[0].statistics!;
    expect(snap.unit).toBe('J mol⁻¹ K⁻¹');
    expect(snap.methods[0].n).toBe(3);
    expect(s.meanSignedError).toBeCloseTo(-(1 + 0.5 + 2) / 3, 12);
    expect(s.maxAbsoluteError).toBeCloseTo(2, 12);
    expect(snap.caution).toMatch(/Calorimetry measures Cp.*harmonic calculation gives Cv/);
    expect(snap.entropyBasis).toBe('formula-unit');
  });

  it('per atom divides by the atoms of the reduced formula (Mg2O2 → MgO: 2), as for entropies', () => {
    const s = run('atom').methods[0].statistics!;
    expect(s.meanAbsoluteError).toBeCloseTo((1 + 0.5 + 2 / 2) / 3, 12);
  });
});

describe('dielectric constants', () => {
  // Invented ε∞ values (modelled on textbook values of Si, NaCl and MgO, from memory).
  const materials = ['si', 'nacl', 'mgo'].map((id) => ({ id, name: id, formula: 'X', atomsInCell: 2, tags: [] as string[] }));
  const measurements = [meas('si', 11.9, null, { temperatureK: 295, technique: null }), meas('nacl', 2.34, null, { temperatureK: null, technique: null }), meas('mgo', 2.95, null, { temperatureK: 295, technique: null })];
  const calculations = [
    calc('A', 'si', 12.9, null, { activity: null, degeneracy: null }),
    calc('A', 'nacl', 2.44, null, { activity: null, degeneracy: null, temperatureK: 0 }),
    calc('A', 'mgo', 3.15, null, { activity: null, degeneracy: null }),
    calc('A', 'mgo', 9.99, null, { activity: null, degeneracy: null }),
  ];
  const snap = computeBenchmark(input({ quantity: 'eps-inf', materials, measurements, calculations, methods: [{ id: 'A', label: 'A', kGrid: null, qGrid: null }], rules: readRules({ bootstrapSamples: 0 }) }));

  it('pairs one measured and one computed value per material whatever the temperatures, dimensionless', () => {
    expect(snap.unit).toBe('');
    expect(snap.methods[0].n).toBe(3);
    // errors +1.0, +0.1, +0.2 (MgO: the first computed row by id; the second makes the pair ambiguous)
    expect(snap.methods[0].statistics!.meanAbsoluteError).toBeCloseTo((1 + 0.1 + 0.2) / 3, 12);
    const mgo = snap.pairs.find((p) => p.materialId === 'mgo')!;
    expect(mgo.calculated).toBe(3.15);
    expect(mgo.ambiguous).toBe(true);
    expect(mgo.basis).toBe('material');
    expect(snap.entropyBasis).toBeUndefined();
    expect(snap.caution).toMatch(/orientational average/);
  });
});

describe('the outlier scale follows the quantity', () => {
  it('is relative for frequencies and dielectric constants, absolute for entropies and heat capacities', () => {
    expect(outlierScaleOf({}, 'frequency')).toBe('relative');
    expect(outlierScaleOf({}, 'eps-inf')).toBe('relative');
    expect(outlierScaleOf({}, 'eps-static')).toBe('relative');
    expect(outlierScaleOf({}, 'entropy')).toBe('absolute');
    expect(outlierScaleOf({}, 'heat-capacity')).toBe('absolute');
    expect(outlierScaleOf({ scale: 'absolute' }, 'eps-inf')).toBe('absolute');
  });
});

describe('a measured series at every temperature', () => {
  it('pairs each measured value with the computed one nearest in temperature within the tolerance', () => {
    // Invented Cp(T) of one crystal at 100, 200, 298.15 and 500 K; computed Cv at 100, 199, 201 and 300 K.
    const materials = [{ id: 'x', name: 'X', formula: 'MgO', atomsInCell: 2, tags: [] as string[] }];
    const measurements = [100, 200, 298.15, 500].map((t, i) => meas('x', [10, 25, 37, 45][i], null, { temperatureK: t, technique: 'calorimetry' }));
    const calculations = [
      calc('A', 'x', 9, null, { temperatureK: 100, activity: null }),
      calc('A', 'x', 24, null, { temperatureK: 199, activity: null }),
      calc('A', 'x', 99, null, { temperatureK: 201.5, activity: null }),
      calc('A', 'x', 36.5, null, { temperatureK: 300, activity: null }),
    ];
    const snap = computeBenchmark(
      input({ quantity: 'heat-capacity', materials, measurements, calculations, methods: [{ id: 'A', label: 'A', kGrid: null, qGrid: null }], rules: readRules({ bootstrapSamples: 0 }), entropyWindow: { temperatureK: null, toleranceK: 2 } }),
    );
    const byT = new Map(snap.pairs.map((p) => [p.temperatureK, p.calculated]));
    expect(byT).toEqual(
      new Map([
        [100, 9],
        [200, 24],
        [298.15, 36.5],
      ]),
    );
    // the 500 K point has no computed value within 2 K
    expect(snap.methods[0].unpairedMeasurements).toBe(1);
    expect(snap.counts.measuredInScope).toBe(4);
  });
});
