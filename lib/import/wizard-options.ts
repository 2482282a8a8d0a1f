import { z } from 'zod';
import { ENTROPY_UNITS, FREQUENCY_UNITS } from '@/lib/science/units';
import { IMPORTABLE_KINDS } from './columns';
import { CATALOG_KINDS } from './catalog-columns';
import { methodTableSchema } from './method-table';

/** What the wizard sends beside the file bytes (as query parameters): kind, file name, the corrected mapping, file-wide units. */
export const wizardOptionsSchema = z
  .object({
    kind: z.enum([...IMPORTABLE_KINDS, ...CATALOG_KINDS], 'Choose measurements, calculations, materials, methods or sources.'),
    /** Catalogue kinds: update stored records a row changes (curator or owner), instead of refusing the file. */
    onChange: z.enum(['refuse', 'update']).optional(),
    /** Materials with a structure column: typed or structure values where they disagree. */
    prefer: z.enum(['typed', 'structure']).optional(),
    /** Calculations: create missing materials and methods from the rows' catalogue columns. */
    createMissing: z.boolean().optional(),
    /** With createMissing: the method table, one line per new method label (lib/import/method-table.ts). */
    methodTable: methodTableSchema.optional(),
    fileName: z.string().max(255).optional(),
    mapping: z.record(z.string(), z.string().nullable()).optional(),
    units: z
      .object({
        frequency: z.enum(FREQUENCY_UNITS as [string, ...string[]]).optional(),
        entropy: z.enum(ENTROPY_UNITS as [string, ...string[]]).optional(),
      })
      .optional(),
  })
  .refine((o) => o.methodTable === undefined || (o.kind === 'calculations' && o.createMissing === true), {
    message: 'A method table goes with a calculations import that creates missing methods (createMissing=true).',
    path: ['methodTable'],
  });

export type WizardOptions = z.infer<typeof wizardOptionsSchema>;

/** The longest query the wizard sends: with the session cookie it stays inside the usual 16 KB limit on request headers. */
export const MAX_WIZARD_QUERY_CHARS = 12_000;

/** Encodes the options into the query string of the upload URL. */
export function wizardQuery(options: WizardOptions): string {
  const q = new URLSearchParams({ kind: options.kind });
  if (options.fileName) q.set('fileName', options.fileName);
  if (options.mapping) q.set('mapping', JSON.stringify(options.mapping));
  if (options.units) q.set('units', JSON.stringify(options.units));
  if (options.onChange) q.set('onChange', options.onChange);
  if (options.prefer) q.set('prefer', options.prefer);
  if (options.createMissing) q.set('createMissing', 'true');
  if (options.methodTable) q.set('methodTable', JSON.stringify(options.methodTable));
  return q.toString();
}

/** Reads them back on the server; malformed JSON counts as a validation failure. */
export function parseWizardQuery(params: URLSearchParams) {
  const json = (name: string): unknown => {
    const raw = params.get(name);
    if (raw === null) return undefined;
    try {
      return JSON.parse(raw);
    } catch {
      return Symbol.for('invalid');
    }
  };
  return wizardOptionsSchema.safeParse({
    kind: params.get('kind') ?? undefined,
    fileName: params.get('fileName') ?? undefined,
    mapping: json('mapping'),
    units: json('units'),
    methodTable: json('methodTable'),
    onChange: params.get('onChange') ?? undefined,
    prefer: params.get('prefer') ?? undefined,
    createMissing: params.get('createMissing') === null ? undefined : params.get('createMissing') === 'true',
  });
}
