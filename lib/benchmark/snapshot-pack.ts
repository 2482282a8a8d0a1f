/**
 * A revision's snapshot in a compact form, decoded back to exactly the object
 * that was computed: JSON.stringify of the decoded snapshot equals JSON.stringify
 * of the original, byte for byte (tests/unit/benchmark/snapshot-pack.test.ts
 * checks it on random snapshots, the integration tests on computed ones).
 *
 * Two parts:
 * - the head: methods, decisions and pins as plain JSON. The database keeps it
 *   in revision.statistics, where the history and the next revision's cause read
 *   it with json_extract without touching the rest;
 * - the body: everything else. The pairs are stored in columns instead of one
 *   object each, so a field's name is written once, not 30,000 times:
 *   - every id (method, material, measurement, calculation, source, decision)
 *     goes once into an id table, as 16 bytes when it is a canonical UUID, and
 *     the pairs refer to it by index; list indices are stored as the difference
 *     from the previous one, because a scope's rows arrive in order;
 *   - every other text (label, species, technique, exclusion and outlier
 *     reasons) goes once into a string table;
 *   - what the pairing derives is left out when it is exactly what it derives:
 *     the key (pairKey of method and measurements), the error (calculated −
 *     measured) and the relative error (error / measured); a pair where it is
 *     not is stored as an exception.
 *   Pairs of another shape (older revisions, hand-built inputs) are stored as
 *   they are.
 *
 * Body layout: u32 (little-endian) byte length of a UTF-8 JSON part, the JSON
 * part, then the id table's UUIDs, 16 bytes each. Pure: the database layer
 * compresses the body (db/snapshot-bytes.ts).
 */
import { Interner } from './interner';
import { pairKey } from './pair-rows';
import type { BenchmarkSnapshot, PairRecord } from './types';

export const SNAPSHOT_PACK_FORMAT = 1;

export type SnapshotHead = Pick<BenchmarkSnapshot, 'methods' | 'decisions' | 'pins'>;
const HEAD_FIELDS = ['methods', 'decisions', 'pins'] as const;

type FieldKind = 'key' | 'id' | 'ids' | 'nullable-id' | 'number' | 'nullable-number' | 'error' | 'relative-error' | 'nullable-string' | 'string' | 'boolean';

const PAIR_FIELD_KINDS: Record<string, FieldKind> = {
  key: 'key',
  methodId: 'id',
  materialId: 'id',
  measurementIds: 'ids',
  calculationIds: 'ids',
  measured: 'number',
  calculated: 'number',
  error: 'error',
  relativeError: 'relative-error',
  measuredUncertainty: 'nullable-number',
  calculatedUncertainty: 'nullable-number',
  label: 'nullable-string',
  species: 'nullable-string',
  branch: 'nullable-string',
  technique: 'nullable-string',
  temperatureK: 'nullable-number',
  basis: 'string',
  ambiguous: 'boolean',
  sourceIds: 'ids',
  excluded: 'nullable-string',
  excludedBy: 'nullable-id',
  outlier: 'nullable-string',
};

/** Columns of the pairs; `exceptions` holds, per derived field, the values that differ from what is derived. */
interface PairColumns {
  n: number;
  fields: string[];
  columns: Record<string, unknown[]>;
  exceptions: Record<string, Record<string, unknown>>;
}

