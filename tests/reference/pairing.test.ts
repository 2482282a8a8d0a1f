import { describe, expect, it } from 'vitest';
import { pairModes, type ComputedMode, type MeasuredPeak } from '@/lib/science';

describe('pairing: wurtzite GaN, labelled Raman and IR peaks', () => {
  // Measured: Azuhata et al., J. Phys.: Condens. Matter 7, L129 (1995), room temperature:
  // E2(low) 144, A1(TO) 533, E1(TO) 561, E2(high) 569, A1(LO) 735, E1(LO) 743 cm⁻¹.
  const measured: MeasuredPeak[] = [
    { id: 'raman-e2-low', frequencyCm1: 144, technique: 'raman', irrep: 'E2(low)' },
    { id: 'raman-e2-high', frequencyCm1: 569, technique: 'raman', irrep: 'E_2^high' },
    { id: 'raman-a1-lo', frequencyCm1: 735, technique: 'raman', irrep: 'A1(LO)' },
    { id: 'ir-a1-to', frequencyCm1: 533, technique: 'ir', irrep: 'A1', branch: 'TO' },
    { id: 'ir-e1-to', frequencyCm1: 561, technique: 'ir', irrep: 'E1', branch: 'TO' },
    { id: 'ir-e1-lo', frequencyCm1: 743, technique: 'ir', irrep: 'E₁', branch: 'LO' },
  ];
  // Computed: illustrative harmonic values (not from a publication), 4 atoms → 12 modes;
  // symmetry and activities of wurtzite (C6v): A1, E1 Raman+IR; E2 Raman only; B1 silent (common practice).
  const raman = { ramanActive: true, irActive: false };
  const both = { ramanActive: true, irActive: true };
  const silent = { ramanActive: false, irActive: false };
  const computed: ComputedMode[] = [
    { id: 'm1', frequencyCm1: -0.02, irrep: 'E1' },
    { id: 'm2', frequencyCm1: 0.01, irrep: 'E1' },
    { id: 'm3', frequencyCm1: 0.03, irrep: 'A1' },
    { id: 'm4', frequencyCm1: 139.1, irrep: 'E2', ...raman },
    { id: 'm5', frequencyCm1: 139.3, irrep: 'E2', ...raman },
    { id: 'm6', frequencyCm1: 327.0, irrep: 'B1', ...silent },
    { id: 'm7', frequencyCm1: 529.2, irrep: 'A1', branch: 'TO', ...both },
    { id: 'm8', frequencyCm1: 555.9, irrep: 'E1', branch: 'TO', ...both },
    { id: 'm9', frequencyCm1: 556.1, irrep: 'E1', branch: 'TO', ...both },
    { id: 'm10', frequencyCm1: 565.8, irrep: 'E2', ...raman },
    { id: 'm11', frequencyCm1: 566.0, irrep: 'E2', ...raman },
    { id: 'm12', frequencyCm1: 690.4, irrep: 'B1', ...silent },
    { id: 'm13', frequencyCm1: 728.7, irrep: 'A1', branch: 'LO', ...both },
    { id: 'm14', frequencyCm1: 736.0, irrep: 'E1', branch: 'LO', ...both },
    { id: 'm15', frequencyCm1: 736.2, irrep: 'E1', branch: 'LO', ...both },
  ];

  it('pairs every peak with the line of its symmetry and branch', () => {
    const result = pairModes(measured, computed);
    const byId = Object.fromEntries(result.pairs.map((p) => [p.measuredId, p]));
    expect(byId['raman-e2-low'].computedIds).toEqual(['m4', 'm5']); // doubly degenerate E2 collapses
    expect(byId['raman-e2-high'].computedIds).toEqual(['m10', 'm11']);
    expect(byId['raman-a1-lo'].computedIds).toEqual(['m13']);
    expect(byId['ir-a1-to'].computedIds).toEqual(['m7']);
    expect(byId['ir-e1-to'].computedIds).toEqual(['m8', 'm9']);
    expect(byId['ir-e1-lo'].computedIds).toEqual(['m14', 'm15']);
    expect(result.pairs.every((p) => p.basis === 'label')).toBe(true);
    expect(result.unpairedMeasured).toEqual([]);
    // silent B1 modes stay unpaired; acoustic m1–m3 are never listed
    expect(result.unpairedComputed).toEqual(['m6', 'm12']);
  });

  it('reports errors as calculated − measured', () => {
    const pair = pairModes(measured, computed).pairs.find((p) => p.measuredId === 'raman-e2-high');
    expect(pair?.calculatedCm1).toBeCloseTo((565.8 + 566.0) / 2, 12);
    expect(pair?.errorCm1).toBeCloseTo((565.8 + 566.0) / 2 - 569, 12);
    expect(pair?.relativeError).toBeCloseTo(((565.8 + 566.0) / 2 - 569) / 569, 12);
  });

  it('without labels, activity still keeps the IR E1(TO) peak off the Raman-only E2 line', () => {
    const unlabelled = computed.map(({ irrep: _irrep, ...rest }) => rest);
    const result = pairModes([{ id: 'ir', frequencyCm1: 561, technique: 'ir', branch: 'TO' }], unlabelled);
    expect(result.pairs[0].computedIds).toEqual(['m8', 'm9']);
    expect(result.pairs[0].basis).toBe('frequency');
  });
});

