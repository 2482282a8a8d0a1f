/**
 * Chemical formula parsing.
 *
 * Grammar (whitespace between tokens is ignored):
 *   formula  := part (separator part)*          separator: · • ∙ ⋅ *  (hydrates, adducts)
 *   part     := number? group+                  a leading number multiplies the part ("5H2O")
 *   group    := Element count? | "(" group+ ")" count? | "[" group+ "]" count?
 *   count    := digits ("." digits)?             fractional occupancies allowed ("Ba0.5Sr0.5TiO3")
 * A "." is always a decimal point, never a hydrate separator: write "CuSO4·5H2O" or "CuSO4*5H2O".
 *
 * Formula units: a value "per formula unit" (an entropy in J mol⁻¹ K⁻¹) is per mole of
 * the reduced formula's unit, as thermochemical tables give it: "Ga2N2" and "GaN" both
 * mean per GaN (atomsPerReducedFormulaUnit 2), never per Ga2N2.
 * Element symbols are case-sensitive (Co is cobalt, CO is carbon + oxygen).
 */
import { isElementSymbol } from './elements';
import { ScienceInputError } from './errors';

/** A parsed formula: element counts per formula unit, their total, and the reduced formula. */
export interface ParsedFormula {
  counts: Record<string, number>;
  /** Atoms of the formula as written ("Ga2N2": 4). */
  atomsPerFormulaUnit: number;
  reduced: string;
  /** Atoms of the reduced formula ("Ga2N2" → GaN: 2): the unit of every per-formula-unit value. */
  atomsPerReducedFormulaUnit: number;
}

const HYDRATE_SEPARATORS = new Set(['·', '•', '∙', '⋅', '*']);

function cleanCount(value: number): number {
  // Sums of decimal occupancies (0.1 + 0.2) carry binary noise; 12 significant digits remove it.
  return Number(value.toPrecision(12));
}

class FormulaParser {
  private position = 0;

  constructor(private readonly text: string) {}

  parse(): Map<string, number> {
    const total = new Map<string, number>();
    this.skipSpace();
    if (this.atEnd()) this.fail('is empty');
    for (;;) {
      const multiplier = this.readNumber() ?? 1;
      const part = this.readGroups(null);
      if (part.size === 0) this.fail(`expected an element symbol or "(" at position ${this.position + 1}`);
      addInto(total, part, multiplier);
      this.skipSpace();
      if (this.atEnd()) break;
      const ch = this.text[this.position];
      if (!HYDRATE_SEPARATORS.has(ch)) this.fail(`unexpected "${ch}" at position ${this.position + 1}`);
      this.position++;
      this.skipSpace();
      if (this.atEnd()) this.fail(`ends after the separator at position ${this.position}`);
    }
    return total;
  }

  private readGroups(closing: ')' | ']' | null): Map<string, number> {
    const counts = new Map<string, number>();
    for (;;) {
      this.skipSpace();
      if (this.atEnd()) {
        if (closing) this.fail(`missing "${closing}" at the end (position ${this.position + 1})`);
        return counts;
      }
      const ch = this.text[this.position];
      if (ch === '(' || ch === '[') {
        const open = this.position;
        this.position++;
        const inner = this.readGroups(ch === '(' ? ')' : ']');
        if (inner.size === 0) this.fail(`empty group at position ${open + 1}`);
        const count = this.readNumber() ?? 1;
        addInto(counts, inner, count);
      } else if (ch === ')' || ch === ']') {
        if (ch !== closing) this.fail(`unmatched "${ch}" at position ${this.position + 1}`);
        this.position++;
        return counts;
      } else if (ch >= 'A' && ch <= 'Z') {
        const start = this.position;
        let symbol = ch;
        this.position++;
        const next = this.text[this.position];
        if (next !== undefined && next >= 'a' && next <= 'z') {
          symbol += next;
          this.position++;
        }
        if (!isElementSymbol(symbol)) this.fail(`unknown element symbol "${symbol}" at position ${start + 1}`);
        const count = this.readNumber() ?? 1;
        counts.set(symbol, (counts.get(symbol) ?? 0) + count);
      } else if (ch >= 'a' && ch <= 'z') {
        this.fail(`element symbols start with a capital letter; found "${ch}" at position ${this.position + 1}`);
      } else {
        return counts;
      }
    }
  }

