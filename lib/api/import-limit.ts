import { z } from 'zod';

/** Default upper bound of an import body: 200 MB (about two million calculation rows). */
export const DEFAULT_IMPORT_MAX_BYTES = 200 * 1024 * 1024;

const schema = z.coerce.number().int().positive();

/** IMPORT_MAX_BYTES, read at call time so tests and deployments can set it. */
export function importMaxBytes(): number {
  const raw = process.env.IMPORT_MAX_BYTES;
  if (raw === undefined || raw === '') return DEFAULT_IMPORT_MAX_BYTES;
  const parsed = schema.safeParse(raw);
  if (!parsed.success) throw new Error(`IMPORT_MAX_BYTES must be a positive whole number of bytes, got "${raw}". See .env.example.`);
  return parsed.data;
}
