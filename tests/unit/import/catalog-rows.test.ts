import { describe, expect, it } from 'vitest';
import { formulaUnitsInCell } from '@/lib/science/formula';
import { changedRowErrors, planCatalogImport, validateCatalogRow, type CatalogRow, type Stored } from '@/lib/import/catalog-rows';
import { MissingCatalog } from '@/lib/import/create-missing';
import type { RowError } from '@/lib/import/errors';

const reader = (cells: Record<string, string>) => (key: string) => cells[key];
const same = (key: string) => key;

function material(row: number, cells: Record<string, string>) {
  const errors: RowError[] = [];
  return { checked: validateCatalogRow('materials', row, reader(cells), same, errors) as CatalogRow<'materials'> | null, errors };
}

const NO_THERMAL = { thermalExpansionPerK: null, bulkModulusGpa: null, molarVolumeCm3: null };

describe('formulaUnitsInCell (common practice: a cell holds a whole number of formula units)', () => {
  it('counts Z for wurtzite GaN (4 atoms), rocksalt NaCl (2) and cubic SrTiO3 (5), and refuses counts that are no multiple', () => {
    expect(formulaUnitsInCell(4, 2)).toBe(2);
    expect(formulaUnitsInCell(2, 2)).toBe(1);
    expect(formulaUnitsInCell(5, 5)).toBe(1);
    expect(formulaUnitsInCell(3, 2)).toBeNull();
    expect(formulaUnitsInCell(1, 2)).toBeNull();
    expect(formulaUnitsInCell(0, 1)).toBeNull();
  });
  it('does not judge formulas with fractional occupancies (sites, not atoms)', () => {
    expect(formulaUnitsInCell(7, 2.33)).toBeNaN();
  });
});

describe('validateCatalogRow (materials)', () => {
  it('derives the reduced formula, atoms per formula unit and crystal system; tags are sorted and unique', () => {
    const { checked, errors } = material(2, { name: 'GaN-wz', formula: 'Ga2N2', space_group: '186', atoms_in_cell: '4', tags: 'Semiconductor, nitride, semiconductor' });
    expect(errors).toEqual([]);
    expect(checked?.record).toMatchObject({ reducedFormula: 'GaN', atomsPerFormulaUnit: 4, crystalSystem: 'hexagonal', atomsInCell: 4, tags: ['nitride', 'semiconductor'] });
    expect([...checked!.given]).toEqual(expect.arrayContaining(['name', 'formula', 'spaceGroup', 'atomsInCell', 'tags', 'reducedFormula', 'crystalSystem']));
    expect(checked!.given.has('externalId')).toBe(false);
  });
  it('names the column of each bad cell', () => {
    const { checked, errors } = material(3, { name: 'bad name!', formula: 'Zz3', space_group: '0', atoms_in_cell: 'four' });
    expect(checked).toBeNull();
    expect(errors.map((e) => e.column).sort()).toEqual(['atoms_in_cell', 'formula', 'name', 'space_group']);
    expect(errors.every((e) => e.row === 3)).toBe(true);
  });
});

