/**
 * Pairing and quality rules for partial mode lists, LO/TO, the labelled window, degenerate
 * lines and ordinal labels, checked on published zone-centre frequencies (sources beside
 * each check; "from memory" where the value was not re-read from the source).
 */
import { describe, expect, it } from 'vitest';
import { acousticModeIds, normalizeIrrep, irrepSpecies, pairModes, qualityChecks, qualityReport, type ComputedMode } from '@/lib/science';

describe('partial mode lists keep their lowest optical lines', () => {
  // Si optical F2g 520.45 cm⁻¹: Itoh & Shirono, J. Raman Spectrosc. 51 (2020), certified reference material.
  const siPeak = { id: 'si', frequencyCm1: 520.45, technique: 'raman' as const, irrep: 'F2g' };

  it('an optical-only Si list (one T2g line) pairs', () => {
    const optical: ComputedMode[] = [{ id: 't2g', frequencyCm1: 515.2, irrep: 'T2g', degeneracy: 3 }];
    const result = pairModes([siPeak], optical);
    expect(result.pairs.map((p) => p.computedIds)).toEqual([['t2g']]);
    expect(result.pairs[0].basis).toBe('label');
  });

  it('with the atom count and a complete list (3N = 6 for Si) the three lowest |ω| are acoustic', () => {
    const full: ComputedMode[] = [
      { id: 'a1', frequencyCm1: 12 },
      { id: 'a2', frequencyCm1: 12.5 },
      { id: 'a3', frequencyCm1: -11 },
      { id: 't2g', frequencyCm1: 515.2, degeneracy: 3 },
    ];
    // 12 cm⁻¹ is above the 10 cm⁻¹ threshold, but a complete list still has its three acoustic modes.
    expect(acousticModeIds(full, { atomsInCell: 2 })).toEqual(new Set(['a1', 'a2', 'a3']));
    // Without the atom count only modes below 10 cm⁻¹ are acoustic: none here.
    expect(acousticModeIds(full)).toEqual(new Set());
    expect(pairModes([siPeak], full, { atomsInCell: 2 }).pairs[0].computedIds).toEqual(['t2g']);
  });

  it('a stated optical mode is never acoustic, even in a complete list', () => {
    const modes: ComputedMode[] = [
      { id: 'x', frequencyCm1: 0.5, ramanActive: true },
      { id: 'a1', frequencyCm1: 1 },
      { id: 'a2', frequencyCm1: 2 },
      { id: 'a3', frequencyCm1: 3 },
      { id: 'o', frequencyCm1: 500, degeneracy: 2 },
    ];
    expect(acousticModeIds(modes, { atomsInCell: 2 })).toEqual(new Set(['a1', 'a2', 'a3']));
  });

  it('the quality checks do not call an optical line of a partial list an acoustic mode', () => {
    // GaN E2(low) 144 cm⁻¹ (Azuhata et al., J. Phys.: Condens. Matter 7, L129, 1995): the lowest optical line.
    const gan: ComputedMode[] = [
      { id: 'E2(low)', frequencyCm1: 140, irrep: 'E2(low)', degeneracy: 2 },
      { id: 'A1(TO)', frequencyCm1: 530, irrep: 'A1(TO)' },
    ];
    expect(qualityChecks({ modes: gan, atomsInCell: 4 }).map((f) => f.code)).toEqual(['mode-count']);
    expect(qualityChecks({ modes: gan }).map((f) => f.code)).toEqual([]);
  });
});

