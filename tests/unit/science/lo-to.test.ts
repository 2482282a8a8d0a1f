/** LO–TO couples and splittings against published Γ-point frequencies (../shared/reference/check-values.md). */
import { describe, expect, it } from 'vitest';
import { loToCouples, type BranchLine } from '@/lib/science';

describe('loToCouples', () => {
  it('GaN (wurtzite), Azuhata et al., J. Phys.: Condens. Matter 7, L129 (1995): A1 735 − 533 = 202, E1 743 − 561 = 182 cm⁻¹', () => {
    const lines: BranchLine[] = [
      { id: 'a1to', frequencyCm1: 533, species: 'A1', branch: 'TO' },
      { id: 'e1to', frequencyCm1: 561, species: 'E1', branch: 'TO' },
      { id: 'a1lo', frequencyCm1: 735, species: 'A1', branch: 'LO' },
      { id: 'e1lo', frequencyCm1: 743, species: 'E1', branch: 'LO' },
    ];
    const couples = loToCouples(lines);
    expect(couples.map((c) => [c.species, c.to.id, c.lo.id, c.splittingCm1])).toEqual([
      ['A1', 'a1to', 'a1lo', 202],
      ['E1', 'e1to', 'e1lo', 182],
    ]);
  });

  it('GaAs, Hass & Henvis (1962): TO 273.3 ± 3, LO 297.3 ± 2 → 24.0 ± √13 = 3.61 cm⁻¹', () => {
    const [c] = loToCouples([
      { id: 'lo', frequencyCm1: 297.3, species: 'T2', branch: 'LO', uncertaintyCm1: 2 },
      { id: 'to', frequencyCm1: 273.3, species: 'T2', branch: 'TO', uncertaintyCm1: 3 },
    ]);
    expect(c.splittingCm1).toBeCloseTo(24.0, 10);
    expect(c.uncertaintyCm1).toBeCloseTo(Math.sqrt(13), 10);
    expect(c).toMatchObject({ rank: 1, of: 1 });
  });

  it('couples the k-th TO with the k-th LO within a species (interleaving), lowest first', () => {
    // three polar modes of one species, as in a cubic perovskite (invented frequencies)
    const lines: BranchLine[] = [
      { id: 't1', frequencyCm1: 90, species: 'T1u', branch: 'TO' },
      { id: 'l1', frequencyCm1: 170, species: 'T1u', branch: 'LO' },
      { id: 't2', frequencyCm1: 175, species: 'T1u', branch: 'TO' },
      { id: 'l2', frequencyCm1: 470, species: 'T1u', branch: 'LO' },
      { id: 't3', frequencyCm1: 545, species: 'T1u', branch: 'TO' },
      { id: 'l3', frequencyCm1: 795, species: 'T1u', branch: 'LO' },
    ];
    expect(loToCouples(lines).map((c) => [c.rank, c.to.id, c.lo.id, c.splittingCm1])).toEqual([
      [1, 't1', 'l1', 80],
      [2, 't2', 'l2', 295],
      [3, 't3', 'l3', 250],
    ]);
  });

  it('gives no couple for a species with unequal TO and LO counts, and refuses a non-finite frequency', () => {
    expect(loToCouples([{ id: 't', frequencyCm1: 300, species: 'E', branch: 'TO' }])).toEqual([]);
    expect(() => loToCouples([{ id: 't', frequencyCm1: Number.NaN, species: 'E', branch: 'TO' }])).toThrow(/lines\[0\]\.frequencyCm1/);
  });
});
