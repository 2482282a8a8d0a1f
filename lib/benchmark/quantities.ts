/**
 * What differs between the quantities a benchmark compares: the unit, the words, and
 * whether rows are compared at one temperature (entropy and heat capacity: "thermal")
 * or as Γ-point modes (frequency).
 */
import type { BenchmarkQuantity } from './schemas';

export type ThermalQuantity = Exclude<BenchmarkQuantity, 'frequency'>;

/** Entropy and heat capacity: one value per material at a temperature, compared within a tolerance in K. */
export function isThermal(quantity: BenchmarkQuantity): quantity is ThermalQuantity {
  return quantity !== 'frequency';
}

export const QUANTITY_UNIT: Record<BenchmarkQuantity, string> = {
  frequency: 'cm⁻¹',
  entropy: 'J mol⁻¹ K⁻¹',
  'heat-capacity': 'J mol⁻¹ K⁻¹',
};

/** The benchmark list's name of each quantity. */
export const QUANTITY_TITLE: Record<BenchmarkQuantity, string> = {
  frequency: 'Γ-point frequency',
  entropy: 'Vibrational entropy',
  'heat-capacity': 'Heat capacity (Cp measured, Cv computed)',
};

/** The values, plural, as a sentence names them. */
export const QUANTITY_PLURAL: Record<BenchmarkQuantity, string> = {
  frequency: 'frequencies',
  entropy: 'entropies',
  'heat-capacity': 'heat capacities',
};
