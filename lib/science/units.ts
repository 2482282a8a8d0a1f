import { KELVIN_PER_CM1, MEV_PER_CM1, MOLAR_GAS_CONSTANT_J_PER_MOL_K, THERMOCHEMICAL_CALORIE_J, THZ_PER_CM1 } from './constants';
import { ScienceInputError, requireFinite, requirePositive } from './errors';

/** Units a phonon frequency may be entered in; cm⁻¹ is canonical. */
export type FrequencyUnit = 'cm-1' | 'THz' | 'meV';

/**
 * Units a vibrational entropy may be entered in; J mol⁻¹ K⁻¹ per formula unit is canonical.
 * 'J/mol-atom/K' is per mole of atoms, 'kB/atom' and 'kB/fu' are in units of k_B,
 * 'cal/mol/K' is thermochemical calories per mole of formula units.
 */
export type EntropyUnit = 'J/mol/K' | 'J/mol-atom/K' | 'kB/atom' | 'kB/fu' | 'cal/mol/K';

/** All frequency units, for validation and for building pickers. */
export const FREQUENCY_UNITS: readonly FrequencyUnit[] = ['cm-1', 'THz', 'meV'];
/** All entropy units, for validation and for building pickers. */
export const ENTROPY_UNITS: readonly EntropyUnit[] = ['J/mol/K', 'J/mol-atom/K', 'kB/atom', 'kB/fu', 'cal/mol/K'];

const CM1_PER_FREQUENCY_UNIT: Record<FrequencyUnit, number> = {
  'cm-1': 1,
  THz: 1 / THZ_PER_CM1,
  meV: 1 / MEV_PER_CM1,
};

function requireFrequencyUnit(argument: string, unit: string): asserts unit is FrequencyUnit {
  if (!(FREQUENCY_UNITS as readonly string[]).includes(unit)) {
    throw new ScienceInputError(argument, `unknown frequency unit "${unit}"; expected one of ${FREQUENCY_UNITS.join(', ')}`);
  }
}

function requireEntropyUnit(argument: string, unit: string): asserts unit is EntropyUnit {
  if (!(ENTROPY_UNITS as readonly string[]).includes(unit)) {
    throw new ScienceInputError(argument, `unknown entropy unit "${unit}"; expected one of ${ENTROPY_UNITS.join(', ')}`);
  }
}

/**
 * Converts a frequency between cm⁻¹, THz and meV using the CODATA 2018 exact
 * constants (1 cm⁻¹ = 0.0299792458 THz = h c·100/e·1000 meV).
 */
export function convertFrequency(value: number, from: FrequencyUnit, to: FrequencyUnit): number {
  requireFinite('value', value);
  requireFrequencyUnit('from', from);
  requireFrequencyUnit('to', to);
  if (from === to) return value;
  const frequencyCm1 = from === 'cm-1' ? value : value * CM1_PER_FREQUENCY_UNIT[from];
  if (to === 'cm-1') return frequencyCm1;
  return to === 'THz' ? frequencyCm1 * THZ_PER_CM1 : frequencyCm1 * MEV_PER_CM1;
}

/** Converts a frequency in cm⁻¹ to a temperature equivalent h c ν̃ / k_B in K. */
export function frequencyCm1ToKelvin(frequencyCm1: number): number {
  requireFinite('frequencyCm1', frequencyCm1);
  return frequencyCm1 * KELVIN_PER_CM1;
}

function toJoulePerMolK(value: number, unit: EntropyUnit, atoms: number): number {
  switch (unit) {
    case 'J/mol/K':
      return value;
    case 'J/mol-atom/K':
      return value * atoms;
    case 'kB/atom':
      return value * atoms * MOLAR_GAS_CONSTANT_J_PER_MOL_K;
    case 'kB/fu':
      return value * MOLAR_GAS_CONSTANT_J_PER_MOL_K;
    case 'cal/mol/K':
      return value * THERMOCHEMICAL_CALORIE_J;
  }
}

function fromJoulePerMolK(entropyJPerMolK: number, unit: EntropyUnit, atoms: number): number {
  switch (unit) {
    case 'J/mol/K':
      return entropyJPerMolK;
    case 'J/mol-atom/K':
      return entropyJPerMolK / atoms;
    case 'kB/atom':
      return entropyJPerMolK / (atoms * MOLAR_GAS_CONSTANT_J_PER_MOL_K);
    case 'kB/fu':
      return entropyJPerMolK / MOLAR_GAS_CONSTANT_J_PER_MOL_K;
    case 'cal/mol/K':
      return entropyJPerMolK / THERMOCHEMICAL_CALORIE_J;
  }
}

/**
 * Converts an entropy between per-formula-unit, per-atom, k_B and calorie units.
 * `atomsPerFormulaUnit` (> 0, may be fractional for partial occupancies) links
 * per-atom and per-formula-unit values; R = N_A k_B and 1 cal = 4.184 J.
 */
export function convertEntropy(value: number, from: EntropyUnit, to: EntropyUnit, atomsPerFormulaUnit: number): number {
  requireFinite('value', value);
  requireEntropyUnit('from', from);
  requireEntropyUnit('to', to);
  requirePositive('atomsPerFormulaUnit', atomsPerFormulaUnit);
  if (from === to) return value;
  return fromJoulePerMolK(toJoulePerMolK(value, from, atomsPerFormulaUnit), to, atomsPerFormulaUnit);
}
