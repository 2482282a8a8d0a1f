import { describe, expect, it } from 'vitest';
import { decodeUtf8Strict, StrictUtf8Decoder } from '@/lib/import/decode';
import { isImportRefusal, type ImportRefusalError } from '@/lib/import/errors';
import { AppError } from '@/lib/errors';
import { parseDecimal } from '@/lib/import/numbers';

describe('strict UTF-8 decoding', () => {
  it('joins a multibyte character split across chunks (µ = C2 B5, Å = C3 85)', () => {
    const bytes = new TextEncoder().encode('µÅ°');
    const d = new StrictUtf8Decoder();
    let text = '';
    for (const b of bytes) text += d.decode(new Uint8Array([b]));
    text += d.decode(new Uint8Array(0), true);
    expect(text).toBe('µÅ°');
  });

  it('drops a byte-order mark', () => {
    expect(decodeUtf8Strict(new Uint8Array([0xef, 0xbb, 0xbf, 0x61]))).toBe('a');
  });

  it('refuses invalid bytes instead of replacing them, saying where', () => {
    const d = new StrictUtf8Decoder();
    d.decode(new TextEncoder().encode('abc'));
    let error: unknown;
    try {
      d.decode(new Uint8Array([0x61, 0xb5, 0x62]));
    } catch (e) {
      error = e;
    }
    expect(isImportRefusal(error)).toBe(true);
    expect((error as ImportRefusalError).errors[0].reason).toMatch(/not valid UTF-8 .*bytes 4–6/);
    expect(() => decodeUtf8Strict(new Uint8Array([0xc3]))).toThrow(AppError);
  });
});

describe('numbers keep their text', () => {
  it('parses decimal text without losing how it was written', () => {
    expect(parseDecimal('1.50')).toBe(1.5);
    expect(parseDecimal('-35.2')).toBe(-35.2);
    expect(parseDecimal('6.02e23')).toBe(6.02e23);
    expect(parseDecimal('.5')).toBe(0.5);
    for (const bad of ['', '1,5', 'abc', '1.2.3', 'NaN', 'Infinity', '0x10', '1e', ' 1']) expect(parseDecimal(bad), bad).toBeNull();
  });
});
