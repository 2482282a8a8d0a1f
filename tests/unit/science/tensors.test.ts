/**
 * Born-charge tensors and dielectric principal values: worked cases by hand. Charge neutrality
 * per Cartesian component is a fact of the trade (common practice; ../shared/reference/check-values.md).
 */
import { describe, expect, it } from 'vitest';
import { chargeSum, diagonalMean, frobeniusDistance, fullTensor, largestComponent, ScienceInputError } from '@/lib/science';

// A wurtzite-like cation tensor (invented for the arithmetic): Z_xx = Z_yy = 2.60, Z_zz = 2.74, no off-diagonal part.
const cation = [2.6, 0, 0, 0, 2.6, 0, 0, 0, 2.74];
const anion = [-2.6, 0, 0, 0, -2.6, 0, 0, 0, -2.74];

describe('diagonalMean', () => {
  it('is a third of the trace: (2.60 + 2.60 + 2.74)/3 = 2.64667', () => {
    expect(diagonalMean(cation)).toBeCloseTo(7.94 / 3, 12);
  });
  it('of three principal values: ε = (5.35, 5.35, 5.60) → 5.43333', () => {
    expect(diagonalMean([5.35, 5.35, 5.6])).toBeCloseTo(16.3 / 3, 12);
  });
  it('ignores off-diagonal components, which a rotation mixes into the diagonal without changing the trace', () => {
    // Rotating diag(1, 3, 0) by 45° about z gives [[2, 1, 0], [1, 2, 0], [0, 0, 0]]: trace 4 both ways.
    expect(diagonalMean([2, 1, 0, 1, 2, 0, 0, 0, 0])).toBeCloseTo(diagonalMean([1, 0, 0, 0, 3, 0, 0, 0, 0]), 12);
  });
  it('refuses the wrong number of components, naming the count', () => {
    expect(() => diagonalMean([1, 2, 3, 4])).toThrow(/must hold 3 or 9 numbers, got 4/);
    expect(() => diagonalMean([1, 2, Number.NaN])).toThrow(ScienceInputError);
  });
});

describe('frobeniusDistance', () => {
  it('√Σ(ΔZ_ij)²: diag(2.60, 2.60, 2.74) against isotropic 2.50 → √(0.1² + 0.1² + 0.24²) = 0.27857', () => {
    expect(frobeniusDistance(cation, 2.5)).toBeCloseTo(Math.sqrt(0.01 + 0.01 + 0.0576), 12);
    expect(frobeniusDistance(cation, 2.5)).toBeCloseTo(0.278568, 6);
  });
  it('sees an off-diagonal difference the diagonal mean misses', () => {
    const sheared = [2.6, 0.3, 0, 0.3, 2.6, 0, 0, 0, 2.74];
    expect(diagonalMean(sheared) - diagonalMean(cation)).toBe(0);
    expect(frobeniusDistance(sheared, cation)).toBeCloseTo(Math.sqrt(2 * 0.09), 12);
  });
  it('is zero for equal tensors and symmetric', () => {
    expect(frobeniusDistance(cation, cation)).toBe(0);
    expect(frobeniusDistance(cation, anion)).toBeCloseTo(frobeniusDistance(anion, cation), 12);
  });
});

describe('chargeSum and neutrality', () => {
  it('a neutral pair of atoms sums to zero in every component', () => {
    expect(chargeSum([cation, anion]).every((c) => Math.abs(c) < 1e-12)).toBe(true);
  });
  it('scalars stand for Z·I: Ga +2.07, As −2.07 → 0; a missing sign gives 4.14 in xx', () => {
    expect(chargeSum([2.07, -2.07]).map((c) => Math.abs(c))).toEqual(new Array(9).fill(0));
    const wrong = chargeSum([2.07, 2.07]);
    expect(largestComponent(wrong).value).toBeCloseTo(4.14, 12);
    expect(largestComponent(wrong).component).toBe('xx');
  });
  it('names the worst component of a residue: zz of an unconverged cell', () => {
    const residue = chargeSum([cation, [-2.58, 0, 0, 0, -2.58, 0, 0, 0, -2.61]]);
    expect(largestComponent(residue)).toEqual({ value: expect.closeTo(0.13, 12), component: 'zz' });
  });
  it('refuses an atom with a malformed tensor, naming the atom', () => {
    expect(() => chargeSum([cation, [1, 2, 3]])).toThrow(/charges\[1\]/);
    expect(() => fullTensor([1, 0, 0, 0, 1, 0, 0, 0, Number.POSITIVE_INFINITY])).toThrow(/tensor\[8\]/);
  });
});
