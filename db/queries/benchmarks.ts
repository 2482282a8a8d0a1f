import 'server-only';
import { and, asc, eq, gte, inArray, isNotNull, isNull, lte, ne, or, sql, type SQL } from 'drizzle-orm';
import { db, type Executor } from '@/db/client';
import {
  auditLog,
  benchmark,
  calculation,
  decision,
  material,
  materialTag,
  measurement,
  method,
  pairPin,
  revision,
  workspaceSettings,
  type Benchmark,
} from '@/db/schema';
import { AppError } from '@/lib/errors';
import {
  alertThresholdsSchema,
  benchmarkDefinitionSchema,
  readAlertThresholds,
  readRules,
  readScope,
  type BenchmarkDefinition,
  type BenchmarkDefinitionInput,
  type BenchmarkScope,
  type BenchmarkQuantity,
  type ResolvedAlertThresholds,
} from '@/lib/benchmark/schemas';
import type { BenchmarkInput, ScopeDecision } from '@/lib/benchmark/types';
import { runsOf } from '@/lib/benchmark/row-set';
import { isThermal, rowQuantityOf } from '@/lib/benchmark/quantities';
import { writeAudit, type Actor } from './audit';

/** A benchmark with its scope, rules and thresholds parsed (defaults filled). */
export type BenchmarkRecord = Omit<Benchmark, 'scope' | 'rules' | 'alertThresholds'> &
  Omit<BenchmarkDefinition, 'alertThresholds'> & { alertThresholds: ResolvedAlertThresholds; storedAlertThresholds: BenchmarkDefinition['alertThresholds'] };

function parseRow(row: Benchmark): BenchmarkRecord {
  return {
    ...row,
    purpose: row.purpose ?? undefined,
    scope: readScope(row.scope),
    rules: readRules(row.rules),
    alertThresholds: readAlertThresholds(row.alertThresholds, row.quantity as BenchmarkQuantity),
    storedAlertThresholds: alertThresholdsSchema.parse(row.alertThresholds ?? {}),
  } as BenchmarkRecord;
}

/** One live benchmark of this workspace, or null (an id of another workspace is null too). */
export async function getBenchmark(workspaceId: string, benchmarkId: string, executor: Executor = db): Promise<BenchmarkRecord | null> {
  const rows = await executor
    .select()
    .from(benchmark)
    .where(and(eq(benchmark.workspaceId, workspaceId), eq(benchmark.id, benchmarkId), isNull(benchmark.retractedAt)))
    .limit(1);
  return rows[0] ? parseRow(rows[0]) : null;
}

export async function requireBenchmark(workspaceId: string, benchmarkId: string, executor: Executor = db): Promise<BenchmarkRecord> {
  const found = await getBenchmark(workspaceId, benchmarkId, executor);
  if (!found) throw new AppError('not-found', 'No such benchmark in this workspace.');
  return found;
}

/** Refuses method or material ids that are not live rows of this workspace (404: they reveal nothing). */
async function checkScopeIds(executor: Executor, workspaceId: string, scope: BenchmarkScope): Promise<void> {
  if (scope.methodIds.length) {
    const found = await executor
      .select({ id: method.id })
      .from(method)
      .where(and(eq(method.workspaceId, workspaceId), inArray(method.id, scope.methodIds), isNull(method.retractedAt)));
    if (found.length !== new Set(scope.methodIds).size) throw new AppError('not-found', 'A method of the scope does not exist in this workspace.', [{ path: 'scope.methodIds' }]);
  }
  if (scope.materialIds.length) {
    const found = await executor
      .select({ id: material.id })
      .from(material)
      .where(and(eq(material.workspaceId, workspaceId), inArray(material.id, scope.materialIds), isNull(material.retractedAt)));
    if (found.length !== new Set(scope.materialIds).size) throw new AppError('not-found', 'A material of the scope does not exist in this workspace.', [{ path: 'scope.materialIds' }]);
  }
  if (scope.referenceMethodId !== undefined) {
    const found = await executor
      .select({ id: method.id })
      .from(method)
      .where(and(eq(method.workspaceId, workspaceId), eq(method.id, scope.referenceMethodId), isNull(method.retractedAt)));
    if (found.length === 0) throw new AppError('not-found', 'The reference method does not exist in this workspace.', [{ path: 'scope.referenceMethodId' }]);
  }
}

