/** The method comparison's pair in the address: kept when valid, a method never compared with itself. */
import { describe, expect, it } from 'vitest';
import { comparisonFromSearch, comparisonPairSchema } from '@/app/(app)/w/[workspace]/benchmarks/schemas';

const methods = ['m-pbe', 'm-pbesol', 'm-lda'];

describe('comparison pair', () => {
  it('refuses a method compared with itself, with a message on method B', () => {
    const parsed = comparisonPairSchema.safeParse({ methodA: 'm-pbe', methodB: 'm-pbe' });
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues[0].path).toEqual(['methodB']);
    expect(parsed.error!.issues[0].message).toBe('A method cannot be compared with itself: choose two different methods.');
    expect(comparisonPairSchema.safeParse({ methodA: 'm-pbe', methodB: 'm-lda' }).success).toBe(true);
  });

  it('reads the pair from the address', () => {
    expect(comparisonFromSearch({ methodA: 'm-lda', methodB: 'm-pbesol' }, methods)).toEqual({ pair: { methodA: 'm-lda', methodB: 'm-pbesol' }, error: null });
  });

  it('without a pair in the address, compares the first two methods', () => {
    expect(comparisonFromSearch({}, methods)).toEqual({ pair: { methodA: 'm-pbe', methodB: 'm-pbesol' }, error: null });
  });

  it('keeps a self-comparison from the address on screen with the refusal, and computes nothing for it', () => {
    const r = comparisonFromSearch({ methodA: 'm-lda', methodB: 'm-lda' }, methods);
    expect(r.pair).toEqual({ methodA: 'm-lda', methodB: 'm-lda' });
    expect(r.error).toMatch(/cannot be compared with itself/);
  });

  it('falls back to the first two methods when the address names an unknown method', () => {
    const r = comparisonFromSearch({ methodA: 'm-gone', methodB: ['m-lda', 'm-pbe'] }, methods);
    expect(r.pair).toEqual({ methodA: 'm-pbe', methodB: 'm-pbesol' });
    expect(r.error).toMatch(/not in this revision/);
  });
});
