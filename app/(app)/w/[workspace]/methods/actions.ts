'use server';
import { revalidatePath } from 'next/cache';
import { scheduleRecomputeForWorkspace } from '@/lib/services/benchmarks/recompute-queue';
import { workspaceAction } from '@/lib/action';
import { conflictAsFieldError } from '@/lib/catalog/action-state';
import { createMethod, restoreMethod, retractMethod, updateMethod } from '@/db/queries/methods';
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
    scheduleRecomputeForWorkspace(ctx.workspace.id, { trigger: 'data-change', userId: ctx.user.id });
    refresh(ctx.workspace.slug, id);
    return { ok: true, message: `Method ${input.label} saved.`, data: { id } };
  } catch (e) {
    return conflictAsFieldError(e);
  }
});

export const retractMethodAction = workspaceAction('methods:retract', retractMethodSchema, async ({ id, reason }, ctx) => {
  await retractMethod(ctx.workspace.id, { userId: ctx.user.id }, id, reason);
  scheduleRecomputeForWorkspace(ctx.workspace.id, { trigger: 'data-change', userId: ctx.user.id });
  refresh(ctx.workspace.slug, id);
  return { ok: true, message: 'Method retracted.', data: { id } };
});

export const restoreMethodAction = workspaceAction('methods:retract', restoreMethodSchema, async ({ id, reason }, ctx) => {
  await restoreMethod(ctx.workspace.id, { userId: ctx.user.id }, id, reason ?? null);
  scheduleRecomputeForWorkspace(ctx.workspace.id, { trigger: 'data-change', userId: ctx.user.id });
  refresh(ctx.workspace.slug, id);
  return { ok: true, message: 'Method restored.', data: { id } };
});
