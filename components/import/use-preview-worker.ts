'use client';
import { useEffect, useState } from 'react';
import type { WorkerMessage, WorkerRequest } from '@/lib/import/parse-worker';
import type { PreviewResult } from '@/lib/import/preview';
import type { RowError } from '@/lib/import/errors';

export type PreviewState =
  | { status: 'idle' }
  | { status: 'working'; phase: 'reading' | 'parsing'; fraction: number }
  | { status: 'done'; result: PreviewResult }
  | { status: 'refused'; message: string; errors: RowError[] }
  | { status: 'failed'; message: string };

/** Runs the parse worker for the current request; a new request terminates the previous run. */
export function usePreviewWorker(request: WorkerRequest | null): PreviewState {
  const [state, setState] = useState<PreviewState>({ status: 'idle' });
  useEffect(() => {
    if (!request) return;
    const worker = new Worker(new URL('../../lib/import/parse-worker.ts', import.meta.url), { type: 'module' });
    worker.onmessage = (event: MessageEvent<WorkerMessage>) => {
      const m = event.data;
      if (m.type === 'progress') setState({ status: 'working', phase: m.phase, fraction: m.fraction });
      else if (m.type === 'done') setState({ status: 'done', result: m.result });
      else if (m.type === 'refused') setState({ status: 'refused', message: m.message, errors: m.errors });
      else setState({ status: 'failed', message: m.message });
      if (m.type !== 'progress') worker.terminate();
    };
    worker.onerror = (e) => setState({ status: 'failed', message: e.message || 'The file could not be read.' });
    // Reset happens through the worker's first progress message; posting starts the run.
    worker.postMessage(request);
    return () => worker.terminate();
  }, [request]);
  return request ? state : { status: 'idle' };
}
