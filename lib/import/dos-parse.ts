import { convertFrequency, type FrequencyUnit } from '@/lib/science/units';
import { CsvReader, isBlankRecord, type CsvRecord } from './csv-reader';
import { delimiterName, detectDelimiter, hasHeaderLine, type Delimiter } from './delimiter';
import { resolveDosHeader, type DosColumnKey, type DosHeader } from './dos-format';
import { cellTooLong, excerpt, MAX_CELL_CHARS, MAX_REPORTED_ERRORS, type RowError, importRefusal } from './errors';
import { notANumberReason, parseDecimal } from './numbers';
import { parseUnit } from './units';

/** One density of states of the file: the rows of one (material, method). */
export interface DosBlock {
  material: string;
  method: string;
  source: string;
  unit: FrequencyUnit;
  /** Row number of the block's first row (the header is row 1). */
  firstRow: number;
  /** Grid in the file's unit, and in cm⁻¹. */
  frequency: number[];
  frequencyCm1: number[];
  density: number[];
  /** Row of the last point taken, for the ascending-order message. */
  lastRow: number;
  /** Rows of this DOS refused with an error (their points are not in the grid). */
  rejectedRows: number;
  /** Rows at negative frequency, kept out of the grid; checked against NEGATIVE_TAIL_LIMIT at the end. */
  negativeRows?: Array<{ row: number; frequencyText: string; density: number; densityText: string }>;
}

/**
 * A negative-frequency row is a numerical tail, and is accepted (and left out of the
 * grid), when its density is 0 or at most this fraction of the DOS's largest density
 * (0.01 %). Larger density at a negative frequency is real imaginary weight: refused.
 */
export const NEGATIVE_TAIL_LIMIT = 1e-4;

export interface DosParseResult {
  headers: string[];
  delimiter: Delimiter;
  ignored: string[];
  /** Column key → the header text as written, for error messages. */
  columnNames: Record<string, string>;
  /** Data rows read (blank lines not counted). */
  rowCount: number;
  blocks: DosBlock[];
  errors: RowError[];
  errorCount: number;
}

const EMPTY: RowError = { row: 0, column: null, reason: 'The file is empty.' };

/**
 * Reads a DOS file given as decoded text in any chunk sizes (the server streams it,
 * the browser passes it whole): detects the delimiter from the header line, checks
 * the header, and groups rows into blocks per (material, method). Row problems are
 * collected with row, column and reason; file-level problems throw an import refusal.
 * Negative frequencies: phonon codes often write a short tail below 0 with zero
 * density; such rows are accepted and left out of the grid when their density is 0 or
 * at most NEGATIVE_TAIL_LIMIT (0.01 %) of the DOS's largest density, and they must come
 * before the first non-negative row. Real imaginary weight (more density than that) is
 * refused with its row and column, not dropped: a harmonic entropy of an unstable
 * structure would be silently wrong.
 */
export class DosFileReader {
  private head = '';
  private reader: CsvReader | null = null;
  private delimiter: Delimiter = ',';
  private header: DosHeader | null = null;
  private headers: string[] = [];
  private rowNumber = 0;
  private rowCount = 0;
  private readonly blocks = new Map<string, DosBlock>();
  /** Blocks whose unit is not known yet (their first row had an unreadable unit or another error). */
  private readonly unitless = new Set<DosBlock>();
  private readonly errors: RowError[] = [];
  private errorCount = 0;

  push(text: string): void {
    if (this.reader) {
      this.take(this.reader.push(text));
      this.checkOverflow();
      return;
    }
    this.head += text;
    if (hasHeaderLine(this.head)) this.start(false);
  }

