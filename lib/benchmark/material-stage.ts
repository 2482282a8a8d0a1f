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
 * Cp − Cv (rules.heatCapacityCorrection 'cp-minus-cv', heat capacities against experiment): each
 * computed Cv of a material with α_V, B_T and V_m recorded becomes Cv + α_V² B_T V_m T at the row's
 * own temperature (thermodynamics.ts cpMinusCv; the three properties are taken as given at every
 * temperature), before the per-atom division; a material lacking any of the three is not paired,
 * so corrected and uncorrected values never mix in one statistic.
 *
 * Against a reference method (input.referenceMethod) the reference's calculations of the
 * material take the place of its measurements (reference-pairs.ts); the quality checks run on
 * the candidates only.
 */
import { atomsPerReducedFormulaUnit, cpMinusCvOf, fullTensor, qualityReport, ScienceInputError } from '@/lib/science';
import { groupBy, pairEntropies, pairFrequencies, pairPerMaterial, qualityModes } from './pair-rows';
import { asReference, pairReferenceFrequencies } from './reference-pairs';
import { pairSites, pairSplittings, type TensorDistances } from './site-and-splitting-pairs';
import { isDielectric, isThermal, rowQuantityOf } from './quantities';
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
  /** Born charges: ‖ΔZ‖_F by pair key where both sides hold a full tensor (site-and-splitting-pairs.ts). */
  tensorDistances?: TensorDistances;
  /** Heat capacities under the Cp − Cv rule: whether the material's computed values were corrected or it was left out. */
  cpCorrection?: 'corrected' | 'lacking';
}

export function qualityOrder(a: { methodId: string; materialId: string; code: string }, b: { methodId: string; materialId: string; code: string }): number {
  return a.methodId.localeCompare(b.methodId) || a.materialId.localeCompare(b.materialId) || a.code.localeCompare(b.code);
}

function byId<T extends { id: string }>(a: T, b: T): number {
  return a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

/** Computed Cv → Cp of one material (module header), or null when it lacks α, B or V_m. */
function cvToCp(material: BenchmarkInput['materials'][number] | undefined): ((rows: ScopeCalculation[]) => ScopeCalculation[]) | null {
  if (!material || material.thermalExpansionPerK == null || material.bulkModulusGpa == null || material.molarVolumeCm3 == null) return null;
  return (rows) => rows.map((r) => (r.temperatureK === null ? r : { ...r, value: r.value + cpMinusCvOf(material, r.temperatureK)! }));
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

/** A Born charge as the quality check reads it: 3 × 3 rows. */
function asTensorRows(z: number | number[]): number[][] {
  const t = fullTensor(z);
  return [t.slice(0, 3), t.slice(3, 6), t.slice(6, 9)];
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
  if (rowQuantityOf(input.quantity) !== 'frequency' || !material) return { records, notApplied };
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
        // One charge per atom of the cell (a scalar stands for Z·I); other site lists are checked on import and on the material page.
        bornCharges: stored && stored.bornCharges.length && stored.bornCharges.length === material.atomsInCell ? stored.bornCharges.map(asTensorRows) : undefined,
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
  const correctCv = quantity === 'heat-capacity' && input.referenceMethod === undefined && rules.heatCapacityCorrection === 'cp-minus-cv';

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
    let tensorDistances: TensorDistances | undefined;
    let cpCorrection: MaterialStage['cpCorrection'];
    const calcsByMaterialMethod = (transform: (rows: ScopeCalculation[]) => ScopeCalculation[] = (rows) => rows) =>
      new Map([...calcsByMethod].map(([methodId, list]) => [`${materialId}|${methodId}`, transform(list)]));
    if (quantity === 'born-charge') {
      ({ pairs, unpaired, tensorDistances } = pairSites(measurements, calcsByMaterialMethod(), methodIds));
      measuredInScope = measurements.filter((m) => m.site).length;
    } else if (quantity === 'lo-to-splitting') {
      let measuredCouples: number;
      ({ pairs, unpaired, measuredCouples } = pairSplittings(measurements, calcsByMaterialMethod(), methodIds, rules));
      measuredInScope = measuredCouples;
    } else if (quantity === 'frequency' && referenceRows) {
      const result = pairReferenceFrequencies(materialId, referenceRows, calcsByMethod, methodIds, rules, context);
      ({ pairs, unpaired, matchedBy } = result);
      measuredInScope = result.referenceModes;
    } else if (quantity === 'frequency') {
      ({ pairs, unpaired } = pairFrequencies(measurements, calcsByMaterialMethod(), methodIds, pinsOf.get(materialId) ?? [], rules, context));
    } else if (isDielectric(quantity)) {
      ({ pairs, unpaired } = pairPerMaterial(measurements, calcsByMaterialMethod(), methodIds));
    } else {
      const atoms = atomBasis ? reducedAtoms(materials.get(materialId)?.formula) : undefined;
      const correct = correctCv ? cvToCp(materials.get(materialId)) : (rows: ScopeCalculation[]) => rows;
      if (correct === null) cpCorrection = 'lacking';
      else if (correctCv) cpCorrection = 'corrected';
      measurements = perAtom(measurements, atoms);
      measuredInScope = measurements.filter((m) => near(m.temperatureK)).length;
      ({ pairs, unpaired } = pairEntropies(measurements, calcsByMaterialMethod((list) => (correct === null ? [] : perAtom(correct(list), atoms))), methodIds, window.temperatureK, window.toleranceK));
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
      ...(tensorDistances && Object.keys(tensorDistances).length ? { tensorDistances } : {}),
      ...(cpCorrection ? { cpCorrection } : {}),
    };
  });
}
