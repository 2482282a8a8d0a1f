import { convertEntropy, convertFrequency, type EntropyUnit, type FrequencyUnit } from '@/lib/science/units';
import { irrepBranch, normalizeIrrep } from '@/lib/science/symmetry';
import { IMPORT_QUANTITIES, type ImportableKind, type ImportQuantity } from './columns';
import { excerpt, type RowError } from './errors';
import type { MissingCatalog } from './create-missing';
import { notANumberReason, parseDecimal } from './numbers';
import { isDimensionless, parseUnit, singleUnitOf, unitsOf, type DefaultUnits, type ImportUnit } from './units';
import { parseSite, parseTensorCell, tensorMeanMismatch, valueOfTensor } from './tensor-cells';
import {
  ACTIVITY_VALUES,
  BRANCH_VALUES,
  SAMPLE_FORM_VALUES,
  TECHNIQUE_VALUES,
  type Activity,
  type Branch,
  type SampleForm,
  type Technique,
} from './vocabulary';

/** What a row may refer to, by the handles people write in files. */
export interface ImportReferences {
  /** `elements`: the reduced formula's element counts, where known (Born-charge sites are checked against them). */
  materials: Map<string, { id: string; atomsPerFormulaUnit: number; atomsInCell?: number | null; elements?: Readonly<Record<string, number>> }>;
  sources: Map<string, string>;
  methods: Map<string, string>;
}

/** One validated row, in canonical units, ready to store. */
export interface ValidRow {
  materialId: string;
  sourceId: string;
  methodId: string | null;
  quantity: ImportQuantity;
  value: number;
  valueText: string;
  unit: ImportUnit;
  uncertainty: number | null;
  uncertaintyText: string | null;
  temperatureK: number | null;
  /** The temperature as written, kept for exports. */
  temperatureText: string | null;
  irrep: string | null;
  irrepNormalized: string | null;
  branch: Branch | null;
  degeneracy: number | null;
  activity: Activity | null;
  notes: string | null;
  technique: Technique | null;
  laserWavelengthNm: number | null;
  sampleForm: SampleForm | null;
  modeIndex: number | null;
  /** Born charges: the atom ("Ga", "O2"). */
  site: string | null;
  /** A Born charge's nine tensor components or a dielectric constant's three principal values; value is then their diagonal mean. */
  components: number[] | null;
  /** The identifying fields joined; equal identities are "identical rows". */
  identity: string;
}

export interface RowContext {
  kind: ImportableKind;
  references: ImportReferences;
  units?: DefaultUnits;
  /** Column key → the name to show in errors (the file's header text). */
  columnName: (key: string) => string;
  /** Calculations with createMissing: resolves (creates) the materials and methods the workspace lacks. */
  missing?: MissingCatalog;
}

export type { CellReader } from './column-def';
import type { CellReader } from './column-def';

const enumKey = (text: string) =>
  text
    .trim()
    .toLowerCase()
    .replace(/\s*\+\s*/g, '+')
    .replace(/[\s_]+/g, '-');

function pickEnum<T extends string>(values: readonly T[], text: string): T | null {
  const key = enumKey(text);
  return values.find((v) => v.toLowerCase() === key) ?? null;
}

function suggest(handles: Iterable<string>, text: string): string {
  const lower = text.toLowerCase();
  for (const h of handles) if (h.toLowerCase() === lower) return ` Did you mean "${h}"?`;
  return '';
}

/**
 * Validates one row into canonical values. Returns null and appends to `errors`
 * (one entry per bad cell, with row, column and reason) when anything is wrong.
 */
