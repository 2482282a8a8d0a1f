/** "How to cite" text in common citation styles, rendered by citeproc-js through @citation-js/plugin-csl (styles ship with the package). */
import { Cite } from '@citation-js/core';
import '@citation-js/plugin-csl';
import { sourceToCsl } from './csl';
import type { SourceRecord } from './record';

export const CITATION_STYLES = {
  apa: 'APA (7th edition)',
  vancouver: 'Vancouver',
} as const;
export type CitationStyle = keyof typeof CITATION_STYLES;

export function howToCiteSource(s: SourceRecord, style: CitationStyle): string {
  const text = new Cite(sourceToCsl(s)).format('bibliography', { template: style, lang: 'en-US', format: 'text' });
  return String(text)
    .trim()
    .replace(/^1\.\s+/, '');
}
