import { columnsOf, type TableKind } from './columns';
import { CsvReader, isBlankRecord, type CsvRecord } from './csv-reader';
import { StrictUtf8Decoder } from './decode';
import { delimiterName, detectDelimiter, hasHeaderLine, type Delimiter } from './delimiter';
import { cellTooLong, excerpt, longCellIn, MAX_CELL_CHARS, type RowError, importRefusal, type ImportRefusalError } from './errors';
import { resolveHeader, type ColumnMapping } from './header';
import type { CellReader } from './validate-row';

/** One data row of an import, or a problem that makes it unreadable. */
export type TableRow = { row: number; read: CellReader; error?: undefined } | { row: number; error: RowError; read?: undefined };

/** Rows of an import file, in batches, whatever the file format. */
export interface ImportTable {
  format: 'csv' | 'json';
  columnName(key: string): string;
  /** File columns that are not imported. */
  ignored: string[];
  delimiter?: Delimiter;
  batches(): AsyncIterable<TableRow[]>;
}

const EMPTY_FILE: RowError = { row: 0, column: null, reason: 'The file is empty.' };

/** A header line longer than this cannot be a header of our columns (each cell at most MAX_CELL_CHARS). */
const MAX_HEADER_LINE_CHARS = 100 * MAX_CELL_CHARS;

/** A refusal for a record that grew past every cell allowed before it even ended. */
function overlongRecord(row: number, column: string | null, fieldChars: number, limit: number): ImportRefusalError {
  const error: RowError =
    fieldChars > MAX_CELL_CHARS
      ? { ...cellTooLong(row, column, fieldChars), reason: `This cell is longer than ${MAX_CELL_CHARS.toLocaleString('en')} characters, the most a cell may have.` }
      : { row, column: null, reason: `This row runs past ${limit.toLocaleString('en')} characters without ending (more cells than the header has, or a quote that is never closed).` };
  return importRefusal(`Nothing was imported: row ${row} is too long.`, [error]);
}

/**
 * Opens a CSV file given as byte chunks: strict UTF-8 (BOM dropped), delimiter
 * detected from the header line, header checked and mapped. Refuses the file
 * (an unprocessable AppError) when any of that fails; row problems come out with the rows.
 */
