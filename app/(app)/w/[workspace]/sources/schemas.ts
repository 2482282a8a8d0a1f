import { z } from 'zod';
import { sourceInputSchema } from '@/lib/catalog/source-schema';
import { optionalText, reasonField, workspaceIdField } from '@/lib/catalog/fields';

export const createSourceSchema = sourceInputSchema.safeExtend({ workspaceId: workspaceIdField });
export const updateSourceSchema = sourceInputSchema.safeExtend({ workspaceId: workspaceIdField, id: z.string().min(1) });
export const retractSourceSchema = z.object({ workspaceId: workspaceIdField, id: z.string().min(1), reason: reasonField });
export const restoreSourceSchema = z.object({ workspaceId: workspaceIdField, id: z.string().min(1), reason: optionalText(500) });

/** Server actions take at most 1 MB; a .bib of that size holds thousands of entries. */
export const MAX_BIBTEX_CHARS = 900_000;
export const importBibtexSchema = z.object({
  workspaceId: workspaceIdField,
  bibtex: z.string('Paste BibTeX or choose a .bib file.').trim().min(1, 'Paste BibTeX or choose a .bib file.').max(MAX_BIBTEX_CHARS, 'The BibTeX text is too long (at most 900 000 characters); split the file.'),
});
