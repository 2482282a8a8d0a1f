import { index, integer, primaryKey, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { sql } from 'drizzle-orm';
import { organization, user } from './auth';
import type { PersonName } from '@/lib/citations/names';
import { createdAt, id, retraction, timestamp } from './columns';
import { SOURCE_KINDS, APPROACHES } from '@/lib/record-kinds';

export { SOURCE_KINDS, APPROACHES };

export const material = sqliteTable(
  'material',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    /** Short unique handle used by imports and the API, e.g. "GaN-wz". */
    name: text().notNull(),
    displayName: text(),
    formula: text().notNull(),
    reducedFormula: text().notNull(),
    atomsPerFormulaUnit: real().notNull(),
    elementCounts: text({ mode: 'json' }).$type<Record<string, number>>().notNull(),
    spaceGroup: integer(),
    crystalSystem: text(),
    atomsInCell: integer(),
    externalId: text(),
    /**
     * For the Cp − Cv correction of heat-capacity benchmarks (lib/science/thermodynamics.ts cpMinusCv),
     * used only when all three are given: volumetric thermal expansion α in K⁻¹, isothermal bulk
     * modulus B in GPa, molar volume V_m in cm³ per mole of formula units.
     */
    thermalExpansionPerK: real(),
    bulkModulusGpa: real(),
    molarVolumeCm3: real(),
    /** The catalogue or calculation import (import_batch.id) that created the record; null when typed in. Undo of that import retracts it. */
    importId: text(),
    createdBy: text().references(() => user.id),
    createdAt: createdAt(),
    updatedAt: timestamp(),
    ...retraction(),
  },
  (t) => [
    uniqueIndex('material_name_uq').on(t.workspaceId, t.name).where(sql`retracted_at is null`),
    index('material_formula_idx').on(t.workspaceId, t.reducedFormula),
    index('material_import_idx').on(t.workspaceId, t.importId),
  ],
);

export const materialTag = sqliteTable(
  'material_tag',
  {
    materialId: text()
      .notNull()
      .references(() => material.id, { onDelete: 'cascade' }),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    tag: text().notNull(),
  },
  (t) => [primaryKey({ columns: [t.materialId, t.tag] }), index('material_tag_idx').on(t.workspaceId, t.tag)],
);


export const source = sqliteTable(
  'source',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    /** Citation key used by imports, e.g. "azuhata1995". */
    citeKey: text().notNull(),
    kind: text({ enum: SOURCE_KINDS }).notNull(),
    /** Lower-case, without a resolver prefix (lib/catalog/doi.ts). */
    doi: text(),
    title: text(),
    /** The authors in order; the source of truth for every display and export. */
    authorList: text({ mode: 'json' }).$type<PersonName[]>(),
    editorList: text({ mode: 'json' }).$type<PersonName[]>(),
    /** Derived from authorList on every write ("Family, G.; …"), for search and sort only. */
    authors: text(),
    year: integer(),
    /** Journal, or the container of a chapter or data set. */
    venue: text(),
    volume: text(),
    issue: text(),
    pages: text(),
    articleNumber: text(),
    /** Publisher, or the school of a thesis. */
    publisher: text(),
    url: text(),
    accessedOn: text(),
    notebookRef: text(),
    instrument: text(),
    operator: text(),
    recordedOn: text(),
    note: text(),
    /** The catalogue or calculation import (import_batch.id) that created the record; null when typed in. Undo of that import retracts it. */
    importId: text(),
    /** What keeps the source from being complete (lib/citations/completeness.ts), derived on every write; [] when complete. */
    gaps: text({ mode: 'json' }).$type<string[]>().notNull().default(sql`'[]'`),
    createdBy: text().references(() => user.id),
    createdAt: createdAt(),
    updatedAt: timestamp(),
    ...retraction(),
  },
  (t) => [
    uniqueIndex('source_cite_key_uq').on(t.workspaceId, t.citeKey),
    index('source_doi_idx').on(t.workspaceId, t.doi),
    index('source_import_idx').on(t.workspaceId, t.importId),
  ],
);


export const method = sqliteTable(
  'method',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    label: text().notNull(),
    functional: text().notNull(),
    dispersion: text(),
    pseudopotential: text(),
    cutoffEv: real(),
    kGrid: text({ mode: 'json' }).$type<[number, number, number]>(),
    qGrid: text({ mode: 'json' }).$type<[number, number, number]>(),
    smearing: text(),
    approach: text({ enum: APPROACHES }),
    nonAnalyticCorrection: integer({ mode: 'boolean' }),
    notes: text(),
    /** The catalogue or calculation import (import_batch.id) that created the record; null when typed in. Undo of that import retracts it. */
    importId: text(),
    createdBy: text().references(() => user.id),
    createdAt: createdAt(),
    updatedAt: timestamp(),
    ...retraction(),
  },
  (t) => [uniqueIndex('method_label_uq').on(t.workspaceId, t.label), index('method_import_idx').on(t.workspaceId, t.importId)],
);

export type Material = typeof material.$inferSelect;
export type Source = typeof source.$inferSelect;
export type Method = typeof method.$inferSelect;
