import { z } from 'zod';
import { sourceInputSchema } from '@/lib/catalog/source-schema';
import { optionalText, reasonField, workspaceIdField } from '@/lib/catalog/fields';
import { IMPORT_FORMATS } from '@/lib/citations/import';

export const createSourceSchema = sourceInputSchema.safeExtend({ workspaceId: workspaceIdField });
export const updateSourceSchema = sourceInputSchema.safeExtend({ workspaceId: workspaceIdField, id: z.string().min(1) });
export const retractSourceSchema = z.object({ workspaceId: workspaceIdField, id: z.string().min(1), reason: reasonField });
export const restoreSourceSchema = z.object({ workspaceId: workspaceIdField, id: z.string().min(1), reason: optionalText(500) });

/** Server actions take at most 1 MB; a reference file of that size holds thousands of entries. */
export const MAX_REFERENCES_CHARS = 900_000;
const PASTE = 'Paste BibTeX, RIS or CSL-JSON, or choose a file.';
export const importReferencesSchema = z.object({
  workspaceId: workspaceIdField,
  format: z.enum(['auto', ...IMPORT_FORMATS], 'Choose BibTeX, RIS, CSL-JSON or “recognise it”.').default('auto'),
  references: z.string(PASTE).trim().min(1, PASTE).max(MAX_REFERENCES_CHARS, 'The text is too long (at most 900 000 characters); split the file.'),
});
export const mergeSourcesSchema = z.object({ workspaceId: workspaceIdField, keepId: z.string().min(1), mergeId: z.string().min(1), reason: optionalText(500) });
