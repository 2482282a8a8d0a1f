import { importRefusal } from './errors';

/**
 * Strict UTF-8 decoding that works chunk by chunk: a multibyte character split
 * across chunks is joined, an invalid byte sequence is refused (never replaced
 * with U+FFFD), and a leading byte-order mark is dropped.
 */
export class StrictUtf8Decoder {
  private decoder = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false });
  private bytesSeen = 0;

  /** Decodes the next chunk; pass `last` with the final chunk (or an empty one) to flush. */
  decode(chunk: Uint8Array, last = false): string {
    try {
      const text = this.decoder.decode(chunk, { stream: !last });
      this.bytesSeen += chunk.byteLength;
      return text;
    } catch {
      throw importRefusal('The file is not valid UTF-8.', [
        {
          row: 0,
          column: null,
          reason: `The file is not valid UTF-8 (an invalid byte sequence within bytes ${this.bytesSeen + 1}–${this.bytesSeen + chunk.byteLength}). Save it as "CSV UTF-8" and upload it again.`,
        },
      ]);
    }
  }
}

/** Decodes a whole byte array strictly (BOM dropped). */
export function decodeUtf8Strict(bytes: Uint8Array): string {
  return new StrictUtf8Decoder().decode(bytes, true);
}
