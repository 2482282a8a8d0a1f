import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { snapshotOfRow, storedSnapshot } from '@/db/snapshot-bytes';
import { pairKey } from '@/lib/benchmark/pair-rows';
import { packSnapshot, unpackSnapshot } from '@/lib/benchmark/snapshot-pack';
import type { BenchmarkSnapshot, PairRecord } from '@/lib/benchmark/types';

const uuid = fc.uuid({ version: 4 });
const shortId = fc.constantFrom('m1', 'm2', 'k1', 'k2', 'c1', 'c2', 'c3', 's1', 'd1');
const decimal = fc.integer({ min: -5000, max: 50000 }).map((x) => x / 10);
const measuredValue = fc.integer({ min: 1, max: 50000 }).map((x) => x / 10);
const nullableNumber = fc.option(decimal, { nil: null });
const text = fc.option(fc.constantFrom('A1g', 'E¹₂g', 'T2g', 'excluded: saturated peak', 'relative error 12 % above 10 %', 'ü', ''), { nil: null });

function pairOf(id: fc.Arbitrary<string>) {
  return fc
    .record({
      methodId: id,
      materialId: id,
      measurementIds: fc.array(id, { minLength: 1, maxLength: 3 }),
      calculationIds: fc.array(id, { maxLength: 3 }),
      measured: measuredValue,
      calculated: decimal,
      measuredUncertainty: nullableNumber,
      calculatedUncertainty: nullableNumber,
      label: text,
      species: text,
      branch: fc.constantFrom<'TO' | 'LO' | null>('TO', 'LO', null),
      technique: fc.constantFrom('raman', 'ir', 'ins', null),
      temperatureK: fc.option(fc.constantFrom(4, 77, 295, 298.15), { nil: null }),
      basis: fc.constantFrom<PairRecord['basis']>('label', 'frequency', 'pinned', 'temperature'),
      ambiguous: fc.boolean(),
      sourceIds: fc.array(id, { maxLength: 2 }),
      excluded: text,
      excludedBy: fc.option(id, { nil: null }),
      outlier: text,
      // how far the stored key and errors depart from what the pairing derives (an exception of the packed form)
      oddKey: fc.boolean(),
      oddError: fc.constantFrom(0, 0, 0, 1, 2),
    })
    .map(({ oddKey, oddError, ...p }): PairRecord => {
      const error = oddError === 1 ? 0.1 + 0.2 : p.calculated - p.measured;
      const relativeError = oddError === 2 ? 1 / 3 : error / p.measured;
      return {
        key: oddKey ? `old-key-${p.measurementIds[0]}` : pairKey(p.methodId, p.measurementIds),
        methodId: p.methodId,
        materialId: p.materialId,
        measurementIds: p.measurementIds,
        calculationIds: p.calculationIds,
        measured: p.measured,
        calculated: p.calculated,
        error,
        relativeError,
        measuredUncertainty: p.measuredUncertainty,
        calculatedUncertainty: p.calculatedUncertainty,
        label: p.label,
        species: p.species,
        branch: p.branch,
        technique: p.technique,
        temperatureK: p.temperatureK,
        basis: p.basis,
        ambiguous: p.ambiguous,
        sourceIds: p.sourceIds,
        excluded: p.excluded,
        excludedBy: p.excludedBy,
        outlier: p.outlier,
      };
    });
}

function snapshotOf(pairs: PairRecord[], extra: Partial<BenchmarkSnapshot> = {}): BenchmarkSnapshot {
  return {
    version: 2,
    quantity: 'frequency',
    unit: 'cm-1',
    rules: { outlierRule: { kind: 'none' } } as unknown as BenchmarkSnapshot['rules'],
    methods: [{ methodId: 'k1', label: 'PBE', n: pairs.length, excluded: 0, excludedReasons: [], outliers: 0, qualityFlags: 0, unpairedMeasurements: 0, statistics: null, rank: null }],
    classes: [],
    bands: [],
    materialRows: [{ methodId: 'k1', materialId: 'm1', name: 'Silicon', formula: 'Si', n: 2, meanAbsoluteError: 1.5, meanSignedError: -0.5, maxAbsoluteError: 2, outliers: 0, ambiguous: 0, excluded: 0, qualityFlags: 0 }],
    comparisons: [],
    pairs,
    quality: [{ methodId: 'k1', materialId: 'm1', code: 'imaginary', severity: 'warning', message: 'lowest mode −12 cm⁻¹', value: -12 }],
    decisions: [],
    pins: [],
    counts: { measurements: 3, calculations: 4, materials: 1, methods: 1 },
    empty: null,
    ...extra,
  };
}

/** What a revision stored as JSON text reads back as. */
const viaJson = (s: BenchmarkSnapshot) => JSON.stringify(s);

function roundTrip(s: BenchmarkSnapshot): string {
  const { head, body } = packSnapshot(s);
  // the head goes through the database as JSON text, the body as bytes
  return JSON.stringify(unpackSnapshot(JSON.parse(JSON.stringify(head)), body.slice()));
}

