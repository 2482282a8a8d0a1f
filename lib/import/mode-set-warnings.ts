/**
 * Warnings (never refusals) about the computed mode sets of a calculation import, one
 * per material × method of frequency rows:
 * - incomplete: Σ degeneracy is not 3 × the material's atoms in the cell;
 * - no acoustic mode marked (activity "acoustic");
 * - the atoms in the cell are not recorded, so completeness cannot be checked.
 * Each says what it means for pairing (the acoustic rule of lib/science/modes.ts):
 * in a partial list, or without the atom count, only unmarked modes below 10 cm⁻¹
 * (at most three) are taken as acoustic, so every optical line can pair; in a complete
 * list without marks the three lowest |ω| are taken as acoustic.
 */
import { DEFAULT_ACOUSTIC_THRESHOLD_CM1 } from '@/lib/science/modes';
import type { ValidRow } from './validate-row';

export interface ImportWarning {
  /** First row of the set in the file. */
  row: number;
  material: string;
  method: string;
  message: string;
}

/** Warnings are grouped per set; a file with more sets lists this many and counts the rest. */
export const MAX_REPORTED_WARNINGS = 50;

interface Tally {
  row: number;
  materialId: string;
  methodId: string;
  modes: number;
  acoustic: number;
}

/** Collects the mode sets of a calculation import row by row (the server and the browser feed it the same rows). */
export class ModeSetTally {
  private readonly sets = new Map<string, Tally>();

  add(row: number, valid: Pick<ValidRow, 'materialId' | 'methodId' | 'quantity' | 'degeneracy' | 'activity'>): void {
    if (valid.quantity !== 'frequency' || !valid.methodId) return;
    const key = `${valid.materialId}|${valid.methodId}`;
    let t = this.sets.get(key);
    if (!t) this.sets.set(key, (t = { row, materialId: valid.materialId, methodId: valid.methodId, modes: 0, acoustic: 0 }));
    t.modes += valid.degeneracy ?? 1;
    if (valid.activity === 'acoustic') t.acoustic += valid.degeneracy ?? 1;
  }

  /** The warnings, given each material's atoms in the cell (null or absent: not recorded) and the names to show. */
  warnings(facts: {
    atomsInCell: (materialId: string) => number | null | undefined;
    materialName: (materialId: string) => string;
    methodLabel: (methodId: string) => string;
  }): { warnings: ImportWarning[]; warningCount: number } {
    const out: ImportWarning[] = [];
    for (const set of this.sets.values()) {
      const t = { ...set, material: facts.materialName(set.materialId), method: facts.methodLabel(set.methodId) };
      const atomsInCell = facts.atomsInCell;
      const atoms = atomsInCell(t.materialId) ?? null;
      const expected = atoms === null ? null : 3 * atoms;
      const complete = expected !== null && t.modes === expected;
      const parts: string[] = [];
      if (expected === null) parts.push(`${t.material} has no atoms in the cell recorded, so the ${t.modes} mode${t.modes === 1 ? '' : 's'} cannot be checked for completeness`);
      else if (!complete) parts.push(`lists ${t.modes} of the 3N = ${expected} modes of ${t.material} (${atoms} atoms in the cell)${t.modes > expected ? ', more than a cell has' : ''}`);
      if (t.acoustic === 0) parts.push('marks no acoustic mode');
      if (parts.length === 0) continue;
      const meaning = complete
        ? 'Pairing will take the three lowest |ω| as the acoustic modes; mark them with activity "acoustic" if that is wrong.'
        : `Pairing will take as acoustic only unmarked modes below ${DEFAULT_ACOUSTIC_THRESHOLD_CM1} cm⁻¹ (at most three), so every optical line listed can pair; the mode-count quality check will flag the set${expected === null ? ' once the atoms in the cell are recorded' : ''}.`;
      out.push({ row: t.row, material: t.material, method: t.method, message: `${t.method} on ${t.material}: the set ${parts.join(' and ')}. ${meaning}` });
    }
    out.sort((a, b) => a.row - b.row);
    return { warnings: out.slice(0, MAX_REPORTED_WARNINGS), warningCount: out.length };
  }
}
