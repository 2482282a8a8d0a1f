/**
 * Rows of a catalogue import (materials, methods, sources): each row checked with
 * the same zod schemas as the forms and the API (lib/catalog/*-schema.ts), turned
 * into the record it would store, then matched against the stored records.
 *
 * Identity (what "the same record" means):
 * - a material is the stored one with the same external identifier, or else the one
 *   with the same reduced formula, space group and name;
 * - a method is the one with the same label; a source the one with the same cite key.
 * A row matching a stored record with the same values is "unchanged" (reported, nothing
 * written). A row with other values is "changed": the caller refuses it (row, column,
 * stored value, new value) unless updates were asked for. Only columns the row fills
 * are compared and updated: an empty cell or a column the file lacks keeps the stored
 * value. Two rows of one file with the same identity are refused.
 */
import type { z } from 'zod';
import { materialInputSchema } from '@/lib/catalog/material-schema';
import { requiredText } from '@/lib/catalog/fields';
import { crystalSystem } from '@/lib/science/symmetry';
import { ScienceInputError } from '@/lib/science/errors';
import { methodInputSchema } from '@/lib/catalog/method-schema';
import { sourceInputSchema, type SourceInput } from '@/lib/catalog/source-schema';
import { storedSource } from '@/lib/citations/stored';
import { formulaUnitsInCell, parseFormula } from '@/lib/science/formula';
import type { CatalogKind } from './catalog-columns';
import { excerpt, type RowError } from './errors';
import type { CellReader } from './column-def';

export interface MaterialRecord {
  name: string;
  displayName: string | null;
  formula: string;
  reducedFormula: string;
  atomsPerFormulaUnit: number;
  elementCounts: Record<string, number>;
  spaceGroup: number | null;
  crystalSystem: string | null;
  atomsInCell: number | null;
  externalId: string | null;
  tags: string[];
  thermalExpansionPerK: number | null;
  bulkModulusGpa: number | null;
  molarVolumeCm3: number | null;
}

export interface MethodRecord {
  label: string;
  functional: string;
  dispersion: string | null;
  pseudopotential: string | null;
  cutoffEv: number | null;
  kGrid: [number, number, number] | null;
  qGrid: [number, number, number] | null;
  smearing: string | null;
  approach: 'perturbation' | 'finite-displacement' | null;
  nonAnalyticCorrection: boolean | null;
  notes: string | null;
}

export type SourceRow = ReturnType<typeof storedSource>;

export type CatalogRecord<K extends CatalogKind> = K extends 'materials' ? MaterialRecord : K extends 'methods' ? MethodRecord : SourceRow;

/** One checked row: the record it would store and the fields the row gave (the others are left as stored). */
export interface CatalogRow<K extends CatalogKind = CatalogKind> {
  row: number;
  record: CatalogRecord<K>;
  given: ReadonlySet<string>;
}

/** Column key in the file ↔ field of the record, per kind (the order of the template). */
export const CATALOG_FIELDS: Record<CatalogKind, ReadonlyArray<readonly [column: string, field: string]>> = {
  materials: [
    ['name', 'name'],
    ['formula', 'formula'],
    ['display_name', 'displayName'],
    ['space_group', 'spaceGroup'],
    ['atoms_in_cell', 'atomsInCell'],
    ['external_id', 'externalId'],
    ['tags', 'tags'],
    ['thermal_expansion_per_K', 'thermalExpansionPerK'],
    ['bulk_modulus_GPa', 'bulkModulusGpa'],
    ['molar_volume_cm3', 'molarVolumeCm3'],
  ],
  methods: [
    ['label', 'label'],
    ['functional', 'functional'],
    ['dispersion', 'dispersion'],
    ['pseudopotential', 'pseudopotential'],
    ['cutoff_eV', 'cutoffEv'],
    ['k_grid', 'kGrid'],
    ['q_grid', 'qGrid'],
    ['smearing', 'smearing'],
    ['approach', 'approach'],
    ['lo_to_correction', 'nonAnalyticCorrection'],
    ['notes', 'notes'],
  ],
  sources: [
    ['cite_key', 'citeKey'],
    ['kind', 'kind'],
    ['doi', 'doi'],
    ['title', 'title'],
    ['authors', 'authors'],
    ['year', 'year'],
    ['venue', 'venue'],
    ['volume', 'volume'],
    ['pages', 'pages'],
    ['url', 'url'],
    ['notebook_ref', 'notebookRef'],
    ['note', 'note'],
  ],
};

