import { ENTROPY_UNITS, FREQUENCY_UNITS, type EntropyUnit, type FrequencyUnit } from '@/lib/science/units';
import type { ImportQuantity } from './columns';

const FREQUENCY_ALIASES: Record<string, FrequencyUnit> = {
  'cm-1': 'cm-1',
  'cm^-1': 'cm-1',
  'cm⁻¹': 'cm-1',
  '1/cm': 'cm-1',
  '/cm': 'cm-1',
  thz: 'THz',
  mev: 'meV',
};

const ENTROPY_ALIASES: Record<string, EntropyUnit> = {
  'j/mol/k': 'J/mol/K',
  'j/(mol k)': 'J/mol/K',
  'j/(mol*k)': 'J/mol/K',
  'j mol-1 k-1': 'J/mol/K',
  'j/mol-atom/k': 'J/mol-atom/K',
  'kb/atom': 'kB/atom',
  'kb/fu': 'kB/fu',
  'cal/mol/k': 'cal/mol/K',
};

/** Dielectric constants are dimensionless: stored with the unit "1". */
export type DimensionlessUnit = '1';
export const DIMENSIONLESS_UNITS: readonly DimensionlessUnit[] = ['1'];
const DIMENSIONLESS_ALIASES: Record<string, DimensionlessUnit> = { '1': '1', '-': '1', none: '1', dimensionless: '1' };

/** Born effective charges: in units of the elementary charge. */
export type ChargeUnit = 'e';
export const CHARGE_UNITS: readonly ChargeUnit[] = ['e'];
const CHARGE_ALIASES: Record<string, ChargeUnit> = { e: 'e', '|e|': 'e', e0: 'e', 'e₀': 'e', '1': 'e', '-': 'e', none: 'e' };

export type ImportUnit = FrequencyUnit | EntropyUnit | DimensionlessUnit | ChargeUnit;

/** Whether a quantity carries no unit (an empty unit cell is then fine). */
export function isDimensionless(quantity: ImportQuantity): boolean {
  return quantity === 'eps-inf' || quantity === 'eps-static';
}

/** Whether a quantity has one unit only, so an empty unit cell means it (dielectric constants, Born charges). */
export function hasSingleUnit(quantity: ImportQuantity): boolean {
  return isDimensionless(quantity) || quantity === 'born-charge';
}

/** The unit an empty unit cell stands for, where the quantity has one only. */
export function singleUnitOf(quantity: ImportQuantity): ImportUnit | null {
  if (isDimensionless(quantity)) return '1';
  return quantity === 'born-charge' ? 'e' : null;
}

/** Units chosen for the whole file, used where a row has no unit. */
export interface DefaultUnits {
  frequency?: FrequencyUnit;
  entropy?: EntropyUnit;
  'heat-capacity'?: EntropyUnit;
}

/** The unit code for a written unit, or null when it is not a unit of that quantity (heat capacities take the entropy units). */
export function parseUnit(quantity: ImportQuantity, text: string): ImportUnit | null {
  const key = text.trim().toLowerCase().replace(/\s+/g, ' ');
  if (quantity === 'frequency') return FREQUENCY_ALIASES[key] ?? null;
  if (isDimensionless(quantity)) return DIMENSIONLESS_ALIASES[key] ?? null;
  if (quantity === 'born-charge') return CHARGE_ALIASES[key] ?? null;
  return ENTROPY_ALIASES[key] ?? null;
}

export function unitsOf(quantity: ImportQuantity): readonly string[] {
  if (quantity === 'frequency') return FREQUENCY_UNITS;
  if (quantity === 'born-charge') return CHARGE_UNITS;
  return isDimensionless(quantity) ? DIMENSIONLESS_UNITS : ENTROPY_UNITS;
}