describe('pairing: cubic crystals with a triply degenerate mode', () => {
  it('Si: the F2g Raman line pairs with the collapsed triply degenerate T2g line', () => {
    // Itoh & Shirono, J. Raman Spectrosc. 51 (2020): Si 520.45 cm⁻¹ (F2g); computed values illustrative
    const measured: MeasuredPeak[] = [{ id: 'si', frequencyCm1: 520.45, uncertaintyCm1: 0.14, technique: 'raman', irrep: 'F2g' }];
    const computed: ComputedMode[] = [
      { id: 'a1', frequencyCm1: 0 },
      { id: 'a2', frequencyCm1: 0 },
      { id: 'a3', frequencyCm1: 0 },
      { id: 'o1', frequencyCm1: 511.9, irrep: 'T2g', ramanActive: true, irActive: false },
      { id: 'o2', frequencyCm1: 512.0, irrep: 'T2g', ramanActive: true, irActive: false },
      { id: 'o3', frequencyCm1: 512.2, irrep: 'T2g', ramanActive: true, irActive: false },
    ];
    const result = pairModes(measured, computed);
    expect(result.pairs).toHaveLength(1);
    expect(result.pairs[0]).toMatchObject({ measuredId: 'si', computedIds: ['o1', 'o2', 'o3'], basis: 'label', ambiguous: false });
    expect(result.pairs[0].calculatedCm1).toBeCloseTo((511.9 + 512.0 + 512.2) / 3, 12);
    expect(result.unpairedComputed).toEqual([]);
  });

  it('CaF2: the Raman F2g at 322 cm⁻¹ skips the IR-only T1u line', () => {
    // CaF2 F2g 322 cm⁻¹, Raman polarisation studies of cubic crystals (Ananthanarayanan); computed illustrative
    const computed: ComputedMode[] = [
      { id: 'ac1', frequencyCm1: 0.1, acoustic: true },
      { id: 'ac2', frequencyCm1: 0.1, acoustic: true },
      { id: 'ac3', frequencyCm1: 0.1, acoustic: true },
      { id: 't1u-1', frequencyCm1: 305, irrep: 'T1u', ramanActive: false, irActive: true, acoustic: false },
      { id: 't1u-2', frequencyCm1: 305, irrep: 'T1u', ramanActive: false, irActive: true, acoustic: false },
      { id: 't1u-3', frequencyCm1: 305, irrep: 'T1u', ramanActive: false, irActive: true, acoustic: false },
      { id: 't2g', frequencyCm1: 318, irrep: 'T2g', ramanActive: true, irActive: false, degeneracy: 3, acoustic: false },
    ];
    const result = pairModes([{ id: 'caf2', frequencyCm1: 322, technique: 'raman', irrep: 'F2g' }], computed);
    expect(result.pairs.map((p) => p.computedIds)).toEqual([['t2g']]);
    expect(result.unpairedComputed).toEqual(['t1u-1', 't1u-2', 't1u-3']);
  });
});

describe('pairing: unlabelled modes', () => {
  const acoustic: ComputedMode[] = [
    { id: 'a1', frequencyCm1: 0 },
    { id: 'a2', frequencyCm1: 0 },
    { id: 'a3', frequencyCm1: 0 },
  ];

  it('two computed modes within the ambiguity window make the pair ambiguous', () => {
    // window = max(2 cm⁻¹, 0.01 × 300) = 3 cm⁻¹ (contract defaults); deviations 1.0 and 1.5 cm⁻¹
    const computed = [...acoustic, { id: 'x', frequencyCm1: 299 }, { id: 'y', frequencyCm1: 301.5 }];
    const result = pairModes([{ id: 'p', frequencyCm1: 300, technique: 'ins' }], computed);
    expect(result.pairs[0]).toMatchObject({ computedIds: ['x'], ambiguous: true, basis: 'frequency' });
    expect(result.unpairedComputed).toEqual(['y']);
  });

  it('well separated modes are not ambiguous', () => {
    const computed = [...acoustic, { id: 'x', frequencyCm1: 299 }, { id: 'y', frequencyCm1: 320 }];
    const result = pairModes([{ id: 'p', frequencyCm1: 300, technique: 'ins' }], computed);
    expect(result.pairs[0].ambiguous).toBe(false);
  });

  it('nothing pairs beyond the 25 % window', () => {
    const computed = [...acoustic, { id: 'x', frequencyCm1: 380 }];
    const result = pairModes([{ id: 'p', frequencyCm1: 300, technique: 'raman' }], computed);
    expect(result.pairs).toEqual([]);
    expect(result.unpairedMeasured).toEqual(['p']);
    expect(result.unpairedComputed).toEqual(['x']);
  });
});