describe('LO peaks and calculations without the non-analytic correction', () => {
  // GaAs TO 273.3, LO 297.3 cm⁻¹: Hass & Henvis, J. Phys. Chem. Solids (1962), IR reflection at liquid-helium temperature.
  const lo = { id: 'lo', frequencyCm1: 297.3, technique: 'raman' as const, branch: 'LO' as const };
  const computedTO: ComputedMode[] = [
    { id: 'acoustic', frequencyCm1: 0.2, acoustic: true, degeneracy: 3 },
    { id: 'to', frequencyCm1: 265, irrep: 'T2', degeneracy: 3 },
  ];

  it('without the correction an LO peak never pairs with an unbranched line (a TO line)', () => {
    const result = pairModes([lo], computedTO, { nonAnalyticCorrection: false });
    expect(result.pairs).toEqual([]);
    expect(result.unpairedMeasured).toEqual(['lo']);
  });

  it('a TO peak still pairs with it', () => {
    const to = { id: 'to-peak', frequencyCm1: 273.3, technique: 'ir' as const, branch: 'TO' as const };
    expect(pairModes([to], computedTO, { nonAnalyticCorrection: false }).pairs).toHaveLength(1);
  });

  it('an unknown correction keeps the earlier behaviour (the LO peak pairs)', () => {
    expect(pairModes([lo], computedTO).pairs[0].errorCm1).toBeCloseTo(265 - 297.3, 10);
  });
});

describe('the labelled window keeps the worst errors', () => {
  // SrTiO3 soft mode T1u(TO1) ≈ 88 cm⁻¹ at room temperature (from memory; Servoin, Luspin & Gervais, PRB 22, 5501, 1980).
  const soft = { id: 'soft', frequencyCm1: 88, technique: 'ir' as const, irrep: 'T1u(TO)' };

  it('a labelled soft mode 27 % off still pairs', () => {
    const result = pairModes([soft], [{ id: 'c', frequencyCm1: 64, irrep: 'T1u', branch: 'TO', degeneracy: 3 }]);
    expect(result.pairs).toHaveLength(1);
    expect(result.pairs[0].relativeError).toBeCloseTo(-24 / 88, 12);
  });

  it('unlabelled pairs keep the 25 % window', () => {
    const result = pairModes([{ ...soft, irrep: undefined }], [{ id: 'c', frequencyCm1: 64, degeneracy: 3 }]);
    expect(result.pairs).toEqual([]);
  });

  it('the labelled window is an option and never narrower than the unlabelled one', () => {
    const c: ComputedMode[] = [{ id: 'c', frequencyCm1: 64, irrep: 'T1u' }];
    expect(pairModes([soft], c, { labelledMaxRelativeDeviation: 0.2 }).pairs).toEqual([]);
    expect(pairModes([soft], c, { labelledMaxRelativeDeviation: 0.1, maxRelativeDeviation: 0.3 }).pairs).toHaveLength(1);
  });
});

describe('degenerate lines collapse on the running mean', () => {
  const si = { id: 'si', frequencyCm1: 520.45, technique: 'raman' as const };

  it('a triplet at 517.0 / 517.3 / 517.6 is one line, not ambiguous (worked case)', () => {
    const triplet: ComputedMode[] = [
      { id: 'a', frequencyCm1: 517.0, irrep: 'T2g' },
      { id: 'b', frequencyCm1: 517.3, irrep: 'T2g' },
      { id: 'c', frequencyCm1: 517.6, irrep: 'T2g' },
    ];
    const result = pairModes([si], triplet);
    expect(result.pairs[0].computedIds).toEqual(['a', 'b', 'c']);
    expect(result.pairs[0].calculatedCm1).toBeCloseTo(517.3, 12);
    expect(result.pairs[0].ambiguous).toBe(false);
    expect(result.unpairedComputed).toEqual([]);
  });

  it('two lines 1.2 cm⁻¹ apart stay apart', () => {
    const result = pairModes([si], [
      { id: 'a', frequencyCm1: 517.0 },
      { id: 'b', frequencyCm1: 518.2 },
    ]);
    expect(result.pairs[0].computedIds).toEqual(['b']);
    expect(result.unpairedComputed).toEqual(['a']);
  });
});

