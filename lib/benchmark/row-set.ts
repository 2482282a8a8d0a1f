/**
 * The set of rows a revision was computed from, in a compact form. Every
 * measurement and calculation has a stable sequence number (`seq`, assigned at
 * insert and never reused); a set is stored as sorted runs of consecutive
 * numbers, each written as two unsigned LEB128 varints: the gap from the end of
 * the previous run and the run's length. Rows arrive in imports, so a scope is
 * mostly long runs: 231,000 rows of one import are a handful of bytes, and even
 * a scattered set costs about two bytes a row before compression.
 *
 * Layout: format byte (1), then for measurements and then calculations: the
 * number of runs, then the runs. Pure: the database layer compresses the bytes.
 */

export interface RowSet {
  measurements: number[];
  calculations: number[];
}

export const ROW_SET_FORMAT = 1;

class Writer {
  private bytes: number[] = [];

  varint(value: number): void {
    if (!Number.isSafeInteger(value) || value < 0) throw new RangeError(`row set: ${value} is not a non-negative integer`);
    let v = value;
    while (v >= 0x80) {
      this.bytes.push((v % 0x80) | 0x80);
      v = Math.floor(v / 0x80);
    }
    this.bytes.push(v);
  }

  byte(value: number): void {
    this.bytes.push(value);
  }

  done(): Uint8Array {
    return Uint8Array.from(this.bytes);
  }
}

class Reader {
  private at = 0;
  constructor(private readonly bytes: Uint8Array) {}

  byte(): number {
    if (this.at >= this.bytes.length) throw new RangeError('row set: truncated');
    return this.bytes[this.at++];
  }

  varint(): number {
    let value = 0;
    let scale = 1;
    for (;;) {
      const b = this.byte();
      value += (b & 0x7f) * scale;
      if (b < 0x80) return value;
      scale *= 0x80;
      if (scale > 2 ** 56) throw new RangeError('row set: varint too long');
    }
  }

  end(): void {
    if (this.at !== this.bytes.length) throw new RangeError('row set: trailing bytes');
  }
}

/** Sorted runs [first, last] of a list of sequence numbers (duplicates ignored). */
export function runsOf(seqs: readonly number[]): Array<[number, number]> {
  const sorted = Float64Array.from(seqs).sort();
  const runs: Array<[number, number]> = [];
  for (const s of sorted) {
    const last = runs[runs.length - 1];
    if (last && s <= last[1] + 1) last[1] = Math.max(last[1], s);
    else runs.push([s, s]);
  }
  return runs;
}

function writeRuns(w: Writer, seqs: readonly number[]): void {
  const runs = runsOf(seqs);
  w.varint(runs.length);
  let end = 0;
  for (const [first, last] of runs) {
    w.varint(first - end);
    w.varint(last - first + 1);
    end = last + 1;
  }
}

function readRuns(r: Reader): Array<[number, number]> {
  const count = r.varint();
  const out: Array<[number, number]> = [];
  let end = 0;
  for (let i = 0; i < count; i++) {
    const first = end + r.varint();
    const length = r.varint();
    if (length === 0) throw new RangeError('row set: empty run');
    out.push([first, first + length - 1]);
    end = first + length;
  }
  return out;
}

/** The numbers of sorted runs, in order. */
export function expandRuns(runs: ReadonlyArray<readonly [number, number]>): number[] {
  const out: number[] = [];
  for (const [first, last] of runs) for (let s = first; s <= last; s++) out.push(s);
  return out;
}

/** The runs [first, last] of an encoded set, without listing every number: for counting overlaps. */
export function decodeRowSetRuns(bytes: Uint8Array): { measurements: Array<[number, number]>; calculations: Array<[number, number]> } {
  const r = new Reader(bytes);
  const format = r.byte();
  if (format !== ROW_SET_FORMAT) throw new RangeError(`row set: unknown format ${format}`);
  const measurements = readRuns(r);
  const calculations = readRuns(r);
  r.end();
  return { measurements, calculations };
}

/** Whether sorted runs hold a number (binary search). */
export function runsHave(runs: ReadonlyArray<readonly [number, number]>, seq: number): boolean {
  let lo = 0;
  let hi = runs.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (seq < runs[mid][0]) hi = mid - 1;
    else if (seq > runs[mid][1]) lo = mid + 1;
    else return true;
  }
  return false;
}

/** The runs of the numbers in `a` and not in `b` (both sorted, disjoint runs): what entered or left a row set, without listing every number. */
export function subtractRuns(a: ReadonlyArray<readonly [number, number]>, b: ReadonlyArray<readonly [number, number]>): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  let j = 0;
  for (const [first, last] of a) {
    let lo = first;
    while (j < b.length && b[j][1] < lo) j++;
    let k = j;
    while (lo <= last) {
      if (k >= b.length || b[k][0] > last) {
        out.push([lo, last]);
        break;
      }
      if (b[k][0] > lo) out.push([lo, b[k][0] - 1]);
      lo = Math.max(lo, b[k][1] + 1);
      k++;
    }
  }
  return out;
}

/** How many numbers of the range [first, last] the runs hold. */
export function overlapCount(runs: ReadonlyArray<readonly [number, number]>, first: number, last: number): number {
  let n = 0;
  for (const [a, b] of runs) {
    const lo = Math.max(a, first);
    const hi = Math.min(b, last);
    if (hi >= lo) n += hi - lo + 1;
  }
  return n;
}

export function encodeRowSet(set: RowSet): Uint8Array {
  const w = new Writer();
  w.byte(ROW_SET_FORMAT);
  writeRuns(w, set.measurements);
  writeRuns(w, set.calculations);
  return w.done();
}

/** The sorted sequence numbers of an encoded set; throws on bytes that are not one. */
export function decodeRowSet(bytes: Uint8Array): RowSet {
  const runs = decodeRowSetRuns(bytes);
  return { measurements: expandRuns(runs.measurements), calculations: expandRuns(runs.calculations) };
}
