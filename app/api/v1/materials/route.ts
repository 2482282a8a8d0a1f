import { listMaterials } from '@/db/queries/materials';
import { catalogPage } from '@/lib/api/catalog-page';
import { listRoute } from '@/lib/api/resources';
import { materialSummarySchema } from '@/lib/api/schemas';

export const GET = listRoute('materials:read', materialSummarySchema, (workspaceId, page) => listMaterials(workspaceId, catalogPage(page)));
