import { createMaterial } from '@/db/queries/materials';
import { createRoute } from '../_lib/catalog-writes';
import { materialSpec } from '../_lib/catalog-specs';
import { listMaterials } from '@/db/queries/materials';
import { catalogPage } from '@/lib/api/catalog-page';
import { listRoute } from '@/lib/api/resources';
import { materialSummarySchema } from '@/lib/api/schemas';

export const GET = listRoute('materials:read', materialSummarySchema, (workspaceId, page) => listMaterials(workspaceId, catalogPage(page)));

/** POST /api/v1/materials — one material (201 + Location); bulk: POST /imports?kind=materials. */
export const POST = createRoute('materials:create', materialSpec, createMaterial);
