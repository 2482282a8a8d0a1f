/**
 * Reference files of sources, written by citation-js from their CSL items:
 * BibTeX (@citation-js/plugin-bibtex), RIS (@citation-js/plugin-ris) and CSL-JSON.
 */
import { Cite, plugins, type CSL } from '@citation-js/core';
import '@citation-js/plugin-bibtex';
import '@citation-js/plugin-ris';
import { sourceToCsl } from './csl';
import type { ExportFormat } from './formats';
import type { SourceRecord } from './record';

export { EXPORT_FORMAT_NAMES, EXPORT_FORMATS, type ExportFormat } from './formats';

// Our cite keys (CITE_KEY_PATTERN) are valid BibTeX keys; citation-js would replace any with "-", ":" or "/" by a label of its own.
(plugins.config.get('@bibtex') as { format: { checkLabel: boolean } }).format.checkLabel = false;

/** RIS has no place for a particle: citation-js would drop it, so it goes in front of the family name ("van der Waals, J. D."). */
function particlesIntoFamily(item: CSL): CSL {
  const fold = (names: CSL['author']) =>
    names?.map((n) => (n['non-dropping-particle'] ? { ...n, family: `${n['non-dropping-particle']} ${n.family ?? ''}`.trim(), 'non-dropping-particle': undefined } : n));
  return { ...item, author: fold(item.author), editor: fold(item.editor) };
}

/**
 * plugin-ris maps the fields; its own text output breaks every value after 70
 * characters, which splits titles mid-word for every reader, so the lines are
 * written here, one tag per line, TY first and ER last.
 */
function risText(items: CSL[]): string {
  // plugin-ris registers the "ris" output at run time; citation-js's typings list only the built-in ones.
  const entries = new Cite(items.map(particlesIntoFamily)).format('ris' as 'bibtex', { format: 'object' }) as unknown as Array<Record<string, unknown>>;
  const lines = entries.map((entry) => {
    const tags = Object.entries(entry)
      .filter(([tag]) => tag !== 'TY')
      .flatMap(([tag, value]) => [value].flat().map((v) => `${tag}  - ${String(v).replace(/\s*[\r\n]+\s*/g, ' ')}`));
    return [`TY  - ${entry.TY}`, ...tags, 'ER  - '].join('\n');
  });
  return `${lines.join('\n')}\n`;
}

export function exportSources(sources: readonly SourceRecord[], format: ExportFormat): string {
  const items = [...sources].sort((a, b) => a.citeKey.localeCompare(b.citeKey)).map(sourceToCsl);
  if (format === 'csl-json') return `${JSON.stringify(items, null, 2)}\n`;
  if (items.length === 0) return '';
  if (format === 'ris') return risText(items);
  return String(new Cite(items).format('bibtex', { format: 'text' }));
}
