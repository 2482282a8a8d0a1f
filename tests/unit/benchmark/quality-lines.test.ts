/**
 * The benchmark's quality flags as lines: a method's k-grid / q-grid note once per method
 * with its material count, the real problems (an imaginary mode, a broken acoustic sum rule)
 * first, and messages without "mode mode" or "1 modes". Frequencies are invented.
 */
import { describe, expect, it } from 'vitest';
import { qualityLines } from '@/lib/benchmark/quality-lines';
import { qualityModes } from '@/lib/benchmark/pair-rows';
import { qualityChecks } from '@/lib/science';
import { counted } from '@/lib/format';
import type { QualityRecord, ScopeCalculation } from '@/lib/benchmark/types';

const methods: Record<string, string> = { pbe: 'PBE · NC · k8', lda: 'LDA · PAW · k6' };
const materials: Record<string, string> = { si: 'Si', ge: 'Ge', gaas: 'GaAs', mgo: 'MgO', zno: 'ZnO' };
const label = (id: string) => methods[id] ?? id;
const name = (id: string) => materials[id] ?? id;

const kGrid = (methodId: string, materialId: string, atoms: number): QualityRecord => ({
  methodId,
  materialId,
  code: 'k-point-density',
  severity: 'warning',
  message: `6×6×6 k-points × ${atoms} atoms = ${216 * atoms} per reciprocal atom, below the target 1500.`,
  value: 216 * atoms,
});
const qGrid = (methodId: string, materialId: string): QualityRecord => ({
  methodId,
  materialId,
  code: 'grid-commensurability',
  severity: 'warning',
  message: 'The q-point grid 4×4×4 is not commensurate with the k-point grid 6×6×6 (each q_i should divide k_i).',
});

describe('qualityLines', () => {
  const flags: QualityRecord[] = [
    ...['si', 'ge', 'gaas', 'mgo'].map((m) => kGrid('lda', m, m === 'gaas' ? 2 : m === 'mgo' ? 2 : 2)),
    kGrid('lda', 'zno', 4),
    ...['si', 'ge', 'gaas', 'mgo', 'zno'].map((m) => qGrid('lda', m)),
    { methodId: 'pbe', materialId: 'si', code: 'acoustic-sum-rule', severity: 'warning', message: 'Acoustic mode no. 3 is at 18 cm⁻¹; the acoustic sum rule expects ≈ 0 (limit 10 cm⁻¹).', value: 18 },
    { methodId: 'pbe', materialId: 'ge', code: 'acoustic-sum-rule', severity: 'warning', message: 'Acoustic mode no. 2 is at -12 cm⁻¹; the acoustic sum rule expects ≈ 0 (limit 10 cm⁻¹).', value: -12 },
    { methodId: 'lda', materialId: 'mgo', code: 'imaginary-mode', severity: 'error', message: '1 imaginary optical mode (T1u no. 4), lowest -87 cm⁻¹: a dynamical instability or an unconverged calculation.', value: -87 },
    { methodId: 'pbe', materialId: 'zno', code: 'imaginary-mode', severity: 'error', message: '1 imaginary optical mode (E2 no. 4), lowest -15 cm⁻¹: a dynamical instability or an unconverged calculation.', value: -15 },
  ];
  const lines = qualityLines(flags, label, name);

  it('writes a method-level flag once per method, with the material count', () => {
    const grid = lines.filter((l) => l.code === 'grid-commensurability');
    expect(grid).toHaveLength(1);
    expect(grid[0].scope).toBe('on 5 materials');
    expect(grid[0].materials).toEqual(['GaAs', 'Ge', 'MgO', 'Si', 'ZnO']);
    const k = lines.filter((l) => l.code === 'k-point-density');
    expect(k).toHaveLength(1);
    // the messages differ per material (atoms in the cell): the lowest density stands for all
    expect(k[0].message).toContain('= 432 per reciprocal atom');
    expect(k[0].message).toMatch(/\(worst: (GaAs|Ge|MgO|Si)\)$/);
    // 4 per-calculation flags + 2 method lines instead of 14 entries
    expect(lines).toHaveLength(6);
  });

  it('puts imaginary modes first (lowest first), then the acoustic sum rule (largest |ω| first), the recipe notes last', () => {
    expect(lines.map((l) => `${l.code} ${l.scope}`)).toEqual([
      'imaginary-mode MgO',
      'imaginary-mode ZnO',
      'acoustic-sum-rule Si',
      'acoustic-sum-rule Ge',
      'k-point-density on 5 materials',
      'grid-commensurability on 5 materials',
    ]);
  });

  it('shows the numbers of messages with a true minus sign', () => {
    expect(lines[0].message).toContain('lowest −87 cm⁻¹');
    expect(lines[3].message).toContain('at −12 cm⁻¹');
  });

  it('counts one material in the singular', () => {
    const one = qualityLines([qGrid('pbe', 'si')], label, name);
    expect(one[0].scope).toBe('on 1 material');
  });
});

describe('quality wording', () => {
  const calc = (id: string, value: number, irrep: string | null): ScopeCalculation => ({
    id,
    materialId: 'si',
    methodId: 'pbe',
    sourceId: 'calc',
    importId: null,
    value,
    uncertainty: null,
    temperatureK: null,
    irrep,
    branch: null,
    activity: null,
    degeneracy: 1,
  });

  it('names an unlabelled acoustic mode "mode no. 3", not "mode mode no. 3"', () => {
    const modes = qualityModes([calc('a', 0.5, null), calc('b', 1.2, null), calc('c', 18, null), calc('d', 517, 'T2g'), calc('e', 517, 'T2g'), calc('f', 517, 'T2g')]);
    const [flag] = qualityChecks({ modes, atomsInCell: 2 });
    expect(flag.code).toBe('acoustic-sum-rule');
    expect(flag.message).toMatch(/^Acoustic mode no\. 3 is at 18 cm⁻¹/);
    expect(flag.message).not.toContain('mode mode');
  });

  it('keeps the label of a labelled mode', () => {
    expect(qualityModes([calc('a', 300, 'T2g')])[0].id).toBe('T2g no. 1');
  });

  it('says "1 mode" and "6 modes"', () => {
    expect(counted(1, 'mode')).toBe('1 mode');
    expect(counted(6, 'mode')).toBe('6 modes');
    expect(counted(1200, 'pair')).toBe('1,200 pairs');
  });
});