function parseDefinition(input: BenchmarkDefinitionInput): BenchmarkDefinition {
  const parsed = benchmarkDefinitionSchema.safeParse(input);
  if (!parsed.success) {
    const where = parsed.error.issues.map((i) => `${i.path.join('.') || 'definition'}: ${i.message}`).join('; ');
    throw new AppError('bad-request', `Invalid benchmark definition (${where}).`, parsed.error.issues);
  }
  return parsed.data;
}

/**
 * Creates a benchmark (no request context needed: the seed calls it with an explicit
 * workspace and actor). It computes nothing: the benchmark services report the change.
 */
export async function createBenchmark(workspaceId: string, actor: Actor, input: BenchmarkDefinitionInput): Promise<{ id: string }> {
  const def = parseDefinition(input);
  return db.transaction(async (tx) => {
    await checkScopeIds(tx, workspaceId, def.scope);
    const [row] = await tx
      .insert(benchmark)
      .values({
        workspaceId,
        name: def.name,
        purpose: def.purpose ?? null,
        quantity: def.scope.quantity,
        scope: def.scope,
        rules: def.rules,
        alertThresholds: def.alertThresholds,
        createdBy: actor.userId,
      })
      .returning({ id: benchmark.id });
    await writeAudit({ workspaceId, actor, action: 'create', entityType: 'benchmark', entityId: row.id, after: def }, tx);
    return row;
  });
}

export async function updateBenchmark(workspaceId: string, actor: Actor, benchmarkId: string, input: BenchmarkDefinitionInput): Promise<void> {
  const def = parseDefinition(input);
  await db.transaction(async (tx) => {
    const before = await requireBenchmark(workspaceId, benchmarkId, tx);
    await checkScopeIds(tx, workspaceId, def.scope);
    await tx
      .update(benchmark)
      .set({
        name: def.name,
        purpose: def.purpose ?? null,
        quantity: def.scope.quantity,
        scope: def.scope,
        rules: def.rules,
        alertThresholds: def.alertThresholds,
        updatedAt: new Date(),
      })
      .where(and(eq(benchmark.workspaceId, workspaceId), eq(benchmark.id, benchmarkId)));
    await writeAudit({
      workspaceId,
      actor,
      action: 'update',
      entityType: 'benchmark',
      entityId: benchmarkId,
      before: { name: before.name, purpose: before.purpose, scope: before.scope, rules: before.rules, alertThresholds: before.storedAlertThresholds },
      after: def,
    }, tx);
  });
}

/** Live benchmarks of a workspace with the headline of their latest ready revision. */
export async function listBenchmarks(workspaceId: string) {
  const rows = await db
    .select({ id: benchmark.id, name: benchmark.name, purpose: benchmark.purpose, quantity: benchmark.quantity, createdAt: benchmark.createdAt })
    .from(benchmark)
    .where(and(eq(benchmark.workspaceId, workspaceId), isNull(benchmark.retractedAt)))
    .orderBy(asc(benchmark.name));
  if (rows.length === 0) return [];
  const latest = await db
    .select({
      benchmarkId: revision.benchmarkId,
      number: revision.number,
      createdAt: revision.createdAt,
      methods: sql<string | null>`json_extract(${revision.statistics}, '$.methods')`,
    })
    .from(revision)
    .where(
      and(
        eq(revision.workspaceId, workspaceId),
        eq(revision.status, 'ready'),
        sql`${revision.number} = (select max(r2.number) from ${revision} r2 where r2.benchmark_id = ${revision.benchmarkId} and r2.status = 'ready')`,
      ),
    );
  const byBenchmark = new Map(latest.map((r) => [r.benchmarkId, r]));
  return rows.map((b) => {
    const r = byBenchmark.get(b.id);
    const methods = r?.methods
      ? (JSON.parse(r.methods) as Array<{
          label: string;
          n: number;
          rank: number | null;
          outliers: number;
          qualityFlags: number;
          statistics: { meanAbsoluteError: number } | null;
          coverage?: number | null;
          common?: { n: number; meanAbsoluteError: number } | null;
        }>)
      : [];
    // The headline follows the ranking rule: the rank-1 method on the common pairs (older revisions: its own MAE).
    const best = methods.find((m) => m.rank === 1);
    return {
      ...b,
      revisionNumber: r?.number ?? null,
      revisionAt: r?.createdAt ?? null,
      methodCount: methods.length,
      pairCount: methods.reduce((s, m) => s + m.n, 0),
      outlierCount: methods.reduce((s, m) => s + (m.outliers ?? 0), 0),
      qualityFlagCount: methods.reduce((s, m) => s + (m.qualityFlags ?? 0), 0),
      best: best
        ? {
            label: best.label,
            mae: best.common?.meanAbsoluteError ?? best.statistics!.meanAbsoluteError,
            n: best.common?.n ?? best.n,
            common: best.common != null,
            coverage: best.coverage ?? null,
            ranked: methods.filter((m) => m.rank !== null).length,
          }
        : null,
    };
  });
}

