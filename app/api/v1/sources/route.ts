import { listSources } from '@/db/queries/sources';
import { catalogPage } from '@/lib/api/catalog-page';
import { listRoute } from '@/lib/api/resources';
import { sourceSummarySchema } from '@/lib/api/schemas';
import { sourceForApi } from '@/lib/api/serialize';

export const GET = listRoute('sources:read', sourceSummarySchema, async (workspaceId, page) => {
  const list = await listSources(workspaceId, catalogPage(page));
  return { ...list, rows: list.rows.map(sourceForApi) };
});
