import { AppError } from '@/lib/errors';

function tooLarge(maxBytes: number): AppError {
  return new AppError('too-large', `The request body is larger than the limit of ${maxBytes.toLocaleString('en')} bytes (IMPORT_MAX_BYTES).`, [
    { row: 0, column: null, reason: `Body exceeds ${maxBytes} bytes.` },
  ]);
}

/** Refuses at once when the declared Content-Length is over the limit. */
export function checkDeclaredLength(request: Request, maxBytes: number): void {
  const declared = request.headers.get('content-length');
  if (declared !== null && /^\d+$/.test(declared) && Number(declared) > maxBytes) throw tooLarge(maxBytes);
}

/**
 * The request body as chunks, counting bytes as they arrive: past the limit the
 * stream is cancelled and a 413 AppError thrown, whatever Content-Length said,
 * so nothing beyond the limit is ever read or buffered.
 */
export async function* limitedBody(request: Request, maxBytes: number): AsyncGenerator<Uint8Array> {
  checkDeclaredLength(request, maxBytes);
  if (!request.body) return;
  const reader = request.body.getReader();
  let total = 0;
  try {
    while (true) {
      const { done, value } = await reader.read();
      if (done) return;
      total += value.byteLength;
      if (total > maxBytes) {
        await reader.cancel('body too large').catch(() => undefined);
        throw tooLarge(maxBytes);
      }
      yield value;
    }
  } finally {
    reader.releaseLock();
  }
}

/** Reads a whole body (e.g. JSON) under the limit. */
export async function readLimitedBody(request: Request, maxBytes: number): Promise<Uint8Array> {
  const parts: Uint8Array[] = [];
  let total = 0;
  for await (const chunk of limitedBody(request, maxBytes)) {
    parts.push(chunk);
    total += chunk.byteLength;
  }
  const out = new Uint8Array(total);
  let offset = 0;
  for (const p of parts) {
    out.set(p, offset);
    offset += p.byteLength;
  }
  return out;
}
