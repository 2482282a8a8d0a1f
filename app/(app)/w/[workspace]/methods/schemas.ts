import { z } from 'zod';
import { methodInputSchema } from '@/lib/catalog/method-schema';
import { optionalText, reasonField, workspaceIdField } from '@/lib/catalog/fields';

export const createMethodSchema = methodInputSchema.extend({ workspaceId: workspaceIdField });
export const updateMethodSchema = methodInputSchema.extend({ workspaceId: workspaceIdField, id: z.string().min(1) });
export const retractMethodSchema = z.object({ workspaceId: workspaceIdField, id: z.string().min(1), reason: reasonField });
export const restoreMethodSchema = z.object({ workspaceId: workspaceIdField, id: z.string().min(1), reason: optionalText(500) });
