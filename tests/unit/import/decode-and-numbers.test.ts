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
    expect((error as ImportRefusalError).errors[0].reason).toMatch(/not valid UTF-8: the first invalid byte \(0xB5 at byte 5\)/);
    expect(() => decodeUtf8Strict(new Uint8Array([0xc3]))).toThrow(AppError);
  });

  const refusalOf = (chunks: Uint8Array[]) => {
    const d = new StrictUtf8Decoder();
    try {
      for (const c of chunks) d.decode(c);
      d.decode(new Uint8Array(0), true);
    } catch (e) {
      return (e as ImportRefusalError).errors[0];
    }
    throw new Error('not refused');
  };
  const utf8 = (s: string) => new TextEncoder().encode(s);
  const join = (...parts: Uint8Array[]) => {
    const out = new Uint8Array(parts.reduce((n, p) => n + p.byteLength, 0));
    let o = 0;
    for (const p of parts) {
      out.set(p, o);
      o += p.byteLength;
    }
    return out;
  };

  it('names the row and column of the first bad byte of a CSV file', () => {
    // Latin-1 "µ" (0xB5) in the unit cell of the third data row (row 4; the header is row 1).
    const file = join(utf8('\n\nmaterial,quantity,value,unit\nSi,frequency,520,cm-1\n"Ge\nx",frequency,300,cm-1\nGaN,frequency,531,'), new Uint8Array([0x6d, 0xb5]), utf8('m\n'));
    const e = refusalOf([file]);
    expect(e).toMatchObject({ row: 4, column: 'unit' });
    expect(e.reason).toMatch(/first invalid byte \(0xB5 at byte \d+\) is in this cell/);
    // The same file in one-byte chunks, and semicolon-separated.
    expect(refusalOf([...file].map((b) => new Uint8Array([b])))).toMatchObject({ row: 4, column: 'unit' });
    const semi = join(utf8('material;quantity;value\nSi;frequency;5'), new Uint8Array([0xff]));
    expect(refusalOf([semi])).toMatchObject({ row: 2, column: 'value' });
  });

  it('finds a bad byte that follows a character split across chunks, and a character cut off at the end', () => {
    const mu = utf8('µ');
    const e = refusalOf([join(utf8('a,b\nx,'), mu.subarray(0, 1)), join(mu.subarray(1), new Uint8Array([0xc0, 0x80]))]);
    expect(e).toMatchObject({ row: 2, column: 'b' });
    expect(e.reason).toMatch(/0xC0 at byte 9\b/);
    expect(refusalOf([join(utf8('a,b\nx,y'), new Uint8Array([0xe2, 0x82]))])).toMatchObject({ row: 2, column: 'b' });
  });

  it('a header cell is named by its position', () => {
    expect(refusalOf([join(utf8('material,'), new Uint8Array([0xb5]))])).toMatchObject({ row: 1, column: 'column 2' });
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
