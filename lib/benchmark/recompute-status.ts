/** The JSON of the benchmark status route: the recomputation state and the latest stored revision. */
export interface RecomputeStatus {
  state: 'idle' | 'queued' | 'running';
  computing: boolean;
  latestRevision: { number: number; createdAt: string } | null;
}
