'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { conflictAsFieldError } from '@/lib/action-state';
import { describeReferenceError, detectFormat, IMPORT_FORMAT_LABELS, parseReferences } from '@/lib/citations/import';
import { createSource, importSources } from '@/db/queries/sources';
import { mergeSources, restoreSource, retractSource, updateSource } from '@/lib/services/catalog/changes';
import { createSourceSchema, importReferencesSchema, mergeSourcesSchema, restoreSourceSchema, retractSourceSchema, updateSourceSchema } from './schemas';

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
    refresh(ctx.workspace.slug, id);
    return { ok: true, message: `Source ${input.citeKey} saved.`, data: { id } };
  } catch (e) {
    return conflictAsFieldError(e);
  }
});

export const retractSourceAction = workspaceAction('sources:retract', retractSourceSchema, async ({ id, reason }, ctx) => {
  await retractSource(ctx.workspace.id, { userId: ctx.user.id }, id, reason);
  refresh(ctx.workspace.slug, id);
  return { ok: true, message: 'Source retracted. Its cite key stays reserved.', data: { id } };
});

export const restoreSourceAction = workspaceAction('sources:retract', restoreSourceSchema, async ({ id, reason }, ctx) => {
  await restoreSource(ctx.workspace.id, { userId: ctx.user.id }, id, reason ?? null);
  refresh(ctx.workspace.slug, id);
  return { ok: true, message: 'Source restored.', data: { id } };
});

/** Imports every entry of a BibTeX, RIS or CSL-JSON text in one transaction, or nothing when any entry has a problem. */
export const importReferencesAction = workspaceAction('sources:create', importReferencesSchema, async ({ references, format: chosen }, ctx) => {
  const format = chosen === 'auto' ? detectFormat(references) : chosen;
  if (!format) {
    return { ok: false, code: 'unprocessable', message: 'Nothing imported: the text is not BibTeX, RIS or CSL-JSON.', fieldErrors: { references: ['Expected @type{key, …} entries (BibTeX), "TY  - " records (RIS) or a JSON array of CSL items.'] } };
  }
  const parsed = parseReferences(references, format);
  const label = IMPORT_FORMAT_LABELS[format];
  if (parsed.errors.length > 0) {
    const syntax = parsed.errors.some((e) => e.syntax);
    const n = parsed.errors.length;
    const message = syntax ? `Nothing imported: the ${label} text has ${n === 1 ? 'an error' : `${n} errors`}.` : `Nothing imported: ${n} entr${n === 1 ? 'y is' : 'ies are'} refused.`;
    return { ok: false, code: 'unprocessable', message, fieldErrors: { references: parsed.errors.map(describeReferenceError) } };
  }
  const entries = parsed.sources.map((input, i) => ({ input, label: `Entry ${i + 1} (${input.citeKey})${parsed.lines[i] ? `, line ${parsed.lines[i]}` : ''}` }));
  const result = await importSources(ctx.workspace.id, { userId: ctx.user.id }, entries, `${label} import`);
  if (!result.ok) {
    const n = result.refusals.length;
    return { ok: false, code: 'unprocessable', message: `Nothing imported: ${n} entr${n === 1 ? 'y is' : 'ies are'} refused.`, fieldErrors: { references: result.refusals } };
  }
  refresh(ctx.workspace.slug);
  const review = parsed.sources.filter((s) => s.authors.some((a) => a.review)).map((s) => s.citeKey);
  const message =
    `Imported ${result.created.length} source${result.created.length === 1 ? '' : 's'} from ${label}.` +
    (result.existing.length ? ` Already present, not duplicated: ${result.existing.join(', ')}.` : '') +
    (review.length ? ` Author names to review: ${review.join(', ')}.` : '');
  return { ok: true, message, data: { created: result.created, existing: result.existing, format } };
});

/** Curators and owners merge two sources that share a DOI: the values move to the kept one. */
export const mergeSourcesAction = workspaceAction('sources:retract', mergeSourcesSchema, async ({ keepId, mergeId, reason }, ctx) => {
  const { moved } = await mergeSources(ctx.workspace.id, { userId: ctx.user.id }, keepId, mergeId, reason ?? null);
  refresh(ctx.workspace.slug, keepId);
  return { ok: true, message: `Merged: ${moved} value${moved === 1 ? '' : 's'} now cite the kept source.`, data: { keepId, moved } };
});
