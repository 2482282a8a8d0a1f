/**
 * A small invented k-point convergence family as one calculations CSV (one method label per row,
 * the methods created from the row's method_* columns), and an independent reading of it: the
 * recommended k-points per reciprocal atom per class, computed here from the CSV text alone with
 * none of the app's code. Every value is invented for the tests.
 */
export const FAMILY_GRIDS = [4, 6, 8, 10] as const;
export const REFERENCE_GRID = 16;

/** Materials: name, atoms in the cell, class tag, optical modes of the reference (cm⁻¹, degeneracy), deviation per grid. */
const MATERIALS = [
  { name: 'Aa-fam', atoms: 2, tag: 'famclass-a', optical: [[400.0, 3]], dev: { 4: 6.0, 6: 2.5, 8: 0.6, 10: 0.2 } },
  { name: 'Ab-fam', atoms: 2, tag: 'famclass-a', optical: [[310.0, 3]], dev: { 4: 3.0, 6: 0.8, 8: 0.3, 10: 0.1 } },
  { name: 'Ac-fam', atoms: 2, tag: 'famclass-a', optical: [[250.0, 3]], dev: { 4: 0.9, 6: 1.4, 8: 0.7, 10: 0.4 } },
  { name: 'Ba-fam', atoms: 2, tag: 'famclass-b', optical: [[500.0, 2], [520.0, 1]], dev: { 4: 9.0, 6: 4.0, 8: 1.8, 10: 0.5 } },
  { name: 'Bb-fam', atoms: 2, tag: 'famclass-b', optical: [[450.0, 3]], dev: { 4: 5.0, 6: 3.0, 8: 2.0, 10: 1.6 } },
] as const;

export const familyLabel = (k: number) => `Fam-PBEsol-k${k}`;
export const referenceLabel = `Fam-PBEsol-k${REFERENCE_GRID}-ref`;
export const TOLERANCE = 1;

/** The CSV: for each method and material, 3 acoustic rows and the optical rows, with mode indices. */
export function familyCsv(source = 'inhouse-2026'): string {
  const lines = [
    'material,method,quantity,value,unit,mode_index,degeneracy,activity,source,material_formula,material_atoms_in_cell,material_tags,method_functional,method_k_grid',
  ];
  for (const k of [...FAMILY_GRIDS, REFERENCE_GRID]) {
    const label = k === REFERENCE_GRID ? referenceLabel : familyLabel(k);
    for (const m of MATERIALS) {
      const d = k === REFERENCE_GRID ? 0 : m.dev[k as keyof typeof m.dev];
      const rows: Array<[number, number, string]> = [[0, 1, 'acoustic'], [0, 1, 'acoustic'], [0, 1, 'acoustic']];
      // the first optical mode carries the whole deviation, the others half of it, alternating in sign
      m.optical.forEach(([w, g], i) => rows.push([w + (i === 0 ? d : -d / 2), g, 'raman']));
      rows.forEach(([w, g, activity], i) =>
        lines.push([m.name, label, 'frequency', w.toFixed(2), 'cm-1', i + 1, g, activity, source, 'GaAs', m.atoms, m.tag, 'PBEsol', `${k}x${k}x${k}`].join(',')),
      );
    }
  }
  return lines.join('\n');
}

/**
 * Independent of the app: per material, the largest |Δ| per grid from the CSV, the least dense grid from which every
 * denser grid stays within the tolerance, and per class the ⌈0.95·N⌉-th of those in k-points per reciprocal atom.
 */
export function independentRecommendation(csv: string, tag: string, share = 0.95): number | null {
  const [head, ...rows] = csv.split('\n').map((l) => l.split(','));
  const at = (name: string) => head.indexOf(name);
  const value = new Map<string, number>();
  const meta = new Map<string, { atoms: number; tag: string }>();
  for (const r of rows) {
    value.set(`${r[at('material')]}|${r[at('method')]}|${r[at('mode_index')]}`, Number(r[at('value')]));
    meta.set(r[at('material')], { atoms: Number(r[at('material_atoms_in_cell')]), tag: r[at('material_tags')] });
  }
  const points: Array<number | null> = [];
  for (const [name, m] of meta) {
    if (m.tag !== tag) continue;
    const worst = (k: number) => {
      let max = 0;
      for (let i = 4; value.has(`${name}|${referenceLabel}|${i}`); i++) max = Math.max(max, Math.abs(value.get(`${name}|${familyLabel(k)}|${i}`)! - value.get(`${name}|${referenceLabel}|${i}`)!));
      return max;
    };
    let point: number | null = null;
    for (const k of [...FAMILY_GRIDS].reverse()) {
      if (worst(k) > TOLERANCE + 1e-9) break;
      point = k * k * k * m.atoms;
    }
    points.push(point);
  }
  const needed = Math.ceil(share * points.length - 1e-9);
  const converged = points.filter((p): p is number => p !== null).sort((a, b) => a - b);
  return converged.length >= needed ? converged[needed - 1] : null;
}
