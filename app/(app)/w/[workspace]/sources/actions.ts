'use server';
import { revalidatePath } from 'next/cache';
import { scheduleRecomputeForWorkspace } from '@/lib/benchmark/recompute-queue';
import { workspaceAction } from '@/lib/action';
import { conflictAsFieldError } from '@/lib/catalog/action-state';
import { parseBibtex } from '@/lib/bibtex';
import { createSource, importSources, restoreSource, retractSource, updateSource } from '@/db/queries/sources';
import { createSourceSchema, importBibtexSchema, restoreSourceSchema, retractSourceSchema, updateSourceSchema } from './schemas';

function refresh(slug: string, id?: string) {
  revalidatePath(`/w/${slug}/sources`);
  if (id) revalidatePath(`/w/${slug}/sources/${id}`);
}

export const createSourceAction = workspaceAction('sources:create', createSourceSchema, async ({ workspaceId: _w, ...input }, ctx) => {
  try {
    const id = await createSource(ctx.workspace.id, { userId: ctx.user.id }, input);
    refresh(ctx.workspace.slug, id);
    return { ok: true, message: `Source ${input.citeKey} created.`, data: { id } };
  } catch (e) {
    return conflictAsFieldError(e);
  }
});

export const updateSourceAction = workspaceAction('sources:update', updateSourceSchema, async ({ workspaceId: _w, id, ...input }, ctx) => {
  try {
    await updateSource(ctx.workspace.id, { userId: ctx.user.id }, id, input);
    scheduleRecomputeForWorkspace(ctx.workspace.id, { trigger: 'data-change', userId: ctx.user.id });
    refresh(ctx.workspace.slug, id);
    return { ok: true, message: `Source ${input.citeKey} saved.`, data: { id } };
  } catch (e) {
    return conflictAsFieldError(e);
  }
});

export const retractSourceAction = workspaceAction('sources:retract', retractSourceSchema, async ({ id, reason }, ctx) => {
  await retractSource(ctx.workspace.id, { userId: ctx.user.id }, id, reason);
  scheduleRecomputeForWorkspace(ctx.workspace.id, { trigger: 'data-change', userId: ctx.user.id });
  refresh(ctx.workspace.slug, id);
  return { ok: true, message: 'Source retracted. Its cite key stays reserved.', data: { id } };
});

export const restoreSourceAction = workspaceAction('sources:retract', restoreSourceSchema, async ({ id, reason }, ctx) => {
  await restoreSource(ctx.workspace.id, { userId: ctx.user.id }, id, reason ?? null);
  scheduleRecomputeForWorkspace(ctx.workspace.id, { trigger: 'data-change', userId: ctx.user.id });
  refresh(ctx.workspace.slug, id);
  return { ok: true, message: 'Source restored.', data: { id } };
});

/** Imports every entry of a .bib in one transaction, or nothing when any entry has a problem. */
export const importBibtexAction = workspaceAction('sources:create', importBibtexSchema, async ({ bibtex }, ctx) => {
  const parsed = parseBibtex(bibtex);
  if (parsed.errors.length > 0) {
    const lines = parsed.errors.map((e) => `Entry ${e.entry}${e.citeKey ? ` (${e.citeKey})` : ''}, line ${e.line}: ${e.message}`);
    return { ok: false, code: 'unprocessable', message: `Nothing imported: ${parsed.errors.length} entr${parsed.errors.length === 1 ? 'y has' : 'ies have'} problems.`, fieldErrors: { bibtex: lines } };
  }
  if (parsed.sources.length === 0) {
    return { ok: false, code: 'unprocessable', message: 'No BibTeX entries found.', fieldErrors: { bibtex: ['No @type{key, …} entries in the text.'] } };
  }
  const result = await importSources(ctx.workspace.id, { userId: ctx.user.id }, parsed.sources, 'BibTeX import');
  refresh(ctx.workspace.slug);
  const skipped = [...new Set([...result.existing, ...parsed.repeated])];
  const message =
    `Imported ${result.created.length} source${result.created.length === 1 ? '' : 's'}.` +
    (skipped.length ? ` Already present, not duplicated: ${skipped.join(', ')}.` : '');
  return { ok: true, message, data: { created: result.created, existing: result.existing, repeated: parsed.repeated } };
});