export async function listBenchmarkIds(workspaceId: string): Promise<string[]> {
  const rows = await db
    .select({ id: benchmark.id })
    .from(benchmark)
    .where(and(eq(benchmark.workspaceId, workspaceId), isNull(benchmark.retractedAt)));
  return rows.map((r) => r.id);
}

/** The measurement rows a scope selects (live rows of live materials of this workspace). */
function measurementScope(workspaceId: string, scope: BenchmarkScope): SQL {
  const conditions: Array<SQL | undefined> = [
    eq(measurement.workspaceId, workspaceId),
    isNull(measurement.retractedAt),
    eq(measurement.quantity, rowQuantityOf(scope.quantity)),
    inArray(
      measurement.materialId,
      db.select({ id: material.id }).from(material).where(and(eq(material.workspaceId, workspaceId), isNull(material.retractedAt))),
    ),
  ];
  if (scope.techniques.length) conditions.push(inArray(measurement.technique, scope.techniques));
  if (isThermal(scope.quantity)) {
    if (scope.entropyTemperatureK === null) conditions.push(isNotNull(measurement.temperatureK));
    else {
      conditions.push(gte(measurement.temperatureK, scope.entropyTemperatureK - scope.entropyToleranceK));
      conditions.push(lte(measurement.temperatureK, scope.entropyTemperatureK + scope.entropyToleranceK));
    }
  } else {
    if (scope.temperatureMinK !== null) conditions.push(gte(measurement.temperatureK, scope.temperatureMinK));
    if (scope.temperatureMaxK !== null) conditions.push(lte(measurement.temperatureK, scope.temperatureMaxK));
    if (scope.temperatureMinK !== null || scope.temperatureMaxK !== null) conditions.push(isNotNull(measurement.temperatureK));
  }
  if (scope.materialIds.length) conditions.push(inArray(measurement.materialId, scope.materialIds));
  else if (scope.materialTags.length) {
    conditions.push(
      inArray(
        measurement.materialId,
        db
          .select({ id: materialTag.materialId })
          .from(materialTag)
          .where(and(eq(materialTag.workspaceId, workspaceId), inArray(materialTag.tag, scope.materialTags))),
      ),
    );
  }
  return and(...conditions)!;
}

/** Materials with at least one measurement in scope; against a reference method, those with a reference value of the quantity. */
function materialsInScope(workspaceId: string, scope: BenchmarkScope) {
  if (scope.referenceMethodId === undefined) return db.selectDistinct({ id: measurement.materialId }).from(measurement).where(measurementScope(workspaceId, scope));
  const conditions: Array<SQL | undefined> = [
    eq(calculation.workspaceId, workspaceId),
    isNull(calculation.retractedAt),
    eq(calculation.quantity, rowQuantityOf(scope.quantity)),
    eq(calculation.methodId, scope.referenceMethodId),
    inArray(
      calculation.materialId,
      db.select({ id: material.id }).from(material).where(and(eq(material.workspaceId, workspaceId), isNull(material.retractedAt))),
    ),
  ];
  if (scope.materialIds.length) conditions.push(inArray(calculation.materialId, scope.materialIds));
  else if (scope.materialTags.length) {
    conditions.push(
      inArray(
        calculation.materialId,
        db
          .select({ id: materialTag.materialId })
          .from(materialTag)
          .where(and(eq(materialTag.workspaceId, workspaceId), inArray(materialTag.tag, scope.materialTags))),
      ),
    );
  }
  return db.selectDistinct({ id: calculation.materialId }).from(calculation).where(and(...conditions));
}

/**
 * Reads every row a benchmark needs, one query per table, each restricted to the
 * scope (this workspace, live rows, the scope's quantity, techniques, temperatures,
 * materials and methods): never a whole table.
 */
