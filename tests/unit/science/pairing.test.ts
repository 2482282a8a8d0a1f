import { describe, expect, it } from 'vitest';
import { ScienceInputError, acousticModeIds, pairModes, type ComputedMode, type MeasuredPeak } from '@/lib/science';

const acoustic: ComputedMode[] = [
  { id: 'a1', frequencyCm1: 0.01 },
  { id: 'a2', frequencyCm1: -0.02 },
  { id: 'a3', frequencyCm1: 0.03 },
];

describe('acoustic modes', () => {
  it('are the three lowest |ω| when nothing is marked, counting degeneracy', () => {
    expect(acousticModeIds([...acoustic, { id: 'o', frequencyCm1: 100 }])).toEqual(new Set(['a1', 'a2', 'a3']));
    expect(acousticModeIds([{ id: 't', frequencyCm1: 0, degeneracy: 3 }, { id: 'o', frequencyCm1: 100 }])).toEqual(new Set(['t']));
    expect(acousticModeIds([{ id: 'neg', frequencyCm1: -4 }, { id: 'x', frequencyCm1: 3 }, { id: 'y', frequencyCm1: 1 }, { id: 'o', frequencyCm1: 5 }])).toEqual(
      new Set(['neg', 'x', 'y']),
    );
  });

  it('follow the marks when any mode is marked', () => {
    const modes: ComputedMode[] = [{ id: 'x', frequencyCm1: 0, acoustic: false }, { id: 'y', frequencyCm1: 300 }];
    expect(acousticModeIds(modes)).toEqual(new Set());
    expect(pairModes([{ id: 'p', frequencyCm1: 300, technique: 'ins' }], modes).pairs).toHaveLength(1);
  });

  it('never pair and are not listed as unpaired', () => {
    const result = pairModes([{ id: 'p', frequencyCm1: 1, technique: 'ins' }], [...acoustic, { id: 'o', frequencyCm1: 400 }]);
    expect(result.pairs).toEqual([]);
    expect(result.unpairedComputed).toEqual(['o']);
  });
});

describe('eligibility', () => {
  const modes: ComputedMode[] = [
    ...acoustic,
    { id: 'raman-only', frequencyCm1: 300, ramanActive: true, irActive: false },
    { id: 'ir-only', frequencyCm1: 310, ramanActive: false, irActive: true },
    { id: 'silent', frequencyCm1: 305, ramanActive: false, irActive: false },
  ];

  it('Raman peaks pair only with Raman-active lines, IR only with IR-active', () => {
    expect(pairModes([{ id: 'r', frequencyCm1: 309, technique: 'raman' }], modes).pairs[0].computedIds).toEqual(['raman-only']);
    expect(pairModes([{ id: 'i', frequencyCm1: 299, technique: 'ir' }], modes).pairs[0].computedIds).toEqual(['ir-only']);
  });

  it('INS pairs with any optical line, including silent ones', () => {
    expect(pairModes([{ id: 'n', frequencyCm1: 305.2, technique: 'ins' }], modes).pairs[0].computedIds).toEqual(['silent']);
  });

  it('hyper-Raman excludes Raman-only lines but takes IR-active and silent ones', () => {
    expect(pairModes([{ id: 'h', frequencyCm1: 300, technique: 'hyper-raman' }], modes).pairs[0].computedIds).toEqual(['silent']);
  });

  it('TO pairs with TO and LO with LO, also when the branch is written in the label', () => {
    const polar: ComputedMode[] = [...acoustic, { id: 'to', frequencyCm1: 270, branch: 'TO' }, { id: 'lo', frequencyCm1: 290, irrep: 'T2(LO)' }];
    expect(pairModes([{ id: 'x', frequencyCm1: 289, technique: 'ir', branch: 'TO' }], polar).pairs[0].computedIds).toEqual(['to']);
    expect(pairModes([{ id: 'x', frequencyCm1: 271, technique: 'raman', irrep: 'T2(LO)' }], polar).pairs[0].computedIds).toEqual(['lo']);
  });

  it('labels must match when both sides carry one', () => {
    const labelled: ComputedMode[] = [...acoustic, { id: 'eg', frequencyCm1: 400, irrep: 'Eg' }, { id: 'a1g', frequencyCm1: 450, irrep: 'A1g' }];
    const result = pairModes([{ id: 'p', frequencyCm1: 401, technique: 'raman', irrep: 'A_{1g}' }], labelled);
    expect(result.pairs[0]).toMatchObject({ computedIds: ['a1g'], basis: 'label' });
  });
});

