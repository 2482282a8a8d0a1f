import { getMaterial } from '@/db/queries/materials';
import { getRoute } from '@/lib/api/resources';
import { materialSchema } from '@/lib/api/schemas';

export const GET = getRoute('materials:read', materialSchema, 'material', getMaterial);
