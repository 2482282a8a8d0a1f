/** The JSON of the benchmark status route: the recomputation state, the last run's error, and the latest stored revision. */
export interface RecomputeStatus {
  state: 'idle' | 'queued' | 'running' | 'failed';
  computing: boolean;
  /** The last recomputation's error: of a failed job, or of one waiting to be retried. */
  error: string | null;
  attempts: number;
  /** When a job waiting after a failure is tried again (ISO time). */
  retryAt: string | null;
  latestRevision: { number: number; createdAt: string } | null;
}
