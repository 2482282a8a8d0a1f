/**
 * Cp − Cv = α_V² B_T V_m T on worked cases. The material properties are handbook values
 * recalled from memory (not checked against a table), so the checks are of the arithmetic
 * and of the size of the gap the heat-capacity caution states, not of the handbook.
 */
import { describe, expect, it } from 'vitest';
import { cpMinusCv, ScienceInputError } from '@/lib/science';
import { HEAT_CAPACITY_CAUTION } from '@/lib/benchmark/compute';

// MgO: α_V = 3 × 10.4 × 10⁻⁶ K⁻¹, B_T = 160 GPa, V_m = 40.30 g/mol ÷ 3.58 g/cm³ = 11.25 cm³/mol (from memory).
const mgo = { volumetricExpansionPerK: 3.12e-5, bulkModulusGPa: 160, molarVolumeCm3PerMol: 11.25, temperatureK: 298.15 };
// NaCl: α_V = 3 × 40 × 10⁻⁶ K⁻¹, B_T = 24.0 GPa, V_m = 58.44 g/mol ÷ 2.165 g/cm³ = 27.0 cm³/mol (from memory).
const nacl = { volumetricExpansionPerK: 1.2e-4, bulkModulusGPa: 24, molarVolumeCm3PerMol: 27, temperatureK: 298.15 };
// Cp°(298.15 K): MgO 37.2, NaCl 50.5 J mol⁻¹ K⁻¹ (NIST-JANAF Thermochemical Tables, Chase 1998; from memory).
const CP = { mgo: 37.2, nacl: 50.5 };

describe('Cp − Cv = α² B V_m T', () => {
  it('MgO at 298.15 K: (3.12e-5)² × 160e9 Pa × 11.25e-6 m³/mol × 298.15 K = 0.5224 J mol⁻¹ K⁻¹, 1.4 % of Cp', () => {
    // by hand: 9.7344e-10 × 160e9 = 155.750; × 11.25e-6 = 1.752192e-3; × 298.15 = 0.522416
    expect(cpMinusCv(mgo)).toBeCloseTo(0.522416, 5);
    expect(cpMinusCv(mgo) / CP.mgo).toBeGreaterThan(0.01);
    expect(cpMinusCv(mgo) / CP.mgo).toBeLessThan(0.02);
  });

  it('NaCl at 298.15 K: (1.2e-4)² × 24e9 Pa × 27e-6 m³/mol × 298.15 K = 2.7821 J mol⁻¹ K⁻¹, 5.5 % of Cp', () => {
    // by hand: 1.44e-8 × 24e9 = 345.6; × 27e-6 = 9.3312e-3; × 298.15 = 2.782097
    expect(cpMinusCv(nacl)).toBeCloseTo(2.782097, 5);
    expect(cpMinusCv(nacl) / CP.nacl).toBeCloseTo(0.0551, 3);
  });

  it('grows linearly with T, vanishes at 0 K, and is the same for a contracting crystal (α² ≥ 0)', () => {
    expect(cpMinusCv({ ...nacl, temperatureK: 0 })).toBe(0);
    expect(cpMinusCv({ ...nacl, temperatureK: 596.3 })).toBeCloseTo(2 * cpMinusCv(nacl), 10);
    expect(cpMinusCv({ ...mgo, volumetricExpansionPerK: -mgo.volumetricExpansionPerK })).toBe(cpMinusCv(mgo));
  });

  it('the heat-capacity caution states the gap these cases give (about 1.4 % for MgO, 5.5 % for NaCl)', () => {
    expect(HEAT_CAPACITY_CAUTION).toMatch(/Cp − Cv = α² B V_m T/);
    expect(HEAT_CAPACITY_CAUTION).toMatch(/about 1\.4 % of Cp for a stiff oxide such as MgO/);
    expect(HEAT_CAPACITY_CAUTION).toMatch(/about 5\.5 % for NaCl/);
    expect(((100 * cpMinusCv(mgo)) / CP.mgo).toFixed(1)).toBe('1.4');
    expect(((100 * cpMinusCv(nacl)) / CP.nacl).toFixed(1)).toBe('5.5');
  });

  it('refuses a bulk modulus or molar volume ≤ 0, a negative temperature and non-finite input', () => {
    expect(() => cpMinusCv({ ...mgo, bulkModulusGPa: 0 })).toThrow(ScienceInputError);
    expect(() => cpMinusCv({ ...mgo, molarVolumeCm3PerMol: -1 })).toThrow(/molarVolumeCm3PerMol/);
    expect(() => cpMinusCv({ ...mgo, temperatureK: -1 })).toThrow(/temperatureK/);
    expect(() => cpMinusCv({ ...mgo, volumetricExpansionPerK: Number.NaN })).toThrow(/volumetricExpansionPerK/);
  });
});
