/**
 * Harmonic lattice thermodynamics (zero-point energy included).
 * Per mode, with x = h c ν̃ / (k_B T):
 *   C_v/k_B = x² eˣ/(eˣ − 1)²,  S/k_B = x/(eˣ − 1) − ln(1 − e⁻ˣ),
 *   U/(k_B T) = x/2 + x/(eˣ − 1),  F/(k_B T) = x/2 + ln(1 − e⁻ˣ).
 * Written with expm1/log1p so that no term overflows or cancels at large or small x.
 *
 * A harmonic calculation gives Cv; calorimetry measures Cp. cpMinusCv gives the gap,
 * Cp − Cv = α_V² B_T V_m T, from the material's expansion, bulk modulus and molar volume.
 */
import { AVOGADRO_CONSTANT_PER_MOL, JOULE_PER_CM1, KELVIN_PER_CM1, MOLAR_GAS_CONSTANT_J_PER_MOL_K } from './constants';
import { ScienceInputError, requireFinite, requireNonNegative, requirePositive } from './errors';

/** Per-mode harmonic quantities in units of k_B (energies in k_B·T). */
export interface HarmonicModeQuantities {
  heatCapacity: number;
  entropy: number;
  internalEnergy: number;
  freeEnergy: number;
}

/** Thermodynamic functions per mole of cells from a phonon density of states. */
export interface HarmonicDosQuantities {
  entropyJPerMolK: number;
  heatCapacityJPerMolK: number;
  internalEnergyKJPerMol: number;
  freeEnergyKJPerMol: number;
}

function einsteinFunctions(x: number): HarmonicModeQuantities {
  const expMinus = Math.exp(-x);
  const oneMinusExpMinus = -Math.expm1(-x);
  const occupancyTimesX = x / Math.expm1(x);
  const logTerm = Math.log1p(-expMinus);
  return {
    heatCapacity: (x * x * expMinus) / (oneMinusExpMinus * oneMinusExpMinus),
    entropy: occupancyTimesX - logTerm,
    internalEnergy: x / 2 + occupancyTimesX,
    freeEnergy: x / 2 + logTerm,
  };
}

/**
 * Harmonic quantities of one mode of frequency `frequencyCm1` (> 0) at `temperatureK` (> 0):
 * heat capacity and entropy in k_B, internal and free energy in k_B·T, zero-point included.
 */
export function harmonicMode(frequencyCm1: number, temperatureK: number): HarmonicModeQuantities {
  requirePositive('frequencyCm1', frequencyCm1);
  requirePositive('temperatureK', temperatureK);
  return einsteinFunctions((frequencyCm1 * KELVIN_PER_CM1) / temperatureK);
}

function validateDos(dos: { frequencyCm1: number[]; density: number[] }): void {
  if (!dos || !Array.isArray(dos.frequencyCm1) || !Array.isArray(dos.density)) {
    throw new ScienceInputError('dos', 'must have frequencyCm1 and density arrays');
  }
  const { frequencyCm1: nu, density: g } = dos;
  if (nu.length < 2) throw new ScienceInputError('dos.frequencyCm1', `needs at least 2 grid points, got ${nu.length}`);
  if (g.length !== nu.length) throw new ScienceInputError('dos.density', `must have ${nu.length} values like dos.frequencyCm1, got ${g.length}`);
  for (let i = 0; i < nu.length; i++) {
    requireFinite(`dos.frequencyCm1[${i}]`, nu[i]);
    requireNonNegative(`dos.density[${i}]`, g[i]);
    if (i > 0 && !(nu[i] > nu[i - 1])) throw new ScienceInputError(`dos.frequencyCm1[${i}]`, 'the grid must increase strictly');
    if (nu[i] <= 0 && g[i] > 0) {
      throw new ScienceInputError(`dos.density[${i}]`, `has weight at ${nu[i]} cm⁻¹; zero or imaginary frequencies have no harmonic entropy`);
    }
  }
}

/**
 * Harmonic S, C_v, U and F per mole of cells at `temperatureK` (≥ 0; at 0 K only the
 * zero-point energy remains) from a phonon DOS on an increasing grid. The density is
 * rescaled so that it integrates to `modesPerCell`; integrals use the trapezoidal rule
 * (error well below 0.1 % on a 1,000-point grid).
 */
