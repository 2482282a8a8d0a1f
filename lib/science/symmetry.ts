/**
 * Crystal systems and irreducible-representation (Mulliken) labels.
 *
 * Canonical irrep form produced by normalizeIrrep:
 *   Letter  A, B, E, T, G, H — upper case; F is written T (T ≡ F, Mulliken's recommendation).
 *   Index   digits after the letter ("A1", "E2"); Unicode subscript digits become ASCII.
 *   Parity  "g" or "u", lower case, after the index ("A1g", "T1u"); subscript/modifier ᵍ ᵤ accepted.
 *   Primes  ASCII apostrophes after parity: ′ or ' → "'", ″ or '' → "''" ("A1'", "A''").
 *   Qualifier in parentheses at the end: "(high)", "(low)" (from high/hi/h, low/l, as in
 *           E2(high) of wurtzite), or "(TO)", "(LO)". Written "E2 high", "E_2^high", "E2^H",
 *           "E2(high)" they all become "E2(high)".
 *   Ordinal a superscript number that tells apart two modes of one species in layered
 *           crystals (E¹₂g and E²₂g of MoS2 or graphite), written as a superscript digit,
 *           "^1" or "^{1}", before or after the index: E¹₂g, E^1_{2g}, E_{2g}^1 → "E2g^1".
 *           It stays in the label, so E¹₂g and E²₂g are distinct labels; it is not part
 *           of the species, so both match a computed E2g.
 * Whitespace, "_", "^", "{", "}" are dropped and the label is NFKC-normalised first.
 * A label that does not fit this pattern (e.g. Koster "Γ5+") is returned NFKC-normalised
 * with whitespace removed, so normalisation is still idempotent and deterministic.
 */
import { ScienceInputError } from './errors';

/** The seven crystal systems. */
export type CrystalSystem = 'triclinic' | 'monoclinic' | 'orthorhombic' | 'tetragonal' | 'trigonal' | 'hexagonal' | 'cubic';

/** Crystal system of a space group (International Tables numbering 1–230). */
export function crystalSystem(spaceGroupNumber: number): CrystalSystem {
  if (!Number.isInteger(spaceGroupNumber) || spaceGroupNumber < 1 || spaceGroupNumber > 230) {
    throw new ScienceInputError('spaceGroupNumber', `must be an integer from 1 to 230, got ${String(spaceGroupNumber)}`);
  }
  if (spaceGroupNumber <= 2) return 'triclinic';
  if (spaceGroupNumber <= 15) return 'monoclinic';
  if (spaceGroupNumber <= 74) return 'orthorhombic';
  if (spaceGroupNumber <= 142) return 'tetragonal';
  if (spaceGroupNumber <= 167) return 'trigonal';
  if (spaceGroupNumber <= 194) return 'hexagonal';
  return 'cubic';
}

// "lo" is the LO branch; the low-frequency partner is written low or l ("E2low", "E2^L").
const MULLIKEN = /^([abeftgh])(\d*)([gu]?)('*)(?:\((high|hi|h|low|l|to|lo)\)|(high|hi|h|low|l|to|lo))?$/i;

const QUALIFIERS: Record<string, string> = {
  high: 'high', hi: 'high', h: 'high',
  low: 'low', l: 'low',
  to: 'TO', lo: 'LO',
};

function qualifierOf(raw: string | undefined): string {
  if (!raw) return '';
  return `(${QUALIFIERS[raw.toLowerCase()]})`;
}

// Mode lists repeat a handful of labels thousands of times; normalisation is pure, so cache it.
const CACHE_LIMIT = 4096;
const normalizedCache = new Map<string, string>();

/**
 * Normalises an irreducible-representation label to one canonical form (see the
 * module header): "f2g", "F_{2g}", "T₂g" → "T2g"; "E2 high" → "E2(high)"; "A″" → "A''".
 */
export function normalizeIrrep(label: string): string {
  const cached = normalizedCache.get(label);
  if (cached !== undefined) return cached;
  const normalized = normalizeUncached(label);
  if (normalizedCache.size >= CACHE_LIMIT) normalizedCache.clear();
  normalizedCache.set(label, normalized);
  return normalized;
}

const SUPERSCRIPT_DIGITS: Record<string, string> = {
  '⁰': '0', '¹': '1', '²': '2', '³': '3', '⁴': '4', '⁵': '5', '⁶': '6', '⁷': '7', '⁸': '8', '⁹': '9',
};
// An ordinal: a run of superscript digits, or "^" with digits (braces optional).
const ORDINAL = /[⁰¹²³⁴⁵⁶⁷⁸⁹]+|\^\{?(\d+)\}?/g;

function clean(text: string): string {
  return text
    .normalize('NFKC')
    .replace(/[\u2032\u2019\u02B9\u00B4`]/g, "'")
    .replace(/[\s_^{}]/g, '');
}

function mullikenForm(cleaned: string, ordinal: string): string | null {
  const match = MULLIKEN.exec(cleaned);
  if (!match) return null;
  const [, letter, index, parity, primes, inParentheses, bare] = match;
  const mulliken = letter.toUpperCase() === 'F' ? 'T' : letter.toUpperCase();
  const qualifier = qualifierOf(inParentheses ?? bare);
  return `${mulliken}${index}${parity.toLowerCase()}${primes}${ordinal ? `^${ordinal}` : ''}${qualifier}`;
}

function normalizeUncached(label: string): string {
  if (typeof label !== 'string' || label.trim() === '') {
    throw new ScienceInputError('label', 'must be a non-empty irreducible-representation label');
  }
  const cleaned = clean(label);
  if (cleaned === '') throw new ScienceInputError('label', `"${label}" has no symbol once spacing and markup are removed`);
  const ordinals = [...label.matchAll(ORDINAL)];
  if (ordinals.length === 1) {
    const found = ordinals[0];
    const ordinal = found[1] ?? [...found[0]].map((c) => SUPERSCRIPT_DIGITS[c]).join('');
    const withOrdinal = mullikenForm(clean(label.replace(ORDINAL, '')), String(Number(ordinal)));
    if (withOrdinal) return withOrdinal;
  }
  return mullikenForm(cleaned, '') ?? cleaned;
}

const speciesCache = new Map<string, { species: string; branch?: 'TO' | 'LO' }>();

function speciesAndBranch(label: string): { species: string; branch?: 'TO' | 'LO' } {
  let entry = speciesCache.get(label);
  if (entry === undefined) {
    const canonical = normalizeIrrep(label);
    const branch = /\((TO|LO)\)$/.exec(canonical)?.[1] as 'TO' | 'LO' | undefined;
    entry = { species: canonical.replace(/\((high|low|TO|LO)\)$/, '').replace(/\^\d+$/, ''), branch };
    if (speciesCache.size >= CACHE_LIMIT) speciesCache.clear();
    speciesCache.set(label, entry);
  }
  return entry;
}

/**
 * The symmetry species of a label: its canonical form without the high/low or
 * TO/LO qualifier ("E2(high)" → "E2", "A1(TO)" → "A1"). Pairing compares species.
 */
export function irrepSpecies(label: string): string {
  return speciesAndBranch(label).species;
}

/** The TO/LO branch written into a label ("A1(TO)" → "TO"), if any. */
export function irrepBranch(label: string): 'TO' | 'LO' | undefined {
  return speciesAndBranch(label).branch;
}