  end(): DosParseResult {
    if (!this.reader) {
      if (this.head.trim() === '') throw importRefusal('The file is empty.', [EMPTY]);
      this.start(true);
    } else this.take(this.reader.end());
    if (this.rowCount === 0) throw importRefusal('The file has a header but no data rows.', [{ row: 0, column: null, reason: 'The file has a header but no data rows.' }]);
    for (const block of this.blocks.values()) {
      const peak = block.density.reduce((m, g) => Math.max(m, g), 0);
      for (const t of block.negativeRows ?? []) {
        if (t.density === 0 || (peak > 0 && t.density <= NEGATIVE_TAIL_LIMIT * peak)) continue;
        block.rejectedRows++;
        const share = peak > 0 ? ` (${Number(((100 * t.density) / peak).toPrecision(3))} % of this DOS's largest density)` : '';
        this.fail(
          t.row,
          'density',
          `Imaginary weight: density ${excerpt(t.densityText)} at the negative frequency ${excerpt(t.frequencyText)}${share}. A negative-frequency tail is accepted only with density 0 or at most ${100 * NEGATIVE_TAIL_LIMIT} % of the largest density; this is an unstable structure, whose harmonic entropy is undefined. Fix the calculation or cut the imaginary part from the DOS.`,
          t.densityText,
        );
      }
      if (block.frequency.length < 2 && block.rejectedRows === 0) {
        this.fail(block.firstRow, 'frequency', `The DOS of ${excerpt(block.material)} / ${excerpt(block.method)} has ${block.frequency.length} grid point; it needs at least 2.`);
      } else if (block.rejectedRows === 0 && block.frequency.length >= 2 && !block.density.some((g) => g > 0)) {
        this.fail(block.firstRow, 'density', `The DOS of ${excerpt(block.material)} / ${excerpt(block.method)} is zero everywhere; there is nothing to normalise.`);
      }
    }
    return {
      headers: this.headers,
      delimiter: this.delimiter,
      ignored: this.header?.ignored ?? [],
      columnNames: Object.fromEntries(this.header?.nameByKey ?? []),
      rowCount: this.rowCount,
      blocks: [...this.blocks.values()],
      errors: this.errors,
      errorCount: this.errorCount,
    };
  }

  private start(final: boolean): void {
    if (this.head.trim() === '') throw importRefusal('The file is empty.', [EMPTY]);
    this.delimiter = detectDelimiter(this.head);
    this.reader = new CsvReader(this.delimiter);
    const records = this.reader.push(this.head);
    if (final) this.reader.end(records);
    this.head = '';
    this.take(records);
  }

  /** An unfinished record longer than any allowed row: refuse now rather than buffer the rest of the file. */
  private checkOverflow(): void {
    const over = this.reader?.overflow();
    if (!over) return;
    const row = this.rowNumber + 1;
    const column = over.fieldIndex < this.headers.length ? excerpt(this.headers[over.fieldIndex].trim()) : null;
    const error: RowError =
      over.fieldChars > MAX_CELL_CHARS
        ? { ...cellTooLong(row, column, over.fieldChars), reason: `This cell is longer than ${MAX_CELL_CHARS.toLocaleString('en')} characters, the most a cell may have.` }
        : { row, column: null, reason: 'This row runs on without ending (more cells than the header has, or a quote that is never closed).' };
    throw importRefusal(`Nothing was imported: row ${row} is too long.`, [error]);
  }

  private take(records: CsvRecord[]): void {
    for (const record of records) {
      this.rowNumber++;
      if (isBlankRecord(record.fields)) continue;
      const long = record.fields.findIndex((f) => f.length > MAX_CELL_CHARS);
      if (!this.header) {
        if (long !== -1) throw importRefusal('The header row has problems.', [cellTooLong(1, `column ${long + 1}`, record.fields[long].length)]);
        this.headers = record.fields;
        this.header = resolveDosHeader(record.fields);
        if (this.header.errors.length) throw importRefusal('The header row has problems.', this.header.errors);
        this.reader!.maxRecordChars = this.headers.length * (MAX_CELL_CHARS + 3);
        continue;
      }
      this.rowCount++;
      if (long !== -1) {
        this.errorCount++;
        if (this.errors.length < MAX_REPORTED_ERRORS) this.errors.push(cellTooLong(this.rowNumber, excerpt(this.headers[long]?.trim() ?? ''), record.fields[long].length));
        continue;
      }
      this.readRow(this.rowNumber, record);
    }
  }

  private columnName(key: DosColumnKey): string {
    return this.header?.nameByKey.get(key) ?? key;
  }

  private fail(row: number, key: DosColumnKey | null, reason: string, value?: string): void {
    this.errorCount++;
    if (this.errors.length < MAX_REPORTED_ERRORS) {
      this.errors.push({ row, column: key === null ? null : this.columnName(key), reason, ...(value !== undefined ? { value: excerpt(value) } : {}) });
    }
  }

