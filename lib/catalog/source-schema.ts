import { z } from 'zod';
import { SOURCE_KINDS } from '@/db/schema/catalog';
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

/** Source fields; a notebook needs its reference, published kinds need a DOI, a URL or a title. */
export const sourceInputSchema = z
  .object({
    kind: z.enum(SOURCE_KINDS, 'Choose a kind of source.'),
    citeKey: requiredText('A cite key', 100).pipe(z.string().regex(CITE_KEY_PATTERN, 'Use letters, digits and _ : . + - / only (e.g. "azuhata1995").')),
    doi: doiField,
    title: optionalText(1000),
    authors: optionalText(2000),
    year: optionalInteger('The year', 1600, 2200),
    venue: optionalText(300),
    url: urlField,
    notebookRef: optionalText(200),
    instrument: optionalText(200),
    operator: optionalText(200),
    recordedOn: dateField,
  })
  .superRefine((s, ctx) => {
    if (s.kind === 'in-house-notebook') {
      if (!s.notebookRef) ctx.addIssue({ code: 'custom', path: ['notebookRef'], message: 'An in-house notebook needs its notebook reference.' });
    } else if (!s.doi && !s.url && !s.title) {
      ctx.addIssue({ code: 'custom', path: ['doi'], message: 'Give a DOI, a URL or a title so the source can be found.' });
    }
  });

export type SourceInput = z.infer<typeof sourceInputSchema>;
