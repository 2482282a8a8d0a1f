/**
 * CSV that a spreadsheet cannot execute: a text cell starting with = + - @ tab or
 * carriage return (a formula trigger, OWASP "CSV injection") is prefixed with a
 * single quote; numbers are written as numbers, negative ones included.
 */
export type CsvCell = string | number | null | undefined;

const FORMULA_TRIGGER = /^[=+\-@\t\r]/;

export function csvCell(value: CsvCell): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  const text = FORMULA_TRIGGER.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function toCsv(header: readonly string[], rows: Iterable<readonly CsvCell[]>): string {
  const lines = [header.map(csvCell).join(',')];
  for (const row of rows) lines.push(row.map(csvCell).join(','));
  return lines.join('\r\n') + '\r\n';
}
