import { describe, expect, it } from 'vitest';
import { debyeHeatCapacity, harmonicFromDos, harmonicMode } from '@/lib/science';

// CODATA 2018 exact constants, written out here so the checks do not depend on constants.ts
const h = 6.62607015e-34;
const c = 299792458;
const kB = 1.380649e-23;
const NA = 6.02214076e23;
const R = NA * kB;
const kelvinPerCm1 = (h * c * 100) / kB;

function debyeDos(debyeTemperatureK: number, points: number) {
  // Debye density of states g(ν) ∝ ν² up to ν_D = k_B θ_D / (h c) (Kittel, Introduction to Solid State Physics, ch. 5)
  const nuD = debyeTemperatureK / kelvinPerCm1;
  const frequencyCm1: number[] = [];
  const density: number[] = [];
  for (let i = 0; i < points; i++) {
    const nu = (nuD * i) / (points - 1);
    frequencyCm1.push(nu);
    density.push(nu * nu);
  }
  return { frequencyCm1, density };
}

describe('Einstein (single harmonic mode) closed forms', () => {
  // Standard textbook Einstein functions, x = h c ν̃ / (k_B T):
  // C/k_B = x² eˣ/(eˣ − 1)²; S/k_B = x/(eˣ − 1) − ln(1 − e⁻ˣ); U/(k_B T) = x/2 + x/(eˣ − 1); F/(k_B T) = x/2 + ln(1 − e⁻ˣ)
  for (const x of [0.05, 0.5, 1, 2, 5, 10, 30]) {
    it(`matches at x = ${x}`, () => {
      const T = 300;
      const frequencyCm1 = (x * T) / kelvinPerCm1;
      const result = harmonicMode(frequencyCm1, T);
      const ex = Math.exp(x);
      expect(result.heatCapacity).toBeCloseTo((x * x * ex) / (ex - 1) ** 2, 12);
      expect(result.entropy).toBeCloseTo(x / (ex - 1) - Math.log(1 - Math.exp(-x)), 12);
      expect(result.internalEnergy).toBeCloseTo(x / 2 + x / (ex - 1), 12);
      expect(result.freeEnergy).toBeCloseTo(x / 2 + Math.log(1 - Math.exp(-x)), 12);
      // thermodynamic identity F = U − T S (in k_B T units: f = u − s)
      expect(result.freeEnergy).toBeCloseTo(result.internalEnergy - result.entropy, 12);
    });
  }

  it('tends to the classical limit C → k_B at high T', () => {
    // equipartition (textbook): C/k_B = 1 − x²/12 + O(x⁴)
    const x = 1e-3;
    expect(harmonicMode(x * 1000 / kelvinPerCm1, 1000).heatCapacity).toBeCloseTo(1 - (x * x) / 12, 12);
  });
});

describe('Debye heat capacity', () => {
  it('C_v/3R = 0.951 732 135 7 at T = θ_D', () => {
    // Adv. Cond. Matter Phys. 2017, article 9321439, Table 7 (published)
    expect(debyeHeatCapacity(345, 345)).toBeCloseTo(0.9517321357, 9);
  });

  it('follows the T³ law C_v = (12π⁴/5) R (T/θ_D)³ at low T', () => {
    // Kittel, Introduction to Solid State Physics, ch. 5 (textbook), per mole of atoms: C/3R = (4π⁴/5)(T/θ)³
    const t = 0.01;
    expect(debyeHeatCapacity(t * 400, 400) / ((4 * Math.PI ** 4) / 5) / t ** 3).toBeCloseTo(1, 8);
  });

  it('harmonicFromDos on a 1,000-point Debye DOS gives C_v/3R = 0.951 732 135 7 at T = θ_D (within 0.1 %)', () => {
    // Adv. Cond. Matter Phys. 2017, article 9321439, Table 7; DOS per Kittel ch. 5; one atom → 3 modes per cell
    for (const theta of [150, 345, 645]) {
      const result = harmonicFromDos(debyeDos(theta, 1000), theta, 3);
      const ratio = result.heatCapacityJPerMolK / (3 * R);
      expect(Math.abs(ratio / 0.9517321357 - 1)).toBeLessThan(1e-4);
    }
  });

  it('harmonicFromDos agrees with the Debye function at other temperatures and the Dulong–Petit limit', () => {
    // Debye model (Kittel ch. 5); Dulong–Petit C → 3R at T ≫ θ_D (textbook)
    const theta = 400;
    const dos = debyeDos(theta, 1000);
    for (const T of [40, 100, 200, 800]) {
      const ratio = harmonicFromDos(dos, T, 3).heatCapacityJPerMolK / (3 * R);
      expect(Math.abs(ratio / debyeHeatCapacity(T, theta) - 1)).toBeLessThan(1e-3);
    }
    expect(harmonicFromDos(dos, 20000, 3).heatCapacityJPerMolK / (3 * R)).toBeCloseTo(1, 4);
  });

  it('harmonicFromDos rescales an unnormalised DOS and keeps F = U − T S', () => {
    const theta = 300;
    const unit = harmonicFromDos(debyeDos(theta, 1000), 250, 3);
    const scaled = debyeDos(theta, 1000);
    scaled.density = scaled.density.map((g) => g * 1234.5);
    const again = harmonicFromDos(scaled, 250, 3);
    expect(again.entropyJPerMolK).toBeCloseTo(unit.entropyJPerMolK, 10);
    expect(unit.freeEnergyKJPerMol).toBeCloseTo(unit.internalEnergyKJPerMol - (250 * unit.entropyJPerMolK) / 1000, 10);
  });

  it('a narrow DOS peak reproduces one Einstein mode per mole', () => {
    // Einstein model: N_A modes of one frequency; S = R s(x), C = R c(x) (textbook)
    const nu0 = 300;
    const frequencyCm1: number[] = [];
    const density: number[] = [];
    for (let i = 0; i < 1000; i++) {
      const nu = nu0 - 0.05 + (0.1 * i) / 999;
      frequencyCm1.push(nu);
      density.push(Math.max(0, 1 - Math.abs(nu - nu0) / 0.05));
    }
    const result = harmonicFromDos({ frequencyCm1, density }, 300, 1);
    const single = harmonicMode(nu0, 300);
    expect(result.entropyJPerMolK / (R * single.entropy)).toBeCloseTo(1, 6);
    expect(result.heatCapacityJPerMolK / (R * single.heatCapacity)).toBeCloseTo(1, 6);
    // zero-point energy at 0 K: N_A h c ν̃ / 2 (textbook)
    const zeroK = harmonicFromDos({ frequencyCm1, density }, 0, 1);
    expect(zeroK.entropyJPerMolK).toBe(0);
    expect(zeroK.internalEnergyKJPerMol).toBeCloseTo((NA * h * c * 100 * nu0) / 2 / 1000, 9);
  });
});