/** The record field a source input field is stored in (authors are stored as a list). */
const SOURCE_STORED_FIELD: Record<string, string> = { authors: 'authorList' };

function readInput(kind: CatalogKind, read: CellReader): { input: Record<string, string>; given: Set<string> } {
  const input: Record<string, string> = {};
  const given = new Set<string>();
  for (const [column, field] of CATALOG_FIELDS[kind]) {
    const text = (read(column) ?? '').trim();
    if (text === '') continue;
    input[field] = text;
    given.add(kind === 'sources' ? (SOURCE_STORED_FIELD[field] ?? field) : field);
  }
  return { input, given };
}

function pushIssues(row: number, kind: CatalogKind, issues: readonly z.core.$ZodIssue[], input: Record<string, string>, columnName: (key: string) => string, errors: RowError[]) {
  const columnOf = new Map(CATALOG_FIELDS[kind].map(([c, f]) => [f, c]));
  const seen = new Set<string>();
  for (const issue of issues) {
    const field = String(issue.path[0] ?? '');
    const column = columnOf.get(field) ?? null;
    const key = `${column}|${issue.message}`;
    if (seen.has(key)) continue;
    seen.add(key);
    const value = input[field];
    errors.push({ row, column: column === null ? null : columnName(column), reason: issue.message, ...(value !== undefined ? { value: excerpt(value) } : {}) });
  }
}

/** The material form's schema with the formula taken as text: the row parses it once, for the check and the derived fields alike. */
const materialRowSchema = materialInputSchema.extend({ formula: requiredText('A formula', 200) });

function materialRow(row: number, read: CellReader, columnName: (key: string) => string, errors: RowError[]): CatalogRow<'materials'> | null {
  const { input, given } = readInput('materials', read);
  const parsed = materialRowSchema.safeParse(input);
  let formula: ReturnType<typeof parseFormula> | null = null;
  const formulaText = parsed.success ? parsed.data.formula : typeof input.formula === 'string' ? input.formula : null;
  if (formulaText) {
    try {
      formula = parseFormula(formulaText);
    } catch (e) {
      if (!(e instanceof ScienceInputError)) throw e;
      errors.push({ row, column: columnName('formula'), reason: e.message.replace(/^formula: /, 'Formula '), value: excerpt(formulaText) });
    }
  }
  if (!parsed.success) {
    pushIssues(row, 'materials', parsed.error.issues, input, columnName, errors);
    return null;
  }
  if (!formula) return null;
  const m = parsed.data;
  if (m.atomsInCell !== undefined && formulaUnitsInCell(m.atomsInCell, formula.atomsPerReducedFormulaUnit) === null) {
    const perUnit = formula.atomsPerReducedFormulaUnit;
    errors.push({
      row,
      column: columnName('atoms_in_cell'),
      reason: `${m.atomsInCell} atoms contradict the formula ${m.formula}: a primitive cell holds a whole number of formula units of ${perUnit} atoms (${formula.reduced}), so 1×, 2×, … ${perUnit}.`,
      value: excerpt(String(input.atomsInCell)),
    });
    return null;
  }
  if (given.has('formula')) {
    given.add('reducedFormula');
    given.add('atomsPerFormulaUnit');
    given.add('elementCounts');
  }
  if (given.has('spaceGroup')) given.add('crystalSystem');
  return {
    row,
    given,
    record: {
      name: m.name,
      displayName: m.displayName ?? null,
      formula: m.formula,
      // as deriveMaterial (lib/catalog/material-schema.ts) derives them for the form
      reducedFormula: formula.reduced,
      atomsPerFormulaUnit: formula.atomsPerFormulaUnit,
      elementCounts: formula.counts,
      spaceGroup: m.spaceGroup ?? null,
      crystalSystem: m.spaceGroup ? crystalSystem(m.spaceGroup) : null,
      atomsInCell: m.atomsInCell ?? null,
      externalId: m.externalId ?? null,
      // Stored tags have no order: compare and store them sorted.
      tags: [...m.tags].sort(),
      thermalExpansionPerK: m.thermalExpansionPerK ?? null,
      bulkModulusGpa: m.bulkModulusGpa ?? null,
      molarVolumeCm3: m.molarVolumeCm3 ?? null,
    },
  };
}

