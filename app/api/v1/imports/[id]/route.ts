import { getImport } from '@/db/queries/imports';
import { getRoute } from '@/lib/api/resources';
import { importSummarySchema } from '@/lib/api/schemas';

export const GET = getRoute('imports:read', importSummarySchema, 'import', getImport);
