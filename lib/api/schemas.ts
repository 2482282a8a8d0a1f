import { z } from 'zod';
import { APPROACHES, SOURCE_KINDS } from '@/lib/record-kinds';
import { GAP_CODES } from '@/lib/citations/completeness';
import { CALCULATION_CATALOG_COLUMNS, CALCULATION_COLUMNS, MEASUREMENT_COLUMNS, type ColumnDef } from '@/lib/import/columns';
import { MATERIAL_IMPORT_COLUMNS, METHOD_IMPORT_COLUMNS, SOURCE_IMPORT_COLUMNS } from '@/lib/import/catalog-columns';
import { ENTROPY_UNITS, FREQUENCY_UNITS } from '@/lib/science/units';
import { ACTIVITY_VALUES, BRANCH_VALUES, SAMPLE_FORM_VALUES, TECHNIQUE_VALUES } from '@/lib/import/vocabulary';

// Schemas of the public REST API: they parse requests and, through z.toJSONSchema, make the OpenAPI document.

const cell = z.union([z.string(), z.number(), z.null()]);
/** The tensor column may also be sent as numbers: [9], [[3], [3], [3]] or the 3 principal values. */
const tensorCell = z.union([z.string(), z.null(), z.array(z.number()).max(9), z.array(z.array(z.number()).length(3)).length(3)]);

function rowSchema(columns: readonly ColumnDef[], title: string) {
  const shape: Record<string, z.ZodOptional<typeof cell | typeof tensorCell>> = {};
  for (const c of columns) shape[c.key] = (c.key === 'tensor' ? tensorCell : cell).optional().describe(`${c.required ? '(required) ' : ''}${c.description}`);
  return z
    .strictObject(shape)
    .meta({ title, description: 'Cells as in the CSV template. Send numbers as strings to keep their text exactly ("1.50").' });
}

export const measurementRowSchema = rowSchema(MEASUREMENT_COLUMNS, 'MeasurementRow');
export const calculationRowSchema = rowSchema([...CALCULATION_COLUMNS, ...CALCULATION_CATALOG_COLUMNS], 'CalculationRow');
export const materialImportRowSchema = rowSchema(MATERIAL_IMPORT_COLUMNS, 'MaterialImportRow');
export const methodImportRowSchema = rowSchema(METHOD_IMPORT_COLUMNS, 'MethodImportRow');
export const sourceImportRowSchema = rowSchema(SOURCE_IMPORT_COLUMNS, 'SourceImportRow');

const onChangeSchema = z
  .enum(['refuse', 'update'])
  .optional()
  .meta({ description: 'Catalogue kinds: a row whose stored record has other values is refused (default) or, with `update` (curator or owner), updates it with an audit entry.' });
const createMissingSchema = z
  .boolean()
  .optional()
  .meta({ description: 'Calculations: create the materials and methods the rows name but the workspace lacks, from their material_… and method_… columns (needs materials:create and methods:create). Undo retracts them.' });

const defaultUnitsSchema = z
  .object({
    frequency: z.enum(FREQUENCY_UNITS as [string, ...string[]]).optional(),
    entropy: z.enum(ENTROPY_UNITS as [string, ...string[]]).optional(),
    'heat-capacity': z.enum(ENTROPY_UNITS as [string, ...string[]]).optional(),
  })
  .meta({ description: 'Unit for rows whose unit cell is empty.' });

const MAX_JSON_ROWS = 1_000_000;

export const importRequestSchema = z
  .discriminatedUnion('kind', [
    z.object({
      kind: z.literal('measurements'),
      fileName: z.string().max(255).optional(),
      units: defaultUnitsSchema.optional(),
      rows: z.array(measurementRowSchema).min(1).max(MAX_JSON_ROWS),
    }),
    z.object({
      kind: z.literal('calculations'),
      fileName: z.string().max(255).optional(),
      units: defaultUnitsSchema.optional(),
      createMissing: createMissingSchema,
      rows: z.array(calculationRowSchema).min(1).max(MAX_JSON_ROWS),
    }),
    z.object({
      kind: z.literal('materials'),
      fileName: z.string().max(255).optional(),
      onChange: onChangeSchema,
      prefer: z.enum(['typed', 'structure']).optional().meta({ description: 'Rows with a structure: which value wins where it disagrees with a typed cell (else the row is refused with both).' }),
      rows: z.array(materialImportRowSchema).min(1).max(MAX_JSON_ROWS),
    }),
    z.object({ kind: z.literal('methods'), fileName: z.string().max(255).optional(), onChange: onChangeSchema, rows: z.array(methodImportRowSchema).min(1).max(MAX_JSON_ROWS) }),
    z.object({ kind: z.literal('sources'), fileName: z.string().max(255).optional(), onChange: onChangeSchema, rows: z.array(sourceImportRowSchema).min(1).max(MAX_JSON_ROWS) }),
  ])
  .meta({ title: 'ImportRequest' });

