import { updateSource } from '@/lib/services/catalog/changes';
import { patchRoute } from '../../_lib/catalog-writes';
import { sourceSpec } from '../../_lib/catalog-specs';
import { getSource } from '@/db/queries/sources';
import { getRoute } from '@/lib/api/resources';
import { sourceSchema } from '@/lib/api/schemas';
import { sourceForApi } from '@/lib/api/serialize';

export const GET = getRoute('sources:read', sourceSchema, 'source', async (workspaceId, id) => {
  const row = await getSource(workspaceId, id);
  return row && sourceForApi(row);
});

/** PATCH /api/v1/sources/{id} — the fields to change (null clears one); the whole is validated again. */
export const PATCH = patchRoute('sources:update', sourceSpec, updateSource);
