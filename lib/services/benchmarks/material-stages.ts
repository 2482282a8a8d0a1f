import 'server-only';
/**
 * The per-material pairings a recomputation starts from, kept between runs so that
 * a change re-pairs only the materials it touched (lib/benchmark/material-stage.ts
 * says what one stage depends on).
 *
 * A process keeps, per benchmark, the row set its last computation used, each
 * material's stage, the sequence numbers of that material's rows, and two keys: one
 * over the benchmark-wide pairing inputs (scope, rules, quality thresholds, entropy
 * window, methods) and one per material over its own fields, dielectric rows and
 * pins. A new run:
 *   1. reads today's row set as runs (one SQL query, no rows);
 *   2. takes the runs that entered or left since the kept set and asks which
 *      materials own those rows (retracted rows included);
 *   3. adds the materials whose key changed, that are new, or that left the scope;
 *   4. reads and pairs those materials only, and keeps every other stage.
 * A changed benchmark-wide key, or no kept state (a new process, or one that ran
 * another benchmark since), re-pairs every material: the full computation.
 *
 * Rows are never edited after they are written (fingerprint.ts), so a material none
 * of whose rows entered or left, and whose key is the same, has the same stage. The
 * state is per process and is only a cache: a process that lacks it computes in full,
 * and the result is the same either way (tests/integration/benchmark-incremental.test.ts
 * checks that against a full computation after random changes).
 */
import { createHash } from 'node:crypto';
import { loadScopeRows, materialsOfRuns, pinMaterials, type BenchmarkContext, type BenchmarkRecord } from '@/db/queries/benchmarks';
import { canonicalJson } from '@/lib/benchmark/fingerprint';
import { pairMaterials, type MaterialStage } from '@/lib/benchmark/material-stage';
import { runsOf, subtractRuns, type RowSet } from '@/lib/benchmark/row-set';

type Runs = Array<[number, number]>;

interface KeptMaterial {
  key: string;
  stage: MaterialStage;
  measurements: number[];
  calculations: number[];
}

interface KeptBenchmark {
  pairingKey: string;
  runs: { measurements: Runs; calculations: Runs };
  materials: Map<string, KeptMaterial>;
}

/** Benchmarks whose stages a process keeps; the least recently used goes first. */
const KEPT_BENCHMARKS = 4;
/** Materials whose rows one read loads. */
const MATERIALS_PER_READ = 2000;
const kept = new Map<string, KeptBenchmark>();

function hash(value: unknown): string {
  return createHash('sha256').update(canonicalJson(value)).digest('base64');
}

function pairingKeyOf(bm: BenchmarkRecord, context: BenchmarkContext): string {
  const methods = [...context.methods].sort((a, b) => (a.id < b.id ? -1 : 1));
  return hash({ scope: bm.scope, rules: context.rules, thresholds: context.qualityThresholds ?? null, window: context.entropyWindow ?? null, methods, sourceMerges: context.sourceMerges ?? 0 });
}

export interface MaterialStages {
  stages: MaterialStage[];
  /** Exactly the rows the stages were computed from. */
  rows: RowSet;
  /** How many materials were paired in this run, of how many in scope. */
  repaired: number;
  materials: number;
}

/**
 * The stages of every material in scope (module header). `today` is the row set scopeRowRuns read; `full` ignores
 * what the process kept.
 */