export const importKindQuerySchema = z.object({
  kind: z.enum(['measurements', 'calculations', 'materials', 'methods', 'sources'], 'Give ?kind=measurements, calculations, materials, methods or sources.'),
  fileName: z.string().max(255).optional(),
  onChange: z.enum(['refuse', 'update'], 'onChange is refuse or update.').optional(),
  prefer: z.enum(['typed', 'structure'], 'prefer is typed or structure.').optional(),
  createMissing: z.enum(['true', 'false'], 'createMissing is true or false.').optional(),
});

export const rowErrorSchema = z
  .object({
    row: z.int().meta({ description: 'CSV: the header is row 1. JSON: row N is rows[N − 1]. 0: the file as a whole.' }),
    column: z.string().nullable(),
    reason: z.string(),
    value: z.string().optional(),
  })
  .meta({ title: 'RowError' });

export const importResultSchema = z
  .object({
    importId: z.string(),
    rowCount: z.int(),
    insertedCount: z.int(),
    duplicateCount: z.int(),
    duplicates: z.array(z.object({ row: z.int(), reason: z.string() })),
    createdMaterials: z.int().optional().meta({ description: 'createMissing: materials created.' }),
    createdMethods: z.int().optional().meta({ description: 'createMissing: methods created.' }),
  })
  .meta({ title: 'ImportResult' });

export const catalogImportResultSchema = z
  .object({
    importId: z.string().nullable().meta({ description: 'null when every row was unchanged: nothing was written (200).' }),
    kind: z.enum(['materials', 'methods', 'sources']),
    rowCount: z.int(),
    createdCount: z.int(),
    updatedCount: z.int(),
    unchangedCount: z.int(),
    unchanged: z.array(z.object({ row: z.int(), handle: z.string() })),
    insertedCount: z.int(),
    duplicateCount: z.int(),
    duplicates: z.array(z.object({ row: z.int(), reason: z.string() })),
  })
  .meta({ title: 'CatalogImportResult' });

export const problemSchema = z
  .object({
    type: z.string(),
    title: z.string(),
    status: z.int(),
    detail: z.string(),
    errorCount: z.int().optional().meta({ description: 'On 422: how many errors the body has in all.' }),
    errors: z.array(rowErrorSchema).optional().meta({ description: 'On 422: the first 1,000 errors; a cell is echoed up to 40 characters.' }),
    firstImportId: z.string().optional().meta({ description: 'On 409: the import that already holds this file.' }),
    field: z.string().optional().meta({ description: 'On 409 of a catalogue write: the field whose value is taken (name, label, citeKey, doi).' }),
    fields: z
      .array(z.object({ path: z.string(), message: z.string() }))
      .optional()
      .meta({ description: 'On 422 of a catalogue write: every field issue, with its path ("tags.0", "kGrid").' }),
    idempotencyKey: z.string().optional().meta({ description: 'On 409/422 from the Idempotency-Key check: the key.' }),
  })
  .meta({ title: 'Problem', description: 'RFC 9457 problem details (application/problem+json).' });

export const pageQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  size: z.coerce.number().int().min(1).max(1000).default(100),
});

const timestamp = z.iso.datetime();
const nullableText = z.string().nullable();

export const materialSchema = z
  .object({
    id: z.string(),
    name: z.string(),
    displayName: nullableText,
    formula: z.string(),
    reducedFormula: z.string(),
    atomsPerFormulaUnit: z.number(),
    spaceGroup: z.int().nullable(),
    crystalSystem: nullableText,
    atomsInCell: z.int().nullable(),
    externalId: nullableText,
    tags: z.array(z.string()),
    thermalExpansionPerK: z.number().nullable().meta({ description: 'Volumetric thermal expansion α_V, K⁻¹. With the next two, for the Cp − Cv correction of heat-capacity benchmarks only.' }),
    bulkModulusGpa: z.number().nullable().meta({ description: 'Isothermal bulk modulus B_T, GPa.' }),
    molarVolumeCm3: z.number().nullable().meta({ description: 'Molar volume V_m, cm³ per mole of formula units.' }),
    createdAt: timestamp,
    retractedAt: timestamp.nullable(),
  })
  .meta({ title: 'Material' });

