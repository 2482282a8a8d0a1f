
import { AppError } from '@/lib/errors';
import { describe, expect, it } from 'vitest';

import { previewCsv, type ReferenceLists } from '@/lib/import/preview';

const references: ReferenceLists = {
  materials: [{ name: 'Si', id: 'm-si', atomsPerFormulaUnit: 1 }],
  sources: [{ citeKey: 'parker1967', id: 's-1' }],
  methods: [{ label: 'PBEsol', id: 'me-1' }],
};

describe('browser preview (papaparse in chunks)', () => {
  it('maps the header, validates every row with row numbers counting the header as row 1, and reports progress', () => {
    const fractions: number[] = [];
    const text = '\n Material ;Quantity;Value;Unit;Source;Operator\nSi;frequency;520.2;cm-1;parker1967;AB\n\nSi;frequency;x;cm-1;parker1967;AB\nSi;frequency;1;pc;nobody;AB\n';
    const result = previewCsv(text, { kind: 'measurements', references }, (f) => fractions.push(f));
    expect(result.delimiterName).toBe('semicolon');
    expect(result.mapping).toMatchObject({ material: ' Material ', value: 'Value', source: 'Source' });
    expect(result.ignored).toEqual(['Operator']);
    expect(result).toMatchObject({ rowCount: 3, validCount: 1, errorCount: 3 });
    expect(result.errors.map((e) => [e.row, e.column])).toEqual([
      [4, 'Value'],
      [5, 'Source'],
      [5, 'Unit'],
    ]);
    expect(result.preview.map((p) => [p.row, p.ok])).toEqual([
      [2, true],
      [4, false],
      [5, false],
    ]);
    expect(fractions.at(-1)).toBe(1);
  });

  it('shows what would be stored (normalised label, canonical value with the entry\'s precision) and which cells are bad', () => {
    const text = 'material,quantity,value,unit,irrep,source\nSi,frequency,15.60,THz,F2g,parker1967\nSi,frequency,520.2,cm-1,t2g,parker1967\nSi,frequency,12x,cm-1,T2g,nobody\n';
    const result = previewCsv(text, { kind: 'measurements', references });
    // 15.60 THz × 33.356 409 52 cm⁻¹/THz (CODATA 2018, derived) = 520.36 cm⁻¹; 4 significant figures typed → 520.4
    expect(result.preview[0]).toMatchObject({ ok: true, badColumns: [], stored: { label: 'T2g', value: '520.4\u00a0cm⁻¹' } });
    expect(result.preview[1].stored).toEqual({ label: 'T2g', value: '520.2\u00a0cm⁻¹' });
    expect(result.preview[2]).toMatchObject({ ok: false, stored: null });
    expect(result.preview[2].badColumns.sort()).toEqual(['source', 'value']);
  });

  it('uses a corrected mapping and file-wide units', () => {
    const text = 'name,q,v,cite\nSi,frequency,15.6,parker1967\n';
    const result = previewCsv(text, { kind: 'measurements', references, mapping: { material: 'name', quantity: 'q', value: 'v', source: 'cite' }, units: { frequency: 'THz' } });
    expect(result).toMatchObject({ rowCount: 1, validCount: 1, errorCount: 0 });
  });

  it('refuses header problems and empty files like the server does', () => {
    expect(() => previewCsv('   ', { kind: 'measurements', references })).toThrow(AppError);
    expect(() => previewCsv('material,value,value\n', { kind: 'measurements', references })).toThrow(/header/);
    expect(() => previewCsv('material,quantity,value,unit,source\n', { kind: 'measurements', references })).toThrow(/no data rows/);
  });
});
