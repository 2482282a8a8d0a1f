import { columnsOf, type TableKind } from './columns';
import { excerpt, type RowError } from './errors';

/** Column key → header text in the file; a key left out (or null) is not imported. */
export type ColumnMapping = Record<string, string | null>;

export interface ResolvedHeader {
  /** Column key → index of the field in each record. */
  indexByKey: Map<string, number>;
  /** Column key → the header text as written in the file (for error messages). */
  nameByKey: Map<string, string>;
  /** File columns that no key maps to; they are ignored. */
  ignored: string[];
  errors: RowError[];
}

/** "Temperature (K)" → "temperature_k", " Laser-nm " → "laser_nm". */
export function normalizeHeader(header: string): string {
  return header
    .normalize('NFKC')
    .trim()
    .toLowerCase()
    .replace(/[^a-z0-9+]+/g, '_')
    .replace(/^_+|_+$/g, '');
}

/** Suggests, for each column of the kind, the file header it most likely is. */
export function autoMapColumns(kind: TableKind, headers: readonly string[]): ColumnMapping {
  const byNormalized = new Map<string, string>();
  for (const h of headers) {
    const n = normalizeHeader(h);
    if (n && !byNormalized.has(n)) byNormalized.set(n, h);
  }
  const taken = new Set<string>();
  const mapping: ColumnMapping = {};
  for (const column of columnsOf(kind)) {
    const candidates = [column.key, ...column.aliases].map(normalizeHeader);
    const hit = candidates.map((c) => byNormalized.get(c)).find((h) => h !== undefined && !taken.has(h));
    mapping[column.key] = hit ?? null;
    if (hit !== undefined) taken.add(hit);
  }
  return mapping;
}

/**
 * Checks a header row and resolves the mapping (the one given, else the automatic one):
 * duplicate headers (papaparse would silently rename them), a mapping to a column the
 * file lacks, one file column used twice, and missing required columns. Header errors
 * are reported on row 1.
 */
export function resolveHeader(kind: TableKind, headers: readonly string[], requested?: ColumnMapping): ResolvedHeader {
  const errors: RowError[] = [];
  const firstIndex = new Map<string, number>();
  headers.forEach((h, i) => {
    const n = normalizeHeader(h);
    if (!n) return;
    const seen = firstIndex.get(n);
    if (seen === undefined) firstIndex.set(n, i);
    else
      errors.push({
        row: 1,
        column: h,
        reason: `Duplicate header: columns ${seen + 1} and ${i + 1} are both named "${excerpt(headers[seen].trim())}". Rename or remove one.`,
      });
  });

  const mapping = requested ?? autoMapColumns(kind, headers);
  const known = new Set(columnsOf(kind).map((c) => c.key));
  const indexByKey = new Map<string, number>();
  const nameByKey = new Map<string, string>();
  const usedBy = new Map<number, string>();
  for (const [key, header] of Object.entries(mapping)) {
    if (!known.has(key)) {
      errors.push({ row: 1, column: excerpt(key), reason: `"${excerpt(key)}" is not a column of ${kind}.` });
      continue;
    }
    if (header === null || header === undefined || header === '') continue;
    const index = headers.findIndex((h) => h === header);
    if (index === -1) {
      errors.push({ row: 1, column: excerpt(key), reason: `Column "${excerpt(key)}" is mapped to "${excerpt(header)}", which is not in the file's header.` });
      continue;
    }
    const other = usedBy.get(index);
    if (other !== undefined) {
      errors.push({ row: 1, column: excerpt(header), reason: `File column "${excerpt(header)}" is mapped to both "${excerpt(other)}" and "${excerpt(key)}".` });
      continue;
    }
    usedBy.set(index, key);
    indexByKey.set(key, index);
    nameByKey.set(key, excerpt(header.trim()));
  }
  for (const column of columnsOf(kind)) {
    if (column.required && !indexByKey.has(column.key)) {
      errors.push({ row: 1, column: column.key, reason: `Required column "${column.key}" is missing from the header.` });
    }
  }
  const ignored = headers.filter((h, i) => h.trim() !== '' && !usedBy.has(i));
  return { indexByKey, nameByKey, ignored, errors };
}
