import { listRevisionHistory, importsByIds } from '@/db/queries/revisions';
import { decisionNames } from '@/db/queries/decisions';
import { Panel } from '@/components/ui/panel';
import { RevisionHistory } from './revision-history';

/**
 * The revision history with the imports and decisions behind each revision. It loads on its own, inside a
 * Suspense boundary, so the leaderboard and the rest of the page stream first on a benchmark with a long history.
 */
export async function RevisionHistoryPanel({ workspaceId, benchmarkId, base, current }: { workspaceId: string; benchmarkId: string; base: string; current: number }) {
  const history = await listRevisionHistory(workspaceId, benchmarkId);
  const importIds = [...new Set(history.flatMap((h) => h.cause?.imports.map((i) => i.id) ?? []))];
  const decisionIds = [...new Set(history.flatMap((h) => [...(h.cause?.decisions.added ?? []), ...(h.cause?.decisions.reverted ?? [])]))];
  const [importRows, decisionMap] = await Promise.all([importsByIds(workspaceId, importIds), decisionNames(workspaceId, decisionIds)]);
  const importMap = new Map(importRows.map((r) => [r.id, { fileName: r.fileName, by: r.by, status: r.status }]));
  return (
    <Panel title="Revision history">
      <RevisionHistory history={history} base={base} current={current} imports={importMap} decisions={decisionMap} />
    </Panel>
  );
}

export function RevisionHistoryLoading() {
  return (
    <Panel title="Revision history">
      <p role="status" className="text-sm text-ink-muted">
        Loading the revision history…
      </p>
    </Panel>
  );
}
