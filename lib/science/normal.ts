/**
 * Standard normal distribution from the complementary error function, computed
 * by two convergent expansions (no fitted coefficients): the positive-term series
 * erf(x) = 2/√π e^(−x²) Σ 2ⁿ x^(2n+1) / (1·3·…·(2n+1)) for |x| < 3, and the
 * Laplace continued fraction for erfc above it. Relative accuracy ≈ 1e-14.
 */

const SQRT_PI = Math.sqrt(Math.PI);

function erfSeries(x: number): number {
  let term = x;
  let sum = x;
  const x2 = x * x;
  for (let n = 1; n < 200; n++) {
    term *= (2 * x2) / (2 * n + 1);
    sum += term;
    if (Math.abs(term) < Math.abs(sum) * 1e-17) break;
  }
  return (2 / SQRT_PI) * Math.exp(-x2) * sum;
}

function erfcContinuedFraction(x: number): number {
  // erfc(x) = e^(−x²)/√π · 1/(x + (1/2)/(x + 1/(x + (3/2)/(x + …)))), modified Lentz.
  const tiny = 1e-300;
  let f = x;
  let c = x;
  let d = 0;
  for (let k = 1; k < 500; k++) {
    const a = k / 2;
    d = x + a * d;
    d = d === 0 ? tiny : d;
    c = x + a / c;
    c = c === 0 ? tiny : c;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return Math.exp(-x * x) / SQRT_PI / f;
}

/** Complementary error function erfc(x) = 1 − erf(x). */
export function erfc(x: number): number {
  if (x >= 3) return erfcContinuedFraction(x);
  if (x <= -3) return 2 - erfcContinuedFraction(-x);
  return 1 - erfSeries(x);
}

/** Standard normal cumulative distribution function Φ(z). */
export function normalCdf(z: number): number {
  return 0.5 * erfc(-z / Math.SQRT2);
}
