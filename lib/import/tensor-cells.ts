/**
 * The tensor and site cells of an import row. A Born charge's tensor is nine numbers
 * row-major; a dielectric constant's is its three principal values. Numbers are separated
 * by spaces, semicolons or commas, and may be wrapped in brackets ("[[2.6, 0, 0], …]").
 */
import { diagonalMean, isElementSymbol, PRINCIPAL_COMPONENTS, TENSOR_COMPONENTS } from '@/lib/science';
import { excerpt } from './errors';
import { parseDecimal } from './numbers';
import type { ImportQuantity } from './columns';

/** The largest |component| a Born charge may have (anomalous charges reach about 7–8 e). */
const MAX_BORN_COMPONENT = 20;

/** Decimals written after the point of a number's text ("2.60" → 2, "3.1e-5" → 1). */
const decimalsOf = (text: string) => /\.(\d+)/.exec(text.replace(/[eE].*$/, ''))?.[1].length ?? 0;

/** The number texts of a tensor cell. */
const partsOf = (text: string) =>
  text
    .replace(/[[\]()]/g, ' ')
    .split(/[\s;,]+/)
    .filter((p) => p !== '');

export function parseTensorCell(quantity: ImportQuantity, text: string): { components: number[] } | { reason: string } {
  const expected = quantity === 'born-charge' ? TENSOR_COMPONENTS : quantity === 'eps-inf' || quantity === 'eps-static' ? PRINCIPAL_COMPONENTS : null;
  if (expected === null) return { reason: `Only Born charges (9 components) and dielectric constants (3 principal values) carry a tensor; leave it empty for a ${quantity} row.` };
  const parts = partsOf(text);
  const what = expected === TENSOR_COMPONENTS ? 'A Born-charge tensor needs 9 numbers (3 × 3, row-major: xx xy xz yx yy yz zx zy zz)' : 'A dielectric tensor is given by its 3 principal values';
  if (parts.length !== expected) return { reason: `${what}; got ${parts.length}.` };
  const components: number[] = [];
  for (let i = 0; i < parts.length; i++) {
    const n = parseDecimal(parts[i]);
    if (n === null) return { reason: `Component ${i + 1} "${excerpt(parts[i])}" is not a finite number.` };
    components.push(n);
  }
  if (expected === PRINCIPAL_COMPONENTS) {
    const below = components.findIndex((c) => c < 1);
    if (below >= 0) return { reason: `Principal value ${below + 1} is ${parts[below]}; a dielectric constant is ≥ 1 (write ε, not χ = ε − 1).` };
  } else {
    const big = components.findIndex((c) => Math.abs(c) > MAX_BORN_COMPONENT);
    if (big >= 0) return { reason: `Component ${big + 1} is ${parts[big]} e, beyond ±${MAX_BORN_COMPONENT} e; Born charges are of a few e. Is it in another unit?` };
  }
  return { components };
}

/**
 * The value of a row given only by its tensor: the mean of the diagonal, exact, written with two
 * decimals more than the tensor's cells (2.60, 2.60, 2.74 → "2.6467").
 */
export function valueOfTensor(components: readonly number[], tensorText: string): { value: number; text: string } {
  const value = diagonalMean(components);
  const decimals = Math.max(0, ...partsOf(tensorText).map(decimalsOf));
  return { value, text: String(Number(value.toFixed(Math.min(12, decimals + 2)))) };
}

/**
 * Why a written value disagrees with the mean of its tensor's diagonal, or null: the two may
 * differ by half a unit of the value's last written decimal (2.65 for a mean of 2.6467).
 */
export function tensorMeanMismatch(value: number, valueText: string, components: readonly number[]): string | null {
  const mean = diagonalMean(components);
  const decimals = decimalsOf(valueText);
  const slack = 0.5 * 10 ** -decimals + 1e-9 * Math.max(1, Math.abs(mean));
  if (Math.abs(value - mean) <= slack) return null;
  return `The value ${excerpt(valueText)} is not the mean of the tensor's diagonal (${Number(mean.toPrecision(6))}); correct one of them, or leave the value empty.`;
}

/** A site: an element symbol with an optional whole number ("Ga", "O2"), the element one of the material's when those are known. */
export function parseSite(text: string, elements?: Readonly<Record<string, number>>): { site: string } | { reason: string } {
  const match = /^([A-Z][a-z]?)(\d{0,3})$/.exec(text.trim());
  if (!match || !isElementSymbol(match[1])) return { reason: `"${excerpt(text)}" is not a site: write the atom's element symbol with an optional number, e.g. "Ga", "O2".` };
  if (elements && !(match[1] in elements)) return { reason: `${match[1]} is not an element of this material (${Object.keys(elements).join(', ')}).` };
  return { site: `${match[1]}${match[2]}` };
}
