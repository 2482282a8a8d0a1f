import { getSource } from '@/db/queries/sources';
import { getRoute } from '@/lib/api/resources';
import { sourceSchema } from '@/lib/api/schemas';

export const GET = getRoute('sources:read', sourceSchema, 'source', getSource);
