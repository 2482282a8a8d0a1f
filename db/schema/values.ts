import { index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import { organization, user } from './auth';
import { apiToken } from './workspace';
import { material, method, source } from './catalog';
import { createdAt, id, retraction, timestamp } from './columns';
import { QUANTITIES, BRANCHES, ACTIVITIES, TECHNIQUES, SAMPLE_FORMS, IMPORT_KINDS } from '@/lib/record-kinds';

export { QUANTITIES, BRANCHES, ACTIVITIES, TECHNIQUES, SAMPLE_FORMS, IMPORT_KINDS };


/** One upload batch; the file's SHA-256 is unique per workspace so a file cannot be imported twice. */
export const importBatch = sqliteTable(
  'import_batch',
  {
    id: id(),
    workspaceId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    kind: text({ enum: IMPORT_KINDS }).notNull(),
    fileName: text(),
    sha256: text().notNull(),
    byteCount: integer().notNull(),
    rowCount: integer().notNull(),
    insertedCount: integer().notNull(),
    duplicateCount: integer().notNull().default(0),
    status: text({ enum: ['committed', 'undone'] }).notNull().default('committed'),
    via: text({ enum: ['wizard', 'api', 'form'] }).notNull(),
    createdBy: text().references(() => user.id),
    createdByToken: text().references(() => apiToken.id),
    createdAt: createdAt(),
    undoneAt: timestamp(),
    undoneBy: text().references(() => user.id),
    undoReason: text(),
  },
  (t) => [uniqueIndex('import_sha_uq').on(t.workspaceId, t.sha256), index('import_time_idx').on(t.workspaceId, t.createdAt)],
);

/** Columns shared by measured and computed values. */
const valueColumns = () => ({
  id: id(),
  workspaceId: text()
    .notNull()
    .references(() => organization.id, { onDelete: 'cascade' }),
  materialId: text()
    .notNull()
    .references(() => material.id),
  sourceId: text()
    .notNull()
    .references(() => source.id),
  importId: text().references(() => importBatch.id),
  quantity: text({ enum: QUANTITIES }).notNull(),
  /** Canonical value: cm⁻¹ for frequencies, J mol⁻¹ K⁻¹ per formula unit for entropies. */
  value: real().notNull(),
  /** The number exactly as entered ("1.50" stays "1.50"). */
  valueText: text().notNull(),
  unit: text().notNull(),
  uncertainty: real(),
  uncertaintyText: text(),
  temperatureK: real(),
  /** The temperature exactly as entered ("298.150"); null on rows stored before it was kept: show temperatureK then. */
  temperatureText: text(),
  irrep: text(),
  irrepNormalized: text(),
  branch: text({ enum: BRANCHES }),
  degeneracy: integer(),
  activity: text({ enum: ACTIVITIES }),
  /** Born charges: the atom the row belongs to, an element symbol with an optional number ("Ga", "O2"). */
  site: text(),
  /**
   * Tensor components where the quantity has them: a Born charge's 3 × 3 tensor row-major (9 numbers,
   * in e), or a dielectric constant's three principal values. `value` then holds the mean of the diagonal.
   */
  components: text({ mode: 'json' }).$type<number[]>(),
  notes: text(),
  /** Hash of the identifying fields, to report rows identical to existing ones. */
  rowHash: text().notNull(),
  /**
   * Stable sequence number, unique in the table and never reused: what a revision's row set lists
   * (lib/benchmark/row-set.ts). Imports assign it; the insert trigger of migration 0009 fills it for any
   * other insert (max + 1). Not the rowid, which VACUUM INTO (the backups) may renumber.
   */
  seq: integer(),
  contributorId: text().references(() => user.id),
  createdAt: createdAt(),
  ...retraction(),
});

export const measurement = sqliteTable(
  'measurement',
  {
    ...valueColumns(),
    technique: text({ enum: TECHNIQUES }),
    laserWavelengthNm: real(),
    sampleForm: text({ enum: SAMPLE_FORMS }),
  },
  (t) => [
    index('measurement_material_idx').on(t.workspaceId, t.materialId, t.quantity),
    index('measurement_hash_idx').on(t.workspaceId, t.rowHash),
    index('measurement_import_idx').on(t.importId),
    index('measurement_source_idx').on(t.workspaceId, t.sourceId),
    uniqueIndex('measurement_seq_uq').on(t.seq),
  ],
);

export const calculation = sqliteTable(
  'calculation',
  {
    ...valueColumns(),
    methodId: text()
      .notNull()
      .references(() => method.id),
    modeIndex: integer(),
  },
  (t) => [
    index('calculation_method_material_idx').on(t.workspaceId, t.methodId, t.materialId, t.quantity),
    index('calculation_hash_idx').on(t.workspaceId, t.rowHash),
    index('calculation_import_idx').on(t.importId),
    index('calculation_material_idx').on(t.workspaceId, t.materialId, t.quantity),
    index('calculation_source_idx').on(t.workspaceId, t.sourceId),
    uniqueIndex('calculation_seq_uq').on(t.seq),
  ],
);

export type ImportBatch = typeof importBatch.$inferSelect;
export type Measurement = typeof measurement.$inferSelect;
export type Calculation = typeof calculation.$inferSelect;
