import { describe, expect, it } from 'vitest';
import { MissingCatalog } from '@/lib/import/create-missing';
import {
  checkMethodTable,
  compactLine,
  copyRecipe,
  fillDown,
  methodTableSchema,
  MissingMethodLabels,
  prefillLine,
  tableRefusal,
  unusedLineErrors,
  type MethodTableLine,
} from '@/lib/import/method-table';
import { previewCsv } from '@/lib/import/preview';
import { importRefusal } from '@/lib/import/errors';
import { parseWizardQuery, wizardQuery } from '@/lib/import/wizard-options';

const nothingStored = { stored: () => false };
const family: MethodTableLine[] = [
  { label: 'Fam-k4', functional: 'PBEsol', pseudopotential: 'PAW-std', cutoff_eV: '600', k_grid: '4x4x4', q_grid: '2x2x2', approach: 'perturbation', lo_to_correction: 'yes' },
  { label: 'Fam-k6', functional: 'PBEsol', k_grid: '6 6 6' },
];

describe('checkMethodTable', () => {
  it('turns good lines into the records a methods catalogue row would store', () => {
    const { methods, errors } = checkMethodTable(family, nothingStored);
    expect(errors).toEqual([]);
    expect(methods.get('Fam-k4')).toEqual({
      line: 1,
      record: {
        label: 'Fam-k4',
        functional: 'PBEsol',
        dispersion: null,
        pseudopotential: 'PAW-std',
        cutoffEv: 600,
        kGrid: [4, 4, 4],
        qGrid: [2, 2, 2],
        smearing: null,
        approach: 'perturbation',
        nonAnalyticCorrection: true,
        notes: null,
      },
    });
    expect(methods.get('Fam-k6')).toMatchObject({ line: 2, record: { kGrid: [6, 6, 6], nonAnalyticCorrection: null } });
  });

  it('names the line and the field of each bad cell, with the catalogue rule’s reason', () => {
    const { methods, errors } = checkMethodTable(
      [
        { label: 'A', functional: 'PBE', k_grid: '8x8' },
        { label: 'B', functional: '', cutoff_eV: 'lots', approach: 'guess', lo_to_correction: 'maybe' },
      ],
      nothingStored,
    );
    expect(errors).toEqual([
      { row: 0, methodLine: 1, column: 'k-grid', reason: 'The k-point grid must be three positive whole numbers like "8x8x8", got "8x8".', value: '8x8' },
      expect.objectContaining({ methodLine: 2, column: 'functional', reason: 'A functional is required.' }),
      expect.objectContaining({ methodLine: 2, column: 'cutoff (eV)', value: 'lots' }),
      expect.objectContaining({ methodLine: 2, column: 'approach', reason: 'Choose perturbation or finite displacement.' }),
      expect.objectContaining({ methodLine: 2, column: 'LO–TO', reason: 'Choose yes or no.' }),
    ]);
    // the labels stay claimed by the table (their rows add no errors of their own), without a record
    expect([...methods]).toEqual([
      ['A', null],
      ['B', null],
    ]);
  });

  it('refuses a label given twice, one the workspace has and one a retracted method reserves', () => {
    const { errors, methods } = checkMethodTable(
      [
        { label: 'X', functional: 'PBE' },
        { label: 'X', functional: 'LDA' },
        { label: 'Stored', functional: 'PBE' },
        { label: 'Gone', functional: 'PBE' },
      ],
      { stored: (l) => l === 'Stored', reserved: new Set(['Gone']) },
    );
    expect(errors.map((e) => [e.methodLine, e.column, e.reason])).toEqual([
      [2, 'label', 'Line 1 already defines method "X".'],
      [3, 'label', expect.stringContaining('already has method "Stored"')],
      [4, 'label', expect.stringContaining('retracted method')],
    ]);
    expect(methods.get('X')?.record.functional).toBe('PBE');
  });
});

