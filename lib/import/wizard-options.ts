import { z } from 'zod';
import { ENTROPY_UNITS, FREQUENCY_UNITS } from '@/lib/science/units';
import { IMPORTABLE_KINDS } from './columns';
import { CATALOG_KINDS } from './catalog-columns';

/** What the wizard sends beside the file bytes (as query parameters): kind, file name, the corrected mapping, file-wide units. */
export const wizardOptionsSchema = z.object({
  kind: z.enum([...IMPORTABLE_KINDS, ...CATALOG_KINDS], 'Choose measurements, calculations, materials, methods or sources.'),
  /** Catalogue kinds: update stored records a row changes (curator or owner), instead of refusing the file. */
  onChange: z.enum(['refuse', 'update']).optional(),
  /** Materials with a structure column: typed or structure values where they disagree. */
  prefer: z.enum(['typed', 'structure']).optional(),
  /** Calculations: create missing materials and methods from the rows' catalogue columns. */
  createMissing: z.boolean().optional(),
  fileName: z.string().max(255).optional(),
  mapping: z.record(z.string(), z.string().nullable()).optional(),
  units: z
    .object({
      frequency: z.enum(FREQUENCY_UNITS as [string, ...string[]]).optional(),
      entropy: z.enum(ENTROPY_UNITS as [string, ...string[]]).optional(),
    })
    .optional(),
});

export type WizardOptions = z.infer<typeof wizardOptionsSchema>;

/** Encodes the options into the query string of the upload URL. */
export function wizardQuery(options: WizardOptions): string {
  const q = new URLSearchParams({ kind: options.kind });
  if (options.fileName) q.set('fileName', options.fileName);
  if (options.mapping) q.set('mapping', JSON.stringify(options.mapping));
  if (options.units) q.set('units', JSON.stringify(options.units));
  if (options.onChange) q.set('onChange', options.onChange);
  if (options.prefer) q.set('prefer', options.prefer);
  if (options.createMissing) q.set('createMissing', 'true');
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
    onChange: params.get('onChange') ?? undefined,
    prefer: params.get('prefer') ?? undefined,
    createMissing: params.get('createMissing') === null ? undefined : params.get('createMissing') === 'true',
  });
}
