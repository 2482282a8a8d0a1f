import { listSources } from '@/db/queries/sources';
import { catalogPage } from '@/lib/api/catalog-page';
import { listRoute } from '@/lib/api/resources';
import { sourceSummarySchema } from '@/lib/api/schemas';

export const GET = listRoute('sources:read', sourceSummarySchema, (workspaceId, page) => listSources(workspaceId, catalogPage(page)));
