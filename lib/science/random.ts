/**
 * Seeded pseudo-random numbers for reproducible resampling: xoshiro128** (Blackman &
 * Vigna) seeded through splitmix32, so the same seed gives the same bootstrap
 * intervals on every machine and every run.
 */
import { ScienceInputError } from './errors';

/** A generator of uniform numbers in [0, 1). */
export type RandomSource = () => number;

function requireSeed(seed: number): void {
  if (!Number.isSafeInteger(seed)) throw new ScienceInputError('seed', `must be a safe integer, got ${String(seed)}`);
}

/** xoshiro128** with its 128-bit state in four 32-bit words. */
export class Xoshiro128 {
  private a: number;
  private b: number;
  private c: number;
  private d: number;

  constructor(seed: number) {
    requireSeed(seed);
    // splitmix32 expands the seed (its high bits folded in) into a non-zero state
    let state = (seed >>> 0) ^ Math.floor(seed / 4294967296);
    const next = (): number => {
      state = (state + 0x9e3779b9) | 0;
      let z = state;
      z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
      z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
      return (z ^ (z >>> 16)) | 0;
    };
    this.a = next();
    this.b = next();
    this.c = next();
    this.d = next();
  }

  /** Next uniform 32-bit unsigned integer. */
  nextUint32(): number {
    let { a, b, c, d } = this;
    const b5 = Math.imul(b, 5);
    const result = Math.imul((b5 << 7) | (b5 >>> 25), 9) >>> 0;
    const t = b << 9;
    c ^= a;
    d ^= b;
    b ^= c;
    a ^= d;
    c ^= t;
    d = (d << 11) | (d >>> 21);
    this.a = a;
    this.b = b;
    this.c = c;
    this.d = d;
    return result;
  }

  /** Fills `target` with uniform integers in [0, bound) (bound ≤ 2³²; multiply-shift, bias < bound / 2³²). */
  fillIndices(target: Int32Array, bound: number): void {
    let { a, b, c, d } = this;
    for (let i = 0; i < target.length; i++) {
      const b5 = Math.imul(b, 5);
      const r = Math.imul((b5 << 7) | (b5 >>> 25), 9) >>> 0;
      const t = b << 9;
      c ^= a;
      d ^= b;
      b ^= c;
      a ^= d;
      c ^= t;
      d = (d << 11) | (d >>> 21);
      target[i] = ((r * bound) / 4294967296) | 0;
    }
    this.a = a;
    this.b = b;
    this.c = c;
    this.d = d;
  }
}

/** Creates a deterministic generator of uniform numbers in [0, 1) from an integer seed. */
export function createRandom(seed: number): RandomSource {
  const generator = new Xoshiro128(seed);
  return () => generator.nextUint32() / 4294967296;
}
