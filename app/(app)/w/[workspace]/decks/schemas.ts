import { z } from 'zod';
import { VIEW_KINDS, viewFiltersSchema } from '@/lib/decks/view-kinds';

const blank = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);
const title = z.string().trim().min(1, 'Give the deck a title.').max(120, 'At most 120 characters.');

export const createDeckSchema = z.object({ workspaceId: z.string().min(1), title });

export const retitleDeckSchema = z.object({ workspaceId: z.string().min(1), deckId: z.string().min(1), title });

const filtersJson = z.preprocess(
  (v) => {
    if (v === undefined || v === '') return {};
    if (typeof v !== 'string') return v;
    try {
      return JSON.parse(v);
    } catch {
      return v;
    }
  },
  viewFiltersSchema,
);

export const addToDeckSchema = z
  .object({
    workspaceId: z.string().min(1),
    deckId: z.preprocess(blank, z.string().min(1).optional()),
    newDeckTitle: z.preprocess(blank, title.optional()),
    viewKind: z.enum(VIEW_KINDS, 'Choose what the view shows.'),
    benchmarkId: z.preprocess(blank, z.string().min(1).optional()),
    revisionNumber: z.preprocess(blank, z.coerce.number().int().positive().optional()),
    filters: filtersJson,
    title: z.preprocess(blank, z.string().trim().max(160, 'At most 160 characters.').optional()),
    note: z.preprocess(blank, z.string().trim().max(2000, 'At most 2000 characters.').optional()),
  })
  .refine((v) => v.deckId || v.newDeckTitle, { path: ['deckId'], message: 'Choose a deck or give the new one a title.' });

export const viewIdSchema = z.object({ workspaceId: z.string().min(1), viewId: z.string().min(1) });

export const moveViewSchema = viewIdSchema.extend({ direction: z.enum(['up', 'down']) });

export const updateViewSchema = viewIdSchema.extend({
  title: z.preprocess(blank, z.string().trim().max(160, 'At most 160 characters.').optional()),
  note: z.preprocess(blank, z.string().trim().max(2000, 'At most 2000 characters.').optional()),
});

export const listDecksSchema = z.object({ workspaceId: z.string().min(1) });
