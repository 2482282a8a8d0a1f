/**
 * Signing secrets are stored encrypted (AES-256-GCM, a fresh 96-bit nonce per
 * secret, the watch id as additional data so a stored value cannot be moved to
 * another watch). The server must read them back to sign, so they cannot be
 * hashed like API tokens. The key is WEBHOOK_SECRET_KEY when set, otherwise one
 * derived from BETTER_AUTH_SECRET with HKDF-SHA256; changing whichever is used
 * makes the stored secrets unreadable (rotate each watch's secret then).
 * Stored form: `v1.<nonce>.<tag>.<ciphertext>`, each part base64url.
 */
import { createCipheriv, createDecipheriv, hkdfSync, randomBytes } from 'node:crypto';

const INFO = 'lattice-ledger webhook signing secrets v1';

export function secretBoxKey(keyMaterial: string): Buffer {
  return Buffer.from(hkdfSync('sha256', Buffer.from(keyMaterial, 'utf8'), Buffer.alloc(0), INFO, 32));
}

export function sealSecret(secret: string, key: Buffer, watchId: string): string {
  const nonce = randomBytes(12);
  const cipher = createCipheriv('aes-256-gcm', key, nonce);
  cipher.setAAD(Buffer.from(watchId, 'utf8'));
  const ciphertext = Buffer.concat([cipher.update(secret, 'utf8'), cipher.final()]);
  return ['v1', nonce, cipher.getAuthTag(), ciphertext].map((p) => (typeof p === 'string' ? p : p.toString('base64url'))).join('.');
}

/** The secret, or null when the value was sealed with another key, for another watch, or was altered. */
export function openSecret(sealed: string, key: Buffer, watchId: string): string | null {
  const parts = sealed.split('.');
  if (parts.length !== 4 || parts[0] !== 'v1') return null;
  try {
    const [nonce, tag, ciphertext] = parts.slice(1).map((p) => Buffer.from(p, 'base64url'));
    const decipher = createDecipheriv('aes-256-gcm', key, nonce);
    decipher.setAAD(Buffer.from(watchId, 'utf8'));
    decipher.setAuthTag(tag);
    return Buffer.concat([decipher.update(ciphertext), decipher.final()]).toString('utf8');
  } catch {
    return null;
  }
}
