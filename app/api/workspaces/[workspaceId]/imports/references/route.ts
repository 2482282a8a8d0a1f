import { z } from 'zod';
import { workspaceRoute } from '@/lib/route';
import { loadImportReferences } from '@/db/queries/imports';

/** The handles a file may use (material names, source cite keys, method labels), so the browser can validate before upload. */
export const GET = workspaceRoute('imports:create', z.object({ workspaceId: z.string().min(1) }), async (_request, ctx) => {
  const refs = await loadImportReferences(ctx.workspace.id);
  return Response.json({
    materials: [...refs.materials].map(([name, m]) => ({ name, id: m.id, atomsPerFormulaUnit: m.atomsPerFormulaUnit })),
    sources: [...refs.sources].map(([citeKey, id]) => ({ citeKey, id })),
    methods: [...refs.methods].map(([label, id]) => ({ label, id })),
  });
});
