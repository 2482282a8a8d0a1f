import { csvNumber } from './format';
import { parseDecimal } from './import/numbers';

export type CsvCell = string | number | null | undefined;

const FORMULA_START = /^[=+\-@\t\r]/;

/**
 * One cell made safe for spreadsheets: text that starts with = + - @ tab or CR
 * is prefixed with an apostrophe so it cannot run as a formula (OWASP "CSV
 * injection"); text that is exactly a decimal number such as a stored "-1.50" is
 * written untouched, and numbers without floating-point noise (csvNumber).
 */
export function neutraliseCell(cell: CsvCell): string {
  if (cell === null || cell === undefined) return '';
  if (typeof cell === 'number') return csvNumber(cell);
  if (parseDecimal(cell) !== null) return cell;
  return FORMULA_START.test(cell) ? `'${cell}` : cell;
}

function quote(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/** One neutralised cell, quoted as RFC 4180 requires. */
export function csvCell(cell: CsvCell): string {
  return quote(neutraliseCell(cell));
}

/** A CSV line (comma-separated, RFC 4180 quoting) of neutralised cells. */
export function csvLine(cells: readonly CsvCell[]): string {
  return cells.map(csvCell).join(',');
}

/** A whole CSV document with a header, lines ended by CRLF as RFC 4180 says. */
export function toCsv(header: readonly string[], rows: Iterable<readonly CsvCell[]>): string {
  const lines = [csvLine(header)];
  for (const row of rows) lines.push(csvLine(row));
  return lines.join('\r\n') + '\r\n';
}