export function validateRow(row: number, read: CellReader, ctx: RowContext, errors: RowError[]): ValidRow | null {
  const before = errors.length;
  const fail = (key: string, reason: string, value?: string) => {
    errors.push({ row, column: ctx.columnName(key), reason, ...(value !== undefined ? { value: excerpt(value) } : {}) });
  };
  const cell = (key: string): string => (read(key) ?? '').trim();

  const number = (key: string, check?: (n: number) => string | null): { n: number; text: string } | null => {
    const text = cell(key);
    if (text === '') return null;
    const n = parseDecimal(text);
    if (n === null) {
      fail(key, notANumberReason(text), text);
      return null;
    }
    const problem = check?.(n);
    if (problem) {
      fail(key, problem, text);
      return null;
    }
    return { n, text };
  };
  const wholeNumber = (key: string, min: number): number | null => {
    const got = number(key, (n) => (Number.isInteger(n) && n >= min ? null : `must be a whole number ≥ ${min}.`));
    return got ? got.n : null;
  };
  const required = (key: string): string | null => {
    const text = cell(key);
    if (text === '') fail(key, `"${key}" is required.`);
    return text === '' ? null : text;
  };
  const choice = <T extends string>(key: string, values: readonly T[]): T | null => {
    const text = cell(key);
    if (text === '') return null;
    const picked = pickEnum(values, text);
    if (!picked) fail(key, `"${excerpt(text)}" is not one of ${values.join(', ')}.`, text);
    return picked;
  };

  const refs = ctx.references;
  const materialName = required('material');
  let material = materialName === null ? undefined : refs.materials.get(materialName);
  if (materialName !== null && ctx.missing?.handlesMaterial(materialName)) material = ctx.missing.material(row, materialName, read, fail) ?? undefined;
  else if (materialName !== null && !material) fail('material', `Unknown material "${excerpt(materialName)}".${suggest(refs.materials.keys(), materialName)}`, materialName);

  const citeKey = required('source');
  const sourceId = citeKey === null ? undefined : refs.sources.get(citeKey);
  if (citeKey !== null && !sourceId) fail('source', `Unknown source "${excerpt(citeKey)}".${suggest(refs.sources.keys(), citeKey)}`, citeKey);

  let methodId: string | null = null;
  if (ctx.kind === 'calculations') {
    const label = required('method');
    methodId = label === null ? null : (refs.methods.get(label) ?? null);
    if (label !== null && ctx.missing?.handlesMethod(label)) methodId = ctx.missing.method(row, label, read, fail);
    else if (label !== null && !methodId) fail('method', `Unknown method "${excerpt(label)}".${suggest(refs.methods.keys(), label)}`, label);
  }

  const quantityText = required('quantity');
  const quantity = quantityText === null ? null : pickEnum(IMPORT_QUANTITIES, quantityText);
  if (quantityText !== null && !quantity) fail('quantity', `"${excerpt(quantityText)}" is not one of ${IMPORT_QUANTITIES.join(', ')}.`, quantityText);

  let unit: ImportUnit | null = null;
  if (quantity) {
    const unitText = cell('unit');
    if (unitText !== '') {
      unit = parseUnit(quantity, unitText);
      if (!unit && isDimensionless(quantity)) fail('unit', `A dielectric constant has no unit, got "${excerpt(unitText)}"; leave the unit cell empty or write 1.`, unitText);
      else if (!unit && quantity === 'born-charge') fail('unit', `A Born charge is in units of the elementary charge e, got "${excerpt(unitText)}"; leave the unit cell empty or write e.`, unitText);
      else if (!unit) fail('unit', `Unknown ${quantity} unit "${excerpt(unitText)}"; use one of ${unitsOf(quantity).join(', ')}.`, unitText);
    } else if (singleUnitOf(quantity)) {
      unit = singleUnitOf(quantity);
    } else {
      unit = ctx.units?.[quantity as keyof DefaultUnits] ?? null;
      if (!unit) fail('unit', `No unit for this ${quantity}: fill the unit column or choose a unit for the whole file.`);
    }
  }

  const isMeasurement = ctx.kind === 'measurements';
  const tensorText = cell('tensor');
  let components: number[] | null = null;
  if (tensorText !== '' && quantity) {
    const parsed = parseTensorCell(quantity, tensorText);
    if ('reason' in parsed) fail('tensor', parsed.reason, tensorText);
    else components = parsed.components;
  }
  let valueText: string | null = cell('value') === '' && tensorText !== '' ? '' : required('value');
  let raw: number | null = null;
  if (valueText === '') {
    const derived = components ? valueOfTensor(components, tensorText) : null;
    raw = derived?.value ?? null;
    valueText = derived?.text ?? null;
  } else if (valueText !== null) {
    raw = parseDecimal(valueText);
    if (raw === null) fail('value', notANumberReason(valueText), valueText);
    else if (quantity === 'frequency' && isMeasurement && raw <= 0) {
      fail('value', `A measured frequency must be > 0 (got ${excerpt(valueText)}); only calculations may carry zero or imaginary (negative) modes.`, valueText);
      raw = null;
    } else if (quantity !== null && isDimensionless(quantity) && raw < 1) {
      fail('value', `A dielectric constant is ≥ 1 (got ${excerpt(valueText)}); write ε itself, not χ = ε − 1.`, valueText);
      raw = null;
    } else if (quantity === 'born-charge') {
      const mismatch = components ? tensorMeanMismatch(raw, valueText, components) : null;
      if (mismatch) {
        fail('value', mismatch, valueText);
        raw = null;
      } else if (Math.abs(raw) > 20) {
        fail('value', `A Born effective charge of ${excerpt(valueText)} e is beyond ±20 e; charges are of a few e (anomalous ones reach about 7–8). Is it a sum over atoms, or another unit?`, valueText);
        raw = null;
      }
    } else if (quantity !== 'frequency' && raw < 0) {
      fail('value', `${quantity === 'entropy' ? 'An entropy' : 'A heat capacity'} cannot be negative (got ${excerpt(valueText)}).`, valueText);
      raw = null;
    }
  }
  const uncertainty = isMeasurement ? number('uncertainty', (n) => (n >= 0 ? null : 'An uncertainty must be ≥ 0.')) : null;
  const temperature = number('temperature_K', (n) => (n >= 0 ? null : `A temperature cannot be below 0 K (got ${n}).`));
  if ((quantity === 'entropy' || quantity === 'heat-capacity') && !temperature && cell('temperature_K') === '') {
    fail('temperature_K', `${quantity === 'entropy' ? 'An entropy' : 'A heat capacity'} needs its temperature (temperature_K).`);
  }

  let irrep: string | null = cell('irrep') || null;
  let irrepNormalized: string | null = null;
  let labelBranch: Branch | undefined;
  if (irrep) {
    try {
      irrepNormalized = normalizeIrrep(irrep);
      labelBranch = irrepBranch(irrep);
    } catch (e) {
      fail('irrep', `"${excerpt(irrep)}" is not an irreducible-representation label: ${excerpt((e as Error).message, 120)}`, irrep);
      irrep = null;
    }
  }
  const branchText = cell('branch');
  let branch: Branch | null = null;
  if (branchText !== '' && branchText !== '-' && branchText !== '—') {
    branch = pickEnum(BRANCH_VALUES, branchText.toUpperCase());
    if (!branch) fail('branch', `"${excerpt(branchText)}" is not one of ${BRANCH_VALUES.join(', ')}.`, branchText);
    else if (labelBranch && labelBranch !== branch) fail('branch', `Branch ${branch} contradicts the irrep label "${excerpt(irrep ?? '')}".`, branchText);
  } else branch = labelBranch ?? null;

  const degeneracy = wholeNumber('degeneracy', 1);
  const activity = choice('activity', ACTIVITY_VALUES);
  const technique = isMeasurement ? choice('technique', TECHNIQUE_VALUES) : null;
  const sampleForm = isMeasurement ? choice('sample_form', SAMPLE_FORM_VALUES) : null;
  const laser = isMeasurement ? number('laser_nm', (n) => (n > 0 ? null : 'A laser wavelength must be > 0 nm.')) : null;
  const modeIndex = isMeasurement ? null : wholeNumber('mode_index', 1);
  const siteText = cell('site');
  let site: string | null = null;
  if (quantity === 'born-charge') {
    if (siteText === '') fail('site', 'A Born charge needs its atom in the site column, e.g. "Ga" or "O2".');
    else {
      const parsed = parseSite(siteText, material?.elements);
      if ('reason' in parsed) fail('site', parsed.reason, siteText);
      else site = parsed.site;
    }
  } else if (siteText !== '' && quantity) fail('site', `Only Born charges carry a site; leave it empty for a ${quantity} row.`, siteText);
  if (components && quantity !== 'born-charge' && valueText !== null && raw !== null && cell('value') !== '') {
    const mismatch = tensorMeanMismatch(raw, valueText, components);
    if (mismatch) fail('value', mismatch, valueText);
  }
  const notes = cell('notes') || null;
  if (notes !== null && notes.includes('\u0000')) fail('notes', `Notes contain a NUL byte (character ${notes.indexOf('\u0000') + 1}); remove it.`);

  if (errors.length > before || !material || !sourceId || !quantity || !unit || raw === null || valueText === null) return null;

  let value: number;
  let uncertaintyCanonical: number | null = null;
  if (quantity === 'frequency') {
    value = convertFrequency(raw, unit as FrequencyUnit, 'cm-1');
    if (uncertainty) uncertaintyCanonical = convertFrequency(uncertainty.n, unit as FrequencyUnit, 'cm-1');
  } else if (isDimensionless(quantity) || quantity === 'born-charge') {
    value = raw;
    if (uncertainty) uncertaintyCanonical = uncertainty.n;
  } else {
    value = convertEntropy(raw, unit as EntropyUnit, 'J/mol/K', material.atomsPerFormulaUnit);
    if (uncertainty) uncertaintyCanonical = convertEntropy(uncertainty.n, unit as EntropyUnit, 'J/mol/K', material.atomsPerFormulaUnit);
  }

  const identity = [
    ctx.kind,
    material.id,
    sourceId,
    methodId ?? '',
    quantity,
    String(raw),
    unit,
    temperature ? String(temperature.n) : '',
    irrepNormalized ?? '',
    branch ?? '',
    modeIndex ?? '',
    technique ?? '',
    sampleForm ?? '',
    // Appended only when present, so the identities (and hashes) of rows without them are unchanged.
    ...(site !== null || components !== null ? [site ?? '', components ? components.join(' ') : ''] : []),
  ].join('\u001f');

  return {
    materialId: material.id,
    sourceId,
    methodId,
    quantity,
    value,
    valueText,
    unit,
    uncertainty: uncertaintyCanonical,
    uncertaintyText: uncertainty ? uncertainty.text : null,
    temperatureK: temperature ? temperature.n : null,
    temperatureText: temperature ? temperature.text : null,
    irrep,
    irrepNormalized,
    branch,
    degeneracy,
    activity,
    notes,
    technique,
    laserWavelengthNm: laser ? laser.n : null,
    sampleForm,
    modeIndex,
    site,
    components,
    identity,
  };
}

/** Names and atom counts by id, for the mode-set warnings of a calculation import. */
export function modeSetFacts(refs: ImportReferences) {
  const materials = new Map<string, { name: string; atomsInCell: number | null }>();
  for (const [name, m] of refs.materials) materials.set(m.id, { name, atomsInCell: m.atomsInCell ?? null });
  const methods = new Map<string, string>();
  for (const [label, id] of refs.methods) methods.set(id, label);
  return {
    atomsInCell: (id: string) => materials.get(id)?.atomsInCell,
    materialName: (id: string) => materials.get(id)?.name ?? id,
    methodLabel: (id: string) => methods.get(id) ?? id,
  };
}
