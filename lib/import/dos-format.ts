import { z } from 'zod';
import { excerpt, type RowError } from './errors';
import { normalizeHeader } from './header';
import { parseDecimal } from './numbers';

/**
 * A phonon density-of-states file: one row per grid point, the identifying cells
 * repeated on every row. Rows with the same (material, method) form one DOS.
 */
export const DOS_COLUMNS = [
  { key: 'material', aliases: ['material_name', 'compound', 'crystal'], description: 'Material name in this workspace (its atoms in the cell must be set).' },
  { key: 'method', aliases: ['method_label', 'recipe'], description: 'Label of the method that computed the DOS.' },
  { key: 'source', aliases: ['source_key', 'cite_key', 'citekey', 'citation', 'reference'], description: 'Cite key of the source of the DOS.' },
  { key: 'unit', aliases: ['units', 'frequency_unit'], description: 'Unit of frequency: cm-1, THz or meV (the same on every row of one DOS).' },
  { key: 'frequency', aliases: ['freq', 'omega', 'nu', 'frequency_cm1', 'frequency_thz', 'frequency_mev'], description: 'Grid point, ≥ 0, strictly increasing within one DOS.' },
  { key: 'density', aliases: ['dos', 'g', 'states', 'pdos', 'total_dos'], description: 'Density of states at that point, ≥ 0, any scale (renormalised to 3 × atoms in the cell).' },
] as const;

export type DosColumnKey = (typeof DOS_COLUMNS)[number]['key'];

/** The temperature used when none is given: the standard-state temperature. */
export const DEFAULT_DOS_TEMPERATURES_K = [298.15] as const;
export const MAX_DOS_TEMPERATURES = 50;
const MAX_DOS_TEMPERATURE_K = 5000;

/** Reads "298.15, 300 500" (commas, semicolons or spaces) into temperatures in K; empty → the default. */
export function parseDosTemperatures(text: string | null | undefined): { ok: true; temperatures: number[] } | { ok: false; reason: string } {
  const trimmed = (text ?? '').trim();
  if (trimmed === '') return { ok: true, temperatures: [...DEFAULT_DOS_TEMPERATURES_K] };
  const parts = trimmed.split(/[\s,;]+/).filter(Boolean);
  if (parts.length > MAX_DOS_TEMPERATURES) return { ok: false, reason: `At most ${MAX_DOS_TEMPERATURES} temperatures, got ${parts.length}.` };
  const out: number[] = [];
  for (const part of parts) {
    const t = parseDecimal(part);
    if (t === null) return { ok: false, reason: `Temperature "${excerpt(part)}" is not a number.` };
    if (!(t > 0 && t <= MAX_DOS_TEMPERATURE_K)) return { ok: false, reason: `Temperature ${excerpt(part)} K is out of range: give values > 0 and ≤ ${MAX_DOS_TEMPERATURE_K} K.` };
    if (!out.includes(t)) out.push(t);
  }
  return { ok: true, temperatures: out.sort((a, b) => a - b) };
}

/** What the upload routes take beside the file bytes for a DOS import (query parameters). */
export const dosOptionsSchema = z.object({
  kind: z.literal('dos'),
  fileName: z.string().max(255).optional(),
  temperatures: z
    .string()
    .max(2000)
    .optional()
    .transform((text, ctx) => {
      const parsed = parseDosTemperatures(text);
      if (!parsed.ok) {
        ctx.addIssue({ code: 'custom', message: parsed.reason });
        return z.NEVER;
      }
      return parsed.temperatures;
    }),
});

export function parseDosQuery(params: URLSearchParams) {
  return dosOptionsSchema.safeParse({
    kind: params.get('kind') ?? undefined,
    fileName: params.get('fileName') ?? undefined,
    temperatures: params.get('temperatures') ?? undefined,
  });
}

/** The query string of a DOS upload, for the wizard. */
export function dosQuery(options: { fileName?: string; temperatures: readonly number[] }): string {
  const q = new URLSearchParams({ kind: 'dos' });
  if (options.fileName) q.set('fileName', options.fileName);
  q.set('temperatures', options.temperatures.join(','));
  return q.toString();
}

export interface DosHeader {
  indexByKey: Map<DosColumnKey, number>;
  /** The header text as written, for error messages. */
  nameByKey: Map<DosColumnKey, string>;
  ignored: string[];
  errors: RowError[];
}

/** Maps the header row to the DOS columns by name or alias; every column is required. */
export function resolveDosHeader(headers: readonly string[]): DosHeader {
  const errors: RowError[] = [];
  const byNormalized = new Map<string, number>();
  headers.forEach((h, i) => {
    const n = normalizeHeader(h);
    if (!n) return;
    const seen = byNormalized.get(n);
    if (seen === undefined) byNormalized.set(n, i);
    else errors.push({ row: 1, column: excerpt(h), reason: `Duplicate header: columns ${seen + 1} and ${i + 1} are both named "${excerpt(headers[seen].trim())}". Rename or remove one.` });
  });
  const indexByKey = new Map<DosColumnKey, number>();
  const nameByKey = new Map<DosColumnKey, string>();
  const used = new Set<number>();
  for (const column of DOS_COLUMNS) {
    const index = [column.key, ...column.aliases].map((c) => byNormalized.get(normalizeHeader(c))).find((i) => i !== undefined && !used.has(i));
    if (index === undefined) {
      errors.push({ row: 1, column: column.key, reason: `Required column "${column.key}" is missing from the header (a DOS file has ${DOS_COLUMNS.map((c) => c.key).join(', ')}).` });
      continue;
    }
    used.add(index);
    indexByKey.set(column.key, index);
    nameByKey.set(column.key, excerpt(headers[index].trim()));
  }
  const ignored = headers.filter((h, i) => h.trim() !== '' && !used.has(i));
  return { indexByKey, nameByKey, ignored, errors };
}
