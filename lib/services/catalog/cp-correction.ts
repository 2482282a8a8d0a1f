import 'server-only';
/**
 * The material page's Cp − Cv line: the gap α_V² B_T V_m T (lib/science cpMinusCv) at 298.15 K from the
 * material's three thermal fields, and its share of a measured Cp near that temperature when there is one.
 */
import { cpMinusCvOf, ScienceInputError } from '@/lib/science';

export const CP_CORRECTION_TEMPERATURE_K = 298.15;
/** A measured Cp this close to 298.15 K is compared with the gap computed at 298.15 K. */
const MEASURED_WINDOW_K = 2;

export type ThermalField = 'thermalExpansionPerK' | 'bulkModulusGpa' | 'molarVolumeCm3';
const FIELDS: readonly ThermalField[] = ['thermalExpansionPerK', 'bulkModulusGpa', 'molarVolumeCm3'];

export interface CpCorrectionView {
  temperatureK: number;
  /** The fields not given; the gap is computed only when none is missing. */
  missing: ThermalField[];
  /** Cp − Cv in J mol⁻¹ K⁻¹ per formula unit, or null. */
  cpMinusCv: number | null;
  /** The measured Cp nearest 298.15 K within the window, and the gap as a fraction of it. */
  measured: { id: string; value: number; temperatureK: number; citeKey: string; share: number } | null;
}

interface MeasuredHeatCapacity {
  id: string;
  value: number;
  temperatureK: number | null;
  citeKey: string;
}

export function materialCpCorrection(material: Record<ThermalField, number | null>, measuredHeatCapacities: readonly MeasuredHeatCapacity[]): CpCorrectionView {
  const temperatureK = CP_CORRECTION_TEMPERATURE_K;
  const missing = FIELDS.filter((f) => material[f] === null || material[f] === undefined);
  let gap: number | null = null;
  if (missing.length === 0) {
    try {
      gap = cpMinusCvOf(material, temperatureK);
    } catch (e) {
      // Stored through the validated paths only; a value that slipped past them shows no gap rather than breaking the page.
      if (!(e instanceof ScienceInputError)) throw e;
    }
  }
  let measured: CpCorrectionView['measured'] = null;
  if (gap !== null) {
    const near = measuredHeatCapacities
      .filter((m) => m.temperatureK !== null && Math.abs(m.temperatureK - temperatureK) <= MEASURED_WINDOW_K && m.value > 0)
      .sort((a, b) => Math.abs(a.temperatureK! - temperatureK) - Math.abs(b.temperatureK! - temperatureK) || (a.id < b.id ? -1 : 1))[0];
    if (near) measured = { id: near.id, value: near.value, temperatureK: near.temperatureK!, citeKey: near.citeKey, share: gap / near.value };
  }
  return { temperatureK, missing, cpMinusCv: gap, measured };
}
