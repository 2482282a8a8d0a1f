'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { conflictAsFieldError } from '@/lib/action-state';
import { createMaterial } from '@/db/queries/materials';
import { restoreMaterial, retractMaterial, updateMaterial } from '@/lib/services/catalog/changes';
import { createMaterialSchema, restoreMaterialSchema, retractMaterialSchema, updateMaterialSchema } from './schemas';

function refresh(slug: string, id?: string) {
  revalidatePath(`/w/${slug}/materials`);
  if (id) revalidatePath(`/w/${slug}/materials/${id}`);
}

export const createMaterialAction = workspaceAction('materials:create', createMaterialSchema, async ({ workspaceId: _w, ...input }, ctx) => {
  try {
    const id = await createMaterial(ctx.workspace.id, { userId: ctx.user.id }, input);
    refresh(ctx.workspace.slug, id);
    return { ok: true, message: `Material ${input.name} created.`, data: { id } };
  } catch (e) {
    return conflictAsFieldError(e);
  }
});

export const updateMaterialAction = workspaceAction('materials:update', updateMaterialSchema, async ({ workspaceId: _w, id, ...input }, ctx) => {
  try {
    await updateMaterial(ctx.workspace.id, { userId: ctx.user.id }, id, input);
    refresh(ctx.workspace.slug, id);
    return { ok: true, message: `Material ${input.name} saved.`, data: { id } };
  } catch (e) {
    return conflictAsFieldError(e);
  }
});

export const retractMaterialAction = workspaceAction('materials:retract', retractMaterialSchema, async ({ id, reason }, ctx) => {
  await retractMaterial(ctx.workspace.id, { userId: ctx.user.id }, id, reason);
  refresh(ctx.workspace.slug, id);
  return { ok: true, message: 'Material retracted. Its values stay in the database, hidden from lists and benchmarks.', data: { id } };
});

export const restoreMaterialAction = workspaceAction('materials:retract', restoreMaterialSchema, async ({ id, reason }, ctx) => {
  try {
    await restoreMaterial(ctx.workspace.id, { userId: ctx.user.id }, id, reason ?? null);
    refresh(ctx.workspace.slug, id);
    return { ok: true, message: 'Material restored.', data: { id } };
  } catch (e) {
    return conflictAsFieldError(e);
  }
});