  private readNumber(): number | undefined {
    this.skipSpace();
    const match = /^\d+(?:\.\d+)?|^\.\d+/.exec(this.text.slice(this.position));
    if (!match) return undefined;
    const start = this.position;
    this.position += match[0].length;
    const value = Number(match[0]);
    if (!(value > 0)) this.fail(`count "${match[0]}" at position ${start + 1} must be greater than 0`);
    return value;
  }

  private skipSpace(): void {
    while (!this.atEnd() && /\s/.test(this.text[this.position])) this.position++;
  }

  private atEnd(): boolean {
    return this.position >= this.text.length;
  }

  private fail(reason: string): never {
    throw new ScienceInputError('formula', `"${this.text}" ${reason}`);
  }
}

function addInto(target: Map<string, number>, source: Map<string, number>, multiplier: number): void {
  for (const [symbol, count] of source) target.set(symbol, (target.get(symbol) ?? 0) + count * multiplier);
}

function greatestCommonDivisor(a: number, b: number): number {
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}

function formatCount(count: number): string {
  return count === 1 ? '' : String(count);
}

/**
 * Parses a chemical formula into element counts per formula unit.
 * Handles nested parentheses/brackets, hydrates ("CuSO4·5H2O", "CuSO4*5H2O") and
 * fractional occupancies ("Ba0.5Sr0.5TiO3"). `reduced` keeps the order of first
 * appearance and divides integer counts by their greatest common divisor
 * ("Fe4O6" → "Fe2O3"); formulas with fractional counts are not reduced further.
 * Unknown element symbols and malformed strings throw a ScienceInputError with
 * the 1-based character position.
 */
export function parseFormula(formula: string): ParsedFormula {
  if (typeof formula !== 'string') throw new ScienceInputError('formula', 'must be a string');
  const parsed = new FormulaParser(formula.normalize('NFC')).parse();
  const counts: Record<string, number> = {};
  let atomsPerFormulaUnit = 0;
  for (const [symbol, count] of parsed) {
    counts[symbol] = cleanCount(count);
    atomsPerFormulaUnit += count;
  }
  const values = Object.values(counts);
  const allIntegers = values.every((v) => Number.isInteger(v));
  const divisor = allIntegers ? values.reduce((g, v) => greatestCommonDivisor(g, v), 0) : 1;
  const reduced = Object.entries(counts)
    .map(([symbol, count]) => symbol + formatCount(cleanCount(count / divisor)))
    .join('');
  return { counts, atomsPerFormulaUnit: cleanCount(atomsPerFormulaUnit), reduced, atomsPerReducedFormulaUnit: cleanCount(atomsPerFormulaUnit / divisor) };
}

/** Atoms per reduced formula unit ("Ga2N2" → 2), the unit of values per formula unit. */
export function atomsPerReducedFormulaUnit(formula: string): number {
  return parseFormula(formula).atomsPerReducedFormulaUnit;
}

/** Element counts of a formula, or undefined when it does not parse (for checks that are skipped then, not refused). */
export function elementCountsOrUndefined(formula: string): Record<string, number> | undefined {
  try {
    return parseFormula(formula).counts;
  } catch (error) {
    if (error instanceof ScienceInputError) return undefined;
    throw error;
  }
}

/**
 * Formula units Z in a cell of `atomsInCell` atoms, or null when the count contradicts
 * the formula: a cell holds a whole number Z ≥ 1 of (reduced) formula units (common
 * practice, e.g. wurtzite GaN: 4 atoms = 2 × GaN; rocksalt NaCl primitive: 2 = 1 × NaCl).
 * Formulas with fractional occupancies (a non-whole atom count per formula unit) count
 * sites, not atoms: any positive whole atomsInCell is accepted for them (Z undefined → NaN).
 */
export function formulaUnitsInCell(atomsInCell: number, atomsPerReducedFormulaUnit: number): number | null {
  if (!Number.isInteger(atomsInCell) || atomsInCell < 1) return null;
  if (!Number.isInteger(atomsPerReducedFormulaUnit)) return Number.NaN;
  const z = atomsInCell / atomsPerReducedFormulaUnit;
  return Number.isInteger(z) && z >= 1 ? z : null;
}
