/**
 * Charge neutrality of the Born charges an import carries, per material × method (calculations)
 * or material × source (measurements): Σ_atoms Z* = 0 in every Cartesian component.
 *
 * - Numbered or bare sites, one per atom of the cell (as many sites as the material's atoms
 *   in the cell): the tensors (or Z·I for a scalar) are summed component by component.
 * - Bare element sites only ("Ga", "N"), each standing for every atom of its element: the
 *   diagonal means are summed with the reduced formula's counts (neutral per formula unit
 *   is neutral per cell); off-diagonal parts are not checked then.
 * - Anything else (some atoms missing, counts unknown): not checked, with a warning that says so.
 *
 * A residue above FAR_FROM_NEUTRAL_E refuses the import (a site is missing, a sign is wrong or a
 * row belongs to another material: the data would mislead); one above the neutrality limit
 * (0.1 e, DEFAULT_QUALITY_THRESHOLDS.bornNeutrality) but below that is a warning: the acoustic sum
 * rule was not imposed, and the charges may still be useful. The same row twice with other
 * components is refused.
 */
import { DEFAULT_QUALITY_THRESHOLDS, siteNeutrality } from '@/lib/science';
import type { RowError } from './errors';
import type { ImportWarning } from './mode-set-warnings';
import type { ValidRow } from './validate-row';

/** A residue of at least this (e, in one component) refuses the import. */
export const FAR_FROM_NEUTRAL_E = 1;

/** How far a residue is from neutral: 'far' refuses an import, 'residue' warns (module header). */
export function neutralityVerdict(residueE: number, limitE: number = DEFAULT_QUALITY_THRESHOLDS.bornNeutrality): 'neutral' | 'residue' | 'far' {
  const size = Math.abs(residueE);
  return size >= FAR_FROM_NEUTRAL_E ? 'far' : size > limitE ? 'residue' : 'neutral';
}

interface SetTally {
  row: number;
  materialId: string;
  /** Method id (calculations) or source id (measurements). */
  by: string;
  sites: Map<string, { row: number; charge: number | number[] }>;
  conflicts: RowError[];
}

export interface NeutralityFacts {
  atomsInCell: (materialId: string) => number | null | undefined;
  elements: (materialId: string) => Readonly<Record<string, number>> | undefined;
  materialName: (materialId: string) => string;
  /** The method label (calculations) or the source's cite key (measurements). */
  byName: (id: string) => string;
}

const fmt = (n: number) => String(Number(n.toFixed(3)));

export class BornChargeTally {
  private readonly sets = new Map<string, SetTally>();

  constructor(
    private readonly columnName: (key: string) => string = (key) => key,
    private readonly limitE: number = DEFAULT_QUALITY_THRESHOLDS.bornNeutrality,
  ) {}

  add(row: number, valid: Pick<ValidRow, 'materialId' | 'methodId' | 'sourceId' | 'quantity' | 'site' | 'components' | 'value'>): void {
    if (valid.quantity !== 'born-charge' || valid.site === null) return;
    const by = valid.methodId ?? valid.sourceId;
    const key = `${valid.materialId}|${by}`;
    let set = this.sets.get(key);
    if (!set) this.sets.set(key, (set = { row, materialId: valid.materialId, by, sites: new Map(), conflicts: [] }));
    const charge = valid.components ?? valid.value;
    const earlier = set.sites.get(valid.site);
    if (!earlier) set.sites.set(valid.site, { row, charge });
    else if (JSON.stringify(earlier.charge) !== JSON.stringify(charge))
      set.conflicts.push({ row, column: this.columnName('site'), reason: `Site ${valid.site} already has a Born charge in row ${earlier.row} with other values; give each atom once.`, value: valid.site });
  }

  /** Refusals (residues far from zero, conflicting rows) and warnings (small residues, sets that cannot be checked). */
  problems(facts: NeutralityFacts): { errors: RowError[]; warnings: ImportWarning[] } {
    const errors: RowError[] = [];
    const warnings: ImportWarning[] = [];
    for (const set of this.sets.values()) {
      errors.push(...set.conflicts);
      const material = facts.materialName(set.materialId);
      const by = facts.byName(set.by);
      const sites = [...set.sites.entries()];
      const atoms = facts.atomsInCell(set.materialId) ?? null;
      const { residue, basis } = siteNeutrality(
        sites.map(([site, s]) => ({ site, charge: s.charge })),
        atoms,
        facts.elements(set.materialId),
      );
      const how = basis === 'cell' ? `over the ${atoms} atoms of the cell` : 'per formula unit, each element site standing for every atom of its element';
      const at = { row: set.row, material, method: by };
      if (!residue) {
        const given = atoms === null ? `${sites.length} site${sites.length === 1 ? '' : 's'} given and no atoms in the cell recorded` : `${sites.length} of the ${atoms} atoms of the cell given`;
        warnings.push({ ...at, message: `${by} on ${material}: charge neutrality of the Born charges not checked (${given}). Give every atom, or one site per element, to have it checked.` });
        continue;
      }
      const where = basis === 'formula-unit' ? 'in the diagonal mean' : `in the ${residue.component} component`;
      const verdict = neutralityVerdict(residue.value, this.limitE);
      if (verdict === 'far') {
        errors.push({
          row: set.row,
          column: this.columnName('tensor'),
          reason: `The Born charges of ${material} (${by}) sum to ${fmt(residue.value)} e ${where} ${how}; neutrality needs 0. A site is missing, a sign is wrong or a row belongs to another material.`,
        });
      } else if (verdict === 'residue') {
        warnings.push({
          ...at,
          message: `${by} on ${material}: the Born charges sum to ${fmt(residue.value)} e ${where} ${how}, beyond ±${this.limitE} e; the acoustic sum rule was probably not imposed. Imported all the same (the charges may still be useful); the benchmarks' neutrality check flags the set.`,
        });
      }
    }
    errors.sort((a, b) => a.row - b.row);
    warnings.sort((a, b) => a.row - b.row);
    return { errors, warnings };
  }
}

/** The facts a tally needs, from an import's references (methods by label, sources by cite key). */
export function neutralityFacts(refs: {
  materials: ReadonlyMap<string, { id: string; atomsInCell?: number | null; elements?: Readonly<Record<string, number>> }>;
  methods: ReadonlyMap<string, string>;
  sources: ReadonlyMap<string, string>;
}): NeutralityFacts {
  const materials = new Map<string, { name: string; atomsInCell: number | null; elements?: Readonly<Record<string, number>> }>();
  for (const [name, m] of refs.materials) materials.set(m.id, { name, atomsInCell: m.atomsInCell ?? null, elements: m.elements });
  const names = new Map<string, string>();
  for (const [label, id] of refs.methods) names.set(id, label);
  for (const [key, id] of refs.sources) names.set(id, key);
  return {
    atomsInCell: (id) => materials.get(id)?.atomsInCell,
    elements: (id) => materials.get(id)?.elements,
    materialName: (id) => materials.get(id)?.name ?? id,
    byName: (id) => names.get(id) ?? id,
  };
}
