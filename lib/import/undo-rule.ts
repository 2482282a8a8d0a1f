/**
 * Who may undo an import: a curator or owner at any time; the member who made it
 * (through the wizard, the single-entry form or one of their API tokens) within
 * IMPORTER_UNDO_HOURS of making it, so a contributor can take back their own slip
 * before anyone builds on it.
 */
export const IMPORTER_UNDO_HOURS = 24;
const WINDOW_MS = IMPORTER_UNDO_HOURS * 3600_000;

export const UNDO_RULE = `A curator or owner can undo any import; whoever made an import can undo it themself within ${IMPORTER_UNDO_HOURS} hours.`;

export type UndoVerdict = { allowed: true; as: 'curator'; until?: undefined } | { allowed: true; as: 'importer'; until: Date } | { allowed: false; reason: string };

export function undoVerdict(input: {
  /** The member's role may undo any import (imports:undo). */
  canUndoAny: boolean;
  /** The member's role may import at all (imports:create). */
  canImport: boolean;
  userId: string;
  batch: { createdBy: string | null; createdAt: Date; status: string };
  now?: Date;
}): UndoVerdict {
  const { batch } = input;
  if (batch.status === 'undone') return { allowed: false, reason: 'This import was already undone.' };
  if (input.canUndoAny) return { allowed: true, as: 'curator' };
  const until = new Date(batch.createdAt.getTime() + WINDOW_MS);
  const now = input.now ?? new Date();
  if (input.canImport && batch.createdBy === input.userId) {
    if (now < until) return { allowed: true, as: 'importer', until };
    return { allowed: false, reason: `Your own imports can be undone by you for ${IMPORTER_UNDO_HOURS} hours; this one is older. Ask a curator or owner to undo it.` };
  }
  return { allowed: false, reason: UNDO_RULE };
}