/** The columns a computation reads of a measurement, as loadBenchmarkInput and rowsOfRowSet select them. */
const MEASUREMENT_INPUT = {
  id: measurement.id,
  materialId: measurement.materialId,
  sourceId: measurement.sourceId,
  importId: measurement.importId,
  value: measurement.value,
  uncertainty: measurement.uncertainty,
  temperatureK: measurement.temperatureK,
  irrep: measurement.irrep,
  branch: measurement.branch,
  technique: measurement.technique,
  seq: measurement.seq,
  site: measurement.site,
  components: measurement.components,
};

/** The columns of a calculation, in the order calculationFromRow reads them from raw rows. */
const CALCULATION_INPUT = {
  id: calculation.id,
  materialId: calculation.materialId,
  methodId: calculation.methodId,
  sourceId: calculation.sourceId,
  importId: calculation.importId,
  value: calculation.value,
  uncertainty: calculation.uncertainty,
  temperatureK: calculation.temperatureK,
  irrep: calculation.irrep,
  branch: calculation.branch,
  activity: calculation.activity,
  degeneracy: calculation.degeneracy,
  seq: calculation.seq,
  modeIndex: calculation.modeIndex,
};
/** The same with the tensor columns, read only for the quantities that have them (the frequency path stays as narrow as before). */
const TENSOR_CALCULATION_INPUT = { ...CALCULATION_INPUT, site: calculation.site, components: calculation.components };
const hasTensors = (quantity: BenchmarkRecord['scope']['quantity']) => quantity === 'born-charge' || quantity === 'eps-inf' || quantity === 'eps-static';

type CalculationRow = BenchmarkInput['calculations'][number];

function calculationFromRow(r: unknown[]): CalculationRow {
  return {
    id: r[0] as string,
    materialId: r[1] as string,
    methodId: r[2] as string,
    sourceId: r[3] as string,
    importId: r[4] as string | null,
    value: r[5] as number,
    uncertainty: r[6] as number | null,
    temperatureK: r[7] as number | null,
    irrep: r[8] as string | null,
    branch: r[9] as CalculationRow['branch'],
    activity: r[10] as CalculationRow['activity'],
    degeneracy: r[11] as number | null,
    seq: r[12] as number,
    modeIndex: r[13] as number | null,
    ...(r.length > 14 ? { site: r[14] as string | null, components: r[15] == null ? null : (JSON.parse(r[15] as string) as number[]) } : {}),
  };
}

/** The conditions a scope puts on its rows; `onlyMaterials` narrows measurements and calculations to those materials. */
function scopeConditions(workspaceId: string, bm: BenchmarkRecord, options: { materialIds?: string[]; onlyMaterials?: string[] } = {}) {
  const { scope } = bm;
  const reference = scope.referenceMethodId;
  // The candidates: never the reference method, even when the scope names every method.
  const methodWhere = and(
    eq(method.workspaceId, workspaceId),
    isNull(method.retractedAt),
    scope.methodIds.length ? inArray(method.id, scope.methodIds) : undefined,
    reference !== undefined ? ne(method.id, reference) : undefined,
  );
  const methodIds = db.select({ id: method.id }).from(method).where(methodWhere);
  const scopedMaterials = options.onlyMaterials ?? options.materialIds ?? materialsInScope(workspaceId, scope);
  const calculationWhere: Array<SQL | undefined> = [
    eq(calculation.workspaceId, workspaceId),
    isNull(calculation.retractedAt),
    eq(calculation.quantity, rowQuantityOf(scope.quantity)),
    reference !== undefined ? or(inArray(calculation.methodId, methodIds), eq(calculation.methodId, reference)) : inArray(calculation.methodId, methodIds),
    inArray(calculation.materialId, scopedMaterials),
  ];
  if (isThermal(scope.quantity)) {
    if (scope.entropyTemperatureK === null) calculationWhere.push(isNotNull(calculation.temperatureK));
    else {
      calculationWhere.push(gte(calculation.temperatureK, scope.entropyTemperatureK - scope.entropyToleranceK));
      calculationWhere.push(lte(calculation.temperatureK, scope.entropyTemperatureK + scope.entropyToleranceK));
    }
  }
  // Against a reference method no measurement is read: the reference's calculations stand in their place.
  const measurementWhere =
    reference !== undefined ? sql`0` : and(measurementScope(workspaceId, scope), options.onlyMaterials ? inArray(measurement.materialId, options.onlyMaterials) : undefined)!;
  return { methodWhere, methodIds, scopedMaterials, calculationWhere: and(...calculationWhere)!, measurementWhere };
}