describe('the table’s wire shape (zod)', () => {
  it('takes label + text cells, refuses unknown keys, an empty table and one over the limit', () => {
    expect(methodTableSchema.safeParse(family).success).toBe(true);
    expect(methodTableSchema.safeParse([{ label: 'A', notes: 'x' }]).success).toBe(false);
    expect(methodTableSchema.safeParse([{ label: ' ' }]).success).toBe(false);
    expect(methodTableSchema.safeParse([{ label: 'A', k_grid: 8 }]).success).toBe(false);
    expect(methodTableSchema.safeParse([]).success).toBe(false);
    expect(methodTableSchema.safeParse(Array.from({ length: 61 }, (_, i) => ({ label: `m${i}` }))).success).toBe(false);
  });
});

describe('the table in the wizard’s upload query', () => {
  it('round-trips, and is refused without createMissing or for another kind', () => {
    const params = (q: string) => new URLSearchParams(q);
    const parsed = parseWizardQuery(params(wizardQuery({ kind: 'calculations', createMissing: true, methodTable: family })));
    expect(parsed.success && parsed.data.methodTable).toEqual(family);
    expect(parseWizardQuery(params(wizardQuery({ kind: 'calculations', methodTable: family }))).success).toBe(false);
    expect(parseWizardQuery(params(wizardQuery({ kind: 'measurements', createMissing: true, methodTable: family }))).success).toBe(false);
    expect(parseWizardQuery(params('kind=calculations&createMissing=true&methodTable=%5B')).success).toBe(false);
  });
});

describe('editing helpers', () => {
  it('copies the recipe of the line above but keeps the label; fill-down sets one field below line 1', () => {
    const copied = copyRecipe(family, 0, 1);
    expect(copied[1]).toMatchObject({ label: 'Fam-k6', functional: 'PBEsol', pseudopotential: 'PAW-std', k_grid: '4x4x4', lo_to_correction: 'yes' });
    expect(copied[0]).toBe(family[0]);
    const filled = fillDown([...family, { label: 'Fam-k8' }], 'pseudopotential');
    expect(filled.map((l) => l.pseudopotential)).toEqual(['PAW-std', 'PAW-std', 'PAW-std']);
    expect(filled[2].k_grid).toBeUndefined();
  });

  it('drops empty cells before sending, and prefills yes/no and the approach as the table’s choices', () => {
    expect(compactLine({ label: 'A', functional: ' PBE ', dispersion: '', k_grid: '  ' })).toEqual({ label: 'A', functional: 'PBE' });
    const line = prefillLine({ label: 'A', row: 2, cells: { functional: 'PBE', lo_to_correction: 'TRUE', approach: 'Finite displacement' }, others: [] });
    expect(line).toEqual({ label: 'A', functional: 'PBE', lo_to_correction: 'yes', approach: 'finite-displacement' });
  });
});

describe('MissingMethodLabels', () => {
  const reader = (cells: Record<string, string>) => (key: string) => cells[key];

  it('lists unknown labels in file order with the first row’s method_ cells and the rows that disagree', () => {
    const labels = new MissingMethodLabels(new Set(['Stored']), 2);
    labels.add(2, reader({ method: 'B', method_functional: 'PBE', method_k_grid: '4x4x4' }));
    labels.add(3, reader({ method: 'Stored', method_functional: 'LDA' }));
    labels.add(4, reader({ method: 'B', method_k_grid: '5x5x5' }));
    labels.add(5, reader({ method: 'B', method_k_grid: '6x6x6' }));
    labels.add(6, reader({ method: ' A ' }));
    labels.add(7, reader({ method: 'C' }));
    expect(labels.labels).toEqual([
      { label: 'B', row: 2, cells: { functional: 'PBE', k_grid: '4x4x4' }, others: [{ field: 'k_grid', row: 4, value: '5x5x5' }] },
      { label: 'A', row: 6, cells: {}, others: [] },
    ]);
    expect(labels.count).toBe(3);
  });
});

