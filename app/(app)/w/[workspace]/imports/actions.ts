'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { undoImport } from '@/db/queries/imports';
import { scheduleRecomputeForWorkspace } from '@/lib/benchmark/recompute-queue';
import { undoImportSchema } from './schemas';

/** Retracts every row of an import with the reason, marks it undone, audits it — one transaction. */
export const undoImportAction = workspaceAction('imports:undo', undoImportSchema, async (input, ctx) => {
  const { retracted } = await undoImport(ctx.workspace.id, input.importId, ctx.user.id, input.reason);
  if (retracted > 0) scheduleRecomputeForWorkspace(ctx.workspace.id, { trigger: 'import-undone', importId: input.importId, userId: ctx.user.id });
  revalidatePath(`/w/${ctx.workspace.slug}/imports`);
  revalidatePath(`/w/${ctx.workspace.slug}/imports/${input.importId}`);
  return { ok: true, message: `Import undone: ${retracted.toLocaleString('en')} rows retracted.` };
});