/** Everything a computation reads besides its measurement and calculation rows. */
export type BenchmarkContext = Omit<BenchmarkInput, 'measurements' | 'calculations'>;

/** The scope's materials, methods, pins, decisions, quality thresholds and dielectric rows (loadBenchmarkInput without the rows). */
export async function loadBenchmarkContext(workspaceId: string, bm: BenchmarkRecord, options: { materialIds?: string[] } = {}): Promise<BenchmarkContext> {
  const { scope, rules } = bm;
  const { methodWhere, methodIds, scopedMaterials } = scopeConditions(workspaceId, bm, options);
  const reference = scope.referenceMethodId;
  const [materials, tags, methods, pins, decisions, settings, dielectricRows, [merges], referenceMethod] = await Promise.all([
    db
      .select({
        id: material.id,
        name: material.name,
        formula: material.formula,
        atomsInCell: material.atomsInCell,
        spaceGroup: material.spaceGroup,
        ...(rules.heatCapacityCorrection === 'cp-minus-cv'
          ? { thermalExpansionPerK: material.thermalExpansionPerK, bulkModulusGpa: material.bulkModulusGpa, molarVolumeCm3: material.molarVolumeCm3 }
          : {}),
      })
      .from(material)
      .where(and(eq(material.workspaceId, workspaceId), inArray(material.id, scopedMaterials))),
    db
      .select({ materialId: materialTag.materialId, tag: materialTag.tag })
      .from(materialTag)
      .where(and(eq(materialTag.workspaceId, workspaceId), inArray(materialTag.materialId, scopedMaterials))),
    db
      .select({ id: method.id, label: method.label, kGrid: method.kGrid, qGrid: method.qGrid, nonAnalyticCorrection: method.nonAnalyticCorrection })
      .from(method)
      .where(methodWhere),
    db
      .select({ id: pairPin.id, methodId: pairPin.methodId, measurementId: pairPin.measurementId, calculationId: pairPin.calculationId, reason: pairPin.reason })
      .from(pairPin)
      .where(and(eq(pairPin.workspaceId, workspaceId), isNull(pairPin.revokedAt), inArray(pairPin.methodId, methodIds))),
    db
      .select({
        id: decision.id,
        kind: decision.kind,
        measurementId: decision.measurementId,
        methodId: decision.methodId,
        reason: decision.reason,
        createdBy: decision.createdBy,
        createdAt: decision.createdAt,
      })
      .from(decision)
      .where(
        and(
          eq(decision.workspaceId, workspaceId),
          isNull(decision.revertedAt),
          or(eq(decision.benchmarkId, bm.id), isNull(decision.benchmarkId)),
        ),
      ),
    db.select().from(workspaceSettings).where(eq(workspaceSettings.workspaceId, workspaceId)).limit(1),
    // Dielectric constants and Born charges, where stored, for the LST and neutrality checks.
    rowQuantityOf(scope.quantity) === 'frequency'
      ? db
          .select({
            materialId: calculation.materialId,
            methodId: calculation.methodId,
            quantity: calculation.quantity,
            value: calculation.value,
            modeIndex: calculation.modeIndex,
            site: calculation.site,
            components: calculation.components,
            id: calculation.id,
          })
          .from(calculation)
          .where(
            and(
              eq(calculation.workspaceId, workspaceId),
              isNull(calculation.retractedAt),
              inArray(calculation.quantity, ['eps-inf', 'eps-static', 'born-charge']),
              inArray(calculation.methodId, methodIds),
              inArray(calculation.materialId, scopedMaterials),
            ),
          )
      : Promise.resolve([]),
    db
      .select({ n: sql<number>`count(*)` })
      .from(auditLog)
      .where(and(eq(auditLog.workspaceId, workspaceId), eq(auditLog.entityType, 'source'), eq(auditLog.action, 'merge'))),
    reference !== undefined
      ? db
          .select({ id: method.id, label: method.label })
          .from(method)
          .where(and(eq(method.workspaceId, workspaceId), eq(method.id, reference)))
          .then((rows) => rows[0])
      : Promise.resolve(undefined),
  ]);
  if (reference !== undefined && !referenceMethod) throw new AppError('conflict', 'The reference method of this benchmark is not in the workspace: choose another in the benchmark’s scope.');

  const tagsByMaterial = new Map<string, string[]>();
  for (const t of tags) (tagsByMaterial.get(t.materialId) ?? tagsByMaterial.set(t.materialId, []).get(t.materialId)!).push(t.tag);
  const s = settings[0];
  const dielectric = new Map<string, NonNullable<BenchmarkInput['dielectric']>[number] & { born: Array<{ index: number; site: string; id: string; z: number | number[] }> }>();
  // Several ε rows of one material × method: the first by id (as the material page reads them).
  for (const r of [...dielectricRows].sort((a, b) => (a.id < b.id ? -1 : 1))) {
    const key = `${r.materialId}|${r.methodId}`;
    let d = dielectric.get(key);
    if (!d) dielectric.set(key, (d = { materialId: r.materialId, methodId: r.methodId, epsInf: null, eps0: null, bornCharges: [], born: [] }));
    if (r.quantity === 'eps-inf') d.epsInf ??= r.value;
    else if (r.quantity === 'eps-static') d.eps0 ??= r.value;
    else d.born.push({ index: r.modeIndex ?? 0, site: r.site ?? '', id: r.id, z: r.components ?? r.value });
  }
  return {
    quantity: scope.quantity,
    rules,
    materials: materials.map((m) => ({ ...m, tags: (tagsByMaterial.get(m.id) ?? []).sort() })),
    methods,
    // Pins and decisions name measurements: a benchmark against a reference method has none.
    pins: reference !== undefined ? [] : pins,
    decisions: reference !== undefined ? [] : decisions.map((d): ScopeDecision => ({ ...d, createdAt: d.createdAt.getTime() })),
    ...(referenceMethod ? { referenceMethod } : {}),
    qualityThresholds: s
      ? {
          kPointsPerReciprocalAtom: s.kPointsPerReciprocalAtom,
          acousticCm1: s.acousticCm1,
          imaginaryCm1: s.imaginaryCm1,
          bornNeutrality: s.bornNeutrality,
          lstRelative: s.lstRelative,
        }
      : undefined,
    entropyWindow: isThermal(scope.quantity) ? { temperatureK: scope.entropyTemperatureK, toleranceK: scope.entropyToleranceK } : undefined,
    ...(merges.n > 0 ? { sourceMerges: Number(merges.n) } : {}),
    dielectric: [...dielectric.values()].map(({ born, ...d }) => ({
      ...d,
      bornCharges: born.sort((a, b) => a.index - b.index || a.site.localeCompare(b.site, 'en', { numeric: true }) || (a.id < b.id ? -1 : 1)).map((b) => b.z),
    })),
  };
}

