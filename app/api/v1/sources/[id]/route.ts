import { getSource } from '@/db/queries/sources';
import { getRoute } from '@/lib/api/resources';
import { sourceSchema } from '@/lib/api/schemas';
import { sourceForApi } from '@/lib/api/serialize';

export const GET = getRoute('sources:read', sourceSchema, 'source', async (workspaceId, id) => {
  const row = await getSource(workspaceId, id);
  return row && sourceForApi(row);
});
