import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { acousticModeIds, collapseDegenerateModes, pairModes, type ComputedMode } from '@/lib/science';

const mode = fc.record({
  frequencyCm1: fc.double({ min: -50, max: 1500, noNaN: true }),
  degeneracy: fc.constantFrom(1, 1, 2, 3),
  acoustic: fc.constantFrom<boolean | undefined>(undefined, undefined, undefined, false, true),
  ramanActive: fc.constantFrom<boolean | undefined>(undefined, undefined, true, false),
  irActive: fc.constantFrom<boolean | undefined>(undefined, undefined, true, false),
  irrep: fc.constantFrom<string | undefined>(undefined, 'T2g', 'Eg', 'A1g'),
});
const modeList = fc.array(mode, { maxLength: 20 }).map((rows) => rows.map((r, i): ComputedMode => ({ id: `m${i}`, ...r })));
const atoms = fc.option(fc.integer({ min: 1, max: 8 }), { nil: undefined });

describe('acoustic rule (properties)', () => {
  it('a stated optical mode is never acoustic, whatever the list', () => {
    fc.assert(
      fc.property(modeList, atoms, (modes, atomsInCell) => {
        const acoustic = acousticModeIds(modes, { atomsInCell });
        for (const m of modes) {
          if (m.acoustic === false || m.ramanActive === true || m.irActive === true) expect(acoustic.has(m.id)).toBe(false);
          else if (m.acoustic === true) expect(acoustic.has(m.id)).toBe(true);
        }
      }),
    );
  });

  it('without marks, a partial list takes only modes below the threshold, at most three by degeneracy', () => {
    fc.assert(
      fc.property(modeList, (modes) => {
        const unmarked = modes.map((m) => ({ ...m, acoustic: undefined }));
        const acoustic = acousticModeIds(unmarked);
        const chosen = unmarked.filter((m) => acoustic.has(m.id));
        for (const m of chosen) expect(Math.abs(m.frequencyCm1)).toBeLessThan(10);
        expect(chosen.length).toBeLessThanOrEqual(3);
      }),
    );
  });

  it('adding an optical line never changes which modes are acoustic in a partial list', () => {
    fc.assert(
      fc.property(modeList, fc.double({ min: 20, max: 1500, noNaN: true }), (modes, frequencyCm1) => {
        const before = acousticModeIds(modes);
        const after = acousticModeIds([...modes, { id: 'extra', frequencyCm1, ramanActive: true }]);
        expect(after).toEqual(before);
      }),
    );
  });

  it('collapsing keeps every id in exactly one line and every degeneracy', () => {
    fc.assert(
      fc.property(modeList, (modes) => {
        const lines = collapseDegenerateModes(modes, acousticModeIds(modes));
        const ids = lines.flatMap((l) => l.ids).sort();
        expect(ids).toEqual(modes.map((m) => m.id).sort());
        expect(lines.reduce((s, l) => s + l.degeneracy, 0)).toBe(modes.reduce((s, m) => s + (m.degeneracy ?? 1), 0));
      }),
    );
  });

  it('an optical-only list pairs each peak placed on one of its lines', () => {
    fc.assert(
      fc.property(fc.uniqueArray(fc.integer({ min: 30, max: 1400 }), { minLength: 1, maxLength: 8, selector: (v) => Math.round(v / 10) }), (frequencies) => {
        const spaced = frequencies.filter((f, i) => frequencies.every((g, j) => j === i || Math.abs(f - g) > 10));
        const modes: ComputedMode[] = spaced.map((f, i) => ({ id: `c${i}`, frequencyCm1: f, ramanActive: true }));
        const peaks = spaced.map((f, i) => ({ id: `p${i}`, frequencyCm1: f + 0.5, technique: 'raman' as const }));
        expect(pairModes(peaks, modes).pairs).toHaveLength(spaced.length);
      }),
    );
  });
});