  private readRow(row: number, record: CsvRecord): void {
    const header = this.header!;
    if (record.malformed) {
      this.fail(row, null, 'Broken quoting: a quoted cell must end with a quote followed by a delimiter or a line break.');
      return;
    }
    if (record.fields.length !== this.headers.length) {
      this.fail(row, null, `This row has ${record.fields.length} cells; the header has ${this.headers.length} (${delimiterName(this.delimiter)}-separated).`);
      return;
    }
    const before = this.errorCount;
    const cell = (key: DosColumnKey) => (record.fields[header.indexByKey.get(key)!] ?? '').trim();
    const required = (key: DosColumnKey) => {
      const text = cell(key);
      if (text === '') this.fail(row, key, `"${key}" is required on every row.`);
      return text;
    };
    const material = required('material');
    const method = required('method');
    const source = required('source');
    const unitText = required('unit');
    const unit = unitText === '' ? null : (parseUnit('frequency', unitText) as FrequencyUnit | null);
    if (unitText !== '' && !unit) this.fail(row, 'unit', `Unknown frequency unit "${excerpt(unitText)}"; use cm-1, THz or meV.`, unitText);

    const number = (key: 'frequency' | 'density'): number | null => {
      const text = required(key);
      if (text === '') return null;
      const n = parseDecimal(text);
      if (n === null) this.fail(row, key, notANumberReason(text), text);
      return n;
    };
    const frequency = number('frequency');
    const density = number('density');
    const frequencyText = cell('frequency');
    if (density !== null && density < 0) this.fail(row, 'density', `A density of states cannot be negative (got ${excerpt(cell('density'))}).`, cell('density'));
    if (frequency === 0 && density !== null && density > 0) {
      this.fail(row, 'density', 'The density at zero frequency must be 0: a zero-frequency mode has no harmonic entropy.', cell('density'));
    }
    if (material === '' || method === '') return;

    const key = `${material}\u001f${method}`;
    let block = this.blocks.get(key);
    if (!block) {
      block = { material, method, source, unit: unit ?? 'cm-1', firstRow: row, frequency: [], frequencyCm1: [], density: [], lastRow: row, rejectedRows: 0 };
      this.blocks.set(key, block);
      if (this.errorCount !== before) {
        // The first row is refused: let the next good row set the source and unit.
        block.source = '';
        this.unitless.add(block);
      }
    }
    if (block.source === '' && source !== '') block.source = source;
    if (this.unitless.has(block) && unit) {
      block.unit = unit;
      this.unitless.delete(block);
    }
    if (source !== '' && source !== block.source) {
      this.fail(row, 'source', `The DOS of ${excerpt(material)} / ${excerpt(method)} started with source "${excerpt(block.source)}" (row ${block.firstRow}); one DOS has one source.`, source);
    }
    if (unit && !this.unitless.has(block) && unit !== block.unit) {
      this.fail(row, 'unit', `The DOS of ${excerpt(material)} / ${excerpt(method)} started in ${block.unit} (row ${block.firstRow}); one DOS has one unit.`, unitText);
    }
    const n = block.frequency.length;
    if (frequency !== null && frequency < 0) {
      const tail = (block.negativeRows ??= []);
      const previous = tail.length ? Number(parseDecimal(tail[tail.length - 1].frequencyText)) : null;
      if (n > 0 || (previous !== null && !(frequency > previous))) {
        this.fail(
          row,
          'frequency',
          `Frequencies must increase strictly within one DOS: ${excerpt(frequencyText)} follows ${n > 0 ? block.frequency[n - 1] : previous} (row ${n > 0 ? block.lastRow : tail[tail.length - 1].row}) of ${excerpt(material)} / ${excerpt(method)}; a negative tail comes first.`,
          frequencyText,
        );
      }
      if (this.errorCount !== before || density === null) block.rejectedRows++;
      else tail.push({ row, frequencyText, density, densityText: cell('density') });
      return;
    }
    if (frequency !== null && frequency >= 0 && n > 0 && !(frequency > block.frequency[n - 1])) {
      this.fail(
        row,
        'frequency',
        `Frequencies must increase strictly within one DOS: ${excerpt(frequencyText)} follows ${block.frequency[n - 1]} (row ${block.lastRow}) of ${excerpt(material)} / ${excerpt(method)}.`,
        frequencyText,
      );
    }
    if (this.errorCount !== before || frequency === null || density === null) {
      block.rejectedRows++;
      return;
    }
    block.frequency.push(frequency);
    block.frequencyCm1.push(convertFrequency(frequency, block.unit, 'cm-1'));
    block.density.push(density);
    block.lastRow = row;
  }
}

/** Parses a whole decoded file (the browser preview and tests). */
export function parseDosText(text: string): DosParseResult {
  const reader = new DosFileReader();
  reader.push(text);
  return reader.end();
}
