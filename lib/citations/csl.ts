/**
 * Sources ↔ CSL-JSON items, the common ground of every reference format:
 * exports go source → CSL → BibTeX / RIS / CSL-JSON, imports come back the same way.
 * In-house fields travel in the note as "Notebook: …; Instrument: …" so our own
 * exports import again unchanged.
 */
import type { CSL, CSLDate, CSLName, CSLType } from '@citation-js/core';
import { CITE_KEY_PATTERN } from '@/lib/catalog/source-schema';
import { parsePersonName, type PersonName } from './names';
import type { SourceKind, SourceRecord } from './record';

const CSL_TYPE: Record<SourceKind, CSLType> = {
  'journal-article': 'article-journal',
  'data-set': 'dataset',
  thesis: 'thesis',
  'in-house-notebook': 'manuscript',
  'computed-data-set': 'dataset',
};

const COMPUTED_GENRE = 'Computed data set';
const THESIS_GENRE = 'PhD thesis';

const IN_HOUSE_FIELDS = [
  ['notebookRef', 'Notebook'],
  ['instrument', 'Instrument'],
  ['operator', 'Operator'],
  ['recordedOn', 'Recorded'],
] as const;

export function nameToCsl(n: PersonName): CSLName {
  if (n.literal) return { literal: n.literal };
  const out: CSLName = { family: n.family };
  if (n.given) out.given = n.given;
  if (n.particle) out['non-dropping-particle'] = n.particle;
  if (n.suffix) out.suffix = n.suffix;
  return out;
}

const INITIALS_ONLY = /^(?:\p{Lu}\.?[\s-]*)+$/u;
const LEADING_PARTICLES = /^((?:(?:van|von|der|den|de|del|della|di|da|du|des|la|le|ter|ten|zu|dos|das)\s+)+)(\p{Lu}.*)$/u;

export function nameFromCsl(n: CSLName): PersonName {
  if (n.literal) return { literal: n.literal.trim() };
  let family = n.family?.trim();
  let given = n.given?.trim();
  // "T., Azuhata" (family and given swapped, as older exports wrote them) is read the right way round.
  if (family && given && INITIALS_ONLY.test(family) && !INITIALS_ONLY.test(given)) [family, given] = [given, family];
  if (!family && given) return parsePersonName(given);
  // A braced BibTeX name ({Halden Phonon Group}) arrives as a family name alone: it is a name as written.
  if (family && !given && !n['non-dropping-particle'] && !n['dropping-particle']) return { literal: family };
  let particle = [n['dropping-particle'], n['non-dropping-particle']].filter(Boolean).join(' ').trim();
  // RIS has no particle field: "van der Waals" comes back whole and is split again.
  const leading = !particle && family ? LEADING_PARTICLES.exec(family) : null;
  if (leading) [particle, family] = [leading[1].trim(), leading[2]];
  const out: PersonName = {};
  if (family) out.family = family;
  if (given) out.given = given;
  if (particle) out.particle = particle;
  if (n.suffix?.trim()) out.suffix = n.suffix.trim();
  return out;
}

function dateParts(text: string | null): CSLDate | undefined {
  const m = text ? /^(\d{4})-(\d{2})-(\d{2})$/.exec(text) : null;
  return m ? { 'date-parts': [[Number(m[1]), Number(m[2]), Number(m[3])]] } : undefined;
}

function isoDate(date: CSLDate | undefined): string | undefined {
  const parts = date?.['date-parts']?.[0];
  if (!parts || parts.length < 3) return undefined;
  const [y, m, d] = parts.map(Number);
  return `${String(y).padStart(4, '0')}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`;
}

function noteOf(s: SourceRecord): string | undefined {
  const inHouse = IN_HOUSE_FIELDS.filter(([k]) => s[k]).map(([k, label]) => `${label}: ${s[k]}`);
  const text = [inHouse.join('; '), s.note].filter(Boolean).join('\n');
  return text || undefined;
}

