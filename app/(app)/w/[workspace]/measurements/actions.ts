'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { AppError } from '@/lib/errors';
import { roleCan } from '@/lib/permissions';
import { isImportRefusal } from '@/lib/import/errors';
import { ENTRY_NOUN, entryFieldErrors, singleEntrySchema } from '@/lib/import/single-entry';
import { commitSingleEntry } from '@/lib/services/imports/single-entry';

/** One measured peak (or entropy) or one computed mode, saved as a one-row import. */
export const createSingleEntryAction = workspaceAction('imports:create', singleEntrySchema, async (input, ctx) => {
  const noun = ENTRY_NOUN[input.kind];
  if (!roleCan(ctx.role, input.kind === 'measurements' ? 'measurements:create' : 'calculations:create')) {
    throw new AppError('forbidden', `Your role (${ctx.role}) does not allow adding a ${noun}.`);
  }
  try {
    const outcome = await commitSingleEntry(ctx.workspace.id, { userId: ctx.user.id, tokenId: null }, input);
    revalidatePath(`/w/${ctx.workspace.slug}/${input.kind}`);
    revalidatePath(`/w/${ctx.workspace.slug}/imports`);
    const duplicate = outcome.insertedCount === 0;
    return {
      ok: true,
      message: duplicate ? `Nothing new was stored: an identical ${noun} is already in the workspace.` : `The ${noun} is saved.`,
      data: { importId: outcome.importId, duplicate },
    };
  } catch (e) {
    if (!isImportRefusal(e)) throw e;
    const { fieldErrors, general } = entryFieldErrors(e.errors);
    return { ok: false, code: 'unprocessable', message: ['Nothing was saved: check the highlighted fields.', ...general].join(' '), fieldErrors };
  }
});