describe('packed snapshot', () => {
  it('decodes to the same JSON, byte for byte, for random pairs with UUIDs and with other ids', () => {
    fc.assert(
      fc.property(fc.oneof(fc.array(pairOf(uuid), { maxLength: 40 }), fc.array(pairOf(shortId), { maxLength: 40 })), (pairs) => {
        const s = snapshotOf(pairs);
        expect(roundTrip(s)).toBe(viaJson(s));
      }),
      { numRuns: 200 },
    );
  });

  it('keeps pairs of an older shape (no species, no branch) and pairs of mixed shapes as they are', () => {
    fc.assert(
      fc.property(fc.array(pairOf(uuid), { minLength: 1, maxLength: 10 }), fc.boolean(), (pairs, mixed) => {
        const older = pairs.map((p, i) => {
          if (mixed && i % 2 === 0) return p;
          const { species: _s, branch: _b, ...rest } = p;
          return rest as PairRecord;
        });
        const s = snapshotOf(older);
        expect(roundTrip(s)).toBe(viaJson(s));
      }),
    );
  });

  it('keeps a non-finite number the way JSON stores it (null), by storing such pairs as they are', () => {
    const pairs = fc.sample(pairOf(uuid), { numRuns: 3, seed: 7 });
    pairs[1] = { ...pairs[1], measured: 0, error: pairs[1].calculated, relativeError: Infinity };
    const s = snapshotOf(pairs);
    expect(roundTrip(s)).toBe(viaJson(s));
  });

  it('keeps the snapshot key order, optional fields left out or undefined, and an empty pair list', () => {
    const s = snapshotOf([], { entropyBasis: undefined, caution: 'harmonic: no anharmonic or electronic part', outlierScale: 'relative' });
    expect(roundTrip(s)).toBe(viaJson(s));
    const reordered = { pins: [], pairs: [], methods: [], decisions: [], version: 2, empty: 'no pairs' } as unknown as BenchmarkSnapshot;
    expect(roundTrip(reordered)).toBe(viaJson(reordered));
  });

  it('puts methods, decisions and pins in the head and nothing else', () => {
    const s = snapshotOf(fc.sample(pairOf(uuid), { numRuns: 5, seed: 3 }), {
      decisions: [{ id: 'd1', kind: 'exclude-pair', measurementId: 'x', methodId: 'k1', reason: 'saturated', createdBy: null, createdAt: 1 }],
    });
    const { head } = packSnapshot(s);
    expect(Object.keys(head).sort()).toEqual(['decisions', 'methods', 'pins']);
    expect(head.decisions).toEqual(s.decisions);
  });

  it('refuses a body of another format or a truncated one', () => {
    const { head, body } = packSnapshot(snapshotOf(fc.sample(pairOf(uuid), { numRuns: 4, seed: 1 })));
    expect(() => unpackSnapshot(head, body.subarray(0, 3))).toThrow(/truncated/);
    expect(() => unpackSnapshot(head, body.subarray(0, body.length - 1))).toThrow(/id table/);
  });

  it('stores 30,000 pairs of one scope, deflated as the database keeps them, in under a tenth of their JSON text', () => {
    // A scope shaped like the benchmark scenario: 6,000 measurements × 5 methods, one calculation each.
    const methods = fc.sample(uuid, { numRuns: 5, seed: 11 });
    const materials = fc.sample(uuid, { numRuns: 1500, seed: 12 });
    const measurements = fc.sample(uuid, { numRuns: 6000, seed: 13 });
    const pairs: PairRecord[] = [];
    let c = 0;
    for (const methodId of methods) {
      measurements.forEach((mId, i) => {
        const measured = 100 + (i % 900) + 0.5;
        const calculated = measured * 1.03 + (c % 7);
        c++;
        pairs.push({
          key: pairKey(methodId, [mId]), methodId, materialId: materials[Math.floor(i / 4)], measurementIds: [mId],
          calculationIds: [`00000000-0000-4000-8000-${String(c).padStart(12, '0')}`], measured, calculated,
          error: calculated - measured, relativeError: (calculated - measured) / measured, measuredUncertainty: 1, calculatedUncertainty: null,
          label: 'A1g', species: 'A1g', branch: null, technique: 'raman', temperatureK: 295, basis: 'label', ambiguous: false,
          sourceIds: [materials[0]], excluded: null, excludedBy: null, outlier: null,
        });
      });
    }
    const s = snapshotOf(pairs);
    const stored = storedSnapshot(s);
    const json = Buffer.byteLength(viaJson(s));
    expect(JSON.stringify(snapshotOfRow(JSON.parse(JSON.stringify(stored.statistics)), stored.snapshot))).toBe(viaJson(s));
    expect(stored.snapshot.length).toBeLessThan(json / 10);
  });
});