describe('MissingCatalog with a method table', () => {
  const references = () => ({ materials: new Map(), sources: new Map(), methods: new Map<string, string>([['Stored', 'm0']]) });

  it('creates a table method at its first row from the line, reads no method_ cell, and reports unused lines', () => {
    const { methods } = checkMethodTable([...family, { label: 'Fam-unused', functional: 'PBE' }], nothingStored);
    let n = 0;
    const refs = references();
    const missing = new MissingCatalog(refs, (k) => k, new Set(), () => `id-${++n}`, methods);
    const errors: string[] = [];
    const fail = (key: string) => errors.push(key);
    // the rows' method_ cells would be an error (a bad grid) if they were read
    expect(missing.method(2, 'Fam-k4', () => '8x8', fail)).toBe('id-1');
    expect(missing.method(3, 'Fam-k4', () => 'LDA', fail)).toBe('id-1');
    expect(missing.method(4, 'Fam-k6', () => undefined, fail)).toBe('id-2');
    expect(errors).toEqual([]);
    expect(missing.takeNew().methods.map((m) => [m.id, m.label, m.kGrid])).toEqual([
      ['id-1', 'Fam-k4', [4, 4, 4]],
      ['id-2', 'Fam-k6', [6, 6, 6]],
    ]);
    expect(refs.methods.get('Fam-k6')).toBe('id-2');
    expect(missing.createdMethodCount).toBe(2);
    expect(unusedLineErrors(missing.unusedTableLines())).toEqual([expect.objectContaining({ methodLine: 3, column: 'label', reason: expect.stringContaining('No row of the file names method "Fam-unused"') })]);
    // a label the table does not list still needs its method_ cells
    expect(missing.method(5, 'Other', () => undefined, fail)).toBeNull();
    expect(errors).toEqual(['method']);
  });

  it('in the preview (deferred) accepts every unknown label without its cells', () => {
    const refs = references();
    const missing = new MissingCatalog(refs, (k) => k, undefined, undefined, 'deferred');
    const fail = () => {
      throw new Error('no error expected');
    };
    const a = missing.method(2, 'New-a', () => undefined, fail);
    expect(missing.method(3, 'New-a', () => undefined, fail)).toBe(a);
    expect(missing.method(4, 'New-b', () => undefined, fail)).not.toBe(a);
    expect(missing.takeNew().methods).toEqual([]);
    expect(missing.unusedTableLines()).toEqual([]);
    // known by label from then on, so warnings about its mode sets name it
    expect(refs.methods.get('New-a')).toBe(a);
  });
});

describe('the refusal with table errors', () => {
  it('lists the table’s errors first and counts both', () => {
    const lines = checkMethodTable([{ label: 'A', functional: 'PBE', k_grid: '8x8' }], nothingStored).errors;
    const rows = importRefusal('Nothing was imported: 2 errors in the file.', [{ row: 3, column: 'value', reason: 'x' }], 2);
    const both = tableRefusal(lines, rows);
    expect(both.message).toBe('Nothing was imported: 3 errors in the file and the method table.');
    expect(both.errorCount).toBe(3);
    expect(both.errors.map((e) => e.methodLine ?? e.row)).toEqual([1, 3]);
    expect(tableRefusal(lines, null).message).toBe('Nothing was imported: 1 error in the method table.');
  });
});

describe('the wizard preview with the method table', () => {
  const refs = { materials: [{ name: 'Si', id: 'si', atomsPerFormulaUnit: 1 }], sources: [{ citeKey: 'calc', id: 's1' }], methods: [{ label: 'Stored', id: 'm0' }] };
  const text = ['material,method,quantity,value,unit,source,method_functional,method_k_grid', 'Si,Fam-k4,frequency,517,cm-1,calc,PBEsol,4x4x4', 'Si,Fam-k6,frequency,519,cm-1,calc,,', 'Si,Stored,frequency,520,cm-1,calc,,'].join('\n');

  it('lists the missing labels with their prefill, and accepts their rows only in table mode', () => {
    const cells = previewCsv(text, { kind: 'calculations', references: refs, createMissing: true });
    expect(cells.errors).toEqual([expect.objectContaining({ row: 3, column: 'method' })]);
    const table = previewCsv(text, { kind: 'calculations', references: refs, createMissing: true, methodTable: true });
    expect(table.errors).toEqual([]);
    expect(table.missingMethods).toEqual([
      { label: 'Fam-k4', row: 2, cells: { functional: 'PBEsol', k_grid: '4x4x4' }, others: [] },
      { label: 'Fam-k6', row: 3, cells: {}, others: [] },
    ]);
    expect(table.missingMethodCount).toBe(2);
    // without createMissing the labels are listed all the same (the wizard points to the option)
    expect(previewCsv(text, { kind: 'calculations', references: refs }).missingMethodCount).toBe(2);
  });
});
