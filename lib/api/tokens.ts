import { createHash, randomBytes } from 'node:crypto';

/** Format of an API token: "llt_" + 8-character public prefix + "_" + 43-character secret. */
export const TOKEN_PATTERN = /^llt_([a-z0-9]{8})_([A-Za-z0-9_-]{43})$/;

const PREFIX_ALPHABET = 'abcdefghijklmnopqrstuvwxyz0123456789';

export function generateApiToken(): { token: string; prefix: string; hash: string } {
  const bytes = randomBytes(8);
  const prefix = Array.from(bytes, (b) => PREFIX_ALPHABET[b % PREFIX_ALPHABET.length]).join('');
  const token = `llt_${prefix}_${randomBytes(32).toString('base64url')}`;
  return { token, prefix, hash: hashApiToken(token) };
}

/** Only this hash is stored; a leaked database does not leak usable tokens. */
export function hashApiToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}