function methodRow(row: number, read: CellReader, columnName: (key: string) => string, errors: RowError[]): CatalogRow<'methods'> | null {
  const { input, given } = readInput('methods', read);
  const parsed = methodInputSchema.safeParse(input);
  if (!parsed.success) {
    pushIssues(row, 'methods', parsed.error.issues, input, columnName, errors);
    return null;
  }
  const m = parsed.data;
  return {
    row,
    given,
    record: {
      label: m.label,
      functional: m.functional,
      dispersion: m.dispersion ?? null,
      pseudopotential: m.pseudopotential ?? null,
      cutoffEv: m.cutoffEv ?? null,
      kGrid: m.kGrid ?? null,
      qGrid: m.qGrid ?? null,
      smearing: m.smearing ?? null,
      approach: m.approach ?? null,
      nonAnalyticCorrection: m.nonAnalyticCorrection ?? null,
      notes: m.notes ?? null,
    },
  };
}

function sourceRow(row: number, read: CellReader, columnName: (key: string) => string, errors: RowError[]): CatalogRow<'sources'> | null {
  const { input, given } = readInput('sources', read);
  const parsed = sourceInputSchema.safeParse({ kind: 'journal-article', ...input });
  if (!parsed.success) {
    pushIssues(row, 'sources', parsed.error.issues, input, columnName, errors);
    return null;
  }
  return sourceFromInput(row, parsed.data, given);
}

/** A source checked elsewhere (a parsed BibTeX, RIS or CSL-JSON entry): every field it has counts as given. */
export function sourceFromInput(row: number, input: SourceInput, given?: Set<string>): CatalogRow<'sources'> {
  const record = storedSource(input);
  const fields = given ?? new Set(Object.entries(record).filter(([, v]) => v !== null && !(Array.isArray(v) && v.length === 0)).map(([k]) => k));
  fields.add('kind');
  fields.add('citeKey');
  if (fields.has('authorList')) fields.add('authors');
  fields.add('gaps');
  return { row, record, given: fields };
}

/** Checks one catalogue row; null (and errors appended, one per bad cell) when it cannot be stored. */
export function validateCatalogRow(kind: CatalogKind, row: number, read: CellReader, columnName: (key: string) => string, errors: RowError[]): CatalogRow | null {
  if (kind === 'materials') return materialRow(row, read, columnName, errors);
  if (kind === 'methods') return methodRow(row, read, columnName, errors);
  return sourceRow(row, read, columnName, errors);
}

// ---------------------------------------------------------------- matching

/**
 * `revivable`: retracted only because the import that created it was undone (nothing else retracted it). A
 * method's label and a source's cite key stay reserved by a retracted record, so a corrected file imported
 * after an undo restores such a record with the row's values instead of being refused.
 */
export type Stored<K extends CatalogKind> = CatalogRecord<K> & { id: string; retracted: boolean; revivable?: boolean };

export interface FieldChange {
  column: string;
  field: string;
  stored: string;
  incoming: string;
}

export interface CatalogPlan<K extends CatalogKind> {
  creates: Array<CatalogRow<K>>;
  /** Rows whose record exists with other values; `after` is the stored record with the row's given fields. */
  changed: Array<{ row: number; id: string; before: Stored<K>; after: CatalogRecord<K>; changes: FieldChange[] }>;
  unchanged: Array<{ row: number; id: string; handle: string }>;
  /** Rows that restore a record retracted by the undo of the import that created it, with the row's values. */
  revives: Array<{ row: number; id: string; before: Stored<K>; record: CatalogRecord<K> }>;
  errors: RowError[];
}