/** The measurement and calculation rows of a scope, each restricted to it; `onlyMaterials`: only those materials' rows. */
export async function loadScopeRows(
  workspaceId: string,
  bm: BenchmarkRecord,
  options: { materialIds?: string[]; onlyMaterials?: string[] } = {},
): Promise<Pick<BenchmarkInput, 'measurements' | 'calculations'>> {
  const { measurementWhere, calculationWhere } = scopeConditions(workspaceId, bm, options);
  const [measurements, calculations] = await Promise.all([
    db
      .select(MEASUREMENT_INPUT)
      .from(measurement)
      .where(measurementWhere)
      .then((rows) => rows.map((r) => ({ ...r, seq: r.seq! }))),
    // The largest read (every computed mode in scope): raw rows mapped by hand skip Drizzle's per-column decoding.
    db
      .select(hasTensors(bm.scope.quantity) ? TENSOR_CALCULATION_INPUT : CALCULATION_INPUT)
      .from(calculation)
      .where(calculationWhere)
      .values()
      .then((rows) => rows.map(calculationFromRow)),
  ]);
  return { measurements, calculations };
}

export async function loadBenchmarkInput(
  workspaceId: string,
  bm: BenchmarkRecord,
  /** Reproducing a revision: its materials (those of its measurements) in place of today's scope. */
  options: { materialIds?: string[] } = {},
): Promise<BenchmarkInput> {
  const [context, rows] = await Promise.all([loadBenchmarkContext(workspaceId, bm, options), loadScopeRows(workspaceId, bm, options)]);
  return { ...context, ...rows };
}

type Runs = Array<[number, number]>;

/**
 * The sequence numbers of the rows a scope selects today, as sorted runs, computed in SQLite (consecutive numbers
 * share `seq − row_number()`), so that telling whether anything changed does not read 200,000 rows into JavaScript.
 */
