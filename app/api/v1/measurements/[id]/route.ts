import { getMeasurement } from '@/db/queries/values';
import { getRoute } from '@/lib/api/resources';
import { measurementSchema } from '@/lib/api/schemas';

export const GET = getRoute('measurements:read', measurementSchema, 'measurement', getMeasurement);