describe('ordinal superscripts of layered crystals', () => {
  // MoS2 (bulk) E¹₂g ≈ 383 cm⁻¹ and A1g ≈ 408 cm⁻¹ (from memory; Lee et al., ACS Nano 4, 2695, 2010).
  it('E¹₂g, E^1_{2g} and E_{2g}^1 are one label; E²₂g another; both of species E2g', () => {
    expect(new Set(['E¹₂g', 'E^1_{2g}', 'E_{2g}^1', 'E^{1}_{2g}'].map(normalizeIrrep))).toEqual(new Set(['E2g^1']));
    expect(normalizeIrrep('E²₂g')).toBe('E2g^2');
    expect(normalizeIrrep('E2g^1')).toBe('E2g^1');
    expect(irrepSpecies('E¹₂g')).toBe('E2g');
    expect(irrepSpecies('E^2_{2g}')).toBe('E2g');
    // Markup without digits is still the high/low qualifier.
    expect(normalizeIrrep('E_2^high')).toBe('E2(high)');
  });

  it('a measured E¹₂g pairs with a computed E2g', () => {
    const result = pairModes([{ id: 'm', frequencyCm1: 383, technique: 'raman', irrep: 'E¹₂g' }], [
      { id: 'c', frequencyCm1: 380, irrep: 'E2g', degeneracy: 2 },
      { id: 'a', frequencyCm1: 404, irrep: 'A1g' },
    ]);
    expect(result.pairs.map((p) => [p.computedIds[0], p.basis])).toEqual([['c', 'label']]);
  });
});

describe('Lyddane–Sachs–Teller needs a cubic crystal with scalar ε', () => {
  // Wurtzite GaN: A1(TO) 533, E1(TO) 561, A1(LO) 735, E1(LO) 743 (Azuhata et al. 1995); ε∞ ≈ 5.35, ε₀ ≈ 9.5 (from memory).
  const gan: ComputedMode[] = [
    { id: 'a1to', frequencyCm1: 533, irrep: 'A1(TO)' },
    { id: 'e1to', frequencyCm1: 561, irrep: 'E1(TO)', degeneracy: 2 },
    { id: 'a1lo', frequencyCm1: 735, irrep: 'A1(LO)' },
    { id: 'e1lo', frequencyCm1: 743, irrep: 'E1(LO)', degeneracy: 2 },
  ];
  const dielectric = { epsInf: 5.35, eps0: 9.5 };

  it('without a space group the product over all lines gives the false +88 % warning', () => {
    const [flag] = qualityChecks({ modes: gan, dielectric });
    expect(flag.code).toBe('lyddane-sachs-teller');
    expect(flag.value!).toBeCloseTo(0.88, 2);
  });

  it('for wurtzite (P6₃mc, no. 186) the check is not applied, and the report says so', () => {
    const report = qualityReport({ modes: gan, dielectric, spaceGroupNumber: 186 });
    expect(report.flags).toEqual([]);
    expect(report.notApplied.map((n) => n.code)).toEqual(['lyddane-sachs-teller']);
    expect(report.notApplied[0].reason).toMatch(/hexagonal/);
  });

  it('cubic GaAs (F-43m, no. 216) is checked as before', () => {
    // Hass & Henvis (1962) TO 273.3, LO 297.3; ε₀ 12.9, ε∞ 10.9 (from memory): (297.3/273.3)² = 1.183 ≈ 12.9/10.9.
    const gaas: ComputedMode[] = [
      { id: 'to', frequencyCm1: 273.3, branch: 'TO', degeneracy: 2 },
      { id: 'lo', frequencyCm1: 297.3, branch: 'LO' },
    ];
    expect(qualityReport({ modes: gaas, dielectric: { epsInf: 10.9, eps0: 12.9 }, spaceGroupNumber: 216 })).toEqual({ flags: [], notApplied: [] });
    expect(qualityChecks({ modes: gaas, dielectric: { epsInf: 10.9, eps0: 16 }, spaceGroupNumber: 216 }).map((f) => f.code)).toEqual(['lyddane-sachs-teller']);
  });
});
