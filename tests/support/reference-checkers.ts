/**
 * Independent readers of the reference files Lattice Ledger writes, for round-trip
 * tests: none of them shares code with citation-js, which writes the files.
 * - BibTeX: @retorquere/bibtex-parser (the parser behind a widely used reference-manager extension).
 * - RIS: astrocite-ris.
 * - CSL-JSON: JSON.parse, then validated with ajv against a JSON Schema written here from the
 *   CSL 1.0.2 specification's variable lists (name, date, number and standard variables, item types).
 */
import { parse as parseBib } from '@retorquere/bibtex-parser';
import { parse as parseRis } from 'astrocite-ris';
import { Ajv } from 'ajv';

export interface CheckedName {
  family: string;
  given: string;
}

export interface CheckedRecord {
  key: string;
  authors: CheckedName[];
  title: string;
  year: string;
  journal: string;
  volume: string;
  pages: string;
  doi: string;
}

const dash = (s: string | undefined) => (s ?? '').replace(/\s*(?:--|[–—-])\s*/g, '-');
const clean = (s: unknown) => (s === undefined || s === null ? '' : String(s).replace(/\s+/g, ' ').trim());

/** A person is compared by family (with its particle) and given names; an organisation by its whole name, in `family`. */
function person(family: string, given: string, particle = ''): CheckedName {
  return { family: clean([particle, family].filter(Boolean).join(' ')), given: clean(given) };
}

export function readBibtexIndependently(text: string): { records: CheckedRecord[]; errors: string[] } {
  const library = parseBib(text, { sentenceCase: false, english: false });
  return {
    errors: library.errors.map((e) => e.error),
    records: library.entries.map((e) => ({
      key: e.key,
      authors: (e.fields.author ?? []).map((c) => (c.name ? person(c.name, '') : person(c.lastName ?? '', c.firstName ?? '', c.prefix))),
      title: clean(e.fields.title),
      year: clean(e.fields.year ?? e.fields.date?.slice(0, 4)),
      journal: clean(e.fields.journal ?? e.fields.journaltitle),
      volume: clean(e.fields.volume),
      pages: dash(e.fields.pages),
      doi: clean(e.fields.doi).toLowerCase(),
    })),
  };
}

const SUFFIX = /^(?:Jr\.?|Sr\.?|II|III|IV)$/;

export function readRisIndependently(text: string): CheckedRecord[] {
  return parseRis(text).map((item) => {
    const record = item as unknown as Record<string, unknown>;
    const names = (record.author as Array<Record<string, string>> | undefined) ?? [];
    return {
      key: clean(record.id),
      authors: names.map((n) => {
        // astrocite-ris 0.16.4 reads "Family, Given, Suffix" (the RIS specification's order) as family, suffix, given.
        const swapped = n.given && SUFFIX.test(n.given) && n.suffix;
        return person(n.family ?? '', swapped ? n.suffix : (n.given ?? ''), n['non-dropping-particle']);
      }),
      title: clean(record.title),
      year: clean((record.issued as { 'date-parts'?: unknown[][] } | undefined)?.['date-parts']?.[0]?.[0]),
      journal: clean(record['container-title']),
      volume: clean(record.volume),
      pages: dash(record.page as string | undefined),
      doi: clean(record.DOI).toLowerCase(),
    };
  });
}

const stringOrNumber = { type: ['string', 'number'] };
const nameSchema = {
  type: 'object',
  additionalProperties: false,
  properties: Object.fromEntries(['family', 'given', 'dropping-particle', 'non-dropping-particle', 'suffix', 'literal'].map((k) => [k, { type: 'string' }])),
};
const dateSchema = {
  type: 'object',
  additionalProperties: false,
  properties: {
    'date-parts': { type: 'array', minItems: 1, maxItems: 2, items: { type: 'array', minItems: 1, maxItems: 3, items: stringOrNumber } },
    season: stringOrNumber,
    circa: { type: ['string', 'number', 'boolean'] },
    literal: { type: 'string' },
    raw: { type: 'string' },
  },
};
// CSL 1.0.2 specification, appendix IV (variables) and the list of item types.
const TYPES = 'article article-journal article-magazine article-newspaper bill book broadcast chapter classic collection dataset document entry entry-dictionary entry-encyclopedia event figure graphic hearing interview legal_case legislation manuscript map motion_picture musical_score pamphlet paper-conference patent performance periodical personal_communication post post-weblog regulation report review review-book software song speech standard thesis treaty webpage'.split(' ');
const NAMES = 'author chair collection-editor compiler composer container-author contributor curator director editor editorial-director executive-producer guest host interviewer illustrator narrator organizer original-author performer producer recipient reviewed-author script-writer series-creator translator'.split(' ');
const DATES = 'accessed available-date event-date issued original-date submitted'.split(' ');
const NUMBERS = 'chapter-number citation-number collection-number edition first-reference-note-number issue locator number number-of-pages number-of-volumes page page-first part-number printing-number section supplement-number version volume'.split(' ');
const STRINGS =
  'abstract annote archive archive_collection archive_location archive-place authority call-number citation-key citation-label collection-title container-title container-title-short dimensions division DOI event event-title event-place genre ISBN ISSN jurisdiction keyword language license medium note original-publisher original-publisher-place original-title part-title PMCID PMID publisher publisher-place references reviewed-genre reviewed-title scale source status title title-short URL volume-title year-suffix'.split(
    ' ',
  );
const cslItemSchema = {
  type: 'object',
  required: ['id', 'type'],
  additionalProperties: false,
  properties: {
    id: stringOrNumber,
    type: { enum: TYPES },
    ...Object.fromEntries(NAMES.map((k) => [k, { type: 'array', items: nameSchema }])),
    ...Object.fromEntries(DATES.map((k) => [k, dateSchema])),
    ...Object.fromEntries(NUMBERS.map((k) => [k, stringOrNumber])),
    ...Object.fromEntries(STRINGS.map((k) => [k, { type: 'string' }])),
  },
};
const validate = new Ajv({ allErrors: true, allowUnionTypes: true }).compile({ type: 'array', items: cslItemSchema });

export function readCslJsonIndependently(text: string): { records: CheckedRecord[]; errors: string[] } {
  const data = JSON.parse(text) as Array<Record<string, unknown>>;
  const errors = validate(data) ? [] : (validate.errors ?? []).map((e) => `${e.instancePath} ${e.message}`);
  const records = data.map((item) => ({
    key: clean(item['citation-key'] ?? item.id),
    authors: ((item.author as Array<Record<string, string>> | undefined) ?? []).map((n) => (n.literal ? person(n.literal, '') : person(n.family ?? '', n.given ?? '', n['non-dropping-particle']))),
    title: clean(item.title),
    year: clean((item.issued as { 'date-parts'?: unknown[][] } | undefined)?.['date-parts']?.[0]?.[0]),
    journal: clean(item['container-title']),
    volume: clean(item.volume),
    pages: dash(item.page as string | undefined),
    doi: clean(item.DOI).toLowerCase(),
  }));
  return { records, errors };
}
