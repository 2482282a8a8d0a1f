import { updateMethod } from '@/lib/services/catalog/changes';
import { patchRoute } from '../../_lib/catalog-writes';
import { methodSpec } from '../../_lib/catalog-specs';
import { getMethod } from '@/db/queries/methods';
import { getRoute } from '@/lib/api/resources';
import { methodSchema } from '@/lib/api/schemas';

export const GET = getRoute('methods:read', methodSchema, 'method', getMethod);

/** PATCH /api/v1/methods/{id} — the fields to change (null clears one); the whole is validated again. */
export const PATCH = patchRoute('methods:update', methodSpec, updateMethod);
