import { z } from 'zod';
import { crystalSystem, parseFormula, ScienceInputError, type CrystalSystem } from '@/lib/science';
import { optionalDecimal, optionalInteger, optionalText, requiredText } from './fields';

export const MATERIAL_NAME_PATTERN = /^[A-Za-z0-9][A-Za-z0-9._+()-]*$/;
export const TAG_PATTERN = /^[a-z0-9][a-z0-9 ._+-]*$/;

/** "oxide, Semiconductor , oxide" → ["oxide", "semiconductor"] (lower case, unique, in order). */
export function parseTags(value: unknown): string[] {
  const list = Array.isArray(value) ? value.map(String) : typeof value === 'string' ? value.split(',') : [];
  const out: string[] = [];
  for (const raw of list) {
    const tag = raw.trim().toLowerCase();
    if (tag && !out.includes(tag)) out.push(tag);
  }
  return out;
}

function formulaIssue(formula: string): string | null {
  try {
    parseFormula(formula);
    return null;
  } catch (e) {
    if (e instanceof ScienceInputError) return e.message.replace(/^formula: /, 'Formula ');
    throw e;
  }
}

/** What the three thermal fields are for, said beside them wherever they are shown or edited. */
export const CP_CORRECTION_NOTE = 'Used only for the Cp − Cv correction of heat-capacity benchmarks (Cp − Cv = α_V² B_T V_m T), and only when all three are given.';

/**
 * Bounds of the thermal fields. |α_V| of solids near room temperature stays below about 3 × 10⁻⁴ K⁻¹, so a
 * larger value is almost always a percentage or a coefficient written in 10⁻⁶ K⁻¹. No crystal reaches
 * 2000 GPa (diamond is about 440) or 1000 cm³ per mole of formula units.
 */
export const THERMAL_EXPANSION_MAX_PER_K = 1e-3;
export const BULK_MODULUS_MAX_GPA = 2000;
export const MOLAR_VOLUME_MAX_CM3 = 1000;

const thermalExpansionField = optionalDecimal('The thermal expansion', (n) =>
  Math.abs(n) > THERMAL_EXPANSION_MAX_PER_K
    ? `A volumetric thermal expansion of ${n} K⁻¹ is too large for a solid (|α| ≤ 1e-3 K⁻¹; NaCl has about 1.2e-4). It looks like a percentage or a coefficient in 10⁻⁶ K⁻¹: write 31.2 × 10⁻⁶ K⁻¹ as 3.12e-5.`
    : null,
);
const bulkModulusField = optionalDecimal('The bulk modulus', (n) =>
  n <= 0 ? 'The bulk modulus must be greater than 0 GPa.' : n >= BULK_MODULUS_MAX_GPA ? `A bulk modulus of ${n} GPa is not below ${BULK_MODULUS_MAX_GPA} GPa (diamond has about 440): give it in GPa, not kbar or MPa.` : null,
);
const molarVolumeField = optionalDecimal('The molar volume', (n) =>
  n <= 0
    ? 'The molar volume must be greater than 0 cm³/mol.'
    : n >= MOLAR_VOLUME_MAX_CM3
      ? `A molar volume of ${n} cm³/mol is not below ${MOLAR_VOLUME_MAX_CM3} cm³/mol: give cm³ per mole of formula units (molar mass ÷ density; MgO has about 11.3).`
      : null,
);

/** Material fields as typed in the form or sent by the API. */
export const materialInputSchema = z.object({
  name: requiredText('A name', 64).pipe(
    z.string().regex(MATERIAL_NAME_PATTERN, 'Use letters, digits and . _ + - ( ) only, starting with a letter or digit (e.g. "GaN-wz").'),
  ),
  displayName: optionalText(200),
  formula: requiredText('A formula', 200).superRefine((value, ctx) => {
    const issue = formulaIssue(value);
    if (issue) ctx.addIssue({ code: 'custom', message: issue });
  }),
  spaceGroup: optionalInteger('The space group', 1, 230),
  atomsInCell: optionalInteger('Atoms in the primitive cell', 1, 10000),
  externalId: optionalText(200),
  tags: z.preprocess(parseTags, z.array(z.string().max(40, 'A tag has at most 40 characters.').regex(TAG_PATTERN, 'Tags use letters, digits, spaces and . _ + - only.')).max(20, 'At most 20 tags.')),
  thermalExpansionPerK: thermalExpansionField.meta({ description: 'Volumetric thermal expansion α_V in K⁻¹ (three times the linear coefficient of a cubic crystal), e.g. 3.12e-5. For the Cp − Cv correction only.' }),
  bulkModulusGpa: bulkModulusField.meta({ description: 'Isothermal bulk modulus B_T in GPa, > 0 and < 2000. For the Cp − Cv correction only.' }),
  molarVolumeCm3: molarVolumeField.meta({ description: 'Molar volume V_m in cm³ per mole of formula units, > 0 and < 1000. For the Cp − Cv correction only.' }),
});

export type MaterialInput = z.infer<typeof materialInputSchema>;

export interface MaterialDerived {
  reducedFormula: string;
  atomsPerFormulaUnit: number;
  elementCounts: Record<string, number>;
  crystalSystem: CrystalSystem | null;
}

/** The values computed from what was typed: reduced formula, atoms per formula unit, crystal system. */
export function deriveMaterial(input: Pick<MaterialInput, 'formula' | 'spaceGroup'>): MaterialDerived {
  const parsed = parseFormula(input.formula);
  return {
    reducedFormula: parsed.reduced,
    atomsPerFormulaUnit: parsed.atomsPerFormulaUnit,
    elementCounts: parsed.counts,
    crystalSystem: input.spaceGroup ? crystalSystem(input.spaceGroup) : null,
  };
}

export const CRYSTAL_SYSTEMS = ['triclinic', 'monoclinic', 'orthorhombic', 'tetragonal', 'trigonal', 'hexagonal', 'cubic'] as const;
