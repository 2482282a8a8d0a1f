// The wizard's web worker: strict UTF-8 decoding of the dropped file in slices, then
// papaparse over the text in chunks, with progress messages, off the main thread.
import { StrictUtf8Decoder } from './decode';
import { isImportRefusal, type RowError } from './errors';
import { previewCsv, type PreviewRequest, type PreviewResult } from './preview';

export type WorkerRequest = PreviewRequest & { file: File };
export type WorkerMessage =
  | { type: 'progress'; phase: 'reading' | 'parsing'; fraction: number }
  | { type: 'done'; result: PreviewResult }
  | { type: 'refused'; message: string; errors: RowError[] }
  | { type: 'failed'; message: string };

const SLICE_BYTES = 1 << 20;
const scope = self as unknown as { postMessage(message: WorkerMessage): void; onmessage: ((event: MessageEvent<WorkerRequest>) => void) | null };
const post = (m: WorkerMessage) => scope.postMessage(m);

async function readStrict(file: File): Promise<string> {
  const decoder = new StrictUtf8Decoder();
  const parts: string[] = [];
  for (let offset = 0; offset < file.size; offset += SLICE_BYTES) {
    const bytes = new Uint8Array(await file.slice(offset, offset + SLICE_BYTES).arrayBuffer());
    parts.push(decoder.decode(bytes));
    post({ type: 'progress', phase: 'reading', fraction: Math.min(1, (offset + SLICE_BYTES) / file.size) });
  }
  parts.push(decoder.decode(new Uint8Array(0), true));
  return parts.join('');
}

scope.onmessage = async (event: MessageEvent<WorkerRequest>) => {
  const { file, ...request } = event.data;
  try {
    const text = await readStrict(file);
    let last = 0;
    const result = previewCsv(text, request, (fraction) => {
      if (fraction - last >= 0.02 || fraction === 1) {
        last = fraction;
        post({ type: 'progress', phase: 'parsing', fraction });
      }
    });
    post({ type: 'done', result });
  } catch (e) {
    if (isImportRefusal(e)) post({ type: 'refused', message: e.message, errors: e.errors });
    else post({ type: 'failed', message: (e as Error).message });
  }
};
