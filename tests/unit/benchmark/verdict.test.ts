import { describe, expect, it } from 'vitest';
import { methodVerdict } from '@/lib/benchmark/verdict';
import type { BenchmarkSnapshot, MethodResult } from '@/lib/benchmark/types';

// Hand-made snapshots (invented numbers): only the fields the verdict reads.
function method(over: Partial<MethodResult>): MethodResult {
  return {
    methodId: 'm1',
    label: 'Recipe',
    n: 30,
    excluded: 1,
    excludedReasons: [],
    outliers: 2,
    qualityFlags: 0,
    unpairedMeasurements: 0,
    statistics: { meanAbsoluteError: 7 } as MethodResult['statistics'],
    rank: 1,
    paired: 31,
    coverage: 0.62,
    unranked: null,
    common: { n: 25, meanAbsoluteError: 6.5, rootMeanSquareError: 8, meanSignedError: -1 },
    ...over,
  };
}

function snapshot(methods: MethodResult[], ranking: Partial<NonNullable<BenchmarkSnapshot['ranking']>> = {}): BenchmarkSnapshot {
  return {
    unit: 'cm⁻¹',
    methods,
    ranking: { commonN: 25, minN: 10, minCoverage: 0.5, rankedMethods: 2, note: null, ...ranking },
    counts: { measurements: 50, calculations: 90, materials: 10, methods: 2, measuredInScope: 50 },
    empty: null,
  } as unknown as BenchmarkSnapshot;
}

describe('methodVerdict', () => {
  it('uses the common-ground MAE, not the method’s own', () => {
    const v = methodVerdict({ snapshot: snapshot([method({})]), methodId: 'm1', maxMae: 6.6, minCoverage: 0.6 });
    expect(v.verdict).toBe('pass');
    expect(v.numbers).toMatchObject({ meanAbsoluteError: 6.5, n: 25, coverage: 0.62 });
    expect(v.own?.meanAbsoluteError).toBe(7);
    expect(v.ground.description).toBe("The 25 measured values that every one of the 2 ranked methods pairs; pairs excluded by a curator's decision are left out.");
    expect(methodVerdict({ snapshot: snapshot([method({})]), methodId: 'm1', maxMae: 6.4, minCoverage: 0 }).verdict).toBe('fail');
  });

  it('fails an unranked method with the ranking rule’s reason, whatever its own MAE', () => {
    const v = methodVerdict({
      snapshot: snapshot([method({ rank: null, common: null, unranked: 'coverage 20 % is below the benchmark’s minimum of 50 %', coverage: 0.2 })]),
      methodId: 'm1',
      maxMae: 100,
      minCoverage: 0,
    });
    expect(v.verdict).toBe('fail');
    expect(v.ground.kind).toBe('none');
    expect(v.numbers.meanAbsoluteError).toBeNull();
    expect(v.reasons[0]).toBe('The method is not ranked on common ground (coverage 20 % is below the benchmark’s minimum of 50 %), so it has no common-ground MAE.');
  });

  it('fails a method that is not in the revision, and one with no measured value in scope', () => {
    expect(methodVerdict({ snapshot: snapshot([method({})]), methodId: 'other', maxMae: 10, minCoverage: 0 })).toMatchObject({ verdict: 'fail', own: null, numbers: { n: 0 } });
    const none = methodVerdict({ snapshot: snapshot([method({ coverage: null })]), methodId: 'm1', maxMae: 10, minCoverage: 0 });
    expect(none.reasons).toEqual(['Coverage is undefined: no measured value is in the benchmark’s scope.']);
  });

  it('warns about small N below 20, or below the benchmark’s own minimum when larger', () => {
    expect(methodVerdict({ snapshot: snapshot([method({})]), methodId: 'm1', maxMae: 10, minCoverage: 0 }).warnings).toEqual([]);
    const small = method({ common: { n: 12, meanAbsoluteError: 3, rootMeanSquareError: 4, meanSignedError: 0 } });
    expect(methodVerdict({ snapshot: snapshot([small]), methodId: 'm1', maxMae: 10, minCoverage: 0 }).warnings).toHaveLength(1);
    expect(methodVerdict({ snapshot: snapshot([method({})], { minN: 40 }), methodId: 'm1', maxMae: 10, minCoverage: 0 }).warnings[0]).toMatch(/under 40/);
  });
});