/** A value as an error message shows it. */
export function shownValue(value: unknown): string {
  if (value === null || value === undefined || (Array.isArray(value) && value.length === 0)) return '(empty)';
  if (Array.isArray(value)) {
    if (value.every((v) => typeof v === 'number')) return value.join('x');
    if (value.every((v) => typeof v === 'string')) return value.join(', ');
    return value.map((v) => [v.family, v.given].filter(Boolean).join(', ') || v.literal).join('; ');
  }
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  return excerpt(String(value));
}

const same = (a: unknown, b: unknown) => JSON.stringify(a ?? null) === JSON.stringify(b ?? null);

/** Fields that are derived and never compared on their own (their source column is). */
const DERIVED = new Set(['reducedFormula', 'atomsPerFormulaUnit', 'elementCounts', 'crystalSystem', 'gaps', 'authors']);

function compare<K extends CatalogKind>(kind: K, row: CatalogRow<K>, stored: Stored<K>, columnName: (key: string) => string): { after: CatalogRecord<K>; changes: FieldChange[] } {
  const after = { ...(stored as unknown as Record<string, unknown>) };
  delete after.id;
  delete after.retracted;
  delete after.revivable;
  const changes: FieldChange[] = [];
  const record = row.record as unknown as Record<string, unknown>;
  for (const field of row.given) {
    after[field] = record[field];
    if (DERIVED.has(field)) continue;
    if (!same(record[field], (stored as unknown as Record<string, unknown>)[field])) {
      const column = CATALOG_FIELDS[kind].find(([, f]) => f === field || SOURCE_STORED_FIELD[f] === field)?.[0] ?? field;
      changes.push({ column: columnName(column), field, stored: shownValue((stored as unknown as Record<string, unknown>)[field]), incoming: shownValue(record[field]) });
    }
  }
  if (kind === 'sources' && changes.length) {
    const merged = after as unknown as SourceRow;
    after.gaps = storedSource({ ...merged, authors: merged.authorList ?? [], editors: merged.editorList ?? [] } as unknown as SourceInput).gaps;
  }
  return { after: after as unknown as CatalogRecord<K>, changes };
}

const handleOf = (kind: CatalogKind, r: object) =>
  kind === 'materials' ? (r as MaterialRecord).name : kind === 'methods' ? (r as MethodRecord).label : (r as SourceRow).citeKey;

const materialKey = (m: Pick<MaterialRecord, 'reducedFormula' | 'spaceGroup' | 'name'>) => `${m.reducedFormula}\u001f${m.spaceGroup ?? ''}\u001f${m.name}`;

/**
 * Matches the checked rows of one file against the stored records of the workspace
 * (live and retracted): which rows create, which leave a record unchanged, which would
 * change one, and which are refused (duplicate identities in the file, a handle taken
 * by a different record, a retracted match, a DOI that is another source).
 */
