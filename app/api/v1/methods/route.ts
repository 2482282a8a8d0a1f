import { listMethods } from '@/db/queries/methods';
import { catalogPage } from '@/lib/api/catalog-page';
import { listRoute } from '@/lib/api/resources';
import { methodSummarySchema } from '@/lib/api/schemas';

export const GET = listRoute('methods:read', methodSummarySchema, (workspaceId, page) => listMethods(workspaceId, catalogPage(page)));
