import { deflateRawSync, inflateRawSync } from 'node:zlib';
import { decodeRowSet, decodeRowSetRuns, encodeRowSet, type RowSet } from '@/lib/benchmark/row-set';

/** A revision's row set as stored in revision.row_set: the row-set encoding (lib/benchmark/row-set.ts), deflated. */
export function packRowSet(rows: RowSet): Buffer {
  return deflateRawSync(encodeRowSet(rows), { level: 9 });
}

export function unpackRowSet(bytes: Uint8Array | ArrayBuffer): RowSet {
  return decodeRowSet(inflateRawSync(bytes instanceof ArrayBuffer ? new Uint8Array(bytes) : bytes));
}

export function unpackRowSetRuns(bytes: Uint8Array | ArrayBuffer) {
  return decodeRowSetRuns(inflateRawSync(bytes instanceof ArrayBuffer ? new Uint8Array(bytes) : bytes));
}
