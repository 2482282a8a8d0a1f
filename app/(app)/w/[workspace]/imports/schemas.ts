import { z } from 'zod';

export const undoImportSchema = z.object({
  workspaceId: z.string().min(1),
  importId: z.string().min(1),
  reason: z.string().trim().min(3, 'Say why the import is undone (at least 3 characters).').max(500, 'At most 500 characters.'),
});
