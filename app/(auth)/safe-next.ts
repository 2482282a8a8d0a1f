// C0 controls, DEL, C1 controls and every Unicode space: a URL parser drops or trims some of them, so
// "/\t/evil.example" is "//evil.example" (another host) once the browser reads it.
const CONTROL_OR_SPACE = /[\u0000-\u0020\u007f-\u00a0\u1680\u180e\u2000-\u200f\u2028\u2029\u202f\u205f\u3000\ufeff]/g;
const BASE = 'http://next.invalid';

/** Decodes percent-escapes until nothing changes (a few rounds: double encoding is a known bypass). */
function fullyDecoded(value: string): string | null {
  let v = value;
  for (let i = 0; i < 4; i++) {
    let d: string;
    try {
      d = decodeURIComponent(v);
    } catch {
      return null;
    }
    if (d === v) return v;
    v = d;
  }
  return null;
}

function looksLocal(path: string): boolean {
  return path.startsWith('/') && !path.startsWith('//') && !path.startsWith('/\\') && !/^[a-z][a-z0-9+.-]*:/i.test(path);
}

/**
 * Only a path on this site may be followed after sign-in. The value is checked as written and after decoding,
 * with control characters and whitespace removed, and must resolve to this origin; what is returned is the
 * parsed path, never the raw text.
 */
export function safeNext(value: string | null | undefined, fallback = '/w'): string {
  if (!value) return fallback;
  const raw = value.replace(CONTROL_OR_SPACE, '');
  const decoded = fullyDecoded(raw);
  if (decoded === null) return fallback;
  const decodedStripped = decoded.replace(CONTROL_OR_SPACE, '');
  if (!looksLocal(raw) || !looksLocal(decodedStripped) || decodedStripped.includes('\\')) return fallback;
  let url: URL;
  try {
    url = new URL(raw, BASE);
  } catch {
    return fallback;
  }
  if (url.origin !== BASE) return fallback;
  return `${url.pathname}${url.search}${url.hash}`;
}
