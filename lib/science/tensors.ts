/**
 * Born effective charges and dielectric principal values as stored: a Born charge is a 3 × 3
 * tensor in units of e, written row-major as nine numbers (Z_xx, Z_xy, Z_xz, Z_yx, …, Z_zz); a
 * dielectric constant of a non-cubic crystal is three principal values. A scalar stands for the
 * isotropic tensor (Z·I) or three equal principal values.
 *
 * - diagonalMean: (Z_xx + Z_yy + Z_zz)/3, the orientational average, i.e. the scalar a
 *   benchmark compares. Invariant under rotations, since it is a third of the trace.
 * - frobeniusDistance: ‖A − B‖_F = √Σ_ij (A_ij − B_ij)², the full-tensor difference. It
 *   depends on the Cartesian frame: both tensors must be written in the same axes.
 * - chargeSum: Σ over the atoms of the cell, component by component. The acoustic sum rule
 *   (charge neutrality) requires Σ_κ Z*_κ,αβ = 0 for every α, β; a calculation without the
 *   sum rule imposed leaves a small residue, a missing atom or a wrong sign a large one.
 */
import { requireFinite, ScienceInputError } from './errors';

export const TENSOR_COMPONENTS = 9;
export const PRINCIPAL_COMPONENTS = 3;

function requireComponents(argument: string, components: readonly number[], counts: readonly number[]): void {
  if (!Array.isArray(components) || !counts.includes(components.length)) {
    throw new ScienceInputError(argument, `must hold ${counts.join(' or ')} numbers, got ${Array.isArray(components) ? components.length : typeof components}`);
  }
  components.forEach((c, i) => requireFinite(`${argument}[${i}]`, c));
}

/** The nine components of a Born charge given as nine numbers (returned as is) or as a scalar (Z·I). */
export function fullTensor(value: number | readonly number[]): number[] {
  if (typeof value === 'number') {
    requireFinite('tensor', value);
    return [value, 0, 0, 0, value, 0, 0, 0, value];
  }
  requireComponents('tensor', value, [TENSOR_COMPONENTS]);
  return [...value];
}

/** The mean of the diagonal of a 3 × 3 tensor (nine numbers) or of three principal values. */
export function diagonalMean(components: readonly number[]): number {
  requireComponents('components', components, [PRINCIPAL_COMPONENTS, TENSOR_COMPONENTS]);
  if (components.length === PRINCIPAL_COMPONENTS) return (components[0] + components[1] + components[2]) / 3;
  return (components[0] + components[4] + components[8]) / 3;
}

/** ‖A − B‖_F of two 3 × 3 tensors (nine numbers each, or scalars for isotropic ones). */
export function frobeniusDistance(a: number | readonly number[], b: number | readonly number[]): number {
  const ta = fullTensor(a);
  const tb = fullTensor(b);
  let sum = 0;
  for (let i = 0; i < TENSOR_COMPONENTS; i++) sum += (ta[i] - tb[i]) ** 2;
  return Math.sqrt(sum);
}

/** Σ_atoms Z*, component by component (nine numbers), of tensors or isotropic scalars. */
export function chargeSum(charges: ReadonlyArray<number | readonly number[]>): number[] {
  if (charges.length === 0) throw new ScienceInputError('charges', 'needs at least one atom');
  const total = new Array<number>(TENSOR_COMPONENTS).fill(0);
  charges.forEach((z, atom) => {
    let t: number[];
    try {
      t = fullTensor(z);
    } catch (error) {
      if (error instanceof ScienceInputError) throw new ScienceInputError(`charges[${atom}]`, error.message);
      throw error;
    }
    for (let i = 0; i < TENSOR_COMPONENTS; i++) total[i] += t[i];
  });
  return total;
}

/** The component of largest magnitude of a charge sum, with its place ("xx", "yz", …). */
export function largestComponent(sum: readonly number[]): { value: number; component: string } {
  requireComponents('sum', sum, [TENSOR_COMPONENTS]);
  const axes = ['x', 'y', 'z'];
  let at = 0;
  for (let i = 1; i < TENSOR_COMPONENTS; i++) if (Math.abs(sum[i]) > Math.abs(sum[at])) at = i;
  return { value: sum[at], component: `${axes[Math.floor(at / 3)]}${axes[at % 3]}` };
}

/** The element of a site ("Ga1" → "Ga"). */
export const siteElement = (site: string): string => /^[A-Z][a-z]?/.exec(site)?.[0] ?? site;
/** Whether a site is an element symbol alone ("Ga"), standing for every atom of that element. */
export const isBareSite = (site: string): boolean => /^[A-Z][a-z]?$/.test(site);

/** The residue of a set of Born charges, and how it was summed; null when the set cannot be checked. */
export interface SiteNeutrality {
  residue: { value: number; component: string } | null;
  /** 'cell': one site per atom, tensors summed; 'formula-unit': one bare element site per element, diagonal means weighted by the reduced formula. */
  basis: 'cell' | 'formula-unit' | null;
}

/**
 * Charge neutrality of one material's Born charges by site ("Ga1", "N"): with one site per atom
 * of the cell, Σ Z* component by component; with one bare element site per element of the
 * formula (each standing for every atom of its element), Σ_el n_el · mean diag(Z_el) per
 * formula unit, which is zero exactly when the cell is neutral on the diagonal mean. Otherwise
 * the set cannot be checked.
 */
export function siteNeutrality(
  sites: ReadonlyArray<{ site: string; charge: number | readonly number[] }>,
  atomsInCell: number | null | undefined,
  elements: Readonly<Record<string, number>> | undefined,
): SiteNeutrality {
  if (sites.length === 0) return { residue: null, basis: null };
  if (atomsInCell && sites.length === atomsInCell) return { residue: largestComponent(chargeSum(sites.map((s) => s.charge))), basis: 'cell' };
  const bare = sites.every((s) => isBareSite(s.site));
  if (bare && elements && Object.keys(elements).length === sites.length && sites.every((s) => s.site in elements)) {
    const value = sites.reduce((sum, s) => sum + elements[s.site] * (typeof s.charge === 'number' ? s.charge : diagonalMean(s.charge)), 0);
    return { residue: { value, component: 'diagonal mean' }, basis: 'formula-unit' };
  }
  return { residue: null, basis: null };
}
