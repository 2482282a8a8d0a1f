/** Columnar plot payload: the rows come back exactly, including the cases the compact form special-cases. Invented points. */
import { describe, expect, it } from 'vitest';
import { decodePlotColumns, encodePlotColumns } from '@/lib/benchmark/plot-columns';
import type { PlotPoint } from '@/lib/benchmark/pairs-export';

const point = (over: Partial<PlotPoint>): PlotPoint => {
  const p = { key: 'M1|a', methodId: 'M1', method: 'PBE', material: 'GaN', label: 'A1g', measured: 500.1, calculated: 490.37, uMeasured: null, excluded: false, outlier: false, citation: 'Doe 2020', ...over };
  return { error: p.calculated - p.measured, mean: (p.measured + p.calculated) / 2, ...p } as PlotPoint;
};

describe('plot columns', () => {
  it('round-trips rows, sharing repeated text and the measurement part of keys', () => {
    const rows = [
      point({}),
      point({ key: 'M2|a', methodId: 'M2', method: 'LDA', excluded: true, uMeasured: 1.25 }),
      point({ key: 'M1|b+c', material: 'ZnO', outlier: true, citation: 'Roe 2021; Doe 2020' }),
      point({ key: 'odd-key', methodId: 'M2', method: 'LDA' }),
    ];
    const payload = encodePlotColumns(rows, { revision: 3, unit: 'cm-1' });
    expect(payload.keys).toEqual(['a', 'b+c', 'odd-key']);
    expect(payload.citations).toEqual(['Doe 2020', 'Roe 2021; Doe 2020']);
    expect(payload.columns.error).toBeNull();
    expect(decodePlotColumns(JSON.parse(JSON.stringify(payload)))).toStrictEqual(rows);
  });

  it('sends the errors when one is not calculated − measured', () => {
    const rows = [point({}), point({ key: 'M1|x', error: 7 })];
    const payload = encodePlotColumns(rows, { revision: 1, unit: 'J/(mol K)' });
    expect(payload.columns.error).toEqual([rows[0].error, 7]);
    expect(decodePlotColumns(payload)).toStrictEqual(rows);
  });

  it('refuses a payload of another format', () => {
    expect(() => decodePlotColumns({ ...encodePlotColumns([], { revision: 1, unit: 'x' }), format: 'rows' as never })).toThrow(/format "rows"/);
  });
});
