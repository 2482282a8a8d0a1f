import { CsvReader } from './csv-reader';
import { DELIMITERS } from './delimiter';
import { excerpt, importRefusal, type ImportRefusalError } from './errors';

/**
 * Index of the first byte of the first invalid UTF-8 sequence in `bytes`, or -1.
 * A sequence cut off by the end of `bytes` counts as valid when `final` is false
 * (the rest may come with the next chunk). Follows the Unicode table of well-formed
 * byte sequences (no overlongs, no surrogates, nothing above U+10FFFF).
 */
export function firstInvalidUtf8(bytes: Uint8Array, final: boolean): number {
  let need = 0;
  let lo = 0x80;
  let hi = 0xbf;
  let start = 0;
  for (let i = 0; i < bytes.length; i++) {
    const b = bytes[i];
    if (need === 0) {
      if (b < 0x80) continue;
      start = i;
      lo = 0x80;
      hi = 0xbf;
      if (b >= 0xc2 && b <= 0xdf) need = 1;
      else if (b === 0xe0) [need, lo] = [2, 0xa0];
      else if ((b >= 0xe1 && b <= 0xec) || b === 0xee || b === 0xef) need = 2;
      else if (b === 0xed) [need, hi] = [2, 0x9f];
      else if (b === 0xf0) [need, lo] = [3, 0x90];
      else if (b >= 0xf1 && b <= 0xf3) need = 3;
      else if (b === 0xf4) [need, hi] = [3, 0x8f];
      else return i;
    } else {
      if (b < lo || b > hi) return start;
      lo = 0x80;
      hi = 0xbf;
      need--;
    }
  }
  return need > 0 && final ? start : -1;
}

/** How many bytes at the end of `bytes` start a multibyte character that is not complete yet. */
function incompleteTail(bytes: Uint8Array): number {
  for (let back = 1; back <= Math.min(3, bytes.length); back++) {
    const b = bytes[bytes.length - back];
    if ((b & 0xc0) === 0x80) continue;
    const length = b >= 0xf0 ? 4 : b >= 0xe0 ? 3 : b >= 0xc0 ? 2 : 1;
    return length > back ? back : 0;
  }
  return 0;
}

const QUOTE = 34;
const COMMA = 44;
const SEMICOLON = 59;
const TAB = 9;
const CR = 13;
const LF = 10;
const HEADER_TEXT_LIMIT = 1 << 20;

/**
 * Where in a CSV file the decoded text has got to — row (the header is row 1,
 * blank lines above it not counted, as the import counts) and cell — so that an
 * encoding error can say where the bad byte is. Quotes toggle, as in
 * hasHeaderLine; delimiters are counted for each candidate and the header's
 * commonest one chosen, as in detectDelimiter.
 */
class CsvPosition {
  private quoted = false;
  private row = 1;
  private started = false;
  private afterCr = false;
  private headerText = '';
  private headerCounts = [0, 0, 0];
  /** Delimiters seen so far in the current record, in the order of DELIMITERS. */
  private counts = [0, 0, 0];

  advance(text: string): void {
    for (let i = 0; i < text.length; i++) {
      const c = text.charCodeAt(i);
      if (this.afterCr) {
        this.afterCr = false;
        if (c === LF) continue;
      }
      if (c === QUOTE) this.quoted = !this.quoted;
      else if (!this.quoted && (c === LF || c === CR)) {
        this.afterCr = c === CR;
        if (!this.started) continue;
        if (this.row === 1) this.headerCounts = this.counts;
        this.row++;
        this.counts = [0, 0, 0];
        continue;
      } else if (!this.quoted) {
        if (c === COMMA) this.counts[0]++;
        else if (c === SEMICOLON) this.counts[1]++;
        else if (c === TAB) this.counts[2]++;
      }
      if (!this.started) {
        if (c === 32 || c === 9) continue;
        this.started = true;
      }
      if (this.row === 1 && this.headerText.length < HEADER_TEXT_LIMIT) this.headerText += text[i];
    }
    if (!this.started) this.counts = [0, 0, 0];
  }

