import { describe, expect, it } from 'vitest';
import {
  AVOGADRO_CONSTANT_PER_MOL,
  BOLTZMANN_CONSTANT_J_PER_K,
  ELEMENTARY_CHARGE_C,
  KELVIN_PER_CM1,
  MEV_PER_CM1,
  MOLAR_GAS_CONSTANT_J_PER_MOL_K,
  PLANCK_CONSTANT_J_S,
  SPEED_OF_LIGHT_M_PER_S,
  THERMOCHEMICAL_CALORIE_J,
  convertEntropy,
  convertFrequency,
  parseFormula,
} from '@/lib/science';

describe('constants', () => {
  it('are the exact CODATA 2018 / 2019 SI values', () => {
    expect(PLANCK_CONSTANT_J_S).toBe(6.62607015e-34); // CODATA 2018, exact
    expect(SPEED_OF_LIGHT_M_PER_S).toBe(299792458); // CODATA 2018, exact
    expect(BOLTZMANN_CONSTANT_J_PER_K).toBe(1.380649e-23); // CODATA 2018, exact
    expect(AVOGADRO_CONSTANT_PER_MOL).toBe(6.02214076e23); // CODATA 2018, exact
    expect(ELEMENTARY_CHARGE_C).toBe(1.602176634e-19); // CODATA 2018, exact
    expect(THERMOCHEMICAL_CALORIE_J).toBe(4.184); // thermochemical calorie, definition
  });

  it('gives R = N_A k_B = 8.314 462 618… J/(mol K)', () => {
    // CODATA 2018: R = 8.314 462 618… (exact product, printed truncated)
    expect(MOLAR_GAS_CONSTANT_J_PER_MOL_K).toBeCloseTo(8.314462618, 9);
  });
});

describe('frequency conversions', () => {
  it('1 cm⁻¹ = 29.979 2458 GHz', () => {
    // NIST IR wavenumber calibration tables, appendix (exact, = c × 100 m⁻¹)
    expect(convertFrequency(1, 'cm-1', 'THz') * 1000).toBeCloseTo(29.9792458, 12);
  });

  it('1 THz = 1e12 / (100 c) cm⁻¹ ≈ 33.356 409 52', () => {
    // derived from c (CODATA 2018); check-values.md lists 33.356 409 52
    const expected = 1e12 / (100 * 299792458);
    expect(convertFrequency(1, 'THz', 'cm-1')).toBeCloseTo(expected, 12);
    expect(convertFrequency(1, 'THz', 'cm-1')).toBeCloseTo(33.35640952, 8);
  });

  it('1 cm⁻¹ = h c 100 / e meV ≈ 0.123 984 198 4 meV', () => {
    // derived from h, c, e (CODATA 2018)
    const expected = ((6.62607015e-34 * 299792458 * 100) / 1.602176634e-19) * 1000;
    expect(convertFrequency(1, 'cm-1', 'meV')).toBeCloseTo(expected, 14);
    expect(convertFrequency(1, 'cm-1', 'meV')).toBeCloseTo(0.1239841984, 10);
    expect(MEV_PER_CM1).toBeCloseTo(expected, 15);
  });

  it('1 THz = h 1e12 / e ≈ 4.135 667 697 meV', () => {
    // derived from h and e (CODATA 2018)
    const expected = ((6.62607015e-34 * 1e12) / 1.602176634e-19) * 1000;
    expect(convertFrequency(1, 'THz', 'meV')).toBeCloseTo(expected, 12);
    expect(convertFrequency(1, 'THz', 'meV')).toBeCloseTo(4.135667697, 9);
  });

  it('1 cm⁻¹ corresponds to h c 100 / k_B ≈ 1.438 776 877 5 K', () => {
    // derived from h, c, k_B (CODATA 2018; the second radiation constant c₂)
    const expected = (6.62607015e-34 * 299792458 * 100) / 1.380649e-23;
    expect(KELVIN_PER_CM1).toBeCloseTo(expected, 14);
    expect(KELVIN_PER_CM1).toBeCloseTo(1.4387768775, 10);
  });

  it('converts the Si Raman line 520.45 cm⁻¹ to THz and meV', () => {
    // Itoh & Shirono, J. Raman Spectrosc. 51 (2020): 520.45 cm⁻¹; conversions derived (CODATA 2018)
    expect(convertFrequency(520.45, 'cm-1', 'THz')).toBeCloseTo(520.45 * 0.0299792458, 12);
    expect(convertFrequency(520.45, 'cm-1', 'meV')).toBeCloseTo(
      (520.45 * 6.62607015e-34 * 299792458 * 100 * 1000) / 1.602176634e-19,
      11,
    );
  });
});

describe('entropy conversions', () => {
  const R = 6.02214076e23 * 1.380649e-23; // CODATA 2018, exact product

  it('converts the NaCl standard entropy between per formula unit, per atom and k_B', () => {
    // NIST-JANAF (Chase 1998): S°(NaCl, cr, 298.15 K) = 72.115 J/(mol K); 2 atoms per formula unit
    const atoms = parseFormula('NaCl').atomsPerFormulaUnit;
    expect(atoms).toBe(2);
    expect(convertEntropy(72.115, 'J/mol/K', 'J/mol-atom/K', atoms)).toBeCloseTo(72.115 / 2, 12);
    expect(convertEntropy(72.115, 'J/mol/K', 'kB/atom', atoms)).toBeCloseTo(72.115 / (2 * R), 12);
    expect(convertEntropy(72.115, 'J/mol/K', 'kB/fu', atoms)).toBeCloseTo(72.115 / R, 12);
    expect(convertEntropy(72.115, 'J/mol/K', 'cal/mol/K', atoms)).toBeCloseTo(72.115 / 4.184, 12); // 1 cal = 4.184 J
  });

  it('converts the corundum standard entropy from kB/atom back to J/(mol K)', () => {
    // CODATA Key Values (Cox, Wagman, Medvedev 1989): S°(Al2O3, corundum) = 50.92 J/(mol K); 5 atoms per formula unit
    const atoms = parseFormula('Al2O3').atomsPerFormulaUnit;
    const perAtomKb = 50.92 / (atoms * R);
    expect(convertEntropy(perAtomKb, 'kB/atom', 'J/mol/K', atoms)).toBeCloseTo(50.92, 12);
  });
});
