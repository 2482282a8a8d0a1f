import { z } from 'zod';
import { workspaceRoute } from '@/lib/route';
import { AppError } from '@/lib/errors';
import { getDeck } from '@/db/queries/decks';
import { requireRevision } from '@/db/queries/revisions';
import { getMaterialValues } from '@/db/queries/material-values';
import { listSourcesForExport } from '@/db/queries/sources';
import { exportFormatParam, referenceFileResponse } from '@/lib/citations/export-response';

const params = z.object({ workspaceId: z.string().min(1), deckId: z.string().min(1) });

/** GET …/decks/:id/sources?format=…: the sources behind every view of a deck (the pairs of each pinned revision, the values of each material). */
export const GET = workspaceRoute('decks:read', params, async (request, ctx, { deckId }) => {
  const format = exportFormatParam(request);
  const deck = await getDeck(ctx.workspace.id, deckId);
  if (!deck) throw new AppError('not-found', 'No such deck in this workspace.');
  const ids = new Set<string>();
  for (const view of deck.views) {
    if (view.benchmark && view.revision) {
      const revision = await requireRevision(ctx.workspace.id, view.benchmark.id, view.revision.number);
      for (const p of revision.statistics.pairs) p.sourceIds.forEach((id) => ids.add(id));
    } else if (view.material) {
      const values = await getMaterialValues(ctx.workspace.id, view.material.id);
      [...values.peaks, ...values.entropies, ...values.methods.flatMap((m) => [...m.modes, ...m.entropies])].forEach((v) => ids.add(v.sourceId));
    }
  }
  const sources = ids.size ? await listSourcesForExport(ctx.workspace.id, [...ids]) : [];
  return referenceFileResponse(sources, format, `deck-${deckId.slice(0, 8)}-sources`, 'No sources: this deck shows no values.');
});
