import { z } from 'zod';
import { workspaceRoute } from '@/lib/route';
import { loadImportReferences } from '@/db/queries/imports';
import { listAtomsInCell } from '@/db/queries/dos-import';

/** The handles a file may use (material names, source cite keys, method labels), so the browser can validate before upload. */
export const GET = workspaceRoute('imports:create', z.object({ workspaceId: z.string().min(1) }), async (_request, ctx) => {
  const [refs, atomsInCell] = await Promise.all([loadImportReferences(ctx.workspace.id), listAtomsInCell(ctx.workspace.id)]);
  return Response.json({
    materials: [...refs.materials].map(([name, m]) => ({ name, id: m.id, atomsPerFormulaUnit: m.atomsPerFormulaUnit, atomsInCell: atomsInCell.get(m.id) ?? null, ...(m.elements ? { elements: m.elements } : {}) })),
    sources: [...refs.sources].map(([citeKey, id]) => ({ citeKey, id })),
    methods: [...refs.methods].map(([label, id]) => ({ label, id })),
  });
});
