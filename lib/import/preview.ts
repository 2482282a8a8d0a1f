import Papa from 'papaparse';
import { isImportableKind, type ImportableKind } from './columns';
import { isBlankRecord } from './csv-reader';
import { detectDelimiter, delimiterName, type Delimiter } from './delimiter';
import { excerpt, longCellIn, MAX_REPORTED_ERRORS, type RowError, importRefusal } from './errors';
import { autoMapColumns, resolveHeader, type ColumnMapping } from './header';
import type { DefaultUnits } from './units';
import { ModeSetTally, type ImportWarning } from './mode-set-warnings';
import { modeSetFacts, validateRow, type ImportReferences, type ValidRow } from './validate-row';
import { storedValue } from '@/lib/format';

/** Reference lists as the wizard fetches them (JSON-friendly). */
export interface ReferenceLists {
  materials: Array<{ name: string; id: string; atomsPerFormulaUnit: number; atomsInCell?: number | null }>;
  sources: Array<{ citeKey: string; id: string }>;
  methods: Array<{ label: string; id: string }>;
}

export function referencesFrom(lists: ReferenceLists): ImportReferences {
  return {
    materials: new Map(lists.materials.map((m) => [m.name, { id: m.id, atomsPerFormulaUnit: m.atomsPerFormulaUnit, atomsInCell: m.atomsInCell ?? null }])),
    sources: new Map(lists.sources.map((s) => [s.citeKey, s.id])),
    methods: new Map(lists.methods.map((m) => [m.label, m.id])),
  };
}

export interface PreviewRequest {
  kind: ImportableKind;
  mapping?: ColumnMapping;
  units?: DefaultUnits;
  references: ReferenceLists;
}

export interface PreviewResult {
  headers: string[];
  delimiter: Delimiter;
  delimiterName: string;
  /** The mapping used: the one asked for, else the automatic one. */
  mapping: ColumnMapping;
  ignored: string[];
  rowCount: number;
  validCount: number;
  errorCount: number;
  errors: RowError[];
  /** The first data rows as read (cells in header order) with their row numbers. */
  preview: PreviewRow[];
  /** Calculation imports: incomplete mode sets and sets without acoustic marks (mode-set-warnings.ts). */
  warnings: ImportWarning[];
  warningCount: number;
}

export interface PreviewRow {
  row: number;
  cells: string[];
  ok: boolean;
  /** Header names of the cells this row's errors point at. */
  badColumns: string[];
  /** What would be stored, for a valid row: the normalised label and the canonical value (shown with the entry's precision). */
  stored: { label: string | null; value: string } | null;
}

/** A valid row's label and value as the server will store them. */
function storedOf(valid: ValidRow): PreviewRow['stored'] {
  return { label: valid.irrepNormalized, value: storedValue({ quantity: valid.quantity, value: valid.value, valueText: valid.valueText, unit: valid.unit }) };
}

export const PREVIEW_ROWS = 50;
const CHUNK_CHARS = 1 << 20;

/**
 * The browser's check of a decoded file, with papaparse streaming over the text
 * in chunks: the same header rules and row validation as the server (which
 * checks everything again on commit). `onProgress` gets the fraction parsed.
 */
export function previewCsv(text: string, request: PreviewRequest, onProgress: (fraction: number) => void = () => undefined): PreviewResult {
  if (!isImportableKind(request.kind)) throw new Error(`unknown kind ${String(request.kind)}`);
  if (text.trim() === '') throw importRefusal('The file is empty.', [{ row: 0, column: null, reason: 'The file is empty.' }]);
  const delimiter = detectDelimiter(text);
  const references = referencesFrom(request.references);
  const errors: RowError[] = [];
  let errorCount = 0;
  let rowCount = 0;
  let validCount = 0;
  let recordNumber = 0;
  let headers: string[] | null = null;
  let header: ReturnType<typeof resolveHeader> | null = null;
  let mapping: ColumnMapping = {};
  const preview: PreviewResult['preview'] = [];
  const tally = new ModeSetTally();
  const addError = (e: RowError) => {
    errorCount++;
    if (errors.length < MAX_REPORTED_ERRORS) errors.push(e);
  };

  const config = {
    delimiter,
    skipEmptyLines: false,
    chunkSize: CHUNK_CHARS,
    chunk: (results: Papa.ParseResult<string[]>) => {
      const broken = new Set<number>();
      for (const e of results.errors) if (e.type === 'Quotes' && e.row !== undefined) broken.add(e.row);
      results.data.forEach((fields, i) => {
        recordNumber++;
        if (!headers) {
          if (isBlankRecord(fields)) return;
          const longHeader = longCellIn(1, fields, (i) => `column ${i + 1}`);
          if (longHeader) throw importRefusal('The header row has problems.', [longHeader]);
          headers = fields;
          mapping = request.mapping ?? autoMapColumns(request.kind, fields);
          header = resolveHeader(request.kind, fields, mapping);
          recordNumber = 1;
          return;
        }
        if (isBlankRecord(fields)) return;
        rowCount++;
        const row = recordNumber;
        const h = header!;
        if (h.errors.length) return;
        let ok = false;
        let stored: PreviewRow['stored'] = null;
        const badColumns: string[] = [];
        const long = longCellIn(row, fields, (idx) => excerpt(headers![idx]?.trim() || `column ${idx + 1}`));
        if (long) addError(long);
        else if (broken.has(i)) addError({ row, column: null, reason: 'Broken quoting: a quoted cell must end with a quote followed by a delimiter or a line break.' });
        else if (fields.length !== headers.length)
          addError({ row, column: null, reason: `This row has ${fields.length} cells; the header has ${headers.length} (${delimiterName(delimiter)}-separated).` });
        else {
          const rowErrors: RowError[] = [];
          const valid = validateRow(row, (key) => { const idx = h.indexByKey.get(key); return idx === undefined ? undefined : fields[idx]; }, { kind: request.kind, references, units: request.units, columnName: (key) => h.nameByKey.get(key) ?? key }, rowErrors);
          if (valid) {
            validCount++;
            ok = true;
            tally.add(row, valid);
            stored = storedOf(valid);
          } else {
            errorCount += Math.max(1, rowErrors.length);
            errors.push(...rowErrors.slice(0, Math.max(0, MAX_REPORTED_ERRORS - errors.length)));
            for (const e of rowErrors) if (e.column && !badColumns.includes(e.column)) badColumns.push(e.column);
          }
        }
        if (preview.length < PREVIEW_ROWS) preview.push({ row, cells: fields, ok, badColumns, stored });
      });
      onProgress(Math.min(1, results.meta.cursor / text.length));
    },
  };
  (Papa.parse as (input: string, config: object) => void)(text, config);
  onProgress(1);

  if (!headers || !header) throw importRefusal('The file is empty.', [{ row: 0, column: null, reason: 'The file is empty.' }]);
  const resolved = header as ReturnType<typeof resolveHeader>;
  if (resolved.errors.length) throw importRefusal('The header row has problems.', resolved.errors);
  if (rowCount === 0) throw importRefusal('The file has a header but no data rows.', [{ row: 0, column: null, reason: 'The file has a header but no data rows.' }]);
  const { warnings, warningCount } = tally.warnings(modeSetFacts(references));
  return { headers, delimiter, delimiterName: delimiterName(delimiter), mapping, ignored: resolved.ignored, rowCount, validCount, errorCount, errors, preview, warnings, warningCount };
}
