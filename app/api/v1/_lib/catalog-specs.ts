import 'server-only';
import { getMaterial } from '@/db/queries/materials';
import { getMethod } from '@/db/queries/methods';
import { getSource } from '@/db/queries/sources';
import { materialInputSchema } from '@/lib/catalog/material-schema';
import { methodInputSchema } from '@/lib/catalog/method-schema';
import { sourceInputSchema } from '@/lib/catalog/source-schema';
import { materialSchema, methodSchema, sourceSchema } from '@/lib/api/schemas';
import { sourceForApi } from '@/lib/api/serialize';

type Row<F extends (...a: never[]) => Promise<unknown>> = NonNullable<Awaited<ReturnType<F>>>;

const pick = (row: Record<string, unknown>, keys: readonly string[]) => Object.fromEntries(keys.map((k) => [k, row[k] ?? null]));

export const MATERIAL_FIELDS = ['name', 'displayName', 'formula', 'spaceGroup', 'atomsInCell', 'externalId', 'tags', 'thermalExpansionPerK', 'bulkModulusGpa', 'molarVolumeCm3'] as const;
export const METHOD_FIELDS = ['label', 'functional', 'dispersion', 'pseudopotential', 'cutoffEv', 'kGrid', 'qGrid', 'smearing', 'approach', 'nonAnalyticCorrection', 'notes'] as const;
export const SOURCE_FIELDS = [
  'kind', 'citeKey', 'doi', 'title', 'authors', 'editors', 'year', 'venue', 'volume', 'issue', 'pages', 'articleNumber',
  'publisher', 'url', 'accessedOn', 'notebookRef', 'instrument', 'operator', 'recordedOn', 'note',
] as const;

export const materialSpec = {
  what: 'material',
  plural: 'materials',
  input: materialInputSchema,
  fields: MATERIAL_FIELDS,
  output: materialSchema,
  read: getMaterial,
  serialize: (row: Row<typeof getMaterial>) => row,
  toInput: (row: Row<typeof getMaterial>) => pick(row as unknown as Record<string, unknown>, MATERIAL_FIELDS),
};

export const methodSpec = {
  what: 'method',
  plural: 'methods',
  input: methodInputSchema,
  fields: METHOD_FIELDS,
  output: methodSchema,
  read: getMethod,
  serialize: (row: Row<typeof getMethod>) => row,
  toInput: (row: Row<typeof getMethod>) => pick(row as unknown as Record<string, unknown>, METHOD_FIELDS),
};

export const sourceSpec = {
  what: 'source',
  plural: 'sources',
  input: sourceInputSchema,
  fields: SOURCE_FIELDS,
  output: sourceSchema,
  read: getSource,
  serialize: (row: Row<typeof getSource>) => sourceForApi(row),
  toInput: (row: Row<typeof getSource>) => ({
    ...pick(row as unknown as Record<string, unknown>, SOURCE_FIELDS),
    authors: row.authorList ?? [],
    editors: row.editorList ?? [],
  }),
};