export const personNameApiSchema = z
  .object({
    family: z.string().optional(),
    given: z.string().optional(),
    particle: z.string().optional().meta({ description: '"van der", "de la": kept apart from the family name (CSL non-dropping-particle).' }),
    suffix: z.string().optional(),
    literal: z.string().optional().meta({ description: 'An organisation, or a name kept exactly as written.' }),
    review: z.boolean().optional().meta({ description: 'The name could not be split into family and given names: kept as written, to review.' }),
  })
  .meta({ title: 'PersonName' });

export const sourceSchema = z
  .object({
    id: z.string(),
    citeKey: z.string(),
    kind: z.enum(SOURCE_KINDS),
    doi: nullableText.meta({ description: 'Bare and lower-case, e.g. 10.1103/physrev.155.712.' }),
    title: nullableText,
    authors: z.string().meta({ description: 'The authors in the display format used everywhere ("T. Azuhata, T. Sota and S. Nakamura"); empty when none.' }),
    authorList: z.array(personNameApiSchema).meta({ description: 'The authors in order.' }),
    editorList: z.array(personNameApiSchema),
    year: z.int().nullable(),
    venue: nullableText.meta({ description: 'Journal, or the container of a chapter or data set.' }),
    volume: nullableText,
    issue: nullableText,
    pages: nullableText.meta({ description: 'A page range with an en dash ("712–716"), or one page ("L129").' }),
    articleNumber: nullableText,
    publisher: nullableText.meta({ description: 'Publisher, or the school of a thesis.' }),
    url: nullableText,
    accessedOn: nullableText,
    notebookRef: nullableText,
    instrument: nullableText,
    operator: nullableText,
    recordedOn: nullableText,
    note: nullableText,
    gaps: z.array(z.enum(GAP_CODES)).meta({ description: 'Why the source is incomplete (no authors, an author name to review, no year, no DOI or notebook reference); empty when complete.' }),
    createdAt: timestamp,
    retractedAt: timestamp.nullable(),
  })
  .meta({ title: 'Source' });

const grid = z.tuple([z.int(), z.int(), z.int()]).nullable();

export const methodSchema = z
  .object({
    id: z.string(),
    label: z.string(),
    functional: z.string(),
    dispersion: nullableText,
    pseudopotential: nullableText,
    cutoffEv: z.number().nullable(),
    kGrid: grid,
    qGrid: grid,
    smearing: nullableText,
    approach: z.enum(APPROACHES).nullable(),
    nonAnalyticCorrection: z.boolean().nullable(),
    notes: nullableText,
    createdAt: timestamp,
    retractedAt: timestamp.nullable(),
  })
  .meta({ title: 'Method' });

const valueFields = {
  id: z.string(),
  materialId: z.string(),
  sourceId: z.string(),
  importId: z.string().nullable(),
  quantity: z.string(),
  value: z.number().meta({ description: 'Canonical: cm⁻¹ for frequencies, J mol⁻¹ K⁻¹ per formula unit for entropies and heat capacities, e for Born charges; dielectric constants are dimensionless.' }),
  valueText: z.string().meta({ description: 'The number exactly as entered, in `unit`.' }),
  unit: z.string(),
  uncertainty: z.number().nullable(),
  uncertaintyText: nullableText,
  temperatureK: z.number().nullable(),
  irrep: nullableText,
  irrepNormalized: nullableText,
  branch: z.enum(BRANCH_VALUES).nullable(),
  degeneracy: z.int().nullable(),
  activity: z.enum(ACTIVITY_VALUES).nullable(),
  site: nullableText.meta({ description: 'Born charges: the atom ("Ga", "O2").' }),
  components: z
    .array(z.number())
    .nullable()
    .meta({ description: 'Born charges: the 3 × 3 tensor in e, row-major (9 numbers); dielectric constants: 3 principal values. `value` is then the mean of the diagonal.' }),
  notes: nullableText,
  createdAt: timestamp,
  retractedAt: timestamp.nullable(),
};

