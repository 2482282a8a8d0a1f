import { createMethod } from '@/db/queries/methods';
import { createRoute } from '../_lib/catalog-writes';
import { methodSpec } from '../_lib/catalog-specs';
import { listMethods } from '@/db/queries/methods';
import { catalogPage } from '@/lib/api/catalog-page';
import { listRoute } from '@/lib/api/resources';
import { methodSummarySchema } from '@/lib/api/schemas';

export const GET = listRoute('methods:read', methodSummarySchema, (workspaceId, page) => listMethods(workspaceId, catalogPage(page)));

/** POST /api/v1/methods — one method (201 + Location); bulk: POST /imports?kind=methods. */
export const POST = createRoute('methods:create', methodSpec, createMethod);
