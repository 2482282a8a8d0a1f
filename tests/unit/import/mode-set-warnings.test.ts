import { describe, expect, it } from 'vitest';
import { previewCsv, type ReferenceLists } from '@/lib/import/preview';

const references: ReferenceLists = {
  materials: [
    { name: 'Si', id: 'm-si', atomsPerFormulaUnit: 1, atomsInCell: 2 },
    { name: 'GaAs', id: 'm-gaas', atomsPerFormulaUnit: 2, atomsInCell: null },
  ],
  sources: [{ citeKey: 'calc2026', id: 's-1' }],
  methods: [{ label: 'PBEsol', id: 'me-1' }],
};
const head = 'material,method,quantity,value,unit,source,irrep,activity,degeneracy\n';

describe('calculation import warnings (warn, not refuse)', () => {
  it('an optical-only Si set is incomplete and marks no acoustic mode; the preview says what that means for pairing', () => {
    // Si T2g 520 cm⁻¹ (Parker, Feldman & Ashkin 1967: 520.2): one triply degenerate line of the 3N = 6 modes.
    const result = previewCsv(`${head}Si,PBEsol,frequency,517.3,cm-1,calc2026,T2g,raman,3\n`, { kind: 'calculations', references });
    expect(result.errorCount).toBe(0);
    expect(result.warningCount).toBe(1);
    const [w] = result.warnings;
    expect(w.row).toBe(2);
    expect(w.message).toContain('PBEsol on Si: the set lists 3 of the 3N = 6 modes of Si (2 atoms in the cell) and marks no acoustic mode.');
    expect(w.message).toContain('only unmarked modes below 10 cm⁻¹ (at most three), so every optical line listed can pair');
  });

  it('a complete set without acoustic marks is warned that the three lowest |ω| count as acoustic', () => {
    const rows = ['Si,PBEsol,frequency,0.1,cm-1,calc2026,,,3', 'Si,PBEsol,frequency,517.3,cm-1,calc2026,T2g,raman,3'].join('\n');
    const result = previewCsv(`${head}${rows}\n`, { kind: 'calculations', references });
    expect(result.warnings.map((w) => w.message)).toEqual([
      'PBEsol on Si: the set marks no acoustic mode. Pairing will take the three lowest |ω| as the acoustic modes; mark them with activity "acoustic" if that is wrong.',
    ]);
  });

  it('a complete set with acoustic marks gets no warning; an unknown atom count is said', () => {
    const rows = ['Si,PBEsol,frequency,0.1,cm-1,calc2026,,acoustic,3', 'Si,PBEsol,frequency,517.3,cm-1,calc2026,T2g,raman,3', 'GaAs,PBEsol,frequency,265,cm-1,calc2026,T2,raman+ir,3'].join('\n');
    const result = previewCsv(`${head}${rows}\n`, { kind: 'calculations', references });
    expect(result.warnings.map((w) => w.message)).toEqual([
      expect.stringContaining('GaAs has no atoms in the cell recorded, so the 3 modes cannot be checked for completeness and marks no acoustic mode'),
    ]);
    expect(result.warnings[0].row).toBe(4);
  });

  it('measurement imports never warn about mode sets', () => {
    const result = previewCsv('material,quantity,value,unit,source\nSi,frequency,520.2,cm-1,calc2026\n', { kind: 'measurements', references });
    expect(result.warnings).toEqual([]);
  });
});