export const measurementSchema = z
  .object({
    ...valueFields,
    technique: z.enum(TECHNIQUE_VALUES).nullable(),
    laserWavelengthNm: z.number().nullable(),
    sampleForm: z.enum(SAMPLE_FORM_VALUES).nullable(),
  })
  .meta({ title: 'Measurement' });

export const calculationSchema = z.object({ ...valueFields, methodId: z.string(), modeIndex: z.int().nullable() }).meta({ title: 'Calculation' });

export function pageOf<T extends z.ZodType>(item: T, title: string) {
  return z.object({ items: z.array(item), page: z.int(), size: z.int(), total: z.int() }).meta({ title });
}

const counts = { measurementCount: z.int(), calculationCount: z.int() };

/** List items are summaries; GET by id gives the whole record. */
export const materialSummarySchema = materialSchema
  .pick({ id: true, name: true, displayName: true, formula: true, reducedFormula: true, atomsPerFormulaUnit: true, spaceGroup: true, crystalSystem: true, atomsInCell: true, tags: true, retractedAt: true })
  .extend(counts)
  .meta({ title: 'MaterialSummary' });

export const sourceSummarySchema = sourceSchema
  .pick({ id: true, citeKey: true, kind: true, doi: true, title: true, authors: true, authorList: true, year: true, venue: true, volume: true, pages: true, notebookRef: true, gaps: true, retractedAt: true })
  .extend({ valueCount: z.int() })
  .meta({ title: 'SourceSummary' });

export const methodSummarySchema = methodSchema
  .pick({ id: true, label: true, functional: true, dispersion: true, pseudopotential: true, cutoffEv: true, kGrid: true, qGrid: true, approach: true, nonAnalyticCorrection: true, retractedAt: true })
  .extend({ calculationCount: z.int() })
  .meta({ title: 'MethodSummary' });

export const importSummarySchema = z
  .object({
    id: z.string(),
    kind: z.string(),
    fileName: nullableText,
    byteCount: z.int(),
    rowCount: z.int(),
    insertedCount: z.int(),
    duplicateCount: z.int(),
    status: z.enum(['committed', 'undone']),
    via: z.enum(['wizard', 'api', 'form']),
    createdAt: timestamp,
  })
  .meta({ title: 'ImportSummary' });

// ---- Benchmarks (reads for a workflow's own checks) ----

export const benchmarkSummarySchema = z
  .object({
    id: z.string(),
    name: z.string(),
    purpose: nullableText,
    quantity: z.string(),
    createdAt: timestamp,
    revisionNumber: z.int().nullable().meta({ description: 'The latest stored revision; null before the first.' }),
    revisionAt: timestamp.nullable(),
    methodCount: z.int(),
    pairCount: z.int(),
    outlierCount: z.int(),
    qualityFlagCount: z.int(),
  })
  .meta({ title: 'BenchmarkSummary' });

const storedStatisticsSchema = z
  .object({
    meanAbsoluteError: z.number(),
    rootMeanSquareError: z.number(),
    meanSignedError: z.number().meta({ description: 'The bias: mean of calculated − measured.' }),
    standardDeviation: z.number(),
    medianAbsoluteError: z.number(),
    p95AbsoluteError: z.number(),
    maxAbsoluteError: z.number(),
    maxAbsoluteErrorPair: z.string(),
    meanAbsolutePercentageError: z.number(),
    meanAbsoluteRelativeError: z.number().optional(),
    scaleFactor: z.number().optional().meta({ description: 'Least-squares λ through the origin; absent when every calculated value is 0 (scaleFactorUndefined says so).' }),
    rmseAfterScaling: z.number().optional(),
    scaleFactorUndefined: z.string().optional(),
  })
  .loose()
  .meta({ title: 'ErrorStatistics', description: 'A method’s statistics on its own included pairs, as the benchmark page shows them (bootstrap intervals and other members as stored).' });

const commonStatisticsSchema = z
  .object({ n: z.int(), meanAbsoluteError: z.number(), rootMeanSquareError: z.number(), meanSignedError: z.number() })
  .meta({ title: 'CommonGroundStatistics', description: 'The method’s errors on the common pairs of the ranked methods.' });

