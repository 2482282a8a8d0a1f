import { deflateRawSync, inflateRawSync } from 'node:zlib';
import { packSnapshot, unpackSnapshot, type SnapshotHead } from '@/lib/benchmark/snapshot-pack';
import type { BenchmarkSnapshot } from '@/lib/benchmark/types';

/**
 * A revision's snapshot as stored: the head in revision.statistics (JSON, read by
 * json_extract) and the rest in revision.snapshot (lib/benchmark/snapshot-pack.ts,
 * deflated). Revisions stored before the packed form keep the whole snapshot in
 * revision.statistics and a null revision.snapshot.
 */
export function storedSnapshot(snapshot: BenchmarkSnapshot): { statistics: SnapshotHead; snapshot: Buffer } {
  const { head, body } = packSnapshot(snapshot);
  return { statistics: head, snapshot: deflateRawSync(body, { level: 6 }) };
}

export function snapshotOfRow(statistics: unknown, snapshot: Uint8Array | ArrayBuffer | null): BenchmarkSnapshot {
  if (!snapshot) return statistics as BenchmarkSnapshot;
  const body = inflateRawSync(snapshot instanceof ArrayBuffer ? new Uint8Array(snapshot) : snapshot);
  return unpackSnapshot(statistics as SnapshotHead, body);
}
