import { getMethod } from '@/db/queries/methods';
import { getRoute } from '@/lib/api/resources';
import { methodSchema } from '@/lib/api/schemas';

export const GET = getRoute('methods:read', methodSchema, 'method', getMethod);