export const methodStatisticsSchema = z
  .object({
    methodId: z.string(),
    label: z.string(),
    n: z.int().meta({ description: 'Included pairs of this method.' }),
    excluded: z.int(),
    outliers: z.int(),
    qualityFlags: z.int(),
    unpairedMeasurements: z.int(),
    statistics: storedStatisticsSchema.nullable().meta({ description: 'Null below 3 included pairs (only N is shown).' }),
    rank: z.int().nullable(),
    paired: z.int().optional(),
    coverage: z.number().nullable().optional().meta({ description: 'Paired measured values / measured values in scope.' }),
    unranked: z.string().nullable().optional().meta({ description: 'Why the method is listed but not ranked.' }),
    common: commonStatisticsSchema.nullable().optional(),
  })
  .meta({ title: 'MethodStatistics' });

const rankingSchema = z
  .object({ commonN: z.int(), minN: z.int(), minCoverage: z.number(), rankedMethods: z.int(), note: z.string().nullable() })
  .meta({ title: 'Ranking', description: 'How the common ground was formed: commonN measured values shared by every ranked method.' });

export const revisionHeadSchema = z
  .object({
    number: z.int(),
    fingerprint: z.string().meta({ description: 'SHA-256 of exactly the rows, rules, decisions and pins the revision used.' }),
    createdAt: timestamp,
    isLatest: z.boolean(),
  })
  .meta({ title: 'RevisionHead' });

const revisionCauseSchema = z
  .object({
    reported: z.array(z.object({ trigger: z.string(), importId: z.string().optional() }).loose()),
    rows: z.object({ measurementsAdded: z.int(), measurementsRemoved: z.int(), calculationsAdded: z.int(), calculationsRemoved: z.int() }),
    imports: z.array(z.object({ id: z.string(), rows: z.int() })).meta({ description: 'Imports whose rows entered the scope with this revision.' }),
  })
  .loose()
  .nullable()
  .meta({ title: 'RevisionCause' });

export const revisionListItemSchema = z
  .object({ number: z.int(), fingerprint: z.string(), createdAt: timestamp, cause: revisionCauseSchema })
  .meta({ title: 'RevisionListItem' });

export const revisionSchema = z
  .object({
    benchmarkId: z.string(),
    number: z.int(),
    fingerprint: z.string(),
    createdAt: timestamp,
    isLatest: z.boolean(),
    cause: revisionCauseSchema,
    unit: z.string(),
    quantity: z.string(),
    methods: z.array(methodStatisticsSchema),
    ranking: rankingSchema.nullable(),
    counts: z.object({ measurements: z.int(), calculations: z.int(), materials: z.int(), methods: z.int(), measuredInScope: z.int().optional() }),
    pairCount: z.int(),
    qualityCount: z.int(),
    empty: z.string().nullable(),
  })
  .meta({ title: 'Revision' });

export const benchmarkSchema = z
  .object({
    id: z.string(),
    name: z.string(),
    purpose: nullableText,
    quantity: z.string(),
    scope: z.record(z.string(), z.unknown()).meta({ description: 'Which materials, methods, sources and conditions the benchmark reads.' }),
    rules: z.record(z.string(), z.unknown()).meta({ description: 'Pairing, outlier and ranking rules (ranking.minN, ranking.minCoverage).' }),
    createdAt: timestamp,
    latestRevision: z
      .object({ number: z.int(), fingerprint: z.string(), createdAt: timestamp, unit: z.string(), ranking: rankingSchema.nullable(), methods: z.array(methodStatisticsSchema) })
      .nullable(),
  })
  .meta({ title: 'Benchmark' });

export const methodStatisticsResponseSchema = z
  .object({ benchmarkId: z.string(), revision: revisionHeadSchema, unit: z.string(), ranking: rankingSchema.nullable(), method: methodStatisticsSchema })
  .meta({ title: 'MethodStatisticsResponse' });

export const pairSchema = z
  .object({
    key: z.string(),
    methodId: z.string(),
    materialId: z.string(),
    measurementIds: z.array(z.string()),
    calculationIds: z.array(z.string()),
    measured: z.number(),
    calculated: z.number(),
    error: z.number().meta({ description: 'calculated − measured, in the revision’s unit.' }),
    relativeError: z.number(),
    label: z.string().nullable(),
    temperatureK: z.number().nullable(),
    basis: z.enum(['label', 'frequency', 'pinned', 'temperature', 'material']),
    ambiguous: z.boolean(),
    excluded: z.string().nullable().meta({ description: 'Reason of the decision that excludes it.' }),
    outlier: z.string().nullable(),
  })
  .meta({ title: 'Pair' });

