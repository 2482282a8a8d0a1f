/**
 * A workflow's pass/fail check of one method against a stored revision, on the benchmark page's own numbers:
 * the method's MAE on the common pairs of the ranking (lib/benchmark/ranking.ts), its coverage and N. Nothing
 * is recomputed here; a method the ranking rule leaves unranked has no common-ground MAE, so it fails, and the
 * reason (the ranking's own) is given. Pure: the route reads the revision and the recomputation state.
 */
import type { BenchmarkSnapshot, MethodResult } from './types';

/**
 * Below this many common pairs a verdict carries a small-N warning: one pair more or less then moves the MAE by
 * several percent (common practice, from memory; not a rule of the benchmark). The benchmark's own ranking
 * minimum is used when it is larger.
 */
export const SMALL_N_WARNING = 20;

export interface VerdictInput {
  snapshot: BenchmarkSnapshot;
  methodId: string;
  maxMae: number;
  minCoverage: number;
}

export interface VerdictNumbers {
  meanAbsoluteError: number | null;
  rootMeanSquareError: number | null;
  meanSignedError: number | null;
  n: number;
  coverage: number | null;
  paired: number | null;
  measuredInScope: number | null;
}

export interface VerdictResult {
  verdict: 'pass' | 'fail';
  reasons: string[];
  warnings: string[];
  numbers: VerdictNumbers;
  ground: {
    kind: 'common' | 'none';
    commonN: number;
    rankedMethods: number;
    rank: number | null;
    description: string;
  };
  own: { n: number; meanAbsoluteError: number | null; excluded: number; outliers: number; qualityFlags: number } | null;
}

function percent(x: number): string {
  return `${Math.round(1000 * x) / 10} %`;
}

function formatNumber(x: number): string {
  return Number(x.toPrecision(4)).toString();
}

export function methodVerdict(input: VerdictInput): VerdictResult {
  const { snapshot, methodId, maxMae, minCoverage } = input;
  const unit = snapshot.unit;
  const result: MethodResult | undefined = snapshot.methods.find((m) => m.methodId === methodId);
  const ranking = snapshot.ranking;
  const measuredInScope = snapshot.counts.measuredInScope ?? null;
  const reasons: string[] = [];
  const warnings: string[] = [];

  if (!result) {
    return {
      verdict: 'fail',
      reasons: [snapshot.empty ?? 'The method has no pairs in this revision of the benchmark.'],
      warnings,
      numbers: { meanAbsoluteError: null, rootMeanSquareError: null, meanSignedError: null, n: 0, coverage: measuredInScope ? 0 : null, paired: 0, measuredInScope },
      ground: { kind: 'none', commonN: ranking?.commonN ?? 0, rankedMethods: ranking?.rankedMethods ?? 0, rank: null, description: 'The method is not in this revision.' },
      own: null,
    };
  }

  const coverage = result.coverage ?? null;
  const common = result.common ?? null;
  const own = {
    n: result.n,
    meanAbsoluteError: result.statistics?.meanAbsoluteError ?? null,
    excluded: result.excluded,
    outliers: result.outliers,
    qualityFlags: result.qualityFlags,
  };
  const rankedMethods = ranking?.rankedMethods ?? 0;
  const commonN = ranking?.commonN ?? 0;

  let description: string;
  if (common) {
    description =
      rankedMethods === 1
        ? `The ${common.n} measured values this method pairs (it is the only ranked method); pairs excluded by a curator's decision are left out.`
        : `The ${common.n} measured values that every one of the ${rankedMethods} ranked methods pairs; pairs excluded by a curator's decision are left out.`;
  } else {
    description = `No common ground: ${result.unranked ?? ranking?.note ?? 'the method is not ranked'}.`;
    reasons.push(`The method is not ranked on common ground (${result.unranked ?? ranking?.note ?? 'no ranking'}), so it has no common-ground MAE.`);
  }

  if (common && common.meanAbsoluteError > maxMae) {
    reasons.push(`MAE ${formatNumber(common.meanAbsoluteError)} ${unit} on ${common.n} common pairs is above maxMae ${formatNumber(maxMae)} ${unit}.`);
  }
  if (coverage === null) reasons.push('Coverage is undefined: no measured value is in the benchmark’s scope.');
  else if (coverage < minCoverage) reasons.push(`Coverage ${percent(coverage)} is below minCoverage ${percent(minCoverage)}.`);

  const n = common?.n ?? 0;
  const smallN = Math.max(SMALL_N_WARNING, ranking?.minN ?? 0);
  if (common && n < smallN) warnings.push(`N = ${n} common pairs is small (under ${smallN}): one pair more or less moves the MAE noticeably.`);

  return {
    verdict: reasons.length === 0 ? 'pass' : 'fail',
    reasons,
    warnings,
    numbers: {
      meanAbsoluteError: common?.meanAbsoluteError ?? null,
      rootMeanSquareError: common?.rootMeanSquareError ?? null,
      meanSignedError: common?.meanSignedError ?? null,
      n,
      coverage,
      paired: result.paired ?? null,
      measuredInScope,
    },
    ground: { kind: common ? 'common' : 'none', commonN, rankedMethods, rank: result.rank, description },
    own,
  };
}
