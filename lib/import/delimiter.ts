export const DELIMITERS = [',', ';', '\t'] as const;
export type Delimiter = (typeof DELIMITERS)[number];

/** Where the header line starts: after any blank lines at the top of the file. */
function headerStart(text: string): number {
  const match = /^(?:[ \t]*\r?\n|[ \t]*\r)*/.exec(text);
  return match ? match[0].length : 0;
}

/** Whether the text holds the whole header line (a line break after it, outside quotes). */
export function hasHeaderLine(text: string): boolean {
  let quoted = false;
  for (let i = headerStart(text); i < text.length; i++) {
    const c = text[i];
    if (c === '"') quoted = !quoted;
    else if (!quoted && (c === '\n' || c === '\r')) return true;
  }
  return false;
}

/**
 * Picks the delimiter from the header line (the first non-blank line): the
 * candidate that occurs most often outside quotes. Comma wins ties and
 * single-column files.
 */
export function detectDelimiter(text: string): Delimiter {
  const counts = new Map<string, number>(DELIMITERS.map((d) => [d, 0]));
  let quoted = false;
  for (let i = headerStart(text); i < text.length; i++) {
    const c = text[i];
    if (c === '"') quoted = !quoted;
    else if (!quoted && (c === '\n' || c === '\r')) break;
    else if (!quoted && counts.has(c)) counts.set(c, counts.get(c)! + 1);
  }
  let best: Delimiter = ',';
  for (const d of DELIMITERS) if (counts.get(d)! > counts.get(best)!) best = d;
  return best;
}

export function delimiterName(d: Delimiter): string {
  return d === ',' ? 'comma' : d === ';' ? 'semicolon' : 'tab';
}
