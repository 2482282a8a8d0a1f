'use client';
import Link from 'next/link';
import type { RowError } from '@/lib/import/errors';
import { Notice } from '@/components/ui/notice';
import { RowErrorTable } from './row-error-table';

export type UploadState<Outcome> =
  | { status: 'idle' }
  | { status: 'sending' }
  | { status: 'done'; outcome: Outcome }
  | { status: 'refused'; message: string; errors?: RowError[]; errorCount?: number; firstImportId?: string };

/** Posts the original file bytes to the workspace's import route; the server re-validates everything. */
export async function uploadImport<Outcome>(workspaceId: string, query: string, file: File): Promise<UploadState<Outcome>> {
  try {
    const res = await fetch(`/api/workspaces/${workspaceId}/imports?${query}`, { method: 'POST', body: file, headers: { 'content-type': 'text/csv' } });
    const body = await res.json();
    // 200: a catalogue import whose rows were all unchanged (nothing written).
    if (res.status === 201 || res.status === 200) return { status: 'done', outcome: body as Outcome };
    return { status: 'refused', message: body.detail ?? `HTTP ${res.status}`, errors: body.errors, errorCount: body.errorCount, firstImportId: body.firstImportId };
  } catch (e) {
    return { status: 'refused', message: `The upload failed: ${(e as Error).message}` };
  }
}

/** The server's refusal: its message, a link to the first import of the same file, and every row error. */
export function UploadRefused({ state, slug }: { state: Extract<UploadState<unknown>, { status: 'refused' }>; slug: string }) {
  return (
    <div className="space-y-2">
      <Notice tone="bad">
        {state.message}
        {state.firstImportId && (
          <>
            {' '}
            <Link href={`/w/${slug}/imports/${state.firstImportId}`}>Open the first import</Link>
          </>
        )}
      </Notice>
      {state.errors && state.errors.length > 0 && <RowErrorTable errors={state.errors} errorCount={state.errorCount ?? state.errors.length} />}
    </div>
  );
}
