import { excerpt } from './errors';

const DECIMAL = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** Parses a decimal number written in a cell; null when the text is not one. */
export function parseDecimal(text: string): number | null {
  if (!DECIMAL.test(text)) return null;
  const n = Number(text);
  return Number.isFinite(n) ? n : null;
}

/** Why a cell is not a number, in words a person can act on. */
export function notANumberReason(text: string): string {
  if (text.length <= 40 && /^[+-]?\d+,\d+$/.test(text)) return `"${text}" uses a decimal comma; write numbers with a decimal point (e.g. ${text.replace(',', '.')}).`;
  return `"${excerpt(text)}" is not a number.`;
}
