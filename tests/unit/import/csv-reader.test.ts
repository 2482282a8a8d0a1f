import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Papa from 'papaparse';
import { CsvReader } from '@/lib/import/csv-reader';
import { detectDelimiter, hasHeaderLine, type Delimiter } from '@/lib/import/delimiter';

function readAll(text: string, delimiter: Delimiter, chunk: number): string[][] {
  const reader = new CsvReader(delimiter);
  const out: string[][] = [];
  for (let i = 0; i < text.length; i += chunk) for (const r of reader.push(text.slice(i, i + chunk))) out.push(r.fields);
  for (const r of reader.end()) out.push(r.fields);
  return out;
}

function encodeCell(cell: string, delimiter: string): string {
  return /["\r\n]/.test(cell) || cell.includes(delimiter) || cell === '' ? `"${cell.replaceAll('"', '""')}"` : cell;
}

describe('CsvReader', () => {
  it('reads quoted delimiters, doubled quotes and quoted line breaks across any chunk boundary', () => {
    const text = 'a,b,c\r\n"x,1","say ""hi""","two\nlines"\r\nlast,,end';
    for (const size of [1, 2, 3, 5, 64]) {
      expect(readAll(text, ',', size)).toEqual([
        ['a', 'b', 'c'],
        ['x,1', 'say "hi"', 'two\nlines'],
        ['last', '', 'end'],
      ]);
    }
  });

  it('handles \\n, \\r\\n and \\r line ends and a missing final line end', () => {
    expect(readAll('a;b\nc;d', ';', 2)).toEqual([
      ['a', 'b'],
      ['c', 'd'],
    ]);
    expect(readAll('a\tb\rc\td\r', '\t', 1)).toEqual([
      ['a', 'b'],
      ['c', 'd'],
    ]);
  });

  it('flags text after a closing quote as malformed', () => {
    const reader = new CsvReader(',');
    const records = [...reader.push('"52"0,x\n'), ...reader.end()];
    expect(records[0]).toEqual({ fields: ['52"0', 'x'], malformed: true });
  });

  it('reads what papaparse reads (property test over random tables, delimiters, line ends and chunk sizes)', () => {
    const cell = fc.string({ unit: fc.constantFrom('a', 'Z', '1', '.', ' ', ',', ';', '\t', '"', '\n', 'µ', 'Å'), maxLength: 8 });
    fc.assert(
      fc.property(
        fc.array(fc.array(cell, { minLength: 2, maxLength: 2 }), { minLength: 1, maxLength: 6 }),
        fc.constantFrom<Delimiter>(',', ';', '\t'),
        fc.constantFrom('\n', '\r\n'),
        fc.integer({ min: 1, max: 40 }),
        (rows, delimiter, newline, chunk) => {
          const table = [['h1', 'h2'], ...rows];
          const text = table.map((r) => r.map((c) => encodeCell(c, delimiter)).join(delimiter)).join(newline);
          const papa = Papa.parse<string[]>(text, { delimiter, newline: newline as '\n' | '\r\n' }).data;
          expect(readAll(text, delimiter, chunk)).toEqual(papa);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('detectDelimiter', () => {
  it('picks comma, semicolon or tab from the header line, ignoring quoted text and later lines', () => {
    expect(detectDelimiter('material,quantity,value\n1;2;3;4;5')).toBe(',');
    expect(detectDelimiter('material;quantity;value\n')).toBe(';');
    expect(detectDelimiter('material\tquantity\tvalue')).toBe('\t');
    expect(detectDelimiter('"a;b;c",d\n')).toBe(',');
    expect(detectDelimiter('single')).toBe(',');
  });
});

describe('header line', () => {
  it('is the first non-blank line, for detection too', () => {
    expect(detectDelimiter('\n  \r\na;b;c\n')).toBe(';');
    expect(hasHeaderLine('\n\n')).toBe(false);
    expect(hasHeaderLine('\n"a\nb",c')).toBe(false);
    expect(hasHeaderLine('\n"a\nb",c\r')).toBe(true);
  });
});
