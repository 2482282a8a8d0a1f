import { shortAuthors } from './authors';
import type { SourceRecord } from './record';

type Citable = Pick<SourceRecord, 'citeKey' | 'kind' | 'authorList' | 'year' | 'venue' | 'volume' | 'pages' | 'articleNumber' | 'notebookRef' | 'operator' | 'recordedOn'>;

/** "Azuhata et al., J. Phys.: Condens. Matter 7, L129 (1995)"; a notebook: "M. Kessel, notebook LN-3 p. 41 (2024-03-05)". */
export function shortCitation(s: Citable): string {
  const who = shortAuthors(s.authorList) || s.operator || s.citeKey;
  if (s.kind === 'in-house-notebook') {
    const when = s.recordedOn ?? s.year;
    return [who, s.notebookRef ? `notebook ${s.notebookRef}` : null].filter(Boolean).join(', ') + (when ? ` (${when})` : '');
  }
  const first = s.pages?.split(/[–-]/)[0] || s.articleNumber;
  const journal = [s.venue, s.volume].filter(Boolean).join(' ');
  const where = [journal, first].filter(Boolean).join(', ');
  return [who, where || null].filter(Boolean).join(', ') + (s.year ? ` (${s.year})` : '');
}
