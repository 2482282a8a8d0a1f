import { describe, expect, it } from 'vitest';
import { convertFrequency, debyeHeatCapacity, harmonicFromDos, qualityChecks } from '@/lib/science';

describe('harmonic thermodynamics edge cases', () => {
  it('at 0 K only the zero-point energy remains', () => {
    const dos = { frequencyCm1: [0, 100, 200], density: [0, 1, 0] };
    const result = harmonicFromDos(dos, 0, 3);
    expect(result.entropyJPerMolK).toBe(0);
    expect(result.heatCapacityJPerMolK).toBe(0);
    expect(result.freeEnergyKJPerMol).toBe(result.internalEnergyKJPerMol);
    expect(result.internalEnergyKJPerMol).toBeGreaterThan(0);
    expect(debyeHeatCapacity(0, 300)).toBe(0);
  });

  it('stays finite at very low and very high temperature', () => {
    const dos = { frequencyCm1: [0, 50, 100, 1000], density: [0, 1, 1, 1] };
    for (const T of [1e-3, 1, 1e5]) {
      const result = harmonicFromDos(dos, T, 3);
      for (const value of Object.values(result)) expect(Number.isFinite(value)).toBe(true);
    }
  });
});

describe('quality checks skip what they cannot evaluate', () => {
  it('no LO lines → no Lyddane–Sachs–Teller verdict; no atoms → no mode count or k-point density', () => {
    const modes = [
      { id: 'a', frequencyCm1: 0 },
      { id: 'b', frequencyCm1: 0 },
      { id: 'c', frequencyCm1: 0 },
      { id: 'to', frequencyCm1: 300, branch: 'TO' as const },
    ];
    expect(qualityChecks({ modes, dielectric: { epsInf: 10, eps0: 50 }, kGrid: [2, 2, 2] })).toEqual([]);
  });

  it('uses custom thresholds', () => {
    const modes = [
      { id: 'a', frequencyCm1: 3 },
      { id: 'b', frequencyCm1: 0 },
      { id: 'c', frequencyCm1: 0 },
      { id: 'o', frequencyCm1: 300, degeneracy: 3 },
    ];
    expect(qualityChecks({ modes, atomsInCell: 2 })).toEqual([]);
    // A complete list (3N = 6): the three lowest |ω| are acoustic, and 3 cm⁻¹ exceeds the limit of 2.
    expect(qualityChecks({ modes, atomsInCell: 2, thresholds: { acousticCm1: 2 } }).map((f) => f.code)).toEqual(['acoustic-sum-rule']);
    // A partial list: only modes below the limit count as acoustic, so the 3 cm⁻¹ line is optical, not a broken sum rule.
    expect(qualityChecks({ modes: modes.slice(0, 3), thresholds: { acousticCm1: 2 } })).toEqual([]);
  });
});

describe('unit identity', () => {
  it('returns the value unchanged when from = to', () => {
    expect(convertFrequency(123.456, 'meV', 'meV')).toBe(123.456);
  });
});
