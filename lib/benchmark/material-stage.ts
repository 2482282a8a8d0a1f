/**
 * The per-material half of a benchmark computation: one material's rows in scope →
 * its pairs with every method, its unpaired measurements per method, and the quality
 * checks of each material × method. Nothing here looks at another material, so a
 * stage depends only on that material's measurements and calculations, the pins on
 * its measurements, its own fields (atoms in the cell, space group, formula), its
 * dielectric rows, and the benchmark-wide pairing inputs (scope, rules, quality
 * thresholds, methods). That is what lets the recomputation keep the stages of
 * unchanged materials and re-pair only the materials whose inputs changed
 * (lib/services/benchmarks/recompute.ts); compute.ts's finishBenchmark turns the
 * stages into statistics.
 *
 * Entropy basis 'atom': values are divided by the atoms of the reduced formula unit
 * here, before pairing (compute.ts header).
 *
 * Against a reference method (input.referenceMethod) the reference's calculations of the
 * material take the place of its measurements (reference-pairs.ts); the quality checks run on
 * the candidates only.
 */
import { atomsPerReducedFormulaUnit, qualityReport, ScienceInputError } from '@/lib/science';
import { groupBy, pairEntropies, pairFrequencies, pairPerMaterial, qualityModes } from './pair-rows';
import { asReference, pairReferenceFrequencies } from './reference-pairs';
import { isDielectric, isThermal } from './quantities';
import type { BenchmarkInput, BenchmarkSnapshot, PairRecord, QualityRecord, ScopeCalculation, ScopeMeasurement } from './types';

type NotApplied = NonNullable<BenchmarkSnapshot['qualityNotApplied']>;

export interface MaterialStage {
  materialId: string;
  /** As paired: no decision, merge or outlier mark applied (finishBenchmark copies them before it does). */
  pairs: PairRecord[];
  /** Measured peaks no computed mode of the method took, per method id. */
  unpaired: Record<string, number>;
  quality: QualityRecord[];
  notApplied: NotApplied;
  /** Rows of this material in scope. */
  measurements: number;
  calculations: number;
  /** Measurements that count for the coverage (entropy: those near the benchmark temperature). */
  measuredInScope: number;
  /** Against a reference method: how many candidate methods were matched by mode index, and how many by the pairing rules. */
  matchedBy?: { index: number; pairing: number };
}

export function qualityOrder(a: { methodId: string; materialId: string; code: string }, b: { methodId: string; materialId: string; code: string }): number {
  return a.methodId.localeCompare(b.methodId) || a.materialId.localeCompare(b.materialId) || a.code.localeCompare(b.code);
}

