'use server';
import { revalidatePath } from 'next/cache';
import { workspaceAction } from '@/lib/action';
import { AppError } from '@/lib/errors';
import { roleCan } from '@/lib/permissions';
import { addView, createDeck, listDecks, moveView, refreshView, removeView, retitleDeck, updateView } from '@/db/queries/decks';
import { addToDeckSchema, createDeckSchema, listDecksSchema, moveViewSchema, retitleDeckSchema, updateViewSchema, viewIdSchema } from './schemas';

function deckPath(slug: string, deckId?: string) {
  return `/w/${slug}/decks${deckId ? `/${deckId}` : ''}`;
}

export const createDeckAction = workspaceAction('decks:create', createDeckSchema, async (input, ctx) => {
  const { id } = await createDeck(ctx.workspace.id, { userId: ctx.user.id }, input.title);
  revalidatePath(deckPath(ctx.workspace.slug));
  return { ok: true, message: 'Deck created.', data: { id, href: deckPath(ctx.workspace.slug, id) } };
});

/** The decks to choose from in "Add to deck". */
export const listDecksAction = workspaceAction('decks:read', listDecksSchema, async (_input, ctx) => {
  const decks = await listDecks(ctx.workspace.id);
  return { ok: true, data: { decks: decks.map((d) => ({ id: d.id, title: d.title, views: d.views })), canCreate: roleCan(ctx.role, 'decks:create') } };
});

export const addToDeckAction = workspaceAction('decks:update', addToDeckSchema, async (input, ctx) => {
  if (!input.deckId && !roleCan(ctx.role, 'decks:create')) throw new AppError('forbidden', `Your role (${ctx.role}) does not allow creating decks.`);
  const added = await addView(ctx.workspace.id, { userId: ctx.user.id }, { ...input, deckId: input.deckId ?? null, newDeckTitle: input.deckId ? null : input.newDeckTitle });
  revalidatePath(deckPath(ctx.workspace.slug, added.deckId));
  const href = deckPath(ctx.workspace.slug, added.deckId);
  return { ok: true, message: `Added as view ${added.position} of the deck.`, data: { ...added, href } };
});

export const retitleDeckAction = workspaceAction('decks:update', retitleDeckSchema, async (input, ctx) => {
  await retitleDeck(ctx.workspace.id, { userId: ctx.user.id }, input.deckId, input.title);
  revalidatePath(deckPath(ctx.workspace.slug, input.deckId));
  return { ok: true, message: 'Title saved.' };
});

export const moveViewAction = workspaceAction('decks:update', moveViewSchema, async (input, ctx) => {
  const { deckId, moved } = await moveView(ctx.workspace.id, input.viewId, input.direction === 'up' ? -1 : 1);
  revalidatePath(deckPath(ctx.workspace.slug, deckId));
  return { ok: true, message: moved ? `Moved ${input.direction}.` : `Already at the ${input.direction === 'up' ? 'top' : 'bottom'}.` };
});

export const updateViewAction = workspaceAction('decks:update', updateViewSchema, async (input, ctx) => {
  const { deckId } = await updateView(ctx.workspace.id, input.viewId, { title: input.title ?? null, note: input.note ?? null });
  revalidatePath(deckPath(ctx.workspace.slug, deckId));
  return { ok: true, message: 'Saved.' };
});

export const refreshViewAction = workspaceAction('decks:update', viewIdSchema, async (input, ctx) => {
  const { deckId, number } = await refreshView(ctx.workspace.id, input.viewId);
  revalidatePath(deckPath(ctx.workspace.slug, deckId));
  return { ok: true, message: `Now showing revision ${number}.` };
});

export const removeViewAction = workspaceAction('decks:update', viewIdSchema, async (input, ctx) => {
  const { deckId } = await removeView(ctx.workspace.id, { userId: ctx.user.id }, input.viewId);
  revalidatePath(deckPath(ctx.workspace.slug, deckId));
  return { ok: true, message: 'View removed from the deck.' };
});
