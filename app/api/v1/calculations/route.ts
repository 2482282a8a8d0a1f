import { listCalculations } from '@/db/queries/values';
import { listRoute } from '@/lib/api/resources';
import { calculationSchema } from '@/lib/api/schemas';
import { valueFilters } from '@/lib/api/value-filters';

export const GET = listRoute('calculations:read', calculationSchema, (workspaceId, page, request) =>
  listCalculations(workspaceId, { ...page, ...valueFilters(request) }),
);
