/**
 * What differs between the quantities a benchmark compares: the unit, the words, and
 * how rows pair. Frequencies pair as Γ-point modes; entropy and heat capacity
 * ("thermal") pair one value per material at the benchmark temperature, within a
 * tolerance in K; the dielectric constants ε∞ and ε₀ pair one value per material,
 * whatever the temperature (measured near room temperature, computed for the structure
 * at rest), dimensionless.
 */
import { THERMAL_QUANTITIES, type BenchmarkQuantity } from './schemas';

export type ThermalQuantity = 'entropy' | 'heat-capacity';
export type DielectricQuantity = 'eps-inf' | 'eps-static';

/** Entropy and heat capacity: one value per material at a temperature, compared within a tolerance in K. */
export function isThermal(quantity: BenchmarkQuantity): quantity is ThermalQuantity {
  return THERMAL_QUANTITIES.includes(quantity);
}

/** ε∞ and ε₀: one scalar per material (the orientational average for a non-cubic crystal). */
export function isDielectric(quantity: BenchmarkQuantity): quantity is DielectricQuantity {
  return quantity === 'eps-inf' || quantity === 'eps-static';
}

export const QUANTITY_UNIT: Record<BenchmarkQuantity, string> = {
  frequency: 'cm⁻¹',
  entropy: 'J mol⁻¹ K⁻¹',
  'heat-capacity': 'J mol⁻¹ K⁻¹',
  'eps-inf': '',
  'eps-static': '',
};

/** The benchmark list's name of each quantity. */
export const QUANTITY_TITLE: Record<BenchmarkQuantity, string> = {
  frequency: 'Γ-point frequency',
  entropy: 'Vibrational entropy',
  'heat-capacity': 'Heat capacity (Cp measured, Cv computed)',
  'eps-inf': 'Dielectric constant ε∞ (electronic)',
  'eps-static': 'Dielectric constant ε₀ (static)',
};

/** The values, plural, as a sentence names them. */
export const QUANTITY_PLURAL: Record<BenchmarkQuantity, string> = {
  frequency: 'frequencies',
  entropy: 'entropies',
  'heat-capacity': 'heat capacities',
  'eps-inf': 'ε∞ values',
  'eps-static': 'ε₀ values',
};