export async function scopeRowRuns(workspaceId: string, bm: BenchmarkRecord): Promise<{ measurements: Runs; calculations: Runs }> {
  const { measurementWhere, calculationWhere } = scopeConditions(workspaceId, bm);
  const runsOfQuery = async (seq: typeof measurement.seq | typeof calculation.seq, table: typeof measurement | typeof calculation, where: SQL) => {
    const rows = await db.values<[number, number]>(
      sql`select min(s), max(s) from (select ${seq} as s, ${seq} - row_number() over (order by ${seq}) as island from ${table} where ${where}) group by island order by 1`,
    );
    return rows.map((r) => [Number(r[0]), Number(r[1])] as [number, number]);
  };
  const [measurements, calculations] = await Promise.all([
    runsOfQuery(measurement.seq, measurement, measurementWhere),
    runsOfQuery(calculation.seq, calculation, calculationWhere),
  ]);
  return { measurements, calculations };
}

function inRuns(column: typeof measurement.seq | typeof calculation.seq, chunk: ReadonlyArray<readonly [number, number]>) {
  return or(...chunk.map(([a, b]) => (a === b ? eq(column, a) : and(gte(column, a), lte(column, b)))));
}

const RUNS_PER_QUERY = 200;

/** The materials of the rows these runs of sequence numbers name (retracted rows included): what a change touched. */
export async function materialsOfRuns(workspaceId: string, runs: { measurements: Runs; calculations: Runs }): Promise<Set<string>> {
  const out = new Set<string>();
  for (const [table, column, list] of [
    [measurement, measurement.seq, runs.measurements],
    [calculation, calculation.seq, runs.calculations],
  ] as const) {
    for (let i = 0; i < list.length; i += RUNS_PER_QUERY) {
      const found = await db
        .selectDistinct({ materialId: table.materialId })
        .from(table)
        .where(and(eq(table.workspaceId, workspaceId), inRuns(column, list.slice(i, i + RUNS_PER_QUERY))));
      for (const f of found) out.add(f.materialId);
    }
  }
  return out;
}

/** How many rows of each import these runs of sequence numbers hold: the imports of a revision's new rows. */
export async function importsOfRuns(workspaceId: string, runs: { measurements: Runs; calculations: Runs }): Promise<Array<{ id: string; rows: number }>> {
  const counts = new Map<string, number>();
  for (const [table, column, list] of [
    [measurement, measurement.seq, runs.measurements],
    [calculation, calculation.seq, runs.calculations],
  ] as const) {
    for (let i = 0; i < list.length; i += RUNS_PER_QUERY) {
      const found = await db
        .select({ importId: table.importId, rows: sql<number>`count(*)` })
        .from(table)
        .where(and(eq(table.workspaceId, workspaceId), isNotNull(table.importId), inRuns(column, list.slice(i, i + RUNS_PER_QUERY))))
        .groupBy(table.importId);
      for (const f of found) counts.set(f.importId!, (counts.get(f.importId!) ?? 0) + Number(f.rows));
    }
  }
  return [...counts].map(([id, rows]) => ({ id, rows }));
}

/** The material of each of these pins' measurements: which material a pin belongs to. */
export async function pinMaterials(workspaceId: string, pinIds: string[]): Promise<Map<string, string>> {
  const out = new Map<string, string>();
  for (let i = 0; i < pinIds.length; i += 500) {
    const rows = await db
      .select({ id: pairPin.id, materialId: measurement.materialId })
      .from(pairPin)
      .innerJoin(measurement, eq(measurement.id, pairPin.measurementId))
      .where(and(eq(pairPin.workspaceId, workspaceId), inArray(pairPin.id, pinIds.slice(i, i + 500))));
    for (const r of rows) out.set(r.id, r.materialId);
  }
  return out;
}

/** Names used to describe a scope in words (empty state, header). */
export async function scopeLabels(workspaceId: string, scope: BenchmarkScope) {
  const [methods, materials, reference] = await Promise.all([
    scope.methodIds.length
      ? db.select({ id: method.id, label: method.label }).from(method).where(and(eq(method.workspaceId, workspaceId), inArray(method.id, scope.methodIds)))
      : Promise.resolve([]),
    scope.materialIds.length
      ? db.select({ id: material.id, name: material.name }).from(material).where(and(eq(material.workspaceId, workspaceId), inArray(material.id, scope.materialIds)))
      : Promise.resolve([]),
    scope.referenceMethodId !== undefined
      ? db
          .select({ label: method.label })
          .from(method)
          .where(and(eq(method.workspaceId, workspaceId), eq(method.id, scope.referenceMethodId)))
          .then((rows) => rows[0]?.label)
      : Promise.resolve(undefined),
  ]);
  return { methods, materials, reference };
}