function byId<T extends { id: string }>(a: T, b: T): number {
  return a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

/** Entropy values per mole of atoms instead of formula units (module header). */
function perAtom<T extends ScopeMeasurement | ScopeCalculation>(rows: readonly T[], atoms: number | undefined): T[] {
  if (!atoms) return [...rows];
  return rows.map((r) => ({ ...r, value: r.value / atoms, uncertainty: r.uncertainty === null ? null : r.uncertainty / atoms }));
}

function reducedAtoms(formula: string | undefined): number | undefined {
  if (formula === undefined) return undefined;
  try {
    return atomsPerReducedFormulaUnit(formula);
  } catch (error) {
    if (!(error instanceof ScienceInputError)) throw error;
    return undefined;
  }
}

function qualityOf(
  input: BenchmarkInput,
  materialId: string,
  calcsByMethod: Map<string, ScopeCalculation[]>,
  methods: Map<string, BenchmarkInput['methods'][number]>,
  material: BenchmarkInput['materials'][number] | undefined,
  dielectric: Map<string, NonNullable<BenchmarkInput['dielectric']>[number]>,
): { records: QualityRecord[]; notApplied: NotApplied } {
  const records: QualityRecord[] = [];
  const notApplied: NotApplied = [];
  if (input.quantity !== 'frequency' || !material) return { records, notApplied };
  for (const [methodId, calcs] of calcsByMethod) {
    const method = methods.get(methodId);
    if (!method) continue;
    const stored = dielectric.get(`${materialId}|${methodId}`);
    try {
      const report = qualityReport({
        modes: qualityModes(calcs),
        atomsInCell: material.atomsInCell ?? undefined,
        spaceGroupNumber: material.spaceGroup ?? undefined,
        kGrid: method.kGrid ?? undefined,
        qGrid: method.qGrid ?? undefined,
        dielectric: stored && stored.epsInf !== null && stored.eps0 !== null ? { epsInf: stored.epsInf, eps0: stored.eps0 } : undefined,
        // One isotropic charge per atom: the diagonal tensor Z·I.
        bornCharges: stored && stored.bornCharges.length ? stored.bornCharges.map((z) => [[z, 0, 0], [0, z, 0], [0, 0, z]]) : undefined,
        thresholds: input.qualityThresholds,
      });
      for (const f of report.flags) records.push({ methodId, materialId, code: f.code, severity: f.severity, message: f.message, ...(f.value !== undefined ? { value: f.value } : {}) });
      for (const n of report.notApplied) notApplied.push({ methodId, materialId, code: n.code, reason: n.reason });
    } catch (error) {
      if (!(error instanceof ScienceInputError)) throw error;
      records.push({ methodId, materialId, code: 'invalid-input', severity: 'error', message: error.message });
    }
  }
  return { records, notApplied };
}

/** One stage per material that has rows in the input, in material id order (module header). */
export function pairMaterials(input: BenchmarkInput): MaterialStage[] {
  const { rules, quantity } = input;
  const methodIds = [...input.methods].sort((a, b) => a.label.localeCompare(b.label) || a.id.localeCompare(b.id)).map((m) => m.id);
  const methods = new Map(input.methods.map((m) => [m.id, m]));
  const materials = new Map(input.materials.map((m) => [m.id, m]));
  const dielectric = new Map((input.dielectric ?? []).map((d) => [`${d.materialId}|${d.methodId}`, d]));
  const measurementsOf = groupBy([...input.measurements].sort(byId), (m) => m.materialId);
  const calculationsOf = groupBy([...input.calculations].sort(byId), (c) => c.materialId);
  const pinsOf = new Map<string, BenchmarkInput['pins']>();
  const materialOfMeasurement = new Map(input.measurements.map((m) => [m.id, m.materialId]));
  for (const pin of [...input.pins].sort(byId)) {
    const materialId = materialOfMeasurement.get(pin.measurementId);
    if (materialId) (pinsOf.get(materialId) ?? pinsOf.set(materialId, []).get(materialId)!).push(pin);
  }
  const context = {
    atomsInCell: new Map(input.materials.map((m) => [m.id, m.atomsInCell])),
    nonAnalyticCorrection: new Map(input.methods.map((m) => [m.id, m.nonAnalyticCorrection])),
    acousticThresholdCm1: input.qualityThresholds?.acousticCm1,
  };
  const window = { temperatureK: 298.15, toleranceK: 1, ...input.entropyWindow };
  const near = (t: number | null) => t !== null && (window.temperatureK === null || Math.abs(t - window.temperatureK) <= window.toleranceK);
  const atomBasis = isThermal(quantity) && (rules.entropyBasis ?? 'formula-unit') === 'atom';

  const ids = [...new Set([...measurementsOf.keys(), ...calculationsOf.keys()])].sort();
  const referenceId = input.referenceMethod?.id;
  return ids.map((materialId) => {
    const calculations = calculationsOf.get(materialId) ?? [];
    const calcsByMethod = groupBy(calculations, (c) => c.methodId);
    const referenceRows = referenceId === undefined ? undefined : (calcsByMethod.get(referenceId) ?? []);
    if (referenceId !== undefined) calcsByMethod.delete(referenceId);
    let measurements = referenceRows ? referenceRows.map(asReference) : (measurementsOf.get(materialId) ?? []);
    let pairs: PairRecord[];
    let unpaired: Map<string, number>;
    let measuredInScope = measurements.length;
    let matchedBy: MaterialStage['matchedBy'];
    if (quantity === 'frequency' && referenceRows) {
      const result = pairReferenceFrequencies(materialId, referenceRows, calcsByMethod, methodIds, rules, context);
      ({ pairs, unpaired, matchedBy } = result);
      measuredInScope = result.referenceModes;
    } else if (quantity === 'frequency') {
      const calcsByMaterialMethod = new Map([...calcsByMethod].map(([methodId, list]) => [`${materialId}|${methodId}`, list]));
      ({ pairs, unpaired } = pairFrequencies(measurements, calcsByMaterialMethod, methodIds, pinsOf.get(materialId) ?? [], rules, context));
    } else if (isDielectric(quantity)) {
      const calcsByMaterialMethod = new Map([...calcsByMethod].map(([methodId, list]) => [`${materialId}|${methodId}`, list]));
      ({ pairs, unpaired } = pairPerMaterial(measurements, calcsByMaterialMethod, methodIds));
    } else {
      const atoms = atomBasis ? reducedAtoms(materials.get(materialId)?.formula) : undefined;
      measurements = perAtom(measurements, atoms);
      const calcsByMaterialMethod = new Map([...calcsByMethod].map(([methodId, list]) => [`${materialId}|${methodId}`, perAtom(list, atoms)]));
      measuredInScope = measurements.filter((m) => near(m.temperatureK)).length;
      ({ pairs, unpaired } = pairEntropies(measurements, calcsByMaterialMethod, methodIds, window.temperatureK, window.toleranceK));
    }
    const { records, notApplied } = qualityOf(input, materialId, calcsByMethod, methods, materials.get(materialId), dielectric);
    return {
      materialId,
      pairs,
      unpaired: Object.fromEntries(unpaired),
      quality: records,
      notApplied,
      measurements: measurements.length,
      calculations: calculations.length - (referenceRows?.length ?? 0),
      measuredInScope,
      ...(matchedBy ? { matchedBy } : {}),
    };
  });
}
