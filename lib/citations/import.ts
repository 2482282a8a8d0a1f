/**
 * Reference files into sources: BibTeX (as a reference manager or a DOI resolver
 * writes it), RIS and CSL-JSON, parsed here, never fetched. A syntax error is
 * reported with its line; an entry without a title, with a cite key used twice,
 * or with a field that does not check is refused by itself, named by its
 * position, cite key and line.
 */
import { plugins, type CSL } from '@citation-js/core';
import '@citation-js/plugin-bibtex';
import '@citation-js/plugin-ris';
import { z } from 'zod';
import { normaliseSourceRow, type SourceInput } from '@/lib/catalog/source-schema';
import { cslToSourceRow, nameToCsl } from './csl';
import { parsePersonName } from './names';

export const IMPORT_FORMATS = ['bibtex', 'ris', 'csl-json'] as const;
export type ImportFormat = (typeof IMPORT_FORMATS)[number];
export const IMPORT_FORMAT_LABELS: Record<ImportFormat, string> = { bibtex: 'BibTeX', ris: 'RIS', 'csl-json': 'CSL-JSON' };

export interface ReferenceEntryError {
  /** 1-based position of the entry in the file; 0 for a problem of the file as a whole. */
  entry: number;
  citeKey: string | null;
  line: number | null;
  message: string;
  /** A syntax error: the file cannot be read as a whole. */
  syntax: boolean;
}

export interface ReferenceParseResult {
  format: ImportFormat;
  sources: SourceInput[];
  /** The first line of each source's entry, in the order of `sources`. */
  lines: Array<number | null>;
  errors: ReferenceEntryError[];
}

// citation-js's typings demand every option; it fills the rest with its defaults.
const chainOptions = (forceType: string) => ({ generateGraph: false, forceType }) as unknown as Parameters<typeof plugins.input.chain>[1];

interface Chunk {
  entry: number;
  line: number;
  citeKey: string | null;
  parse: () => CSL[];
}

