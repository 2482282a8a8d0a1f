import type { ThreadView } from '@/db/queries/comments';
import { listSubjectThreads } from '@/db/queries/comments';
import { DiscussButton } from '@/app/(app)/w/[workspace]/_discussion/discuss-button';
import type { DiscussionPermissions } from '@/app/(app)/w/[workspace]/_discussion/thread-panel';
import { Panel } from '@/components/ui/panel';

/** Subject id of a material's calculations under one method (the format comments.ts and thread-url.ts read). */
export const calculationSetId = (materialId: string, methodId: string) => `${materialId}|${methodId}`;

/** Threads on the material and on each method's calculation set, keyed by subject id. */
export async function loadMaterialThreads(workspaceId: string, materialId: string, methodIds: string[]): Promise<Map<string, ThreadView[]>> {
  const [own, ...sets] = await Promise.all([
    listSubjectThreads(workspaceId, 'material', materialId),
    ...methodIds.map((methodId) => listSubjectThreads(workspaceId, 'calculation-set', calculationSetId(materialId, methodId))),
  ]);
  return new Map([[materialId, own], ...methodIds.map((methodId, i) => [calculationSetId(materialId, methodId), sets[i]] as const)]);
}

/** "Discuss" for the material itself and for each method's calculations of it; the thread links land on #discussion. */
export function MaterialDiscussion({
  workspaceId,
  materialId,
  materialName,
  methods,
  threads,
  can,
}: {
  workspaceId: string;
  materialId: string;
  materialName: string;
  methods: Array<{ methodId: string; methodLabel: string }>;
  threads: Map<string, ThreadView[]>;
  can: DiscussionPermissions;
}) {
  const rows = [
    { key: materialId, label: 'This material', subject: { kind: 'material' as const, id: materialId }, title: materialName },
    ...methods.map((m) => {
      const id = calculationSetId(materialId, m.methodId);
      return { key: id, label: `${m.methodLabel} calculations`, subject: { kind: 'calculation-set' as const, id }, title: `${materialName} · ${m.methodLabel} calculations` };
    }),
  ];
  return (
    <div id="discussion">
      <Panel title="Discussion">
        <ul className="space-y-2 text-sm" data-testid="material-discussion">
          {rows.map((r) => (
            <li key={r.key} className="flex flex-wrap items-start gap-3">
              <span className="w-48 shrink-0 pt-0.5 text-ink-muted">{r.label}</span>
              <DiscussButton workspaceId={workspaceId} subject={r.subject} title={r.title} threads={threads.get(r.key) ?? []} can={can} />
            </li>
          ))}
        </ul>
      </Panel>
    </div>
  );
}