describe('validateCatalogRow (materials): the Cp − Cv fields', () => {
  // MgO: α_V = 3.12e-5 K⁻¹, B_T = 160 GPa, V_m = 11.25 cm³/mol (handbook values from memory, as in tests/unit/science/heat-capacity.test.ts)
  const MGO = { name: 'MgO', formula: 'MgO', space_group: '225' };

  it('stores α_V, B_T and V_m as numbers, marks them given, and leaves them null when the cells are empty', () => {
    const { checked, errors } = material(2, { ...MGO, thermal_expansion_per_K: '3.12e-5', bulk_modulus_GPa: '160', molar_volume_cm3: '11.25' });
    expect(errors).toEqual([]);
    expect(checked?.record).toMatchObject({ thermalExpansionPerK: 3.12e-5, bulkModulusGpa: 160, molarVolumeCm3: 11.25 });
    expect([...checked!.given]).toEqual(expect.arrayContaining(['thermalExpansionPerK', 'bulkModulusGpa', 'molarVolumeCm3']));
    const empty = material(3, { ...MGO, thermal_expansion_per_K: ' ', bulk_modulus_GPa: '' });
    expect(empty.errors).toEqual([]);
    expect(empty.checked?.record).toMatchObject(NO_THERMAL);
    expect(empty.checked!.given.has('thermalExpansionPerK')).toBe(false);
  });

  it('accepts a negative expansion (ZrW2O8 contracts on heating) and an exponent in any case', () => {
    const { checked, errors } = material(2, { ...MGO, thermal_expansion_per_K: '-2.7E-5', bulk_modulus_GPa: '7.2e1' });
    expect(errors).toEqual([]);
    expect(checked?.record).toMatchObject({ thermalExpansionPerK: -2.7e-5, bulkModulusGpa: 72 });
  });

  it.each([
    ['thermal_expansion_per_K', '31.2', /too large for a solid.*percentage or a coefficient in 10⁻⁶ K⁻¹.*3\.12e-5/],
    ['thermal_expansion_per_K', '0.0312', /too large for a solid/],
    ['thermal_expansion_per_K', '-0.002', /too large for a solid/],
    ['thermal_expansion_per_K', '3,12e-5', /must be a number/],
    ['thermal_expansion_per_K', 'Infinity', /must be a number/],
    ['bulk_modulus_GPa', '0', /greater than 0 GPa/],
    ['bulk_modulus_GPa', '-5', /greater than 0 GPa/],
    ['bulk_modulus_GPa', '1600e3', /not below 2000 GPa/],
    ['bulk_modulus_GPa', 'stiff', /"stiff" is not a number/],
    ['molar_volume_cm3', '0', /greater than 0 cm³\/mol/],
    ['molar_volume_cm3', '1000', /not below 1000 cm³\/mol/],
    ['molar_volume_cm3', '11,25', /decimal comma.*11\.25/],
  ])('refuses %s = %s naming the row and the column', (column, value, reason) => {
    const { checked, errors } = material(7, { ...MGO, [column]: value });
    expect(checked).toBeNull();
    expect(errors).toHaveLength(1);
    expect(errors[0]).toMatchObject({ row: 7, column, value });
    expect(errors[0].reason).toMatch(reason);
  });

  it('reports every bad thermal cell of a row, each under its own column (as the file names it)', () => {
    const errors: RowError[] = [];
    const names: Record<string, string> = { thermal_expansion_per_K: 'alpha_V', bulk_modulus_GPa: 'B_T (GPa)', molar_volume_cm3: 'Vm' };
    validateCatalogRow('materials', 4, reader({ ...MGO, thermal_expansion_per_K: '12', bulk_modulus_GPa: '0', molar_volume_cm3: '-1' }), (k) => names[k] ?? k, errors);
    expect(errors.map((e) => [e.row, e.column])).toEqual([
      [4, 'alpha_V'],
      [4, 'B_T (GPa)'],
      [4, 'Vm'],
    ]);
  });
});

describe('planCatalogImport (materials)', () => {
  const stored: Array<Stored<'materials'>> = [
    { id: 'm1', retracted: false, name: 'GaN-wz', displayName: null, formula: 'GaN', reducedFormula: 'GaN', atomsPerFormulaUnit: 2, elementCounts: { Ga: 1, N: 1 }, spaceGroup: 186, crystalSystem: 'hexagonal', atomsInCell: 4, externalId: 'x-1', tags: ['nitride'], ...NO_THERMAL },
    { id: 'm2', retracted: true, name: 'Old-1', displayName: null, formula: 'MgO', reducedFormula: 'MgO', atomsPerFormulaUnit: 2, elementCounts: { Mg: 1, O: 1 }, spaceGroup: 225, crystalSystem: 'cubic', atomsInCell: 2, externalId: null, tags: [], ...NO_THERMAL },
  ];
  const rows = (list: Array<Record<string, string>>) => list.map((cells, i) => material(i + 2, cells).checked!);

  it('sorts rows into created, unchanged and changed, and reports in-file duplicates and taken names', () => {
    const plan = planCatalogImport(
      'materials',
      rows([
        { name: 'GaN-wz', formula: 'GaN', space_group: '186' },
        { name: 'GaN-renamed', formula: 'GaN', external_id: 'x-1' },
        { name: 'GaN-wz', formula: 'GaN', space_group: '216' },
        { name: 'AlN-wz', formula: 'AlN', space_group: '186', atoms_in_cell: '4' },
        { name: 'AlN-wz', formula: 'AlN', space_group: '186', atoms_in_cell: '4' },
        { name: 'Old-1', formula: 'MgO', space_group: '225' },
      ]),
      stored,
      same,
    );
    expect(plan.unchanged).toEqual([{ row: 2, id: 'm1', handle: 'GaN-wz' }]);
    expect(plan.changed.map((c) => [c.row, c.id, c.changes.map((x) => x.column)])).toEqual([[3, 'm1', ['name']]]);
    expect(plan.creates.map((c) => c.row)).toEqual([5, 7]);
    expect(plan.errors.map((e) => [e.row, e.column])).toEqual([
      [4, 'name'],
      [6, 'name'],
    ]);
    const messages = changedRowErrors('materials', plan.changed);
    expect(messages[0]).toMatchObject({ row: 3, column: 'name', value: 'GaN-renamed' });
    expect(messages[0].reason).toContain('stored GaN-wz, this file GaN-renamed');
  });

  it('a thermal value counts in the comparison: the same number is unchanged, another is a change with both values, an empty cell keeps it', () => {
    const withThermal: Array<Stored<'materials'>> = [{ ...stored[0], thermalExpansionPerK: 3.12e-5, bulkModulusGpa: 160, molarVolumeCm3: null }];
    const plan = planCatalogImport('materials', rows([{ name: 'GaN-wz', formula: 'GaN', external_id: 'x-1', thermal_expansion_per_K: '3.120e-5', bulk_modulus_GPa: '160.0' }]), withThermal, same);
    expect(plan.unchanged.map((u) => u.row)).toEqual([2]);
    const blanks = planCatalogImport('materials', rows([{ name: 'GaN-wz', formula: 'GaN', external_id: 'x-1', thermal_expansion_per_K: '', bulk_modulus_GPa: '' }]), withThermal, same);
    expect(blanks.unchanged.map((u) => u.row)).toEqual([2]);
    const changed = planCatalogImport('materials', rows([{ name: 'GaN-wz', formula: 'GaN', external_id: 'x-1', bulk_modulus_GPa: '188', molar_volume_cm3: '13.9' }]), withThermal, same);
    expect(changed.changed.map((c) => c.changes.map((x) => [x.column, x.stored, x.incoming]))).toEqual([
      [
        ['bulk_modulus_GPa', '160', '188'],
        ['molar_volume_cm3', '(empty)', '13.9'],
      ],
    ]);
    expect(changed.changed[0].after).toMatchObject({ thermalExpansionPerK: 3.12e-5, bulkModulusGpa: 188, molarVolumeCm3: 13.9 });
    expect(changedRowErrors('materials', changed.changed)[0].reason).toContain('stored 160, this file 188');
  });
});

