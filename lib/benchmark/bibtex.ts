/**
 * BibTeX of the sources behind a benchmark revision, through citation-js
 * (CSL-JSON in, BibTeX out; the workspace's cite key becomes the entry key).
 */
import { Cite, type CSL } from '@citation-js/core';
import '@citation-js/plugin-bibtex';

export interface BibSource {
  citeKey: string;
  kind: string;
  doi: string | null;
  title: string | null;
  authors: string | null;
  year: number | null;
  venue: string | null;
  url: string | null;
  notebookRef: string | null;
  instrument: string | null;
  operator: string | null;
}

const CSL_TYPE: Record<string, CSL['type']> = {
  'journal-article': 'article-journal',
  'data-set': 'dataset',
  thesis: 'thesis',
  'in-house-notebook': 'manuscript',
  'computed-data-set': 'dataset',
};

/** "Azuhata, T.; Sota, T." or "T. Azuhata and T. Sota" → CSL names. */
export function parseAuthors(authors: string | null): Array<{ family: string; given?: string }> {
  if (!authors?.trim()) return [];
  return authors
    .split(/\s*;\s*|\s+and\s+/)
    .map((a) => a.trim())
    .filter(Boolean)
    .map((name) => {
      if (name.includes(',')) {
        const [family, ...given] = name.split(',');
        return { family: family.trim(), given: given.join(',').trim() || undefined };
      }
      const parts = name.split(/\s+/);
      const family = parts.pop()!;
      return parts.length ? { family, given: parts.join(' ') } : { family };
    });
}

function toCsl(s: BibSource): CSL {
  const item: CSL = { id: s.citeKey, 'citation-key': s.citeKey, type: CSL_TYPE[s.kind] ?? 'document' } as CSL;
  const record = item as Record<string, unknown>;
  if (s.title) record.title = s.title;
  const authors = parseAuthors(s.authors ?? s.operator);
  if (authors.length) record.author = authors;
  if (s.year) record.issued = { 'date-parts': [[s.year]] };
  if (s.venue) record['container-title'] = s.venue;
  if (s.doi) record.DOI = s.doi;
  if (s.url) record.URL = s.url;
  const note = [s.notebookRef && `notebook ${s.notebookRef}`, s.instrument && `instrument ${s.instrument}`].filter(Boolean).join('; ');
  if (note) record.note = note;
  return item;
}

export function sourcesToBibtex(sources: readonly BibSource[]): string {
  if (sources.length === 0) return '';
  const sorted = [...sources].sort((a, b) => a.citeKey.localeCompare(b.citeKey));
  return String(new Cite(sorted.map(toCsl)).format('bibtex'));
}
