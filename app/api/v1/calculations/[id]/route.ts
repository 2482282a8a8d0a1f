import { getCalculation } from '@/db/queries/values';
import { getRoute } from '@/lib/api/resources';
import { calculationSchema } from '@/lib/api/schemas';

export const GET = getRoute('calculations:read', calculationSchema, 'calculation', getCalculation);