export function sourceToCsl(s: SourceRecord): CSL {
  const item: Record<string, unknown> = {
    id: s.citeKey,
    'citation-key': s.citeKey,
    type: CSL_TYPE[s.kind],
    genre: s.kind === 'thesis' ? THESIS_GENRE : s.kind === 'computed-data-set' ? COMPUTED_GENRE : undefined,
    title: s.title ?? (s.kind === 'in-house-notebook' ? `In-house notebook ${s.notebookRef ?? ''}`.trim() : undefined),
    author: s.authorList?.length ? s.authorList.map(nameToCsl) : undefined,
    editor: s.editorList?.length ? s.editorList.map(nameToCsl) : undefined,
    issued: s.year ? { 'date-parts': [[s.year]] } : dateParts(s.recordedOn),
    'container-title': s.venue ?? undefined,
    volume: s.volume ?? undefined,
    issue: s.issue ?? undefined,
    page: s.pages ?? undefined,
    number: s.articleNumber ?? undefined,
    publisher: s.publisher ?? undefined,
    DOI: s.doi ?? undefined,
    URL: s.url ?? undefined,
    accessed: dateParts(s.accessedOn),
    note: noteOf(s),
  };
  for (const key of Object.keys(item)) if (item[key] === undefined) delete item[key];
  return item as unknown as CSL;
}

function kindOf(csl: CSL, inHouse: Record<string, string>): SourceKind {
  const genre = String((csl as Record<string, unknown>).genre ?? '');
  if (csl.type === 'thesis') return 'thesis';
  if (csl.type === 'manuscript' && inHouse.notebookRef) return 'in-house-notebook';
  if (/computed/i.test(genre)) return 'computed-data-set';
  if (['dataset', 'book', 'report', 'document', 'webpage', 'software', 'standard'].includes(csl.type)) return 'data-set';
  return 'journal-article';
}

function splitNote(note: unknown): { inHouse: Record<string, string>; rest?: string } {
  const inHouse: Record<string, string> = {};
  if (typeof note !== 'string') return { inHouse };
  const lines = note.split('\n');
  const first = lines[0].split(/;\s*/);
  const labels = new Map<string, string>(IN_HOUSE_FIELDS.map(([k, label]) => [label.toLowerCase(), k]));
  const parsed = first.map((part) => /^([A-Za-z]+):\s*(.+)$/.exec(part)).filter((m) => m && labels.has(m[1].toLowerCase()));
  if (parsed.length === first.length && parsed.length > 0) {
    for (const m of parsed) inHouse[labels.get(m![1].toLowerCase())!] = m![2].trim();
    const rest = lines.slice(1).join('\n').trim();
    return { inHouse, rest: rest || undefined };
  }
  return { inHouse, rest: note.trim() || undefined };
}

function text(value: unknown): string | undefined {
  if (value === undefined || value === null) return undefined;
  const s = String(value).trim();
  return s || undefined;
}

/** A key from the first author and the year ("azuhata1995") when an item has none we can use. */
function derivedKey(csl: CSL, authors: PersonName[]): string | undefined {
  const family = authors[0]?.family ?? authors[0]?.literal ?? text(csl.title)?.split(/\s+/)[0];
  if (!family) return undefined;
  const ascii = family
    .normalize('NFD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^A-Za-z0-9]/g, '')
    .toLowerCase();
  const year = csl.issued?.['date-parts']?.[0]?.[0];
  return ascii ? `${ascii}${year ?? ''}` : undefined;
}

/** A loose source row for normaliseSourceRow (which checks and completes it). */
export function cslToSourceRow(csl: CSL): Record<string, unknown> {
  const record = csl as CSL & Record<string, unknown>;
  const { inHouse, rest } = splitNote(record.note);
  const kind = kindOf(csl, inHouse);
  const authors = (csl.author ?? []).map(nameFromCsl);
  const key = [text(csl['citation-key']), text(csl.id)].find((k) => k && CITE_KEY_PATTERN.test(k) && !/^(?:temp_id_|https?:)/.test(k));
  const year = csl.issued?.['date-parts']?.[0]?.[0];
  return {
    kind,
    citeKey: key ?? derivedKey(csl, authors),
    doi: text(record.DOI),
    title: text(record.title),
    authors,
    editors: (csl.editor ?? []).map(nameFromCsl),
    year: year === undefined ? undefined : Number(year),
    venue: text(record['container-title']),
    volume: text(record.volume),
    issue: text(record.issue),
    pages: text(record.page),
    articleNumber: text(record.number),
    publisher: text(record.publisher),
    url: text(record.URL),
    accessedOn: isoDate(record.accessed as CSLDate | undefined),
    ...inHouse,
    note: rest,
  };
}