describe('assignment', () => {
  it('maximises the number of pairs, then minimises the total relative deviation', () => {
    // greedy would give m2 → 510 and leave m1 unpaired; the optimum pairs both
    const computed: ComputedMode[] = [...acoustic, { id: 'c510', frequencyCm1: 510 }, { id: 'c640', frequencyCm1: 640 }];
    const measured: MeasuredPeak[] = [
      { id: 'm1', frequencyCm1: 500, technique: 'ins' },
      { id: 'm2', frequencyCm1: 520, technique: 'ins' },
    ];
    const result = pairModes(measured, computed);
    expect(result.pairs.map((p) => [p.measuredId, p.computedIds[0]])).toEqual([
      ['m1', 'c510'],
      ['m2', 'c640'],
    ]);
  });

  it('collapses same-label modes within 0.5 cm⁻¹ but not further apart', () => {
    const computed: ComputedMode[] = [
      ...acoustic,
      { id: 'e1', frequencyCm1: 400.0, irrep: 'Eg' },
      { id: 'e2', frequencyCm1: 400.4, irrep: 'Eg' },
      { id: 'e3', frequencyCm1: 401.0, irrep: 'Eg' },
      { id: 'b', frequencyCm1: 400.2, irrep: 'B1g' },
    ];
    const result = pairModes([{ id: 'p', frequencyCm1: 400.1, technique: 'raman', irrep: 'Eg' }], computed);
    expect(result.pairs[0].computedIds).toEqual(['e1', 'e2']);
    expect(result.pairs[0].calculatedCm1).toBeCloseTo(400.2, 12);
    expect(result.unpairedComputed).toEqual(['e3', 'b']);
  });

  it('uses the ambiguity options', () => {
    const computed: ComputedMode[] = [...acoustic, { id: 'x', frequencyCm1: 299 }, { id: 'y', frequencyCm1: 301.5 }];
    const peak: MeasuredPeak[] = [{ id: 'p', frequencyCm1: 300, technique: 'ins' }];
    expect(pairModes(peak, computed, { ambiguityCm1: 0.2, ambiguityRelative: 0 }).pairs[0].ambiguous).toBe(false);
    expect(pairModes(peak, computed, { ambiguityCm1: 0.5, ambiguityRelative: 0 }).pairs[0].ambiguous).toBe(true);
  });
});

describe('pins', () => {
  const computed: ComputedMode[] = [...acoustic, { id: 'x', frequencyCm1: 300 }, { id: 'y', frequencyCm1: 420, degeneracy: 2 }];
  const measured: MeasuredPeak[] = [
    { id: 'p', frequencyCm1: 301, technique: 'raman' },
    { id: 'q', frequencyCm1: 310, technique: 'raman' },
  ];

  it('override the window and the optimiser', () => {
    const result = pairModes(measured, computed, { pins: [{ measuredId: 'q', computedId: 'y' }] });
    const q = result.pairs.find((pair) => pair.measuredId === 'q');
    expect(q).toMatchObject({ computedIds: ['y'], basis: 'pinned', ambiguous: false, calculatedCm1: 420 });
    expect(result.pairs.find((pair) => pair.measuredId === 'p')?.computedIds).toEqual(['x']);
  });

  it('mark "no counterpart" with null', () => {
    const result = pairModes(measured, computed, { pins: [{ measuredId: 'p', computedId: null }] });
    expect(result.unpairedMeasured).toEqual(['p']);
    expect(result.pairs.map((pair) => [pair.measuredId, pair.computedIds[0]])).toEqual([['q', 'x']]);
  });

  it('survive re-runs: a pin to a mode that no longer exists is inert, others still apply', () => {
    const pins = [
      { measuredId: 'p', computedId: 'gone' },
      { measuredId: 'q', computedId: 'y' },
      { measuredId: 'no-such-peak', computedId: 'x' },
    ];
    const result = pairModes(measured, computed, { pins });
    expect(result.pairs.map((pair) => [pair.measuredId, pair.computedIds[0], pair.basis])).toEqual([
      ['p', 'x', 'frequency'],
      ['q', 'y', 'pinned'],
    ]);
  });

  it('may not claim one measured peak or one line twice', () => {
    expect(() => pairModes(measured, computed, { pins: [{ measuredId: 'p', computedId: 'x' }, { measuredId: 'p', computedId: 'y' }] })).toThrow(ScienceInputError);
    expect(() => pairModes(measured, computed, { pins: [{ measuredId: 'p', computedId: 'x' }, { measuredId: 'q', computedId: 'x' }] })).toThrow(/already pinned/);
  });
});

describe('pins on acoustic modes', () => {
  it('a pin overrides the acoustic rule too (the three acoustic modes at Γ form one degenerate line)', () => {
    const result = pairModes([{ id: 'p', frequencyCm1: 5, technique: 'ins' }], [...acoustic, { id: 'o', frequencyCm1: 200 }], {
      pins: [{ measuredId: 'p', computedId: 'a3' }],
    });
    expect(result.pairs[0]).toMatchObject({ measuredId: 'p', computedIds: ['a2', 'a1', 'a3'], basis: 'pinned' });
    expect(result.unpairedComputed).toEqual(['o']);
  });
});
