import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  ENTROPY_UNITS,
  FREQUENCY_UNITS,
  ScienceInputError,
  compareMethods,
  convertEntropy,
  convertFrequency,
  errorStatistics,
  normalizeIrrep,
  pairModes,
  type ComputedMode,
  type MeasuredPeak,
} from '@/lib/science';

const frequencyUnit = fc.constantFrom(...FREQUENCY_UNITS);
const entropyUnit = fc.constantFrom(...ENTROPY_UNITS);
const finite = fc.double({ min: -1e6, max: 1e6, noNaN: true });

function closeRelative(a: number, b: number, tolerance = 1e-12): boolean {
  return Math.abs(a - b) <= tolerance * Math.max(1, Math.abs(a), Math.abs(b));
}

describe('properties', () => {
  it('frequency conversions round-trip', () => {
    fc.assert(
      fc.property(finite, frequencyUnit, frequencyUnit, (value, from, to) =>
        closeRelative(convertFrequency(convertFrequency(value, from, to), to, from), value),
      ),
    );
  });

  it('entropy conversions round-trip', () => {
    fc.assert(
      fc.property(finite, entropyUnit, entropyUnit, fc.double({ min: 0.1, max: 500, noNaN: true }), (value, from, to, atoms) =>
        closeRelative(convertEntropy(convertEntropy(value, from, to, atoms), to, from, atoms), value),
      ),
    );
  });

  const pairValue = fc.record({
    measured: fc.double({ min: 10, max: 4000, noNaN: true }),
    calculated: fc.double({ min: 10, max: 4000, noNaN: true }),
  });

  it('errorStatistics does not depend on the order of the pairs (bootstrap included)', () => {
    fc.assert(
      fc.property(
        fc.array(pairValue, { minLength: 3, maxLength: 40 }).chain((pairs) => fc.tuple(fc.constant(pairs), fc.shuffledSubarray(pairs, { minLength: pairs.length }))),
        ([pairs, shuffled]) => {
          // constant columns leave r absent rather than throwing; both orders must agree on that too
          const a = errorStatistics(pairs, { bootstrapSamples: 50, seed: 5 });
          const b = errorStatistics(shuffled, { bootstrapSamples: 50, seed: 5 });
          for (const key of ['meanSignedError', 'meanAbsoluteError', 'rootMeanSquareError', 'standardDeviation', 'medianAbsoluteError', 'p95AbsoluteError', 'maxAbsoluteError', 'meanAbsolutePercentageError'] as const) {
            expect(closeRelative(a[key], b[key], 1e-9)).toBe(true);
          }
          for (const key of ['pearsonR', 'concordance', 'scaleFactor', 'rmseAfterScaling'] as const) {
            expect(a[key] === undefined).toBe(b[key] === undefined);
            if (a[key] !== undefined) expect(closeRelative(a[key], b[key]!, 1e-9)).toBe(true);
          }
          expect(a.correlationUndefined).toBe(b.correlationUndefined);
          expect(a.bootstrap).toEqual(b.bootstrap);
        },
      ),
    );
  });

  it('statistics obey MAE ≤ RMSE, |mean error| ≤ MAE, median ≤ p95 ≤ max', () => {
    fc.assert(
      fc.property(fc.array(pairValue, { minLength: 3, maxLength: 40 }), (pairs) => {
        fc.pre(new Set(pairs.map((p) => p.measured)).size > 1 && new Set(pairs.map((p) => p.calculated)).size > 1);
        const s = errorStatistics(pairs, { bootstrapSamples: 0 });
        const eps = 1e-9 * (1 + s.maxAbsoluteError);
        expect(s.meanAbsoluteError).toBeLessThanOrEqual(s.rootMeanSquareError + eps);
        expect(Math.abs(s.meanSignedError)).toBeLessThanOrEqual(s.meanAbsoluteError + eps);
        expect(s.medianAbsoluteError).toBeLessThanOrEqual(s.p95AbsoluteError + eps);
        expect(s.p95AbsoluteError).toBeLessThanOrEqual(s.maxAbsoluteError + eps);
        expect(s.pearsonR).toBeDefined();
        expect(Math.abs(s.concordance!)).toBeLessThanOrEqual(Math.abs(s.pearsonR!) + 1e-9);
      }),
    );
  });

  const measuredPeak = fc.record({
    id: fc.string({ minLength: 1, maxLength: 4 }),
    frequencyCm1: fc.double({ min: 1, max: 1500, noNaN: true }),
    technique: fc.constantFrom('raman' as const, 'ir' as const, 'ins' as const, 'hyper-raman' as const),
    irrep: fc.option(fc.constantFrom('A1g', 'Eg', 'T2g', 'F2g', 'E2(high)', 'B1u', 'A1'), { nil: undefined }),
    branch: fc.option(fc.constantFrom('TO' as const, 'LO' as const), { nil: undefined }),
  });
  const computedMode = fc.record({
    id: fc.string({ minLength: 1, maxLength: 4 }),
    frequencyCm1: fc.double({ min: -100, max: 1500, noNaN: true }),
    irrep: fc.option(fc.constantFrom('A1g', 'Eg', 'T2g', 'E2', 'B1u', 'A1', 'E1'), { nil: undefined }),
    branch: fc.option(fc.constantFrom('TO' as const, 'LO' as const), { nil: undefined }),
    ramanActive: fc.option(fc.boolean(), { nil: undefined }),
    irActive: fc.option(fc.boolean(), { nil: undefined }),
    acoustic: fc.option(fc.boolean(), { nil: undefined }),
    degeneracy: fc.option(fc.integer({ min: 1, max: 3 }), { nil: undefined }),
  });
  const uniqueById = <T extends { id: string }>(arb: fc.Arbitrary<T>, max: number) =>
    fc.uniqueArray(arb, { selector: (x) => x.id, maxLength: max });

  it('pairing never uses a computed line twice, never crashes and accounts for every measured peak', () => {
    fc.assert(
      fc.property(
        uniqueById<MeasuredPeak>(measuredPeak, 12),
        uniqueById<ComputedMode>(computedMode, 30),
        fc.double({ min: 0.01, max: 1, noNaN: true }),
        (measured, computed, maxRelativeDeviation) => {
          const result = pairModes(measured, computed, { maxRelativeDeviation });
          const used = result.pairs.flatMap((p) => p.computedIds);
          expect(new Set(used).size).toBe(used.length);
          const measuredIds = [...result.pairs.map((p) => p.measuredId), ...result.unpairedMeasured];
          expect(measuredIds.sort()).toEqual(measured.map((m) => m.id).sort());
          for (const p of result.pairs) {
            // labelled pairs (both sides of one species) may reach the labelled window, 0.5 by default
            const window = p.basis === 'label' ? Math.max(maxRelativeDeviation, 0.5) : maxRelativeDeviation;
            expect(Math.abs(p.relativeError)).toBeLessThanOrEqual(window + 1e-12);
            expect(result.unpairedComputed).not.toContain(p.computedIds[0]);
          }
        },
      ),
    );
  });

  it('pinned pairs survive arbitrary pins without a line used twice', () => {
    fc.assert(
      fc.property(uniqueById<MeasuredPeak>(measuredPeak, 8), uniqueById<ComputedMode>(computedMode, 20), (measured, computed) => {
        const pins = measured.slice(0, 2).map((m, i) => ({ measuredId: m.id, computedId: computed[i * 7]?.id ?? null }));
        try {
          const result = pairModes(measured, computed, { pins });
          const used = result.pairs.flatMap((p) => p.computedIds);
          expect(new Set(used).size).toBe(used.length);
          for (const pin of pins) {
            if (pin.computedId === null) expect(result.unpairedMeasured).toContain(pin.measuredId);
            else expect(result.pairs.find((p) => p.measuredId === pin.measuredId)?.computedIds).toContain(pin.computedId);
          }
        } catch (error) {
          // two pins landing on one collapsed line is refused explicitly
          expect((error as Error).message).toMatch(/already pinned/);
        }
      }),
    );
  });

  it('normalizeIrrep is idempotent', () => {
    fc.assert(
      fc.property(fc.string({ minLength: 1, maxLength: 10 }), (label) => {
        let once: string;
        try {
          once = normalizeIrrep(label);
        } catch (error) {
          // only labels with nothing but spacing and markup may be refused
          expect(error).toBeInstanceOf(ScienceInputError);
          expect(label.normalize('NFKC').replace(/[\s_^{}]/g, '')).toBe('');
          return;
        }
        expect(normalizeIrrep(once)).toBe(once);
      }),
    );
  });

  it('compareMethods: wins + losses + ties = n, p in [0, 1], swapping A and B swaps wins and losses', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ a: fc.double({ min: 0, max: 100, noNaN: true }), b: fc.double({ min: 0, max: 100, noNaN: true }) }), { minLength: 1, maxLength: 60 }),
        (paired) => {
          const r = compareMethods(paired);
          const s = compareMethods(paired.map(({ a, b }) => ({ a: b, b: a })));
          expect(r.wins + r.losses + r.ties).toBe(r.n);
          expect(r.wilcoxon.pValue).toBeGreaterThanOrEqual(0);
          expect(r.wilcoxon.pValue).toBeLessThanOrEqual(1);
          expect([s.wins, s.losses]).toEqual([r.losses, r.wins]);
          expect(s.wilcoxon.pValue).toBeCloseTo(r.wilcoxon.pValue, 12);
        },
      ),
    );
  });
});
