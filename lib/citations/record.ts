import type { SOURCE_KINDS } from '@/lib/record-kinds';
import type { PersonName } from './names';

export type SourceKind = (typeof SOURCE_KINDS)[number];

/** A source as stored: what citations, exports and completeness checks read (a `source` row has all of it). */
export interface SourceRecord {
  citeKey: string;
  kind: SourceKind;
  doi: string | null;
  title: string | null;
  authorList: PersonName[] | null;
  editorList: PersonName[] | null;
  year: number | null;
  /** Journal, or the container a data set or chapter sits in. */
  venue: string | null;
  volume: string | null;
  issue: string | null;
  pages: string | null;
  articleNumber: string | null;
  /** Publisher, or the school of a thesis. */
  publisher: string | null;
  url: string | null;
  accessedOn: string | null;
  notebookRef: string | null;
  instrument: string | null;
  operator: string | null;
  recordedOn: string | null;
  note: string | null;
}
