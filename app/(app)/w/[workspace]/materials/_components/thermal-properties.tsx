import { FieldList } from '@/components/ui/field-list';
import { Panel } from '@/components/ui/panel';
import { CP_CORRECTION_NOTE } from '@/lib/catalog/material-schema';
import { fixed, percentOf, plain, scientific, withUnit } from '@/lib/format';
import type { CpCorrectionView, ThermalField } from '@/lib/services/catalog/cp-correction';

const SYMBOL: Record<ThermalField, string> = { thermalExpansionPerK: 'α_V', bulkModulusGpa: 'B_T', molarVolumeCm3: 'V_m' };
const J_PER_MOL_K = 'J mol⁻¹ K⁻¹';

/** The material's α_V, B_T and V_m, and the Cp − Cv they give at 298.15 K. */
export function ThermalProperties({ material, correction }: { material: Record<ThermalField, number | null>; correction: CpCorrectionView }) {
  const t = plain(correction.temperatureK);
  let gap: React.ReactNode;
  if (correction.cpMinusCv !== null) {
    gap = (
      <span className="num">
        {withUnit(fixed(correction.cpMinusCv, 3), J_PER_MOL_K)}
        {correction.measured && (
          <span className="text-ink-muted">
            {' '}
            ({percentOf(correction.measured.share, 1)} of the measured Cp, {withUnit(plain(correction.measured.value), J_PER_MOL_K)} at {plain(correction.measured.temperatureK)} K, {correction.measured.citeKey})
          </span>
        )}
      </span>
    );
  } else if (correction.missing.length > 0) {
    gap = <span className="text-ink-muted">needs all three; {correction.missing.map((f) => SYMBOL[f]).join(', ')} not given</span>;
  } else {
    gap = <span className="text-ink-muted">not computable from the stored values</span>;
  }
  const fields: Array<[string, React.ReactNode]> = [
    ['Thermal expansion α_V (volumetric)', material.thermalExpansionPerK !== null ? <span className="num">{withUnit(scientific(material.thermalExpansionPerK, 6), 'K⁻¹')}</span> : '–'],
    ['Bulk modulus B_T (isothermal)', material.bulkModulusGpa !== null ? <span className="num">{withUnit(plain(material.bulkModulusGpa), 'GPa')}</span> : '–'],
    ['Molar volume V_m', material.molarVolumeCm3 !== null ? <span className="num">{withUnit(plain(material.molarVolumeCm3), 'cm³ mol⁻¹')}</span> : '–'],
    [`Cp − Cv at ${t} K`, gap],
  ];
  return (
    <Panel title="Thermal properties (Cp − Cv)">
      <FieldList fields={fields} />
      <p className="mt-3 text-xs text-ink-muted">
        {CP_CORRECTION_NOTE} Computed per mole of formula units, like the stored heat capacities.
      </p>
    </Panel>
  );
}
