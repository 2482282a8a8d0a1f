import { z } from 'zod';
import { WORKSPACE_ROLES } from '@/lib/permissions';

export const inviteSchema = z.object({
  workspaceId: z.string().min(1),
  email: z.email('Enter a valid e-mail address.').transform((v) => v.toLowerCase()),
  role: z.enum(WORKSPACE_ROLES, 'Choose a role.'),
});

export const changeRoleSchema = z.object({
  workspaceId: z.string().min(1),
  memberId: z.string().min(1),
  role: z.enum(WORKSPACE_ROLES, 'Choose a role.'),
});

export const memberSchema = z.object({ workspaceId: z.string().min(1), memberId: z.string().min(1) });
export const invitationSchema = z.object({ workspaceId: z.string().min(1), invitationId: z.string().min(1) });
export const workspaceOnlySchema = z.object({ workspaceId: z.string().min(1) });
