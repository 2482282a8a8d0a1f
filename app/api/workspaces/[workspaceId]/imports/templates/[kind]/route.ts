import { z } from 'zod';
import { AppError } from '@/lib/errors';
import { workspaceRoute } from '@/lib/route';
import { isImportableKind } from '@/lib/import/columns';
import { isCatalogKind } from '@/lib/import/catalog-columns';
import { templateCsv, templateFileName } from '@/lib/import/templates';
import { DOS_TEMPLATE_FILE_NAME, dosTemplateCsv } from '@/lib/import/dos-template';

/** The CSV template of a kind (the same text as data/templates/<kind>-template.csv). */
export const GET = workspaceRoute('imports:read', z.object({ workspaceId: z.string().min(1), kind: z.string().max(40) }), async (_request, _ctx, params) => {
  const kind = params.kind.replace(/\.csv$/, '');
  if (kind === 'dos') {
    return new Response(dosTemplateCsv(), {
      headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${DOS_TEMPLATE_FILE_NAME}"` },
    });
  }
  if (!isImportableKind(kind) && !isCatalogKind(kind)) throw new AppError('not-found', 'Templates exist for measurements, calculations, dos, materials, methods and sources.');
  return new Response(templateCsv(kind), {
    headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${templateFileName(kind)}"` },
  });
});