/** Choices for the benchmark form: live methods, materials and tags of the workspace. */
export async function benchmarkFormOptions(workspaceId: string) {
  const [methods, materials, tags] = await Promise.all([
    db.select({ id: method.id, label: method.label }).from(method).where(and(eq(method.workspaceId, workspaceId), isNull(method.retractedAt))).orderBy(asc(method.label)),
    db
      .select({ id: material.id, name: material.name })
      .from(material)
      .where(and(eq(material.workspaceId, workspaceId), isNull(material.retractedAt)))
      .orderBy(asc(material.name))
      .limit(2000),
    db.selectDistinct({ tag: materialTag.tag }).from(materialTag).where(eq(materialTag.workspaceId, workspaceId)).orderBy(asc(materialTag.tag)),
  ]);
  return { methods, materials, tags: tags.map((t) => t.tag) };
}


/**
 * The measurement and calculation rows of a stored row set, as loadBenchmarkInput reads them, whether or not they
 * were retracted since: what reproducing a past revision starts from. Only this workspace's rows; a sequence
 * number that names no row of it is reported, since the set then cannot be reproduced.
 */
export async function rowsOfRowSet(workspaceId: string, rows: { measurements: number[]; calculations: number[] }) {
  const measurements: BenchmarkInput['measurements'] = [];
  const calculations: BenchmarkInput['calculations'] = [];
  const mRuns = runsOf(rows.measurements);
  for (let i = 0; i < mRuns.length; i += RUNS_PER_QUERY) {
    const found = await db
      .select(MEASUREMENT_INPUT)
      .from(measurement)
      .where(and(eq(measurement.workspaceId, workspaceId), inRuns(measurement.seq, mRuns.slice(i, i + RUNS_PER_QUERY))));
    measurements.push(...found.map((r) => ({ ...r, seq: r.seq! })));
  }
  const cRuns = runsOf(rows.calculations);
  for (let i = 0; i < cRuns.length; i += RUNS_PER_QUERY) {
    const found = await db
      .select(TENSOR_CALCULATION_INPUT)
      .from(calculation)
      .where(and(eq(calculation.workspaceId, workspaceId), inRuns(calculation.seq, cRuns.slice(i, i + RUNS_PER_QUERY))))
      .values();
    calculations.push(...found.map(calculationFromRow));
  }
  const missing = rows.measurements.length - measurements.length + rows.calculations.length - calculations.length;
  if (missing !== 0) throw new AppError('conflict', `${missing} row(s) of this revision's row set are not in the workspace: it cannot be reproduced.`);
  return { measurements, calculations };
}

/** The recipe fields of these methods and the cells and tags of these materials: what the convergence view reads. */
export async function convergenceInputs(workspaceId: string, methodIds: string[], materialIds: string[]) {
  const [methods, materials, tags] = await Promise.all([
    methodIds.length
      ? db
          .select({ id: method.id, label: method.label, kGrid: method.kGrid, qGrid: method.qGrid, cutoffEv: method.cutoffEv, smearing: method.smearing })
          .from(method)
          .where(and(eq(method.workspaceId, workspaceId), inArray(method.id, methodIds)))
      : Promise.resolve([]),
    materialIds.length
      ? db
          .select({ id: material.id, name: material.name, atomsInCell: material.atomsInCell })
          .from(material)
          .where(and(eq(material.workspaceId, workspaceId), inArray(material.id, materialIds)))
      : Promise.resolve([]),
    materialIds.length
      ? db
          .select({ materialId: materialTag.materialId, tag: materialTag.tag })
          .from(materialTag)
          .where(and(eq(materialTag.workspaceId, workspaceId), inArray(materialTag.materialId, materialIds)))
      : Promise.resolve([]),
  ]);
  const tagsOf = new Map<string, string[]>();
  for (const t of tags) (tagsOf.get(t.materialId) ?? tagsOf.set(t.materialId, []).get(t.materialId)!).push(t.tag);
  return { methods, materials: materials.map((m) => ({ ...m, tags: (tagsOf.get(m.id) ?? []).sort() })) };
}
