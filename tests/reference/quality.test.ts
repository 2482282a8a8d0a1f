import { describe, expect, it } from 'vitest';
import { qualityChecks, type ComputedMode } from '@/lib/science';

// A clean zinc-blende GaAs-like calculation (2 atoms, 6 modes). TO 273.3 and LO 297.3 cm⁻¹ are
// Hass & Henvis, J. Phys. Chem. Solids (1962), IR reflection at liquid-helium temperature.
const to = 273.3;
const lo = 297.3;
const clean: ComputedMode[] = [
  { id: 'ac1', frequencyCm1: 0.4, acoustic: true },
  { id: 'ac2', frequencyCm1: 0.4, acoustic: true },
  { id: 'ac3', frequencyCm1: 0.7, acoustic: true },
  { id: 'to1', frequencyCm1: to, branch: 'TO', irrep: 'T2', acoustic: false },
  { id: 'to2', frequencyCm1: to, branch: 'TO', irrep: 'T2', acoustic: false },
  { id: 'lo', frequencyCm1: lo, branch: 'LO', irrep: 'T2', acoustic: false },
];
// ε₀/ε∞ reproduced from the Lyddane–Sachs–Teller relation (Lyddane, Sachs & Teller, Phys. Rev. 59, 673, 1941)
const epsInf = 10.9; // illustrative ε∞ (GaAs-like; the value itself is from memory and not under test)
const eps0 = epsInf * (lo / to) ** 2;

describe('quality checks on hand-made cases', () => {
  it('a clean calculation raises no flag', () => {
    // common practice: ~1500 k-points per reciprocal atom; q-grid dividing the k-grid; Σ Z* = 0
    const flags = qualityChecks({
      modes: clean,
      atomsInCell: 2,
      kGrid: [28, 28, 28],
      qGrid: [4, 4, 4],
      bornCharges: [
        [[2.1, 0, 0], [0, 2.1, 0], [0, 0, 2.1]],
        [[-2.1, 0, 0], [0, -2.1, 0], [0, 0, -2.1]],
      ],
      dielectric: { epsInf, eps0 },
    });
    expect(flags).toEqual([]);
  });

  it('flags a broken acoustic sum rule (common practice: acoustic ≈ 0 at Γ)', () => {
    const modes = clean.map((m) => (m.id === 'ac3' ? { ...m, frequencyCm1: 25 } : m));
    const flags = qualityChecks({ modes });
    expect(flags.map((f) => f.code)).toEqual(['acoustic-sum-rule']);
    expect(flags[0].value).toBe(25);
  });

  it('flags an imaginary optical mode as an error (common practice: dynamical instability)', () => {
    const modes: ComputedMode[] = [
      { id: 'a', frequencyCm1: 0 },
      { id: 'b', frequencyCm1: 0.1 },
      { id: 'c', frequencyCm1: -0.2 },
      { id: 'soft', frequencyCm1: -85 },
      { id: 'ok', frequencyCm1: 120 },
      { id: 'ok2', frequencyCm1: 300 },
    ];
    const flags = qualityChecks({ modes });
    expect(flags).toHaveLength(1);
    expect(flags[0]).toMatchObject({ code: 'imaginary-mode', severity: 'error', value: -85 });
    // −8 cm⁻¹ is within the default 10 cm⁻¹ tolerance
    expect(qualityChecks({ modes: modes.map((m) => (m.id === 'soft' ? { ...m, frequencyCm1: -8 } : m)) })).toEqual([]);
  });

  it('flags a mode count other than 3N', () => {
    // 3N modes at Γ for N atoms in the primitive cell (common practice)
    const flags = qualityChecks({ modes: clean.slice(0, 5), atomsInCell: 2 });
    expect(flags).toEqual([expect.objectContaining({ code: 'mode-count', severity: 'error', value: 5 })]);
    expect(qualityChecks({ modes: clean, atomsInCell: 2 })).toEqual([]);
  });

  it('flags a thin k-point grid and a q-grid that does not divide it', () => {
    // 8×8×8 × 2 atoms = 1024 < 1500 per reciprocal atom (common practice); 3 does not divide 8
    const flags = qualityChecks({ modes: clean, atomsInCell: 2, kGrid: [8, 8, 8], qGrid: [3, 4, 4] });
    expect(flags.map((f) => f.code)).toEqual(['k-point-density', 'grid-commensurability']);
    expect(flags[0].value).toBe(1024);
    // 10×10×10 × 2 = 2000 passes
    expect(qualityChecks({ modes: clean, atomsInCell: 2, kGrid: [10, 10, 10], qGrid: [5, 5, 2] })).toEqual([]);
  });

  it('flags Born charges that violate charge neutrality (common practice: Σ Z* = 0)', () => {
    const flags = qualityChecks({
      modes: clean,
      bornCharges: [
        [[2.1, 0, 0], [0, 2.1, 0], [0, 0, 2.3]],
        [[-2.1, 0, 0], [0, -2.1, 0], [0, 0, -2.1]],
      ],
    });
    expect(flags).toHaveLength(1);
    expect(flags[0].code).toBe('born-charge-neutrality');
    expect(flags[0].value).toBeCloseTo(0.2, 12);
  });

  it('flags LO/TO and dielectric constants inconsistent with Lyddane–Sachs–Teller', () => {
    // Lyddane, Sachs & Teller, Phys. Rev. 59, 673 (1941): ε₀/ε∞ = (ω_LO/ω_TO)²; ε₀ off by 10 %
    const flags = qualityChecks({ modes: clean, dielectric: { epsInf, eps0: eps0 * 1.1 } });
    expect(flags.map((f) => f.code)).toEqual(['lyddane-sachs-teller']);
    expect(flags[0].value).toBeCloseTo(1 / 1.1 - 1, 12);
    // 3 % off stays within the default 5 %
    expect(qualityChecks({ modes: clean, dielectric: { epsInf, eps0: eps0 * 1.03 } })).toEqual([]);
  });
});
