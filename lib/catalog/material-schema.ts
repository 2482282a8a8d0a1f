import { z } from 'zod';
import { crystalSystem, parseFormula, ScienceInputError, type CrystalSystem } from '@/lib/science';
import { optionalInteger, optionalText, requiredText } from './fields';

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