describe('MissingCatalog (createMissing)', () => {
  it('creates a material once, resolves later rows to it, and flags a later row whose catalogue cells disagree', () => {
    const references = { materials: new Map(), sources: new Map(), methods: new Map() };
    let n = 0;
    const missing = new MissingCatalog(references, same, new Set(['Retired-method']), () => `new-${++n}`);
    const errors: Array<[string, string]> = [];
    const fail = (key: string, reason: string) => errors.push([key, reason]);
    const cells = { material_formula: 'NaCl', material_space_group: '225', material_atoms_in_cell: '2' };
    expect(missing.material(2, 'NaCl-rs', reader(cells), fail)).toMatchObject({ id: 'new-1', atomsPerFormulaUnit: 2, atomsInCell: 2 });
    expect(missing.material(3, 'NaCl-rs', reader({}), fail)?.id).toBe('new-1');
    expect(missing.material(4, 'NaCl-rs', reader({ ...cells, material_space_group: '221' }), fail)).toBeNull();
    expect(errors).toEqual([['material_space_group', expect.stringContaining('Conflicts with row 2')]]);
    expect(missing.method(5, 'Retired-method', reader({ method_functional: 'PBE' }), fail)).toBeNull();
    expect(missing.method(6, 'Fresh', reader({}), fail)).toBeNull();
    expect(errors.slice(1).map((e) => e[0])).toEqual(['method', 'method']);
    expect(missing.takeNew().materials.map((m) => m.id)).toEqual(['new-1']);
    expect(references.materials.get('NaCl-rs')?.id).toBe('new-1');
  });
});

describe('the wizard preview of catalogue kinds and createMissing', () => {
  // previewCsv is what the browser's worker runs before upload
  const refs = { materials: [], sources: [{ citeKey: 'calc2026', id: 's1' }], methods: [] };

  it('checks materials rows, flags duplicates and unknown columns, and shows what each valid row stores', async () => {
    const { previewCsv } = await import('@/lib/import/preview');
    const result = previewCsv('name,formula,space_group,atoms_in_cell,colour\nGaN-wz,GaN,186,4,\nGaN-wz,GaN,186,4,\nBad,GaN,186,3,\n', { kind: 'materials', references: refs });
    expect(result.errors.map((e) => [e.row, e.column])).toEqual([
      [1, 'colour'],
      [3, 'name'],
      [4, 'atoms_in_cell'],
    ]);
    expect(result.preview[0]).toMatchObject({ ok: true, stored: { label: 'GaN-wz', value: expect.stringContaining('GaN · SG 186 (hexagonal) · Z = 2') } });
    expect(result.preview[1].ok).toBe(false);
  });

  it('accepts unknown materials and methods of a calculation file only with createMissing', async () => {
    const { previewCsv } = await import('@/lib/import/preview');
    const text = 'material,method,quantity,value,unit,source,material_formula,material_space_group,material_atoms_in_cell,method_functional\nNaCl-rs,PBE-new,frequency,164,cm-1,calc2026,NaCl,225,2,PBE\n';
    expect(previewCsv(text, { kind: 'calculations', references: refs }).errorCount).toBe(2);
    const withFlag = previewCsv(text, { kind: 'calculations', references: refs, createMissing: true });
    expect(withFlag.errors).toEqual([]);
    expect(withFlag.validCount).toBe(1);
  });
});