export function planCatalogImport<K extends CatalogKind>(kind: K, rows: ReadonlyArray<CatalogRow<K>>, stored: ReadonlyArray<Stored<K>>, columnName: (key: string) => string): CatalogPlan<K> {
  const plan: CatalogPlan<K> = { creates: [], changed: [], unchanged: [], revives: [], errors: [] };
  const byHandle = new Map<string, Stored<K>>();
  const byExternal = new Map<string, Stored<K>>();
  const byMaterialKey = new Map<string, Stored<K>>();
  const byDoi = new Map<string, Stored<K>>();
  for (const s of stored) {
    const handle = handleOf(kind, s);
    // Material names are unique among live materials only: prefer the live one.
    if (!byHandle.has(handle) || !s.retracted) byHandle.set(handle, s);
    if (kind === 'materials') {
      const m = s as unknown as Stored<'materials'>;
      if (!s.retracted) {
        if (m.externalId) byExternal.set(m.externalId, s);
        byMaterialKey.set(materialKey(m), s);
      }
    }
    if (kind === 'sources') {
      const src = s as unknown as Stored<'sources'>;
      if (src.doi && !s.retracted) byDoi.set(src.doi, s);
    }
  }
  const firstRowOf = new Map<string, number>();
  const duplicate = (key: string, row: number, column: string, what: string): boolean => {
    const first = firstRowOf.get(key);
    if (first !== undefined) {
      plan.errors.push({ row, column: columnName(column), reason: `Duplicate ${what}: row ${first} of this file has the same. Each record may appear once.` });
      return true;
    }
    firstRowOf.set(key, row);
    return false;
  };

  for (const r of rows) {
    const handle = handleOf(kind, r.record);
    const handleColumn = kind === 'materials' ? 'name' : kind === 'methods' ? 'label' : 'cite_key';
    let dup = duplicate(`h:${handle}`, r.row, handleColumn, `${handleColumn.replace('_', ' ')} "${excerpt(handle)}"`);
    let match: Stored<K> | undefined;
    if (kind === 'materials') {
      const m = r.record as MaterialRecord;
      if (m.externalId) dup = duplicate(`x:${m.externalId}`, r.row, 'external_id', `external identifier "${excerpt(m.externalId)}"`) || dup;
      match = (m.externalId ? byExternal.get(m.externalId) : undefined) ?? byMaterialKey.get(materialKey(m));
      const named = byHandle.get(handle);
      if (!dup && named && !named.retracted && named.id !== match?.id) {
        const n = named as unknown as Stored<'materials'>;
        plan.errors.push({
          row: r.row,
          column: columnName('name'),
          reason: `The name "${excerpt(handle)}" is already the material with formula ${n.reducedFormula}, space group ${n.spaceGroup ?? '(none)'}${n.externalId ? `, external identifier ${n.externalId}` : ''}; this row is a different material (${m.reducedFormula}, space group ${m.spaceGroup ?? '(none)'}${m.externalId ? `, ${m.externalId}` : ''}). Choose another name.`,
          value: excerpt(handle),
        });
        continue;
      }
    } else {
      match = byHandle.get(handle);
      if (kind === 'sources') {
        const doi = (r.record as SourceRow).doi;
        if (doi) {
          dup = duplicate(`d:${doi}`, r.row, 'doi', `DOI ${doi}`) || dup;
          const owner = byDoi.get(doi);
          if (!dup && owner && owner.id !== match?.id) {
            plan.errors.push({ row: r.row, column: columnName('doi'), reason: `The DOI ${doi} is already the source "${(owner as unknown as SourceRow).citeKey}" in this workspace: cite that one.`, value: doi });
            continue;
          }
        }
      }
    }
    if (dup) continue;
    if (!match) {
      plan.creates.push(r);
      continue;
    }
    if (match.retracted && match.revivable) {
      plan.revives.push({ row: r.row, id: match.id, before: match, record: r.record });
      continue;
    }
    if (match.retracted) {
      plan.errors.push({ row: r.row, column: columnName(handleColumn), reason: `"${excerpt(handle)}" is a retracted ${kind.slice(0, -1)} of this workspace: restore it first (its handle stays reserved).`, value: excerpt(handle) });
      continue;
    }
    const { after, changes } = compare(kind, r, match, columnName);
    if (changes.length === 0) plan.unchanged.push({ row: r.row, id: match.id, handle });
    else plan.changed.push({ row: r.row, id: match.id, before: match, after, changes });
  }
  return plan;
}

/** The refusal of a changed row (updates were not asked for): one error per changed column. */
export function changedRowErrors(kind: CatalogKind, changed: CatalogPlan<CatalogKind>['changed']): RowError[] {
  const out: RowError[] = [];
  for (const c of changed)
    for (const ch of c.changes)
      out.push({
        row: c.row,
        column: ch.column,
        reason: `Differs from the stored ${kind.slice(0, -1)} "${excerpt(handleOf(kind, c.before))}": stored ${ch.stored}, this file ${ch.incoming}. Import with "update changed records" (onChange=update, curator or owner) to update it.`,
        value: ch.incoming,
      });
  return out;
}
