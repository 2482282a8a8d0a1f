import { Cite, plugins, type CSL, type CSLName } from '@citation-js/core';
import '@citation-js/plugin-bibtex';
import type { Source } from '@/db/schema/catalog';
import { sourceInputSchema, type SourceInput } from '@/lib/catalog/source-schema';

export interface BibtexEntryError {
  /** 1-based position of the entry in the file. */
  entry: number;
  citeKey: string | null;
  line: number;
  message: string;
}

export interface BibtexParseResult {
  sources: SourceInput[];
  errors: BibtexEntryError[];
  /** Cite keys that appear more than once in the file (the first one is kept). */
  repeated: string[];
}

// citation-js's typings demand every option; it fills the rest with its defaults.
const BIBTEX_INPUT = { generateGraph: false, forceType: '@bibtex/text' } as unknown as Parameters<typeof plugins.input.chain>[1];

interface Chunk {
  entry: number;
  line: number;
  type: string;
  citeKey: string | null;
  text: string;
}

/**
 * Splits a .bib file at each line that starts an "@type{" so every entry is parsed on
 * its own: a syntax error is then reported against the entry that has it, not the next.
 */
function splitEntries(text: string): Chunk[] {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  const chunks: Chunk[] = [];
  let current: { line: number; lines: string[] } | null = null;
  const flush = () => {
    if (!current) return;
    const body = current.lines.join('\n');
    const head = /^\s*@\s*([A-Za-z]+)\s*[{(]\s*([^,\s{}()]*)/.exec(body);
    const type = head?.[1].toLowerCase() ?? '';
    const isEntry = !['string', 'comment', 'preamble'].includes(type);
    chunks.push({ entry: 0, line: current.line, type, citeKey: isEntry && head?.[2] ? head[2] : null, text: body });
  };
  lines.forEach((l, i) => {
    if (/^\s*@/.test(l)) {
      flush();
      current = { line: i + 1, lines: [l] };
    } else current?.lines.push(l);
  });
  flush();
  let n = 0;
  for (const c of chunks) if (!['string', 'comment', 'preamble'].includes(c.type)) c.entry = ++n;
  return chunks;
}

const KIND_BY_CSL_TYPE: Record<string, SourceInput['kind']> = {
  thesis: 'thesis',
  dataset: 'data-set',
  document: 'data-set',
  webpage: 'data-set',
  software: 'data-set',
};

function formatName(name: CSLName): string {
  if (name.literal) return `{${name.literal}}`;
  const family = [name['non-dropping-particle'], name.family].filter(Boolean).join(' ');
  const given = [name.given, name['dropping-particle']].filter(Boolean).join(' ');
  const suffix = name.suffix ? `, ${name.suffix}` : '';
  return given ? `${family}${suffix}, ${given}` : family;
}

function yearOf(date: CSL['issued']): number | undefined {
  const year = date?.['date-parts']?.[0]?.[0];
  return year === undefined ? undefined : Number(year);
}

function cslToFields(csl: CSL): Record<string, unknown> {
  const kind = KIND_BY_CSL_TYPE[csl.type] ?? 'journal-article';
  const record = csl as CSL & Record<string, unknown>;
  return {
    kind,
    citeKey: csl['citation-key'] ?? String(csl.id),
    doi: record.DOI,
    title: record.title,
    authors: csl.author?.map(formatName).join(' and '),
    year: yearOf(csl.issued),
    venue: record['container-title'] ?? record.publisher,
    url: record.URL,
  };
}

function firstLine(message: string): string {
  return message.split('\n')[0].replace(/\s+at line \d+ col \d+:?$/, '');
}

/**
 * Parses BibTeX text into source inputs. Each entry becomes a source whose kind follows
 * its type (@phdthesis/@mastersthesis → thesis; @dataset, @misc, @online → data set;
 * everything else → journal article). Every problem names the entry, its cite key and line.
 */
export function parseBibtex(text: string): BibtexParseResult {
  const chunks = splitEntries(text);
  const result: BibtexParseResult = { sources: [], errors: [], repeated: [] };
  let macros = '';
  const seen = new Set<string>();
  for (const chunk of chunks) {
    if (chunk.type === 'string') {
      macros += `${chunk.text}\n`;
      continue;
    }
    if (chunk.type === 'comment' || chunk.type === 'preamble') continue;
    const fail = (message: string) => result.errors.push({ entry: chunk.entry, citeKey: chunk.citeKey, line: chunk.line, message });
    let parsed: CSL[];
    try {
      parsed = plugins.input.chain(macros + chunk.text, BIBTEX_INPUT);
    } catch (e) {
      fail(`not valid BibTeX: ${firstLine(e instanceof Error ? e.message : String(e))}`);
      continue;
    }
    if (parsed.length !== 1) {
      fail('not a BibTeX entry (expected @type{key, field = {…}, …}).');
      continue;
    }
    const checked = sourceInputSchema.safeParse(cslToFields(parsed[0]));
    if (!checked.success) {
      fail(checked.error.issues.map((i) => `${i.path.join('.') || 'entry'}: ${i.message}`).join(' '));
      continue;
    }
    if (seen.has(checked.data.citeKey)) {
      result.repeated.push(checked.data.citeKey);
      continue;
    }
    seen.add(checked.data.citeKey);
    result.sources.push(checked.data);
  }
  return result;
}

/** "Family, Given and {Organisation} and Given Family" → CSL names. */
function parseAuthors(authors: string): CSLName[] {
  return authors
    .split(/\s+and\s+/)
    .map((a) => a.trim())
    .filter(Boolean)
    .map((a): CSLName => {
      const literal = /^\{(.*)\}$/.exec(a);
      if (literal) return { literal: literal[1] };
      const comma = a.indexOf(',');
      if (comma >= 0) return { family: a.slice(0, comma).trim(), given: a.slice(comma + 1).trim() };
      const words = a.split(/\s+/);
      return words.length > 1 ? { family: words.at(-1), given: words.slice(0, -1).join(' ') } : { literal: a };
    });
}

const CSL_TYPE_BY_KIND: Record<Source['kind'], string> = {
  'journal-article': 'article-journal',
  thesis: 'thesis',
  'data-set': 'dataset',
  'computed-data-set': 'dataset',
  'in-house-notebook': 'document',
};

function sourceToCsl(s: Source): CSL {
  const venueField = s.kind === 'journal-article' ? 'container-title' : 'publisher';
  const notebook = [
    s.notebookRef && `Notebook ${s.notebookRef}`,
    s.instrument && `instrument: ${s.instrument}`,
    s.operator && `operator: ${s.operator}`,
    s.recordedOn && `recorded ${s.recordedOn}`,
  ]
    .filter(Boolean)
    .join('; ');
  const csl: Record<string, unknown> = {
    id: s.citeKey,
    'citation-key': s.citeKey,
    type: CSL_TYPE_BY_KIND[s.kind],
    // Without a genre citation-js writes a thesis as @misc, which would come back as a data set.
    genre: s.kind === 'thesis' ? 'PhD thesis' : undefined,
    title: s.title ?? (s.kind === 'in-house-notebook' ? `In-house notebook ${s.notebookRef ?? ''}`.trim() : undefined),
    author: s.authors ? parseAuthors(s.authors) : undefined,
    issued: s.year ? { 'date-parts': [[s.year]] } : undefined,
    [venueField]: s.venue ?? undefined,
    DOI: s.doi ?? undefined,
    URL: s.url ?? undefined,
    note: notebook || undefined,
  };
  for (const key of Object.keys(csl)) if (csl[key] === undefined) delete csl[key];
  return csl as unknown as CSL;
}

/** BibTeX text for sources (citation-js output; notebooks become @misc with a note). */
export function sourcesToBibtex(sources: Source[]): string {
  if (sources.length === 0) return '';
  return String(new Cite(sources.map(sourceToCsl)).format('bibtex', { format: 'text' }));
}