export async function openCsvTable(chunks: AsyncIterable<Uint8Array>, kind: TableKind, mapping?: ColumnMapping): Promise<ImportTable> {
  const decoder = new StrictUtf8Decoder();
  const iterator = chunks[Symbol.asyncIterator]();
  let head = '';
  let done = false;
  // Read until the header line is complete, to detect the delimiter.
  while (!done && !hasHeaderLine(head)) {
    const next = await iterator.next();
    if (next.done) {
      head += decoder.decode(new Uint8Array(0), true);
      done = true;
    } else head += decoder.decode(next.value);
    if (!done && !hasHeaderLine(head) && head.length > MAX_HEADER_LINE_CHARS) {
      const reason = `The header line is longer than ${MAX_HEADER_LINE_CHARS.toLocaleString('en')} characters; a header cell may have at most ${MAX_CELL_CHARS.toLocaleString('en')}.`;
      throw importRefusal(reason, [{ row: 1, column: null, reason }]);
    }
  }
  if (head.trim() === '') throw importRefusal('The file is empty.', [EMPTY_FILE]);
  const delimiter = detectDelimiter(head);
  const reader = new CsvReader(delimiter);
  const pending: CsvRecord[] = [];
  reader.push(head, pending);
  if (done) reader.end(pending);
  while (pending.length > 0 && isBlankRecord(pending[0].fields)) pending.shift();
  const headerRecord = pending.shift();
  if (!headerRecord) throw importRefusal('The file is empty.', [EMPTY_FILE]);
  const headers = headerRecord.fields;
  const longHeader = longCellIn(1, headers, (i) => `column ${i + 1}`);
  if (longHeader) throw importRefusal('The header row has problems.', [longHeader]);
  const resolved = resolveHeader(kind, headers, mapping);
  if (resolved.errors.length) throw importRefusal('The header row has problems.', resolved.errors);

  const { indexByKey, nameByKey } = resolved;
  const width = headers.length;
  const columnName = (key: string) => nameByKey.get(key) ?? key;
  let rowNumber = 1;
  const headerName = (i: number) => excerpt(headers[i]?.trim() || `column ${i + 1}`);
  reader.maxRecordChars = width * (MAX_CELL_CHARS + 3);
  const checkOverflow = () => {
    const over = reader.overflow();
    if (over) throw overlongRecord(rowNumber + 1, over.fieldIndex < width ? headerName(over.fieldIndex) : null, over.fieldChars, reader.maxRecordChars);
  };

  const toRows = (records: CsvRecord[]): TableRow[] => {
    const rows: TableRow[] = [];
    for (const record of records) {
      rowNumber++;
      const fields = record.fields;
      if (isBlankRecord(fields)) continue;
      const long = longCellIn(rowNumber, fields, headerName);
      if (long) {
        rows.push({ row: rowNumber, error: long });
      } else if (record.malformed) {
        rows.push({ row: rowNumber, error: { row: rowNumber, column: null, reason: 'Broken quoting: a quoted cell must end with a quote followed by a delimiter or a line break.' } });
      } else if (fields.length !== width) {
        rows.push({
          row: rowNumber,
          error: { row: rowNumber, column: null, reason: `This row has ${fields.length} cells; the header has ${width} (${delimiterName(delimiter)}-separated).` },
        });
      } else {
        rows.push({ row: rowNumber, read: (key) => { const i = indexByKey.get(key); return i === undefined ? undefined : fields[i]; } });
      }
    }
    return rows;
  };

  async function* batches(): AsyncGenerator<TableRow[]> {
    let sawData = false;
    const first = toRows(pending.splice(0));
    checkOverflow();
    if (first.length) {
      sawData = true;
      yield first;
    }
    while (!done) {
      const next = await iterator.next();
      const out: CsvRecord[] = [];
      if (next.done) {
        done = true;
        reader.push(decoder.decode(new Uint8Array(0), true), out);
        reader.end(out);
      } else reader.push(decoder.decode(next.value), out);
      const rows = toRows(out);
      checkOverflow();
      if (rows.length) {
        sawData = true;
        yield rows;
      }
    }
    if (!sawData) throw importRefusal('The file has a header but no data rows.', [{ row: 0, column: null, reason: 'The file has a header but no data rows.' }]);
  }

  return { format: 'csv', columnName, ignored: resolved.ignored, delimiter, batches };
}

/** A JSON value of one cell as the text a CSV file would hold. */
function cellText(value: unknown): string | undefined {
  if (value === null || value === undefined) return undefined;
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : 'not-a-finite-number';
  if (Array.isArray(value)) return value.flat().map((v) => cellText(v) ?? '').join(' ');
  return String(value);
}

/** Rows given as JSON objects keyed by our column names (see the template README). */
export function jsonTable(kind: TableKind, rows: ReadonlyArray<Record<string, unknown>>, batchSize = 1000): ImportTable {
  if (rows.length === 0) throw importRefusal('The request has no rows.', [{ row: 0, column: null, reason: 'The request has no rows.' }]);
  const known = new Set(columnsOf(kind).map((c) => c.key));
  async function* batches(): AsyncGenerator<TableRow[]> {
    for (let start = 0; start < rows.length; start += batchSize) {
      const out: TableRow[] = [];
      for (let i = start; i < Math.min(rows.length, start + batchSize); i++) {
        const record = rows[i];
        const row = i + 1;
        const unknown = Object.keys(record).find((k) => !known.has(k));
        const long = Object.entries(record).find(([, v]) => typeof v === 'string' && v.length > MAX_CELL_CHARS);
        if (unknown) out.push({ row, error: { row, column: excerpt(unknown), reason: `"${excerpt(unknown)}" is not a column of ${kind}.` } });
        else if (long) out.push({ row, error: cellTooLong(row, long[0], (long[1] as string).length) });
        else out.push({ row, read: (key) => cellText(record[key]) });
      }
      yield out;
    }
  }
  return { format: 'json', columnName: (key) => key, ignored: [], batches };
}