export function harmonicFromDos(
  dos: { frequencyCm1: number[]; density: number[] },
  temperatureK: number,
  modesPerCell: number,
): HarmonicDosQuantities {
  validateDos(dos);
  requireNonNegative('temperatureK', temperatureK);
  requirePositive('modesPerCell', modesPerCell);
  const { frequencyCm1: nu, density: g } = dos;
  const n = nu.length;
  let norm = 0;
  let heatCapacity = 0;
  let entropy = 0;
  let energyOverKT = 0;
  let freeOverKT = 0;
  let zeroPointCm1 = 0;
  for (let i = 0; i < n; i++) {
    const weight = (i > 0 ? nu[i] - nu[i - 1] : 0) / 2 + (i < n - 1 ? nu[i + 1] - nu[i] : 0) / 2;
    const w = weight * g[i];
    if (w === 0) continue;
    norm += w;
    zeroPointCm1 += (w * nu[i]) / 2;
    if (temperatureK > 0) {
      const f = einsteinFunctions((nu[i] * KELVIN_PER_CM1) / temperatureK);
      heatCapacity += w * f.heatCapacity;
      entropy += w * f.entropy;
      energyOverKT += w * f.internalEnergy;
      freeOverKT += w * f.freeEnergy;
    }
  }
  if (norm === 0) throw new ScienceInputError('dos.density', 'integrates to 0; nothing to normalise');
  const scale = modesPerCell / norm;
  const R = MOLAR_GAS_CONSTANT_J_PER_MOL_K;
  if (temperatureK === 0) {
    const zeroPointKJPerMol = (scale * zeroPointCm1 * JOULE_PER_CM1 * AVOGADRO_CONSTANT_PER_MOL) / 1000;
    return { entropyJPerMolK: 0, heatCapacityJPerMolK: 0, internalEnergyKJPerMol: zeroPointKJPerMol, freeEnergyKJPerMol: zeroPointKJPerMol };
  }
  return {
    entropyJPerMolK: scale * entropy * R,
    heatCapacityJPerMolK: scale * heatCapacity * R,
    internalEnergyKJPerMol: (scale * energyOverKT * R * temperatureK) / 1000,
    freeEnergyKJPerMol: (scale * freeOverKT * R * temperatureK) / 1000,
  };
}

function debyeIntegrand(x: number): number {
  if (x === 0) return 0;
  const expMinus = Math.exp(-x);
  const denominator = -Math.expm1(-x);
  return (x * x * x * x * expMinus) / (denominator * denominator);
}

/**
 * Debye heat capacity C_v/(3R) = 3 (T/θ_D)³ ∫₀^{θ_D/T} x⁴eˣ/(eˣ − 1)² dx,
 * by composite Simpson's rule (2,000 intervals; the integrand beyond x = 60 is below 1e-20).
 */
export function debyeHeatCapacity(temperatureK: number, debyeTemperatureK: number): number {
  requireNonNegative('temperatureK', temperatureK);
  requirePositive('debyeTemperatureK', debyeTemperatureK);
  if (temperatureK === 0) return 0;
  const upper = Math.min(debyeTemperatureK / temperatureK, 60);
  const intervals = 2000;
  const h = upper / intervals;
  let sum = debyeIntegrand(0) + debyeIntegrand(upper);
  for (let i = 1; i < intervals; i++) sum += (i % 2 === 1 ? 4 : 2) * debyeIntegrand(i * h);
  const integral = (sum * h) / 3;
  const t = temperatureK / debyeTemperatureK;
  return 3 * t * t * t * integral;
}

/** Inputs of cpMinusCv, in the units a handbook gives them. */
export interface CpMinusCvInput {
  /** Volumetric thermal expansion α_V = (1/V)(∂V/∂T)_p, K⁻¹ (three times the linear coefficient of a cubic crystal). */
  volumetricExpansionPerK: number;
  /** Isothermal bulk modulus B_T, GPa. */
  bulkModulusGPa: number;
  /** Molar volume V_m, cm³ mol⁻¹ (per mole of formula units). */
  molarVolumeCm3PerMol: number;
  temperatureK: number;
}

/**
 * Cp − Cv = α_V² B_T V_m T, in J mol⁻¹ K⁻¹ (per mole of formula units): the exact
 * thermodynamic identity, not an approximation. It is what separates a calorimetric Cp
 * from a harmonic Cv; it needs all three material properties at the temperature T.
 */
export function cpMinusCv(input: CpMinusCvInput): number {
  requireFinite('volumetricExpansionPerK', input.volumetricExpansionPerK);
  requirePositive('bulkModulusGPa', input.bulkModulusGPa);
  requirePositive('molarVolumeCm3PerMol', input.molarVolumeCm3PerMol);
  requireNonNegative('temperatureK', input.temperatureK);
  const alpha = input.volumetricExpansionPerK;
  return alpha * alpha * (input.bulkModulusGPa * 1e9) * (input.molarVolumeCm3PerMol * 1e-6) * input.temperatureK;
}

/** A material's recorded α_V (K⁻¹), B_T (GPa) and V_m (cm³ mol⁻¹), any of them possibly missing. */
export interface ThermalProperties {
  thermalExpansionPerK?: number | null;
  bulkModulusGpa?: number | null;
  molarVolumeCm3?: number | null;
}

/** cpMinusCv of a material at T, or null when it lacks any of the three properties. */
export function cpMinusCvOf(material: ThermalProperties, temperatureK: number): number | null {
  const { thermalExpansionPerK: alpha, bulkModulusGpa: bulk, molarVolumeCm3: volume } = material;
  if (alpha == null || bulk == null || volume == null) return null;
  return cpMinusCv({ volumetricExpansionPerK: alpha, bulkModulusGPa: bulk, molarVolumeCm3PerMol: volume, temperatureK });
}
