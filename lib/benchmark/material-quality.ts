import { DEFAULT_QUALITY_THRESHOLDS, qualityReport, ScienceInputError, siteNeutrality, type QualityFlag, type QualityThresholds } from '@/lib/science';
import { neutralityVerdict } from '@/lib/import/born-neutrality';
import { qualityModes } from '@/lib/benchmark/pair-rows';

type Grid = [number, number, number];

/** One method's computed Γ-point modes of a material, as the material page reads them. */
export interface MethodModeSet {
  methodId: string;
  methodLabel: string;
  kGrid: Grid | null;
  qGrid: Grid | null;
  modes: Array<{
    id: string;
    value: number;
    irrep: string | null;
    branch: 'TO' | 'LO' | null;
    degeneracy: number | null;
    activity: string | null;
    sourceId: string;
  }>;
  /** The method's ε∞ and ε₀ of this material, where both are stored (the Lyddane–Sachs–Teller check). */
  dielectric?: { epsInf: number; eps0: number };
}

export interface QualityFinding {
  code: QualityFlag['code'] | 'invalid-input';
  severity: QualityFlag['severity'];
  message: string;
}

export interface MethodQuality {
  methodId: string;
  methodLabel: string;
  modeCount: number;
  flags: QualityFinding[];
  /** Checks that could not run for lack of an input, in words. */
  skipped: string[];
}

/**
 * Runs lib/science's qualityChecks on each method's modes of one material with the
 * workspace's thresholds (the inputs a calculation set lacks skip their checks).
 */
export function materialQualityFlags(input: { materialId: string; atomsInCell: number | null; spaceGroup?: number | null; methods: MethodModeSet[]; thresholds?: QualityThresholds }): MethodQuality[] {
  const out: MethodQuality[] = [];
  for (const m of input.methods) {
    if (m.modes.length === 0) continue;
    const skipped: string[] = [];
    if (input.atomsInCell === null) skipped.push('mode count and k-point density: the material has no atoms-in-cell');
    else if (!m.kGrid) skipped.push('k-point density: the method has no k-grid');
    if (!m.kGrid || !m.qGrid) skipped.push(`grid commensurability: the method has no ${!m.kGrid && !m.qGrid ? 'k- or q-grid' : !m.kGrid ? 'k-grid' : 'q-grid'}`);
    let flags: QualityFinding[];
    try {
      const report = qualityReport({
        modes: qualityModes(m.modes.map((c) => ({ ...c, materialId: input.materialId, methodId: m.methodId, importId: null, uncertainty: null, temperatureK: null }))),
        atomsInCell: input.atomsInCell ?? undefined,
        spaceGroupNumber: input.spaceGroup ?? undefined,
        kGrid: m.kGrid ?? undefined,
        qGrid: m.qGrid ?? undefined,
        dielectric: m.dielectric,
        thresholds: input.thresholds,
      });
      flags = report.flags.map(({ code, severity, message }) => ({ code, severity, message }));
      for (const n of report.notApplied) skipped.push(n.reason);
    } catch (error) {
      if (!(error instanceof ScienceInputError)) throw error;
      flags = [{ code: 'invalid-input', severity: 'error', message: `The checks could not run: ${error.message}` }];
    }
    flags.sort((a, b) => (a.severity === b.severity ? a.code.localeCompare(b.code) : a.severity === 'error' ? -1 : 1));
    out.push({ methodId: m.methodId, methodLabel: m.methodLabel, modeCount: m.modes.length, flags, skipped });
  }
  return out;
}

/** One measured source's or one method's Born charges of a material, with their neutrality in words. */
export interface BornChargeSet {
  series: string;
  rows: Array<{ id: string; site: string | null; value: number; components: number[] | null }>;
  neutrality: { status: 'neutral' | 'residue' | 'far' | 'unchecked'; text: string };
}

/**
 * The material page's Born charges per series, checked for neutrality by the rule the import
 * applies (lib/science/tensors.ts siteNeutrality; born-neutrality.ts for the thresholds).
 */
export function bornChargeSets(input: {
  atomsInCell: number | null;
  elements?: Readonly<Record<string, number>>;
  limitE?: number;
  series: Array<{ series: string; rows: BornChargeSet['rows'] }>;
}): BornChargeSet[] {
  const limit = input.limitE ?? DEFAULT_QUALITY_THRESHOLDS.bornNeutrality;
  return input.series
    .filter((s) => s.rows.length > 0)
    .map((s) => {
      const rows = [...s.rows].sort((a, b) => (a.site ?? '').localeCompare(b.site ?? '', 'en', { numeric: true }));
      const { residue, basis } = siteNeutrality(
        rows.filter((r) => r.site !== null).map((r) => ({ site: r.site!, charge: r.components ?? r.value })),
        input.atomsInCell,
        input.elements,
      );
      let neutrality: BornChargeSet['neutrality'];
      if (!residue) neutrality = { status: 'unchecked', text: `Neutrality not checked: ${rows.length} site${rows.length === 1 ? '' : 's'}${input.atomsInCell ? ` of the ${input.atomsInCell} atoms of the cell` : ', and no atoms in the cell recorded'}.` };
      else {
        const zero = Math.abs(residue.value) < 5e-4;
        const where = basis === 'formula-unit' ? 'in the diagonal mean per formula unit' : zero ? 'in every component over the cell' : `in ${residue.component} over the cell`;
        const sum = `Σ Z* = ${Number(residue.value.toFixed(3))} e ${where}`;
        const status = neutralityVerdict(residue.value, limit);
        const text = {
          far: `${sum}: far from neutral — a site is missing or a sign is wrong.`,
          residue: `${sum}, beyond ±${limit} e: the acoustic sum rule was probably not imposed.`,
          neutral: `${sum}, within ±${limit} e: neutral.`,
        }[status];
        neutrality = { status, text };
      }
      return { series: s.series, rows, neutrality };
    });
}
