import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { resolveDosBlocks } from '@/lib/import/dos-compute';
import { DOS_COLUMNS, dosQuery, parseDosQuery, parseDosTemperatures } from '@/lib/import/dos-format';
import { DosFileReader, parseDosText } from '@/lib/import/dos-parse';
import { previewDos } from '@/lib/import/dos-preview';
import { DOS_TEMPLATE_FILE_NAME, dosTemplateCsv } from '@/lib/import/dos-template';
import { type ImportRefusalError } from '@/lib/import/errors';
import { AppError } from '@/lib/errors';

const HEADER = 'material,method,source,unit,frequency,density';
const file = (...rows: string[]) => [HEADER, ...rows].join('\n');

describe('DOS file reader', () => {
  it('groups rows into one DOS per (material, method), converting the grid to cm⁻¹', () => {
    const parsed = parseDosText(file('Si,PBE,s1,THz,0,0', 'Si,PBE,s1,THz,1,1', 'GaN,PBE,s1,cm-1,0,0', 'GaN,PBE,s1,cm-1,100,2', 'Si,PBE,s1,THz,2,4'));
    expect(parsed.errors).toEqual([]);
    expect(parsed.rowCount).toBe(5);
    expect(parsed.blocks.map((b) => [b.material, b.method, b.firstRow, b.frequency])).toEqual([
      ['Si', 'PBE', 2, [0, 1, 2]],
      ['GaN', 'PBE', 4, [0, 100]],
    ]);
    // 1 THz = 33.35640952 cm⁻¹ (reference/check-values.md, derived).
    expect(parsed.blocks[0].frequencyCm1[1]).toBeCloseTo(33.35640952, 7);
  });

  it('reports negative frequency, negative density, non-ascending grid and weight at zero with row and column', () => {
    const parsed = parseDosText(file('Si,PBE,s1,cm-1,0,0', 'Si,PBE,s1,cm-1,-5,0.1', 'Si,PBE,s1,cm-1,10,-1', 'Si,PBE,s1,cm-1,20,1', 'Si,PBE,s1,cm-1,20,1', 'Ge,PBE,s1,cm-1,0,3', 'Ge,PBE,s1,cm-1,1,3'));
    expect(parsed.errors.map((e) => [e.row, e.column])).toEqual([
      [3, 'frequency'],
      [4, 'density'],
      [6, 'frequency'],
      [7, 'density'],
    ]);
    // a negative row after the grid started is out of order (a negative tail comes first)
    expect(parsed.errors[0].reason).toMatch(/increase strictly.*negative tail comes first/);
    expect(parsed.errors[2].reason).toMatch(/increase strictly.*row 5/);
    expect(parsed.errorCount).toBe(4);
  });

  it('accepts a negative tail with zero or negligible density (≤ 0.01 % of the peak) and leaves it out of the grid', () => {
    const parsed = parseDosText(file('Si,PBE,s1,cm-1,-2,0', 'Si,PBE,s1,cm-1,-1,0.00005', 'Si,PBE,s1,cm-1,0,0', 'Si,PBE,s1,cm-1,10,1', 'Si,PBE,s1,cm-1,20,0'));
    expect(parsed.errors).toEqual([]);
    expect(parsed.blocks[0].frequency).toEqual([0, 10, 20]);
  });

  it('refuses real imaginary weight with row, column and the limit', () => {
    const parsed = parseDosText(file('Si,PBE,s1,cm-1,-15,0.2', 'Si,PBE,s1,cm-1,0,0', 'Si,PBE,s1,cm-1,10,1', 'Si,PBE,s1,cm-1,20,0'));
    expect(parsed.errors.map((e) => [e.row, e.column])).toEqual([[2, 'density']]);
    expect(parsed.errors[0].reason).toContain('Imaginary weight: density 0.2 at the negative frequency -15 (20 % of this DOS');
    expect(parsed.errors[0].reason).toContain('at most 0.01 % of the largest density');
  });

  it('refuses a second source or unit inside one DOS, unknown units and non-numbers', () => {
    const parsed = parseDosText(file('Si,PBE,s1,cm-1,0,0', 'Si,PBE,s2,cm-1,1,1', 'Si,PBE,s1,THz,2,1', 'Si,PBE,s1,Hz,3,1', 'Si,PBE,s1,cm-1,4,1,5', 'Si,PBE,s1,cm-1,4x,1', 'Si,PBE,s1,cm-1,"5,5",1'));
    expect(parsed.errors.map((e) => [e.row, e.column])).toEqual([
      [3, 'source'],
      [4, 'unit'],
      [5, 'unit'],
      [6, null],
      [7, 'frequency'],
      [8, 'frequency'],
    ]);
    expect(parsed.errors[5].reason).toMatch(/decimal comma/);
  });

  it('refuses a DOS with one point or zero density, and files without header or rows', () => {
    const parsed = parseDosText(file('Si,PBE,s1,cm-1,10,1', 'Ge,PBE,s1,cm-1,10,0', 'Ge,PBE,s1,cm-1,20,0'));
    expect(parsed.errors.map((e) => [e.row, e.column])).toEqual([
      [2, 'frequency'],
      [3, 'density'],
    ]);
    expect(() => parseDosText('')).toThrow(AppError);
    expect(() => parseDosText(HEADER + '\n')).toThrow(/no data rows/);
    try {
      parseDosText('material,method,unit,frequency,density\nSi,PBE,cm-1,1,1');
      expect.unreachable();
    } catch (err) {
      expect((err as ImportRefusalError).errors).toEqual([expect.objectContaining({ row: 1, column: 'source' })]);
    }
  });

  it('reads the same result whatever the chunking, with semicolons and header aliases', () => {
    const text = 'Compound;Method;Cite key;Units;Freq;DOS\r\nSi;PBE;s1;meV;0;0\r\nSi;PBE;s1;meV;10;1\r\nSi;PBE;s1;meV;20;0.5';
    const reader = new DosFileReader();
    for (let i = 0; i < text.length; i += 3) reader.push(text.slice(i, i + 3));
    const chunked = reader.end();
    const whole = parseDosText(text);
    expect(chunked.blocks).toEqual(whole.blocks);
    expect(whole.blocks[0].density).toEqual([0, 1, 0.5]);
    expect(whole.columnNames.material).toBe('Compound');
  });
});

