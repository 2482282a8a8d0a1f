'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { conflictAsFieldError } from '@/lib/action-state';
import { createMethod } from '@/db/queries/methods';
import { restoreMethod, retractMethod, updateMethod } from '@/lib/services/catalog/changes';
import { createMethodSchema, restoreMethodSchema, retractMethodSchema, updateMethodSchema } from './schemas';

function refresh(slug: string, id?: string) {
  revalidatePath(`/w/${slug}/methods`);
  if (id) revalidatePath(`/w/${slug}/methods/${id}`);
}

export const createMethodAction = workspaceAction('methods:create', createMethodSchema, async ({ workspaceId: _w, ...input }, ctx) => {
  try {
    const id = await createMethod(ctx.workspace.id, { userId: ctx.user.id }, input);
    refresh(ctx.workspace.slug, id);
    return { ok: true, message: `Method ${input.label} created.`, data: { id } };
  } catch (e) {
    return conflictAsFieldError(e);
  }
});

export const updateMethodAction = workspaceAction('methods:update', updateMethodSchema, async ({ workspaceId: _w, id, ...input }, ctx) => {
  try {
    await updateMethod(ctx.workspace.id, { userId: ctx.user.id }, id, input);
    refresh(ctx.workspace.slug, id);
    return { ok: true, message: `Method ${input.label} saved.`, data: { id } };
  } catch (e) {
    return conflictAsFieldError(e);
  }
});

export const retractMethodAction = workspaceAction('methods:retract', retractMethodSchema, async ({ id, reason }, ctx) => {
  await retractMethod(ctx.workspace.id, { userId: ctx.user.id }, id, reason);
  refresh(ctx.workspace.slug, id);
  return { ok: true, message: 'Method retracted.', data: { id } };
});

export const restoreMethodAction = workspaceAction('methods:retract', restoreMethodSchema, async ({ id, reason }, ctx) => {
  await restoreMethod(ctx.workspace.id, { userId: ctx.user.id }, id, reason ?? null);
  refresh(ctx.workspace.slug, id);
  return { ok: true, message: 'Method restored.', data: { id } };
});
