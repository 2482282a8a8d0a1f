import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { csvLine, neutraliseCell, toCsv } from '@/lib/csv';

describe('CSV export neutralises formula cells (OWASP CSV injection)', () => {
  it('prefixes text starting with = + - @ tab or CR with an apostrophe', () => {
    expect(neutraliseCell('=HYPERLINK("http://x")')).toBe('\'=HYPERLINK("http://x")');
    expect(neutraliseCell('+1+1')).toBe("'+1+1");
    expect(neutraliseCell('-2+3')).toBe("'-2+3");
    expect(neutraliseCell('@SUM(A1)')).toBe("'@SUM(A1)");
    expect(neutraliseCell('\tcmd')).toBe("'\tcmd");
    expect(neutraliseCell('\rcmd')).toBe("'\rcmd");
    expect(neutraliseCell('E2(high)')).toBe('E2(high)');
  });

  it('writes numbers as numbers, including stored number text such as "-1.50"', () => {
    expect(neutraliseCell(-35.2)).toBe('-35.2');
    expect(neutraliseCell('-1.50')).toBe('-1.50');
    expect(neutraliseCell('+3e5')).toBe('+3e5');
    expect(neutraliseCell(null)).toBe('');
  });

  it('writes computed numbers without floating-point noise (an error of 531.85 − 520.45)', () => {
    expect(neutraliseCell(531.85 - 520.45)).toBe('11.4');
    expect(neutraliseCell(Number.NaN)).toBe('');
  });

  it('quotes cells with commas, quotes and line breaks so the file reads back cell for cell', () => {
    expect(csvLine(['a,b', 'say "x"', '1.50'])).toBe('"a,b","say ""x""",1.50');
    const csv = toCsv(['notes', 'value'], [['two\nlines', '1.50'], ['=1+1', -2]]);
    expect(Papa.parse<string[]>(csv.trimEnd(), { newline: '\r\n' }).data).toEqual([
      ['notes', 'value'],
      ['two\nlines', '1.50'],
      ["'=1+1", '-2'],
    ]);
  });
});