export async function materialStages(
  workspaceId: string,
  bm: BenchmarkRecord,
  context: BenchmarkContext,
  today: { measurements: Runs; calculations: Runs },
  options: { full?: boolean } = {},
): Promise<MaterialStages> {
  const cacheKey = `${workspaceId}|${bm.id}`;
  const pairingKey = pairingKeyOf(bm, context);
  const pinMaterial = context.pins.length ? await pinMaterials(workspaceId, context.pins.map((p) => p.id)) : new Map<string, string>();
  const pinsOf = new Map<string, unknown[]>();
  for (const p of [...context.pins].sort((a, b) => (a.id < b.id ? -1 : 1))) {
    const materialId = pinMaterial.get(p.id);
    if (materialId) (pinsOf.get(materialId) ?? pinsOf.set(materialId, []).get(materialId)!).push([p.id, p.methodId, p.measurementId, p.calculationId]);
  }
  const dielectricOf = new Map<string, unknown[]>();
  for (const d of context.dielectric ?? []) (dielectricOf.get(d.materialId) ?? dielectricOf.set(d.materialId, []).get(d.materialId)!).push(d);
  const materialKey = (m: BenchmarkContext['materials'][number]) =>
    hash({
      // α, B and V_m are read (and so keyed) only under the Cp − Cv rule
      m: [m.id, m.formula, m.atomsInCell, m.spaceGroup ?? null, ...(m.thermalExpansionPerK !== undefined ? [m.thermalExpansionPerK, m.bulkModulusGpa, m.molarVolumeCm3] : [])],
      d: [...(dielectricOf.get(m.id) ?? [])].sort((a, b) => ((a as { methodId: string }).methodId < (b as { methodId: string }).methodId ? -1 : 1)),
      p: pinsOf.get(m.id) ?? [],
    });

  const previous = options.full ? undefined : kept.get(cacheKey);
  const base = previous && previous.pairingKey === pairingKey ? previous : undefined;
  const inScope = new Map(context.materials.map((m) => [m.id, m]));
  const keys = new Map(context.materials.map((m) => [m.id, materialKey(m)]));
  let changed: Set<string>;
  if (base) {
    const moved = {
      measurements: [...subtractRuns(today.measurements, base.runs.measurements), ...subtractRuns(base.runs.measurements, today.measurements)],
      calculations: [...subtractRuns(today.calculations, base.runs.calculations), ...subtractRuns(base.runs.calculations, today.calculations)],
    };
    changed = await materialsOfRuns(workspaceId, moved);
    for (const [id, key] of keys) if (base.materials.get(id)?.key !== key) changed.add(id);
    for (const id of base.materials.keys()) if (!inScope.has(id)) changed.add(id);
  } else {
    changed = new Set(inScope.keys());
  }

  const materials = new Map(base?.materials ?? []);
  for (const id of changed) materials.delete(id);
  const toLoad = [...changed].filter((id) => inScope.has(id)).sort();
  // In batches of materials, so a full computation never holds every row at once (the kept stages are far smaller).
  for (let i = 0; i < toLoad.length; i += MATERIALS_PER_READ) {
    const batch = toLoad.slice(i, i + MATERIALS_PER_READ);
    const rows = await loadScopeRows(workspaceId, bm, { onlyMaterials: batch });
    const seqs = new Map<string, { measurements: number[]; calculations: number[] }>();
    const seqsOf = (id: string) => seqs.get(id) ?? seqs.set(id, { measurements: [], calculations: [] }).get(id)!;
    for (const r of rows.measurements) seqsOf(r.materialId).measurements.push(r.seq!);
    for (const r of rows.calculations) seqsOf(r.materialId).calculations.push(r.seq!);
    for (const stage of pairMaterials({ ...context, ...rows })) {
      const own = seqsOf(stage.materialId);
      materials.set(stage.materialId, { key: keys.get(stage.materialId) ?? '', stage, ...own });
    }
  }

  const all = [...materials.values()];
  const rows: RowSet = {
    measurements: all.flatMap((m) => m.measurements).sort((a, b) => a - b),
    calculations: all.flatMap((m) => m.calculations).sort((a, b) => a - b),
  };
  kept.delete(cacheKey);
  kept.set(cacheKey, { pairingKey, runs: { measurements: runsOf(rows.measurements), calculations: runsOf(rows.calculations) }, materials });
  if (kept.size > KEPT_BENCHMARKS) kept.delete(kept.keys().next().value!);
  return { stages: all.map((m) => m.stage), rows, repaired: toLoad.length, materials: inScope.size };
}

/** Forgets what this process kept (tests). */
export function forgetMaterialStages(): void {
  kept.clear();
}