  /** The row and the cell's header name (or "column N") the next character falls in. */
  where(): { row: number; column: string } {
    let d = 0;
    const header = this.row === 1 ? this.counts : this.headerCounts;
    for (let k = 1; k < DELIMITERS.length; k++) if (header[k] > header[d]) d = k;
    const index = this.counts[d];
    const names = this.row > 1 ? new CsvReader(DELIMITERS[d]).push(`${this.headerText}\n`)[0]?.fields : undefined;
    const name = names?.[index]?.trim();
    return { row: this.row, column: name ? excerpt(name) : `column ${index + 1}` };
  }
}

const hex = (b: number | undefined) => (b === undefined ? 'end of file' : `0x${b.toString(16).toUpperCase().padStart(2, '0')}`);

/**
 * Strict UTF-8 decoding that works chunk by chunk: a multibyte character split
 * across chunks is joined, an invalid byte sequence is refused (never replaced
 * with U+FFFD) with the row and cell of its first byte, and a leading byte-order
 * mark is dropped. Pass `{ csv: false }` for text that is not a CSV file (a JSON
 * body): its refusal names the byte only.
 */
export class StrictUtf8Decoder {
  private decoder = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false });
  private bytesSeen = 0;
  private carry: Uint8Array = new Uint8Array(0);
  private readonly position: CsvPosition | null;

  constructor(options: { csv?: boolean } = {}) {
    this.position = options.csv === false ? null : new CsvPosition();
  }

  /** Decodes the next chunk; pass `last` with the final chunk (or an empty one) to flush. */
  decode(chunk: Uint8Array, last = false): string {
    let text: string;
    try {
      text = this.decoder.decode(chunk, { stream: !last });
    } catch {
      throw this.refusal(chunk, last);
    }
    this.bytesSeen += chunk.byteLength;
    this.position?.advance(text);
    this.carry = last ? new Uint8Array(0) : tailOf(this.carry, chunk);
    return text;
  }

  private refusal(chunk: Uint8Array, last: boolean): ImportRefusalError {
    const joined = new Uint8Array(this.carry.byteLength + chunk.byteLength);
    joined.set(this.carry);
    joined.set(chunk, this.carry.byteLength);
    let bad = firstInvalidUtf8(joined, last);
    if (bad === -1) bad = joined.byteLength;
    const offset = this.bytesSeen - this.carry.byteLength + bad;
    const byte = `${hex(joined[bad])} at byte ${(offset + 1).toLocaleString('en')}`;
    const advice = 'Save it as "CSV UTF-8" and upload it again.';
    if (!this.position) {
      return importRefusal('The body is not valid UTF-8.', [{ row: 0, column: null, reason: `The body is not valid UTF-8: the first invalid byte is ${byte}.` }]);
    }
    // The valid bytes before the bad one have not been decoded yet (the decoder threw): read them for the position.
    const head = joined.subarray(0, bad);
    this.position.advance(new TextDecoder('utf-8').decode(head));
    const { row, column } = this.position.where();
    return importRefusal(`The file is not valid UTF-8 (row ${row}, column ${column}).`, [
      { row, column, reason: `The file is not valid UTF-8: the first invalid byte (${byte}) is in this cell. ${advice}` },
    ]);
  }
}

/** The bytes the streaming decoder holds back after `chunk`: an unfinished character at its end. */
function tailOf(previous: Uint8Array, chunk: Uint8Array): Uint8Array {
  const joined = chunk.byteLength >= 3 ? chunk : concat(previous, chunk);
  const n = incompleteTail(joined);
  return joined.slice(joined.byteLength - n);
}

function concat(a: Uint8Array, b: Uint8Array): Uint8Array {
  const out = new Uint8Array(a.byteLength + b.byteLength);
  out.set(a);
  out.set(b, a.byteLength);
  return out;
}

/** Decodes a whole byte array strictly (BOM dropped). */
export function decodeUtf8Strict(bytes: Uint8Array, options: { csv?: boolean } = {}): string {
  return new StrictUtf8Decoder(options).decode(bytes, true);
}
