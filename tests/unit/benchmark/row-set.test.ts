import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { decodeRowSet, decodeRowSetRuns, encodeRowSet, expandRuns, overlapCount, runsHave, runsOf, subtractRuns } from '@/lib/benchmark/row-set';

// The compact row set of a revision (lib/benchmark/row-set.ts): runs of consecutive sequence numbers as varints.
describe('row sets', () => {
  it('round-trips any set of sequence numbers, sorted and without duplicates (fast-check)', () => {
    const seqs = fc.array(fc.integer({ min: 1, max: 2 ** 40 }), { maxLength: 300 });
    fc.assert(
      fc.property(seqs, seqs, (m, c) => {
        const back = decodeRowSet(encodeRowSet({ measurements: m, calculations: c }));
        const norm = (xs: number[]) => [...new Set(xs)].sort((a, b) => a - b);
        expect(back).toEqual({ measurements: norm(m), calculations: norm(c) });
      }),
    );
  });

  it('writes runs: 231,000 consecutive rows are a few bytes, the same rows with every other one missing about two bytes a row', () => {
    const run = Array.from({ length: 231_000 }, (_, i) => 1_000_001 + i);
    expect(runsOf(run)).toEqual([[1_000_001, 1_231_000]]);
    const dense = encodeRowSet({ measurements: run.slice(0, 6000), calculations: run.slice(6000) });
    expect(dense.length).toBeLessThan(20);
    const sparse = encodeRowSet({ measurements: [], calculations: run.filter((_, i) => i % 2 === 0) });
    expect(sparse.length).toBeGreaterThan(2 * 115_000);
    expect(sparse.length).toBeLessThan(2 * 115_500 + 10);
  });

  it('worked case: {3,4,5,9} and {} encode as format 1, two runs (gap 3 length 3, gap 3 length 1), zero runs', () => {
    expect([...encodeRowSet({ measurements: [9, 3, 5, 4, 4], calculations: [] })]).toEqual([1, 2, 3, 3, 3, 1, 0]);
  });

  it('counts the overlap of a range with the runs, and finds members, without listing the numbers (fast-check against a plain loop)', () => {
    const seqs = fc.uniqueArray(fc.integer({ min: 1, max: 500 }), { maxLength: 200 });
    fc.assert(
      fc.property(seqs, fc.integer({ min: 1, max: 500 }), fc.integer({ min: 0, max: 100 }), (set, first, width) => {
        const runs = decodeRowSetRuns(encodeRowSet({ measurements: set, calculations: [] })).measurements;
        const last = first + width;
        expect(overlapCount(runs, first, last)).toBe(set.filter((s) => s >= first && s <= last).length);
        for (const probe of [first, last, first + 1]) expect(runsHave(runs, probe)).toBe(set.includes(probe));
      }),
    );
  });

  it('refuses bytes that are not a row set, saying why', () => {
    expect(() => decodeRowSet(Uint8Array.from([2, 0, 0]))).toThrow('unknown format 2');
    expect(() => decodeRowSet(Uint8Array.from([1, 1, 5]))).toThrow('truncated');
    expect(() => decodeRowSet(Uint8Array.from([1, 0, 0, 7]))).toThrow('trailing bytes');
    expect(() => decodeRowSet(Uint8Array.from([1, 1, 3, 0, 0]))).toThrow('empty run');
    expect(() => encodeRowSet({ measurements: [-1], calculations: [] })).toThrow('not a non-negative integer');
  });

  it('subtracts runs as sets: what entered or left a row set (fast-check against Set difference)', () => {
    const seqs = fc.uniqueArray(fc.integer({ min: 1, max: 300 }), { maxLength: 150 });
    fc.assert(
      fc.property(seqs, seqs, (a, b) => {
        const out = subtractRuns(runsOf(a), runsOf(b));
        const gone = new Set(b);
        expect(expandRuns(out)).toEqual(a.filter((x) => !gone.has(x)).sort((x, y) => x - y));
        // Still runs: sorted, disjoint and not touching.
        for (let i = 1; i < out.length; i++) expect(out[i][0]).toBeGreaterThan(out[i - 1][1] + 1);
      }),
    );
    // Worked case: [1–10] minus [3–4] and [8–12] is [1–2] and [5–7].
    expect(subtractRuns([[1, 10]], [[3, 4], [8, 12]])).toEqual([[1, 2], [5, 7]]);
  });
});
