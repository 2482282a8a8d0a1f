'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { roleCan } from '@/lib/permissions';
import { count } from '@/lib/format';
import { undoVerdict } from '@/lib/import/undo-rule';
import { undoImport } from '@/lib/services/imports/undo';
import { undoImportSchema } from './schemas';

/**
 * Retracts every row of an import with the reason, marks it undone, audits it — one transaction.
 * A curator or owner may undo any import; whoever made it, their own within the undo window (lib/import/undo-rule).
 */
export const undoImportAction = workspaceAction('imports:create', undoImportSchema, async (input, ctx) => {
  const canUndoAny = roleCan(ctx.role, 'imports:undo');
  const { retracted, retractedRecords = 0, restoredRecords = 0 } = await undoImport(ctx.workspace.id, input.importId, ctx.user.id, input.reason, (batch) => {
    const verdict = undoVerdict({ canUndoAny, canImport: true, userId: ctx.user.id, batch });
    return verdict.allowed ? null : verdict.reason;
  });
  revalidatePath(`/w/${ctx.workspace.slug}/imports`);
  revalidatePath(`/w/${ctx.workspace.slug}/imports/${input.importId}`);
  const records = [
    retractedRecords ? `${count(retractedRecords)} created ${retractedRecords === 1 ? 'record' : 'records'} retracted` : null,
    restoredRecords ? `${count(restoredRecords)} updated ${restoredRecords === 1 ? 'record' : 'records'} restored` : null,
  ].filter(Boolean);
  return { ok: true, message: `Import undone: ${count(retracted)} ${retracted === 1 ? 'row' : 'rows'} retracted${records.length ? `; ${records.join('; ')}` : ''}.` };
});
