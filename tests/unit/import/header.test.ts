import { describe, expect, it } from 'vitest';
import { autoMapColumns, normalizeHeader, resolveHeader } from '@/lib/import/header';

describe('header mapping', () => {
  it('normalises spelling, case, spaces and units in parentheses', () => {
    expect(normalizeHeader(' Temperature (K) ')).toBe('temperature_k');
    expect(normalizeHeader('Laser-nm')).toBe('laser_nm');
  });

  it('maps our names and common aliases automatically, each file column at most once', () => {
    const mapping = autoMapColumns('measurements', ['Material', 'Quantity', 'Frequency', 'Unit', 'Temperature (K)', 'Cite key', 'Sigma', 'Comment', 'Operator']);
    expect(mapping).toMatchObject({
      material: 'Material',
      quantity: 'Quantity',
      value: 'Frequency',
      unit: 'Unit',
      temperature_K: 'Temperature (K)',
      source: 'Cite key',
      uncertainty: 'Sigma',
      notes: 'Comment',
      irrep: null,
    });
    expect(resolveHeader('measurements', ['Material', 'Quantity', 'Frequency', 'Unit', 'Cite key', 'Operator']).ignored).toEqual(['Operator']);
  });

  it('maps calculation-only columns', () => {
    expect(autoMapColumns('calculations', ['material', 'method', 'quantity', 'value', 'mode', 'source'])).toMatchObject({ method: 'method', mode_index: 'mode' });
  });

  it('rejects duplicate headers, including ones that differ only in case or spacing', () => {
    const { errors } = resolveHeader('measurements', ['material', 'quantity', 'value', 'source', ' Value ']);
    expect(errors).toEqual([{ row: 1, column: ' Value ', reason: 'Duplicate header: columns 3 and 5 are both named "value". Rename or remove one.' }]);
  });

  it('reports missing required columns and a file column mapped twice', () => {
    const { errors } = resolveHeader('calculations', ['material', 'quantity', 'value', 'source'], { material: 'material', quantity: 'quantity', value: 'value', source: 'value' });
    expect(errors).toContainEqual({ row: 1, column: 'value', reason: 'File column "value" is mapped to both "value" and "source".' });
    expect(errors).toContainEqual({ row: 1, column: 'method', reason: 'Required column "method" is missing from the header.' });
    expect(errors).toContainEqual({ row: 1, column: 'source', reason: 'Required column "source" is missing from the header.' });
  });
});
