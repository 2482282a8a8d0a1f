import { updateMaterial } from '@/lib/services/catalog/changes';
import { patchRoute } from '../../_lib/catalog-writes';
import { materialSpec } from '../../_lib/catalog-specs';
import { getMaterial } from '@/db/queries/materials';
import { getRoute } from '@/lib/api/resources';
import { materialSchema } from '@/lib/api/schemas';

export const GET = getRoute('materials:read', materialSchema, 'material', getMaterial);

/** PATCH /api/v1/materials/{id} — the fields to change (null clears one); the whole is validated again. */
export const PATCH = patchRoute('materials:update', materialSpec, updateMaterial);
