import { z } from 'zod';
import { TOKEN_ROLES } from '@/db/schema/workspace';

export const createTokenSchema = z.object({
  workspaceId: z.string().min(1),
  name: z.string().trim().min(1, 'Give the token a name, e.g. the pipeline that uses it.').max(80, 'At most 80 characters.'),
  role: z.enum(TOKEN_ROLES, 'Choose a role.'),
  expiresInDays: z.preprocess((v) => (v === '' || v === undefined ? undefined : v), z.coerce.number().int().min(1, 'At least 1 day.').max(3650, 'At most 3650 days.').optional()),
});

export const revokeTokenSchema = z.object({ workspaceId: z.string().min(1), tokenId: z.string().min(1) });
