import type { Delimiter } from './delimiter';

export interface CsvRecord {
  fields: string[];
  /** A quote was opened inside a field or text followed a closing quote. */
  malformed: boolean;
}

const QUOTE = 34;
const CR = 13;
const LF = 10;

/**
 * A streaming RFC 4180 reader for the server: push decoded text in any chunk
 * sizes, get complete records back. Quoted fields may hold delimiters, doubled
 * quotes and line breaks; records end at \n, \r\n or \r. It reads what
 * papaparse reads in the browser (tests/unit/import/csv-reader.test.ts compares them).
 */
export class CsvReader {
  private pending = '';
  private readonly delimiterCode: number;
  /**
   * The most characters one unfinished record may hold before the reader stops
   * buffering it (see `overflow`): a record longer than every cell allowed can
   * only come from an overlong cell or an unclosed quote.
   */
  maxRecordChars = Number.POSITIVE_INFINITY;

  constructor(delimiter: Delimiter) {
    this.delimiterCode = delimiter.charCodeAt(0);
  }

  push(text: string, out: CsvRecord[] = []): CsvRecord[] {
    this.pending = this.pending.length ? this.pending + text : text;
    const consumed = this.scan(this.pending, false, out);
    this.pending = this.pending.slice(consumed);
    return out;
  }

  /**
   * When the unfinished record has grown past maxRecordChars: which field it is
   * in (0-based) and how long that field is so far. Callers refuse the file then.
   */
  overflow(): { fieldIndex: number; fieldChars: number } | null {
    if (this.pending.length <= this.maxRecordChars) return null;
    const s = this.pending;
    const d = this.delimiterCode;
    let fieldIndex = 0;
    let fieldStart = 0;
    let quoted = false;
    for (let i = 0; i < s.length; i++) {
      const c = s.charCodeAt(i);
      if (c === QUOTE) quoted = !quoted;
      else if (c === d && !quoted) {
        fieldIndex++;
        fieldStart = i + 1;
      }
    }
    return { fieldIndex, fieldChars: s.length - fieldStart };
  }

  /** Flushes the last record (a file need not end with a line break). */
  end(out: CsvRecord[] = []): CsvRecord[] {
    if (this.pending.length) this.scan(this.pending, true, out);
    this.pending = '';
    return out;
  }

  /** Reads whole records from s; returns how many characters were consumed. */
  private scan(s: string, final: boolean, out: CsvRecord[]): number {
    const n = s.length;
    const d = this.delimiterCode;
    let recordStart = 0;
    let p = 0;
    let fields: string[] = [];
    let malformed = false;
    while (p <= n) {
      if (p === n) {
        // End of input inside a record: only the final flush may close it.
        if (!final) return recordStart;
        if (fields.length > 0 || p > recordStart) {
          fields.push('');
          out.push({ fields, malformed });
        }
        return n;
      }
      let value: string;
      let k: number;
      if (s.charCodeAt(p) === QUOTE) {
        let j = s.indexOf('"', p + 1);
        while (j !== -1 && s.charCodeAt(j + 1) === QUOTE) j = s.indexOf('"', j + 2);
        if (j === -1 || (j === n - 1 && !final)) {
          if (!final) return recordStart;
          // Unterminated quote at the end of the file: take the rest as the field.
          value = s.slice(p + 1).replaceAll('""', '"');
          malformed = true;
          fields.push(value);
          out.push({ fields, malformed });
          return n;
        }
        value = s.slice(p + 1, j);
        if (value.includes('""')) value = value.replaceAll('""', '"');
        k = j + 1;
        if (k < n) {
          const c = s.charCodeAt(k);
          if (c !== d && c !== LF && c !== CR) {
            // Text after a closing quote: keep it, as papaparse does, and say the quoting is broken.
            malformed = true;
            let e = k;
            while (e < n) {
              const ce = s.charCodeAt(e);
              if (ce === d || ce === LF || ce === CR) break;
              e++;
            }
            if (e === n && !final) return recordStart;
            value += s.slice(j, e);
            k = e;
          }
        }
      } else {
        k = p;
        while (k < n) {
          const c = s.charCodeAt(k);
          if (c === d || c === LF || c === CR) break;
          k++;
        }
        value = s.slice(p, k);
      }
      fields.push(value);
      if (k === n) {
        if (!final) return recordStart;
        out.push({ fields, malformed });
        return n;
      }
      const c = s.charCodeAt(k);
      if (c === d) {
        p = k + 1;
        if (p === n && final) {
          fields.push('');
          out.push({ fields, malformed });
          return n;
        }
        continue;
      }
      // Line break.
      if (c === CR) {
        if (k + 1 === n && !final) return recordStart;
        p = s.charCodeAt(k + 1) === LF ? k + 2 : k + 1;
      } else p = k + 1;
      out.push({ fields, malformed });
      fields = [];
      malformed = false;
      recordStart = p;
      if (p === n) return n;
    }
    return recordStart;
  }
}

/** Whether a record is a blank line (skipped, like papaparse's skipEmptyLines: 'greedy'). */
export function isBlankRecord(fields: readonly string[]): boolean {
  for (const f of fields) if (f.trim() !== '') return false;
  return true;
}
