import { describe, expect, it } from 'vitest';
import {
  ScienceInputError,
  compareMethods,
  convertEntropy,
  convertFrequency,
  crystalSystem,
  debyeHeatCapacity,
  errorStatistics,
  flagOutliers,
  harmonicFromDos,
  harmonicMode,
  mean,
  modifiedZScores,
  normalizeIrrep,
  pairModes,
  qualityChecks,
  quantile,
  scaleFactor,
  tukeyFences,
  type EntropyUnit,
  type FrequencyUnit,
  type OutlierRule,
} from '@/lib/science';

function expectInputError(run: () => unknown, argument: string, reason: RegExp): void {
  try {
    run();
  } catch (error) {
    expect(error).toBeInstanceOf(ScienceInputError);
    expect((error as ScienceInputError).argument).toBe(argument);
    expect((error as ScienceInputError).message).toMatch(reason);
    return;
  }
  throw new Error(`expected a ScienceInputError for ${argument}`);
}

describe('ScienceInputError: invalid input never becomes a silent NaN', () => {
  it('units', () => {
    expectInputError(() => convertFrequency(Number.NaN, 'cm-1', 'THz'), 'value', /finite/);
    expectInputError(() => convertFrequency(1, 'Hz' as FrequencyUnit, 'THz'), 'from', /unknown frequency unit "Hz"/);
    expectInputError(() => convertFrequency(1, 'cm-1', 'eV' as FrequencyUnit), 'to', /unknown/);
    expectInputError(() => convertEntropy(1, 'J/mol/K', 'kB/atom', 0), 'atomsPerFormulaUnit', /greater than 0/);
    expectInputError(() => convertEntropy(1, 'J/K' as EntropyUnit, 'kB/atom', 2), 'from', /unknown entropy unit/);
    expectInputError(() => convertEntropy(Infinity, 'J/mol/K', 'kB/atom', 2), 'value', /finite/);
  });

  it('symmetry', () => {
    expectInputError(() => crystalSystem(0), 'spaceGroupNumber', /1 to 230/);
    expectInputError(() => crystalSystem(231), 'spaceGroupNumber', /1 to 230/);
    expectInputError(() => crystalSystem(12.5), 'spaceGroupNumber', /integer/);
    expectInputError(() => normalizeIrrep('  '), 'label', /non-empty/);
    expectInputError(() => normalizeIrrep('_{ }^'), 'label', /no symbol/);
    expectInputError(() => pairModes([{ id: 'p', frequencyCm1: 5, technique: 'raman', irrep: '^' }], []), 'measured[0].irrep', /no symbol/);
  });

  it('statistics', () => {
    expectInputError(() => mean([]), 'values', /at least 1/);
    expectInputError(() => mean([1, Number.NaN]), 'values[1]', /finite/);
    expectInputError(() => quantile([1, 2], 1.5), 'p', /between 0 and 1/);
    expectInputError(() => errorStatistics([{ measured: 1, calculated: 1 }]), 'pairs', /at least 2/);
    expectInputError(
      () => errorStatistics([{ measured: 0, calculated: 1 }, { measured: 2, calculated: 1 }]),
      'pairs[0].measured',
      /must not be 0/,
    );
    expectInputError(
      () => errorStatistics([{ measured: 1, calculated: Infinity }, { measured: 2, calculated: 1 }]),
      'pairs[0].calculated',
      /finite/,
    );
    expectInputError(
      () => errorStatistics([{ measured: 1, calculated: 1, measuredUncertainty: -1 }, { measured: 2, calculated: 1 }]),
      'pairs[0].measuredUncertainty',
      /negative/,
    );
    const ok = [{ measured: 1, calculated: 1.1 }, { measured: 2, calculated: 1.9 }];
    expectInputError(() => errorStatistics(ok, { confidence: 1 }), 'options.confidence', /between 0 and 1/);
    expectInputError(() => errorStatistics(ok, { bootstrapSamples: -5 }), 'options.bootstrapSamples', /non-negative integer/);
    expectInputError(() => errorStatistics(ok, { seed: 0.5 }), 'options.seed', /integer/);
    // a constant measured column: r is absent with the reason, never NaN, and the rest is computed
    const constant = errorStatistics([{ measured: 1, calculated: 2 }, { measured: 1, calculated: 3 }], { bootstrapSamples: 0 });
    expect(constant.pearsonR).toBeUndefined();
    expect(constant.correlationUndefined).toMatch(/constant|all equal/);
    for (const [key, value] of Object.entries(constant)) if (typeof value === 'number') expect(Number.isNaN(value), key).toBe(false);
    // every calculated value 0 (calculations may be ≤ 0): no λ, the reason in words, the rest computed.
    // Worked case: errors −100, −200, −300 → MAE 200, RMSE √(140000/3) = 216.0247, SD 100.
    const zeros = errorStatistics(
      [
        { measured: 100, calculated: 0 },
        { measured: 200, calculated: 0 },
        { measured: 300, calculated: 0 },
      ],
      { bootstrapSamples: 0, clusters: ['a', 'b', 'c'] },
    );
    expect(zeros.scaleFactor).toBeUndefined();
    expect(zeros.rmseAfterScaling).toBeUndefined();
    expect(zeros.rmseAfterScalingOutOfSample).toBeUndefined();
    expect(zeros.scaleFactorStandardError).toBeUndefined();
    expect(zeros.scaleFactorUndefined).toMatch(/every calculated value is 0/);
    expect(zeros.meanAbsoluteError).toBe(200);
    expect(zeros.rootMeanSquareError).toBeCloseTo(216.0247, 4);
    expect(zeros.standardDeviation).toBeCloseTo(100, 12);
    expect(zeros.meanAbsoluteRelativeError).toBe(1);
    expectInputError(() => scaleFactor([1, 2], [1]), 'measured', /same length/);
    expectInputError(() => scaleFactor([0, 0], [1, 2]), 'calculated', /all values are 0/);
  });

  it('outliers and comparison', () => {
    expectInputError(() => modifiedZScores([]), 'values', /at least 1/);
    expectInputError(() => tukeyFences([1, 2, 3], -1), 'k', /greater than 0/);
    expectInputError(() => flagOutliers([], { kind: 'tukey', threshold: 0 }), 'rule.threshold', /greater than 0/);
    expectInputError(
      () => flagOutliers([{ measured: 1, calculated: 1 }], { kind: 'zscore', threshold: 3 } as unknown as OutlierRule),
      'rule.kind',
      /unknown outlier rule/,
    );
    expectInputError(() => compareMethods([]), 'paired', /at least 1/);
    expectInputError(() => compareMethods([{ a: -1, b: 2 }]), 'paired[0].a', /negative/);
  });

  it('thermodynamics', () => {
    expectInputError(() => harmonicMode(100, -1), 'temperatureK', /greater than 0/);
    expectInputError(() => harmonicMode(100, 0), 'temperatureK', /greater than 0/);
    expectInputError(() => harmonicMode(-5, 300), 'frequencyCm1', /greater than 0/);
    expectInputError(() => debyeHeatCapacity(-1, 300), 'temperatureK', /negative/);
    expectInputError(() => debyeHeatCapacity(10, 0), 'debyeTemperatureK', /greater than 0/);
    const dos = { frequencyCm1: [0, 100, 200], density: [0, 1, 2] };
    expectInputError(() => harmonicFromDos(dos, -3, 3), 'temperatureK', /negative/);
    expectInputError(() => harmonicFromDos(dos, 300, 0), 'modesPerCell', /greater than 0/);
    expectInputError(() => harmonicFromDos({ frequencyCm1: [0, 100], density: [1] }, 300, 3), 'dos.density', /must have 2 values/);
    expectInputError(() => harmonicFromDos({ frequencyCm1: [0, 100, 50], density: [0, 1, 1] }, 300, 3), 'dos.frequencyCm1[2]', /increase/);
    expectInputError(() => harmonicFromDos({ frequencyCm1: [-10, 100], density: [1, 1] }, 300, 3), 'dos.density[0]', /imaginary/);
    expectInputError(() => harmonicFromDos({ frequencyCm1: [0, 100], density: [0, 0] }, 300, 3), 'dos.density', /integrates to 0/);
  });

  it('pairing and quality checks', () => {
    expectInputError(() => pairModes([{ id: 'p', frequencyCm1: 0, technique: 'raman' }], []), 'measured[0].frequencyCm1', /greater than 0/);
    expectInputError(
      () => pairModes([{ id: 'p', frequencyCm1: 10, technique: 'raman' }, { id: 'p', frequencyCm1: 20, technique: 'raman' }], []),
      'measured[1].id',
      /duplicate/,
    );
    expectInputError(() => pairModes([], [{ id: 'm', frequencyCm1: Number.NaN }]), 'computed[0].frequencyCm1', /finite/);
    expectInputError(() => pairModes([], [{ id: 'm', frequencyCm1: 1, degeneracy: 0 }]), 'computed[0].degeneracy', /positive integer/);
    expectInputError(() => pairModes([], [], { maxRelativeDeviation: 0 }), 'options.maxRelativeDeviation', /greater than 0/);
    expectInputError(() => qualityChecks({ modes: [], kGrid: [4, 4, 0] as [number, number, number] }), 'kGrid', /three positive integers/);
    expectInputError(() => qualityChecks({ modes: [], atomsInCell: 0 }), 'atomsInCell', /positive integer/);
    expectInputError(() => qualityChecks({ modes: [], thresholds: { acousticCm1: -1 } }), 'thresholds.acousticCm1', /greater than 0/);
    expectInputError(() => qualityChecks({ modes: [], atomsInCell: 2, bornCharges: [[[1, 0, 0], [0, 1, 0], [0, 0, 1]]] }), 'bornCharges', /atomsInCell/);
    expectInputError(() => qualityChecks({ modes: [], dielectric: { epsInf: 0, eps0: 2 } }), 'dielectric.epsInf', /greater than 0/);
  });
});
