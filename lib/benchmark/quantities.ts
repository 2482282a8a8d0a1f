/**
 * What differs between the quantities a benchmark compares: the unit, the words, and
 * how rows pair. Frequencies pair as Γ-point modes; entropy and heat capacity
 * ("thermal") pair one value per material at the benchmark temperature, within a
 * tolerance in K; the dielectric constants ε∞ and ε₀ pair one value per material,
 * whatever the temperature (measured near room temperature, computed for the structure
 * at rest), dimensionless; Born effective charges pair per material and site (the atom), compared
 * by the mean of the tensor's diagonal, in e; LO–TO splittings are derived from frequency rows
 * (pair-rows.ts pairSplittings), so their rows are the frequency rows.
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

/** The stored quantity of the rows a benchmark reads: an LO–TO splitting is derived from frequencies. */
export function rowQuantityOf(quantity: BenchmarkQuantity): Exclude<BenchmarkQuantity, 'lo-to-splitting'> {
  return quantity === 'lo-to-splitting' ? 'frequency' : quantity;
}

export const QUANTITY_UNIT: Record<BenchmarkQuantity, string> = {
  frequency: 'cm⁻¹',
  entropy: 'J mol⁻¹ K⁻¹',
  'heat-capacity': 'J mol⁻¹ K⁻¹',
  'eps-inf': '',
  'eps-static': '',
  'born-charge': 'e',
  'lo-to-splitting': 'cm⁻¹',
};

/** The benchmark list's name of each quantity. */
export const QUANTITY_TITLE: Record<BenchmarkQuantity, string> = {
  frequency: 'Γ-point frequency',
  entropy: 'Vibrational entropy',
  'heat-capacity': 'Heat capacity (Cp measured, Cv computed)',
  'eps-inf': 'Dielectric constant ε∞ (electronic)',
  'eps-static': 'Dielectric constant ε₀ (static)',
  'born-charge': 'Born effective charge (mean of the diagonal)',
  'lo-to-splitting': 'LO–TO splitting of polar modes',
};

/** The values, plural, as a sentence names them. */
export const QUANTITY_PLURAL: Record<BenchmarkQuantity, string> = {
  frequency: 'frequencies',
  entropy: 'entropies',
  'heat-capacity': 'heat capacities',
  'eps-inf': 'ε∞ values',
  'eps-static': 'ε₀ values',
  'born-charge': 'Born charges',
  'lo-to-splitting': 'LO–TO splittings',
};