/** Guesses the format from the text: JSON starts with [ or {, RIS with a "TY  - " line, BibTeX with @. */
export function detectFormat(text: string): ImportFormat | null {
  const t = text.replace(/^\uFEFF/, '').trimStart();
  if (t.startsWith('[') || t.startsWith('{')) return 'csl-json';
  if (/^TY {2}- /m.test(t)) return 'ris';
  if (/^\s*@\s*[A-Za-z]+\s*[{(]/m.test(t)) return 'bibtex';
  return null;
}

function lines(text: string): string[] {
  return text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
}

function firstLine(message: string): string {
  return message.split('\n')[0].replace(/\s+at line \d+ col \d+:?$/, '');
}

/** Splits a .bib file at each line that starts an "@type{", so a syntax error is reported against the entry that has it. */
function bibtexChunks(text: string, errors: ReferenceEntryError[]): Chunk[] {
  const all = lines(text);
  const raw: Array<{ line: number; body: string }> = [];
  let current: { line: number; lines: string[] } | null = null;
  all.forEach((l, i) => {
    if (/^\s*@/.test(l)) {
      if (current) raw.push({ line: current.line, body: current.lines.join('\n') });
      current = { line: i + 1, lines: [l] };
    } else if (current) current.lines.push(l);
  });
  if (current) raw.push({ line: (current as { line: number }).line, body: (current as { lines: string[] }).lines.join('\n') });
  let macros = '';
  const chunks: Chunk[] = [];
  for (const r of raw) {
    const head = /^\s*@\s*([A-Za-z]+)\s*[{(]\s*([^,\s{}()]*)/.exec(r.body);
    const type = head?.[1].toLowerCase() ?? '';
    if (type === 'string') {
      macros += `${r.body}\n`;
      continue;
    }
    if (type === 'comment' || type === 'preamble') continue;
    const entry = chunks.length + 1;
    const prefix = macros;
    chunks.push({
      entry,
      line: r.line,
      citeKey: head?.[2] || null,
      parse: () => {
        try {
          return plugins.input.chain(prefix + r.body, chainOptions('@bibtex/text'));
        } catch (e) {
          throw new SyntaxError(`not valid BibTeX: ${firstLine(e instanceof Error ? e.message : String(e))}`);
        }
      },
    });
  }
  if (chunks.length === 0 && text.trim()) errors.push({ entry: 0, citeKey: null, line: 1, message: 'No BibTeX entries (@type{key, field = {…}, …}) in the text.', syntax: true });
  return chunks;
}

const RIS_LINE = /^([A-Z][A-Z0-9]) {2}-(?: (.*))?$/;

/** RIS: every line is "XX  - value" (or blank); a record runs from TY to ER. */
function risChunks(text: string, errors: ReferenceEntryError[]): Chunk[] {
  const chunks: Chunk[] = [];
  let current: { line: number; lines: string[]; key: string | null; authors: string[] } | null = null;
  lines(text).forEach((l, i) => {
    const n = i + 1;
    if (l.trim() === '') return;
    const m = RIS_LINE.exec(l.trimEnd());
    if (!m) {
      errors.push({ entry: chunks.length + (current ? 1 : 0), citeKey: current?.key ?? null, line: n, message: `not a RIS line (expected "XX  - value"): "${l.slice(0, 60)}"`, syntax: true });
      return;
    }
    const [, tag, value = ''] = m;
    if (tag === 'TY') {
      if (current) errors.push({ entry: chunks.length + 1, citeKey: current.key, line: current.line, message: 'this record has no ER line before the next TY.', syntax: true });
      current = { line: n, lines: [l], key: null, authors: [] };
      return;
    }
    if (!current) {
      errors.push({ entry: chunks.length + 1, citeKey: null, line: n, message: `a ${tag} line outside a record (a record starts with "TY  - ").`, syntax: true });
      return;
    }
    current.lines.push(l);
    if (tag === 'ID') current.key = value.trim() || null;
    if (tag === 'AU' || tag === 'A1') current.authors.push(value.trim());
    if (tag === 'ER') {
      const body = current.lines.join('\n');
      const authors = current.authors.filter(Boolean);
      chunks.push({
        entry: chunks.length + 1,
        line: current.line,
        citeKey: current.key,
        // Authors are split by our own parser: RIS files write "Azuhata, T." as often as "Azuhata T.".
        parse: () => plugins.input.chain(`${body}\n`, chainOptions('@ris/file')).map((csl: CSL) => ({ ...csl, author: authors.length ? authors.map((a) => nameToCsl(parsePersonName(a))) : csl.author })),
      });
      current = null;
    }
  });
  if (current) errors.push({ entry: chunks.length + 1, citeKey: (current as { key: string | null }).key, line: (current as { line: number }).line, message: 'this record has no closing "ER  - " line.', syntax: true });
  if (chunks.length === 0 && errors.length === 0) errors.push({ entry: 0, citeKey: null, line: 1, message: 'No RIS records (TY  - … ER  - ) in the text.', syntax: true });
  return chunks;
}

const cslItem = z.looseObject({ type: z.string('an item needs a "type"'), id: z.union([z.string(), z.number()]).optional() });

/** The 1-based line of a character offset. */
function lineAt(text: string, offset: number): number {
  return text.slice(0, offset).split(/\r\n|\n|\r/).length;
}

/** JSON.parse's message names a position; Node 20 says "at position N", newer ones "(line L column C)". */
function jsonErrorLine(text: string, message: string): number | null {
  const line = /line (\d+)/.exec(message);
  if (line) return Number(line[1]);
  const pos = /position (\d+)/.exec(message);
  return pos ? lineAt(text, Number(pos[1])) : null;
}

/** Where each top-level item of a JSON array starts, for naming entries by line. */
function itemLines(text: string): number[] {
  const out: number[] = [];
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (inString) {
      if (c === '\\') i++;
      else if (c === '"') inString = false;
      continue;
    }
    if (c === '"') inString = true;
    else if (c === '{' || c === '[') {
      if (depth === 1 && c === '{') out.push(lineAt(text, i));
      depth++;
    } else if (c === '}' || c === ']') depth--;
  }
  return out;
}

function cslChunks(text: string, errors: ReferenceEntryError[]): Chunk[] {
  const body = text.replace(/^\uFEFF/, '');
  let data: unknown;
  try {
    data = JSON.parse(body);
  } catch (e) {
    const message = e instanceof Error ? e.message : String(e);
    errors.push({ entry: 0, citeKey: null, line: jsonErrorLine(body, message), message: `not valid JSON: ${firstLine(message)}`, syntax: true });
    return [];
  }
  const items = Array.isArray(data) ? data : [data];
  const starts = Array.isArray(data) ? itemLines(body) : [1];
  return items.map((item, i) => {
    const key = item && typeof item === 'object' ? ((item as Record<string, unknown>)['citation-key'] ?? (item as Record<string, unknown>).id) : null;
    return {
      entry: i + 1,
      line: starts[i] ?? null,
      citeKey: typeof key === 'string' || typeof key === 'number' ? String(key) : null,
      parse: () => {
        const checked = cslItem.safeParse(item);
        if (!checked.success) throw new Error(`not a CSL-JSON item: ${checked.error.issues.map((x) => x.message).join('; ')}.`);
        return [checked.data as unknown as CSL];
      },
    } as Chunk;
  });
}

/**
 * Parses a reference file. Syntax errors make `errors` non-empty with `syntax: true`;
 * entry problems are listed entry by entry. Callers import nothing while `errors` is non-empty.
 */
export function parseReferences(text: string, format: ImportFormat): ReferenceParseResult {
  const result: ReferenceParseResult = { format, sources: [], lines: [], errors: [] };
  const chunks = format === 'bibtex' ? bibtexChunks(text, result.errors) : format === 'ris' ? risChunks(text, result.errors) : cslChunks(text, result.errors);
  const seen = new Map<string, number>();
  for (const chunk of chunks) {
    const fail = (message: string, syntax = false) => result.errors.push({ entry: chunk.entry, citeKey: chunk.citeKey, line: chunk.line, message, syntax });
    let parsed: CSL[];
    try {
      parsed = chunk.parse();
    } catch (e) {
      fail(e instanceof Error ? e.message : String(e), e instanceof SyntaxError);
      continue;
    }
    if (parsed.length !== 1) {
      fail('not one reference entry.', true);
      continue;
    }
    const checked = normaliseSourceRow(cslToSourceRow(parsed[0]));
    if (!checked.ok) {
      fail(checked.issues.map((i) => `${i.field}: ${i.message}`).join(' '));
      continue;
    }
    const key = checked.source.citeKey;
    const earlier = seen.get(key);
    if (earlier !== undefined) {
      fail(`the cite key "${key}" is already used by entry ${earlier} of this file.`);
      continue;
    }
    seen.set(key, chunk.entry);
    result.sources.push(checked.source);
    result.lines.push(chunk.line);
  }
  return result;
}

/** "Entry 2 (fresh2), line 5: …" — one line per problem, for the form. */
export function describeReferenceError(e: ReferenceEntryError): string {
  const where = e.entry ? `Entry ${e.entry}${e.citeKey ? ` (${e.citeKey})` : ''}` : 'The file';
  return `${where}${e.line ? `, line ${e.line}` : ''}: ${e.message}`;
}
