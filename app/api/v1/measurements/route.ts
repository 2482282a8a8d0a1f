import { listMeasurements } from '@/db/queries/values';
import { listRoute } from '@/lib/api/resources';
import { measurementSchema } from '@/lib/api/schemas';
import { valueFilters } from '@/lib/api/value-filters';

export const GET = listRoute('measurements:read', measurementSchema, (workspaceId, page, request) =>
  listMeasurements(workspaceId, { ...page, ...valueFilters(request) }),
);
