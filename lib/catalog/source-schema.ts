/**
 * Validation of a source, shared by the form, the reference imports (BibTeX, RIS,
 * CSL-JSON), the REST API and bulk imports: loose input in (strings from a form or
 * a CSV cell, names as typed or structured), one normalised source out.
 */
import { z } from 'zod';
import { SOURCE_KINDS } from '@/lib/record-kinds';
import { MAX_NAME_CHARS, MAX_NAMES, parseNameList, parsePersonName, type PersonName } from '@/lib/citations/names';
import { normalizeDoi } from './doi';
import { optionalInteger, optionalText, requiredText } from './fields';

export const CITE_KEY_PATTERN = /^[A-Za-z0-9][A-Za-z0-9_:.+\-/]*$/;

export const SOURCE_KIND_LABELS: Record<(typeof SOURCE_KINDS)[number], string> = {
  'journal-article': 'Journal article',
  'data-set': 'Data set',
  thesis: 'Thesis',
  'in-house-notebook': 'In-house notebook',
  'computed-data-set': 'Computed data set',
};

const doiField = optionalText(300).transform((value, ctx) => {
  if (value === undefined) return undefined;
  const result = normalizeDoi(value);
  if (!result.ok) {
    ctx.issues.push({ code: 'custom', message: result.message, input: value });
    return z.NEVER;
  }
  return result.doi;
});

const urlField = optionalText(1000).pipe(z.url({ protocol: /^https?$/, message: 'Enter a web address starting with http:// or https://.' }).optional());

const dateField = optionalText(10).pipe(
  z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use the date format YYYY-MM-DD.')
    .refine((d) => !Number.isNaN(Date.parse(d)), 'Not a calendar date.')
    .optional(),
);

/** "712--716", "712 - 716" and "712—716" are all "712–716". */
export function normalizePages(pages: string): string {
  return pages.replace(/\s*(?:--?|—|–)\s*/g, '–').trim();
}

const pagesField = optionalText(100).transform((v) => (v === undefined ? undefined : normalizePages(v)));

const namePart = z.string().trim().max(MAX_NAME_CHARS, `A name part has at most ${MAX_NAME_CHARS} characters.`).optional();

export const personNameSchema = z
  .object({ family: namePart, given: namePart, particle: namePart, suffix: namePart, literal: namePart, review: z.boolean().optional() })
  .transform((n): PersonName => {
    const out: PersonName = {};
    for (const key of ['family', 'given', 'particle', 'suffix', 'literal'] as const) if (n[key]) out[key] = n[key];
    // A person who corrected the split into family and given has reviewed it.
    if (out.family) delete out.literal;
    else if (out.literal && n.review) out.review = true;
    return out;
  })
  .refine((n) => Boolean(n.family || n.literal), 'Each name needs a family name (or the name as written).');

/** Names as typed ("Azuhata T.; Sota T."), as JSON text, or as a list of strings and {family, given} objects. */
function namesInput(value: unknown): unknown {
  if (value === null || value === undefined) return [];
  if (typeof value === 'string') {
    const text = value.trim();
    if (!text) return [];
    if (text.startsWith('[')) {
      try {
        return namesInput(JSON.parse(text));
      } catch {
        return text;
      }
    }
    return parseNameList(text);
  }
  if (Array.isArray(value)) return value.map((n) => (typeof n === 'string' ? parsePersonName(n) : n));
  return value;
}

const namesField = (label: string) =>
  z.preprocess(namesInput, z.array(personNameSchema, `${label}: give names as text or as a list of {family, given}.`).max(MAX_NAMES, `At most ${MAX_NAMES} names.`));

/** Source fields; a notebook needs its reference, every other kind a title. */
export const sourceInputSchema = z
  .object({
    kind: z.enum(SOURCE_KINDS, 'Choose a kind of source.'),
    citeKey: requiredText('A cite key', 100).pipe(z.string().regex(CITE_KEY_PATTERN, 'Use letters, digits and _ : . + - / only (e.g. "azuhata1995").')),
    doi: doiField,
    title: optionalText(1000),
    authors: namesField('Authors'),
    editors: namesField('Editors'),
    year: optionalInteger('The year', 1600, 2200),
    venue: optionalText(300),
    volume: optionalText(50),
    issue: optionalText(50),
    pages: pagesField,
    articleNumber: optionalText(50),
    publisher: optionalText(300),
    url: urlField,
    accessedOn: dateField,
    notebookRef: optionalText(200),
    instrument: optionalText(200),
    operator: optionalText(200),
    recordedOn: dateField,
    note: optionalText(2000),
  })
  .superRefine((s, ctx) => {
    if (s.kind === 'in-house-notebook') {
      if (!s.notebookRef) ctx.addIssue({ code: 'custom', path: ['notebookRef'], message: 'An in-house notebook needs its notebook reference.' });
    } else if (!s.title) {
      ctx.addIssue({ code: 'custom', path: ['title'], message: 'A title is required, so the source can be found and cited.' });
    }
  });

export type SourceInput = z.infer<typeof sourceInputSchema>;

export interface SourceRowIssue {
  field: string;
  message: string;
}

export type NormalisedSourceRow = { ok: true; source: SourceInput; review: string[] } | { ok: false; issues: SourceRowIssue[] };

/**
 * One source row from anywhere (a form, a CSV or JSON row, a parsed reference file)
 * checked and normalised: DOI bare and lower-case, pages with an en dash, names
 * split into family and given. Names the parser could not split are kept as
 * written and listed in `review`.
 */
export function normaliseSourceRow(row: Record<string, unknown>): NormalisedSourceRow {
  const parsed = sourceInputSchema.safeParse(row);
  if (!parsed.success) return { ok: false, issues: parsed.error.issues.map((i) => ({ field: i.path.join('.') || 'source', message: i.message })) };
  const review = [...parsed.data.authors, ...parsed.data.editors].filter((n) => n.review).map((n) => n.literal ?? '');
  return { ok: true, source: parsed.data, review };
}