interface BodyJson {
  format: typeof SNAPSHOT_PACK_FORMAT;
  /** The snapshot's own key order, head fields included. */
  order: string[];
  rest: Record<string, unknown>;
  pairs: { packed: PairColumns } | { rows: PairRecord[] };
  /** The id table when some id is not a canonical UUID; otherwise null and the ids follow the JSON part. */
  ids: string[] | null;
  idCount: number;
  strings: string[];
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

function typeFits(kind: FieldKind, v: unknown): boolean {
  switch (kind) {
    case 'key':
    case 'id':
    case 'string':
      return typeof v === 'string';
    case 'nullable-id':
    case 'nullable-string':
      return v === null || typeof v === 'string';
    case 'ids':
      return Array.isArray(v) && v.every((x) => typeof x === 'string');
    case 'number':
    case 'error':
    case 'relative-error':
      return typeof v === 'number' && Number.isFinite(v);
    case 'nullable-number':
      return v === null || (typeof v === 'number' && Number.isFinite(v));
    case 'boolean':
      return typeof v === 'boolean';
  }
}

/** The pairs' field order when every pair has the same known fields in the same order and every value has its field's type; else null. */
function packableFields(pairs: readonly PairRecord[]): string[] | null {
  if (pairs.length === 0) return null;
  const fields = Object.keys(pairs[0]);
  if (!fields.every((f) => f in PAIR_FIELD_KINDS)) return null;
  const signature = fields.join(',');
  for (const p of pairs) {
    const keys = Object.keys(p);
    if (keys.length !== fields.length || keys.join(',') !== signature) return null;
    const record = p as unknown as Record<string, unknown>;
    for (const f of fields) if (!typeFits(PAIR_FIELD_KINDS[f], record[f])) return null;
  }
  // derived fields need what they are derived from
  const has = (f: string) => fields.includes(f);
  if (has('key') && !(has('methodId') && has('measurementIds'))) return null;
  if (has('error') && !(has('measured') && has('calculated'))) return null;
  if (has('relativeError') && !(has('error') && has('measured'))) return null;
  return fields;
}

function packPairs(pairs: readonly PairRecord[], fields: string[], ids: Interner, strings: Interner): PairColumns {
  const columns: Record<string, unknown[]> = {};
  const exceptions: Record<string, Record<string, unknown>> = {};
  const lastOfList: Record<string, number> = {};
  for (const f of fields) {
    const kind = PAIR_FIELD_KINDS[f];
    if (kind === 'ids') {
      columns[`${f}.length`] = [];
      columns[`${f}.delta`] = [];
      lastOfList[f] = 0;
    } else if (kind === 'key' || kind === 'error' || kind === 'relative-error') {
      exceptions[f] = {};
    } else columns[f] = [];
  }
  pairs.forEach((pair, i) => {
    const p = pair as unknown as Record<string, unknown>;
    for (const f of fields) {
      const v = p[f];
      switch (PAIR_FIELD_KINDS[f]) {
        case 'key':
          if (v !== pairKey(pair.methodId, pair.measurementIds)) exceptions[f][i] = v;
          break;
        case 'error':
          if (!Object.is(v, pair.calculated - pair.measured)) exceptions[f][i] = v;
          break;
        case 'relative-error':
          if (!Object.is(v, pair.error / pair.measured)) exceptions[f][i] = v;
          break;
        case 'id':
          columns[f].push(ids.of(v as string));
          break;
        case 'nullable-id':
          columns[f].push(v === null ? -1 : ids.of(v as string));
          break;
        case 'ids': {
          const list = v as string[];
          columns[`${f}.length`].push(list.length);
          for (const id of list) {
            const at = ids.of(id);
            columns[`${f}.delta`].push(at - lastOfList[f]);
            lastOfList[f] = at;
          }
          break;
        }
        case 'string':
          columns[f].push(strings.of(v as string));
          break;
        case 'nullable-string':
          columns[f].push(v === null ? -1 : strings.of(v as string));
          break;
        case 'boolean':
          columns[f].push(v ? 1 : 0);
          break;
        case 'number':
        case 'nullable-number':
          columns[f].push(v);
          break;
      }
    }
  });
  return { n: pairs.length, fields, columns, exceptions };
}

type Decoder = (p: Record<string, unknown>, i: number) => void;

/** Reads an id-list column pair in pair order: each call returns the next pair's list (indices stored as deltas). */
function listReader(columns: PairColumns['columns'], field: string, ids: readonly string[]): (i: number) => string[] {
  const lengths = columns[`${field}.length`] as number[];
  const deltas = columns[`${field}.delta`] as number[];
  let at = 0;
  let last = 0;
  return (i) => {
    const len = lengths[i];
    const list: string[] = new Array(len);
    for (let k = 0; k < len; k++) {
      last += deltas[at++];
      list[k] = ids[last];
    }
    return list;
  };
}

/** Whether pair i has an exception stored for a derived field. */
function hasException(given: Record<string, unknown> | null | undefined, i: number): given is Record<string, unknown> {
  return given != null && Object.prototype.hasOwnProperty.call(given, i);
}

function unpackPairs(packed: PairColumns, ids: readonly string[], strings: readonly string[]): PairRecord[] {
  const { n, fields, columns, exceptions } = packed;
  if (fields.join(',') === CANONICAL_FIELDS) return unpackCanonical(packed, ids, strings);
  // One decoder per field, built once; a derived field gets a placeholder that keeps the field order and is filled after.
  const decoders: Decoder[] = fields.map((f): Decoder => {
    const col = columns[f] as number[] | undefined;
    switch (PAIR_FIELD_KINDS[f]) {
      case 'key':
      case 'error':
      case 'relative-error':
        return (p) => {
          p[f] = undefined;
        };
      case 'id':
        return (p, i) => {
          p[f] = ids[col![i]];
        };
      case 'nullable-id':
        return (p, i) => {
          const at = col![i];
          p[f] = at < 0 ? null : ids[at];
        };
      case 'ids': {
        const next = listReader(columns, f, ids);
        return (p, i) => {
          p[f] = next(i);
        };
      }
      case 'string':
        return (p, i) => {
          p[f] = strings[col![i]];
        };
      case 'nullable-string':
        return (p, i) => {
          const at = col![i];
          p[f] = at < 0 ? null : strings[at];
        };
      case 'boolean':
        return (p, i) => {
          p[f] = col![i] === 1;
        };
      case 'number':
      case 'nullable-number':
        return (p, i) => {
          p[f] = (columns[f] as unknown[])[i];
        };
    }
  });
  const given = (f: string) => (fields.includes(f) ? (exceptions[f] ?? {}) : null);
  const keys = given('key');
  const errors = given('error');
  const relative = given('relativeError');
  const out: PairRecord[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const p: Record<string, unknown> = {};
    for (const decode of decoders) decode(p, i);
    if (keys) p.key = hasException(keys, i) ? keys[i] : pairKey(p.methodId as string, p.measurementIds as string[]);
    if (errors) p.error = hasException(errors, i) ? errors[i] : (p.calculated as number) - (p.measured as number);
    if (relative) p.relativeError = hasException(relative, i) ? relative[i] : (p.error as number) / (p.measured as number);
    out[i] = p as unknown as PairRecord;
  }
  return out;
}

/** The field order of the pairs the pairing builds today (pair-rows.ts newPair). */
const CANONICAL_FIELDS = Object.keys(PAIR_FIELD_KINDS).join(',');

/** unpackPairs for pairs of today's shape: one object literal per pair, which is several times faster than adding fields one by one. */
function unpackCanonical(packed: PairColumns, ids: readonly string[], strings: readonly string[]): PairRecord[] {
  const { n, columns: c, exceptions } = packed;
  const col = (f: string) => c[f] as number[];
  const num = (f: string) => c[f] as Array<number | null>;
  const [methodId, materialId, label, species, branch, technique, basis, ambiguous, excluded, excludedBy, outlier] = [
    'methodId', 'materialId', 'label', 'species', 'branch', 'technique', 'basis', 'ambiguous', 'excluded', 'excludedBy', 'outlier',
  ].map(col);
  const [measured, calculated, measuredUncertainty, calculatedUncertainty, temperatureK] = ['measured', 'calculated', 'measuredUncertainty', 'calculatedUncertainty', 'temperatureK'].map(num);
  const measurementIds = listReader(c, 'measurementIds', ids);
  const calculationIds = listReader(c, 'calculationIds', ids);
  const sourceIds = listReader(c, 'sourceIds', ids);
  const text = (at: number) => (at < 0 ? null : strings[at]);
  const { key: keys, error: errors, relativeError: relative } = exceptions;
  const out: PairRecord[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const m = measured[i] as number;
    const calc = calculated[i] as number;
    const method = ids[methodId[i]];
    const mIds = measurementIds(i);
    const error = hasException(errors, i) ? (errors[i] as number) : calc - m;
    out[i] = {
      key: hasException(keys, i) ? (keys[i] as string) : pairKey(method, mIds),
      methodId: method,
      materialId: ids[materialId[i]],
      measurementIds: mIds,
      calculationIds: calculationIds(i),
      measured: m,
      calculated: calc,
      error,
      relativeError: hasException(relative, i) ? (relative[i] as number) : error / m,
      measuredUncertainty: measuredUncertainty[i],
      calculatedUncertainty: calculatedUncertainty[i],
      label: text(label[i]),
      species: text(species[i]),
      branch: text(branch[i]) as PairRecord['branch'],
      technique: text(technique[i]),
      temperatureK: temperatureK[i],
      basis: strings[basis[i]] as PairRecord['basis'],
      ambiguous: ambiguous[i] === 1,
      sourceIds: sourceIds(i),
      excluded: text(excluded[i]),
      excludedBy: excludedBy[i] < 0 ? null : ids[excludedBy[i]],
      outlier: text(outlier[i]),
    };
  }
  return out;
}

const HEX = Array.from({ length: 256 }, (_, b) => b.toString(16).padStart(2, '0'));
const HEX_VALUE = new Map(HEX.map((h, b) => [h, b]));

function uuidBytes(id: string, into: Uint8Array, at: number): void {
  let k = 0;
  for (let c = 0; c < id.length; c += 2) {
    if (id[c] === '-') c++;
    into[at + k++] = HEX_VALUE.get(id.slice(c, c + 2))!;
  }
}

function uuidOf(bytes: Uint8Array, at: number): string {
  const h = (k: number) => HEX[bytes[at + k]];
  return `${h(0)}${h(1)}${h(2)}${h(3)}-${h(4)}${h(5)}-${h(6)}${h(7)}-${h(8)}${h(9)}-${h(10)}${h(11)}${h(12)}${h(13)}${h(14)}${h(15)}`;
}

/** The head (plain JSON) and the body bytes of a snapshot. */
export function packSnapshot(snapshot: BenchmarkSnapshot): { head: SnapshotHead; body: Uint8Array } {
  const source = snapshot as unknown as Record<string, unknown>;
  const order = Object.keys(source).filter((k) => source[k] !== undefined);
  const head = Object.fromEntries(HEAD_FIELDS.map((f) => [f, snapshot[f]])) as unknown as SnapshotHead;
  const rest: Record<string, unknown> = {};
  for (const k of order) if (k !== 'pairs' && !(HEAD_FIELDS as readonly string[]).includes(k)) rest[k] = source[k];
  const ids = new Interner();
  const strings = new Interner();
  const fields = packableFields(snapshot.pairs);
  const pairs = fields ? { packed: packPairs(snapshot.pairs, fields, ids, strings) } : { rows: snapshot.pairs };
  const allUuid = ids.values.every((id) => UUID.test(id));
  const json: BodyJson = { format: SNAPSHOT_PACK_FORMAT, order, rest, pairs, ids: allUuid ? null : ids.values, idCount: ids.values.length, strings: strings.values };
  const text = new TextEncoder().encode(JSON.stringify(json));
  const idBytes = allUuid ? 16 * ids.values.length : 0;
  const body = new Uint8Array(4 + text.length + idBytes);
  new DataView(body.buffer).setUint32(0, text.length, true);
  body.set(text, 4);
  if (allUuid) ids.values.forEach((id, i) => uuidBytes(id, body, 4 + text.length + 16 * i));
  return { head, body };
}

export function unpackSnapshot(head: SnapshotHead, body: Uint8Array): BenchmarkSnapshot {
  if (body.length < 4) throw new RangeError('snapshot: truncated');
  const length = new DataView(body.buffer, body.byteOffset, body.byteLength).getUint32(0, true);
  if (4 + length > body.length) throw new RangeError('snapshot: truncated');
  const json = JSON.parse(new TextDecoder().decode(body.subarray(4, 4 + length))) as BodyJson;
  if (json.format !== SNAPSHOT_PACK_FORMAT) throw new RangeError(`snapshot: unknown format ${String(json.format)}`);
  let ids = json.ids;
  if (!ids) {
    const at = 4 + length;
    if (body.length !== at + 16 * json.idCount) throw new RangeError('snapshot: id table has the wrong length');
    ids = new Array(json.idCount);
    for (let i = 0; i < json.idCount; i++) ids[i] = uuidOf(body, at + 16 * i);
  }
  const pairs = 'packed' in json.pairs ? unpackPairs(json.pairs.packed, ids, json.strings) : json.pairs.rows;
  const headFields = head as unknown as Record<string, unknown>;
  const out: Record<string, unknown> = {};
  for (const k of json.order) {
    if (k === 'pairs') out[k] = pairs;
    else if ((HEAD_FIELDS as readonly string[]).includes(k)) out[k] = headFields[k];
    else out[k] = json.rest[k];
  }
  return out as unknown as BenchmarkSnapshot;
}
