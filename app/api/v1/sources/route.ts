import { createSource } from '@/db/queries/sources';
import { createRoute } from '../_lib/catalog-writes';
import { sourceSpec } from '../_lib/catalog-specs';
import { listSources } from '@/db/queries/sources';
import { catalogPage } from '@/lib/api/catalog-page';
import { listRoute } from '@/lib/api/resources';
import { sourceSummarySchema } from '@/lib/api/schemas';
import { sourceForApi } from '@/lib/api/serialize';

export const GET = listRoute('sources:read', sourceSummarySchema, async (workspaceId, page) => {
  const list = await listSources(workspaceId, catalogPage(page));
  return { ...list, rows: list.rows.map(sourceForApi) };
});

/** POST /api/v1/sources — one source (201 + Location); bulk: POST /imports?kind=sources. */
export const POST = createRoute('sources:create', sourceSpec, createSource);