export const pairPageSchema = pageOf(pairSchema, 'PairPage').extend({ revision: z.int(), unit: z.string() }).meta({ title: 'PairPage' });

export const flagSchema = z
  .object({
    id: z.string(),
    kind: z.enum(['outlier', 'quality']),
    code: z.string(),
    methodId: z.string().nullable(),
    measurementId: z.string().nullable(),
    subjectKey: z.string(),
    details: z.unknown(),
  })
  .meta({ title: 'Flag' });

export const flagPageSchema = pageOf(flagSchema, 'FlagPage').extend({ revision: z.int() }).meta({ title: 'FlagPage' });

export const benchmarkStatusSchema = z
  .object({
    benchmarkId: z.string(),
    state: z.enum(['idle', 'queued', 'running', 'failed']).meta({
      description: 'idle: every change committed before this answer is in the latest revision. failed: the last recomputation failed (error says why).',
    }),
    computing: z.boolean(),
    error: z.string().nullable(),
    latestRevision: z.object({ number: z.int(), fingerprint: z.string(), createdAt: timestamp }).nullable(),
    import: z
      .object({
        id: z.string(),
        status: z.enum(['committed', 'undone']),
        settled: z.boolean().meta({ description: 'True when the recomputation after this import has finished: latestRevision is the revision that includes it.' }),
        revision: z.int().nullable().meta({ description: 'Once settled: the revision that reflects the import (the latest).' }),
        rowsInRevision: z.int().meta({ description: 'Rows of the import that the latest revision was computed from (0: none is in this benchmark’s scope).' }),
        importedRows: z.int(),
      })
      .optional()
      .meta({ description: 'With ?import=<importId>: whether the latest revision includes that import.' }),
  })
  .meta({ title: 'BenchmarkStatus' });

export const statusQuerySchema = z.object({ import: z.string().min(1).max(100).optional() });

const finiteNumber = (name: string) =>
  z.coerce.number({ message: `${name} must be a number.` }).refine(Number.isFinite, `${name} must be a finite number.`);

export const verdictQuerySchema = z.object({
  maxMae: finiteNumber('maxMae').pipe(z.number().min(0, 'maxMae must not be negative.')),
  minCoverage: finiteNumber('minCoverage').pipe(z.number().min(0, 'minCoverage must be between 0 and 1.').max(1, 'minCoverage must be between 0 and 1.')).default(0),
  revision: z.coerce.number({ message: 'revision must be a positive integer.' }).int('revision must be a positive integer.').positive('revision must be a positive integer.').optional(),
});

export const verdictSchema = z
  .object({
    verdict: z.enum(['pass', 'fail']),
    reasons: z.array(z.string()).meta({ description: 'Why it failed; empty on pass.' }),
    warnings: z.array(z.string()).meta({ description: 'Small N, a newer revision pending.' }),
    benchmark: z.object({ id: z.string(), name: z.string(), quantity: z.string() }),
    method: z.object({ id: z.string(), label: z.string() }),
    thresholds: z.object({ maxMae: z.number(), minCoverage: z.number(), unit: z.string() }),
    unit: z.string(),
    numbers: z.object({
      meanAbsoluteError: z.number().nullable().meta({ description: 'On the common pairs (the ranking’s), in `unit`.' }),
      rootMeanSquareError: z.number().nullable(),
      meanSignedError: z.number().nullable(),
      n: z.int().meta({ description: 'Common pairs the MAE rests on.' }),
      coverage: z.number().nullable(),
      paired: z.int().nullable(),
      measuredInScope: z.int().nullable(),
    }),
    ground: z.object({
      kind: z.enum(['common', 'none']),
      commonN: z.int(),
      rankedMethods: z.int(),
      rank: z.int().nullable(),
      description: z.string().meta({ description: 'How the common ground was formed.' }),
    }),
    own: z.object({ n: z.int(), meanAbsoluteError: z.number().nullable(), excluded: z.int(), outliers: z.int(), qualityFlags: z.int() }).nullable().meta({
      description: 'The method’s statistics on all its own included pairs (for information; the verdict uses the common ground).',
    }),
    revision: revisionHeadSchema,
    recomputation: z.object({ state: z.enum(['idle', 'queued', 'running', 'failed']), pending: z.boolean().meta({ description: 'A newer revision is being computed; this verdict is of `revision`.' }) }),
  })
  .meta({ title: 'Verdict' });