describe('DOS references', () => {
  const refs = {
    materials: new Map([
      ['Si', { id: 'si', atomsPerFormulaUnit: 1, atomsInCell: 2 }],
      ['Ge', { id: 'ge', atomsPerFormulaUnit: 1, atomsInCell: null }],
    ]),
    sources: new Map([['s1', 'src']]),
    methods: new Map([['PBE', 'pbe']]),
  };

  it('refuses unknown handles and a material without atoms in the cell, once per DOS on its first row', () => {
    const parsed = parseDosText(file('si,PBE,s1,cm-1,0,0', 'si,PBE,s1,cm-1,1,1', 'Ge,PBE,s1,cm-1,0,0', 'Ge,PBE,s1,cm-1,1,1', 'Si,LDA,s9,cm-1,0,0', 'Si,LDA,s9,cm-1,1,1'));
    const { resolved, errors } = resolveDosBlocks(parsed.blocks, refs);
    expect(resolved).toEqual([]);
    expect(errors.map((e) => [e.row, e.column])).toEqual([
      [2, 'material'],
      [4, 'material'],
      [6, 'method'],
      [6, 'source'],
    ]);
    expect(errors[0].reason).toMatch(/Did you mean "Si"/);
    expect(errors[1].reason).toMatch(/no atoms in the cell/);
  });

  it('the preview shows the values the server will store, and none while there are errors', () => {
    const lists = {
      materials: [{ name: 'Si', id: 'si', atomsPerFormulaUnit: 1, atomsInCell: 2 }],
      sources: [{ citeKey: 's1', id: 'src' }],
      methods: [{ label: 'PBE', id: 'pbe' }],
    };
    const ok = previewDos(file('Si,PBE,s1,cm-1,0,0', 'Si,PBE,s1,cm-1,300,1', 'Si,PBE,s1,cm-1,500,0.5'), lists, [298.15]);
    expect(ok.errorCount).toBe(0);
    expect(ok.blocks[0]).toMatchObject({ material: 'Si', points: 3, formulaUnitsPerCell: 2 });
    expect(ok.blocks[0].values![0].entropy).toMatch(/^\d+\.\d{4}$/);
    const bad = previewDos(file('Si,PBE,s1,cm-1,0,0', 'Si,PBE,s1,cm-1,300,-1', 'Si,PBE,s1,cm-1,500,0.5'), lists, [298.15]);
    expect(bad.errorCount).toBe(1);
    expect(bad.blocks[0].values).toBeNull();
  });
});

describe('DOS options and template', () => {
  it('parses temperatures, defaulting to 298.15 K', () => {
    expect(parseDosTemperatures('')).toEqual({ ok: true, temperatures: [298.15] });
    expect(parseDosTemperatures('300, 100;298.15 300')).toEqual({ ok: true, temperatures: [100, 298.15, 300] });
    expect(parseDosTemperatures('0').ok).toBe(false);
    expect(parseDosTemperatures('abc').ok).toBe(false);
    const q = parseDosQuery(new URLSearchParams(dosQuery({ fileName: 'a.csv', temperatures: [100, 200] })));
    expect(q.success && q.data).toEqual({ kind: 'dos', fileName: 'a.csv', temperatures: [100, 200] });
    expect(parseDosQuery(new URLSearchParams('kind=dos&temperatures=-3')).success).toBe(false);
  });

  it(`data/templates/${DOS_TEMPLATE_FILE_NAME} is the generated template, reads without errors and is documented`, () => {
    expect(readFileSync(`data/templates/${DOS_TEMPLATE_FILE_NAME}`, 'utf8')).toBe(dosTemplateCsv());
    const parsed = parseDosText(dosTemplateCsv());
    expect(parsed.errors).toEqual([]);
    expect(parsed.blocks).toHaveLength(1);
    const readme = readFileSync('data/templates/README.md', 'utf8');
    for (const c of DOS_COLUMNS) expect(readme).toContain(`\`${c.key}\``);
    expect(readme).toContain(DOS_TEMPLATE_FILE_NAME);
  });
});
