import { z } from 'zod';
import { materialInputSchema } from '@/lib/catalog/material-schema';
import { optionalText, reasonField, workspaceIdField } from '@/lib/catalog/fields';

export const createMaterialSchema = materialInputSchema.extend({ workspaceId: workspaceIdField });
export const updateMaterialSchema = materialInputSchema.extend({ workspaceId: workspaceIdField, id: z.string().min(1) });
export const retractMaterialSchema = z.object({ workspaceId: workspaceIdField, id: z.string().min(1), reason: reasonField });
export const restoreMaterialSchema = z.object({ workspaceId: workspaceIdField, id: z.string().min(1), reason: optionalText(500) });
