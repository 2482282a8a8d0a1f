/**
 * Ranking on common ground.
 *
 * Coverage of a method = measured values in scope it paired (pairs excluded by a
 * decision count: the method did pair them) / measured values in scope. A method is
 * ranked when it has statistics (N ≥ 3), at least `rules.ranking.minN` included pairs
 * and a coverage of at least `rules.ranking.minCoverage`; otherwise it is listed with
 * the reason and no rank. Ranked methods are compared on the common pairs: the
 * measured values (keys of their measurement ids) that every ranked method has as an
 * included pair. Their MAE on those pairs decides the rank (competition ranking,
 * "1224"); each method's own statistics stay beside. With fewer than three common
 * pairs nothing is ranked, and the note says why. A method with few pairs can thus
 * never rank above one with many on a sample of its own choosing.
 */
import { MIN_PAIRS_FOR_STATISTICS } from './statistics-minimum';
import type { BenchmarkRules } from './schemas';
import type { MethodResult, PairRecord, RankingRecord } from './types';

function measurementKey(p: PairRecord): string {
  return p.measurementIds.join('+');
}

function format(value: number): string {
  return `${Math.round(100 * value)} %`;
}

/**
 * Coverage of each method: paired measured values (any status) / measured values in scope. A derived
 * pair (an LO–TO splitting, from a TO and an LO measurement) is one measured value, not two.
 */
export function coverageOf(pairs: readonly PairRecord[], measuredInScope: number, derived = false): Map<string, { paired: number; coverage: number | null }> {
  const paired = new Map<string, Set<string>>();
  for (const p of pairs) {
    let set = paired.get(p.methodId);
    if (!set) paired.set(p.methodId, (set = new Set()));
    if (derived) set.add(p.measurementIds.join('+'));
    else for (const id of p.measurementIds) set.add(id);
  }
  const out = new Map<string, { paired: number; coverage: number | null }>();
  for (const [methodId, set] of paired) out.set(methodId, { paired: set.size, coverage: measuredInScope > 0 ? Math.min(1, set.size / measuredInScope) : null });
  return out;
}

/** Why a method is not ranked, or null when it is (module header). */
export function unrankedReason(result: Pick<MethodResult, 'n' | 'statistics'>, coverage: number | null, rule: BenchmarkRules['ranking']): string | null {
  if (result.statistics === null) return `fewer than ${MIN_PAIRS_FOR_STATISTICS} included pairs`;
  if (result.n < rule.minN) return `N = ${result.n} is below the benchmark's minimum of ${rule.minN}`;
  if (coverage !== null && coverage < rule.minCoverage) return `coverage ${format(coverage)} is below the benchmark's minimum of ${format(rule.minCoverage)}`;
  return null;
}

/**
 * Sets rank, coverage, unranked and common on each result (module header) and returns
 * the ranking record. `included` holds each method's included pairs.
 */
export function rankOnCommonGround(
  results: MethodResult[],
  included: ReadonlyMap<string, readonly PairRecord[]>,
  allPairs: readonly PairRecord[],
  measuredInScope: number,
  rule: BenchmarkRules['ranking'],
  derived = false,
): RankingRecord {
  const coverage = coverageOf(allPairs, measuredInScope, derived);
  const eligible: MethodResult[] = [];
  for (const r of results) {
    const c = coverage.get(r.methodId) ?? { paired: 0, coverage: measuredInScope > 0 ? 0 : null };
    r.paired = c.paired;
    r.coverage = c.coverage;
    r.unranked = unrankedReason(r, c.coverage, rule);
    r.common = null;
    r.rank = null;
    if (r.unranked === null) eligible.push(r);
  }
  const record: RankingRecord = { commonN: 0, minN: rule.minN, minCoverage: rule.minCoverage, rankedMethods: 0, note: null };
  if (eligible.length === 0) {
    record.note = 'No method meets the ranking rule, so none is ranked.';
    return record;
  }
  const byKey = eligible.map((r) => new Map((included.get(r.methodId) ?? []).map((p) => [measurementKey(p), p])));
  const common = [...byKey[0].keys()].filter((key) => byKey.every((m) => m.has(key))).sort();
  record.commonN = common.length;
  if (common.length < MIN_PAIRS_FOR_STATISTICS) {
    record.note = `The ranked methods share only ${common.length} pair${common.length === 1 ? '' : 's'}; a ranking needs at least ${MIN_PAIRS_FOR_STATISTICS}.`;
    for (const r of eligible) r.unranked = 'the ranked methods share too few pairs';
    return record;
  }
  eligible.forEach((r, i) => {
    let abs = 0;
    let signed = 0;
    let squares = 0;
    for (const key of common) {
      const e = byKey[i].get(key)!.error;
      abs += Math.abs(e);
      signed += e;
      squares += e * e;
    }
    const n = common.length;
    r.common = { n, meanAbsoluteError: abs / n, rootMeanSquareError: Math.sqrt(squares / n), meanSignedError: signed / n };
  });
  for (const r of eligible) r.rank = 1 + eligible.filter((o) => o.common!.meanAbsoluteError < r.common!.meanAbsoluteError).length;
  record.rankedMethods = eligible.length;
  return record;
}
