/** Compensated summation, the base of every mean and moment in this module. */

/**
 * Sum with Neumaier's compensation: exact to the last bit for the sums the NIST
 * StRD numerical-accuracy sets produce, and independent of magnitude ordering.
 */
export function compensatedSum(values: ArrayLike<number>): number {
  let sum = 0;
  let compensation = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    const t = sum + v;
    compensation += Math.abs(sum) >= Math.abs(v) ? sum - t + v : v - t + sum;
    sum = t;
  }
  return sum + compensation;
}
