import Papa from 'papaparse';
import { isImportableKind, type TableKind } from './columns';
import { isCatalogKind } from './catalog-columns';
import { planCatalogImport, validateCatalogRow, type CatalogRow, type MaterialRecord, type MethodRecord, type SourceRow } from './catalog-rows';
import { MissingCatalog } from './create-missing';
import { MissingMethodLabels, type MissingMethodLabel } from './method-table';
import { isBlankRecord } from './csv-reader';
import { detectDelimiter, delimiterName, type Delimiter } from './delimiter';
import { excerpt, longCellIn, MAX_REPORTED_ERRORS, type RowError, importRefusal } from './errors';
import { autoMapColumns, resolveHeader, type ColumnMapping } from './header';
import type { DefaultUnits } from './units';
import { MAX_REPORTED_WARNINGS, ModeSetTally, type ImportWarning } from './mode-set-warnings';
import { BornChargeTally, neutralityFacts } from './born-neutrality';
import { modeSetFacts, validateRow, type ImportReferences, type ValidRow } from './validate-row';
import { storedValue } from '@/lib/format';

/** Reference lists as the wizard fetches them (JSON-friendly). */
export interface ReferenceLists {
  materials: Array<{ name: string; id: string; atomsPerFormulaUnit: number; atomsInCell?: number | null; elements?: Record<string, number> }>;
  sources: Array<{ citeKey: string; id: string }>;
  methods: Array<{ label: string; id: string }>;
}

export function referencesFrom(lists: ReferenceLists): ImportReferences {
  return {
    materials: new Map(lists.materials.map((m) => [m.name, { id: m.id, atomsPerFormulaUnit: m.atomsPerFormulaUnit, atomsInCell: m.atomsInCell ?? null, elements: m.elements }])),
    sources: new Map(lists.sources.map((s) => [s.citeKey, s.id])),
    methods: new Map(lists.methods.map((m) => [m.label, m.id])),
  };
}

export interface PreviewRequest {
  kind: TableKind;
  /** Calculations: new materials and methods come from the rows' catalogue columns. */
  createMissing?: boolean;
  /** With createMissing: the recipes of new methods come from the wizard's method table, checked apart (method-table.ts), not from method_ cells. */
  methodTable?: boolean;
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
  /** Calculation imports: the method labels the workspace lacks (the first MAX_METHOD_LINES), for the method table. */
  missingMethods: MissingMethodLabel[];
  missingMethodCount: number;
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

/** What a catalogue row will store, in the two preview columns: its handle and the derived summary. */
function storedOfCatalog(kind: TableKind, row: CatalogRow): PreviewRow['stored'] {
  if (kind === 'materials') {
    const m = row.record as MaterialRecord;
    return { label: m.name, value: `${m.reducedFormula}${m.spaceGroup ? ` · SG ${m.spaceGroup} (${m.crystalSystem})` : ''}${m.atomsInCell ? ` · Z = ${m.atomsInCell / (m.atomsPerFormulaUnit || 1)}` : ''}` };
  }
  if (kind === 'methods') {
    const m = row.record as MethodRecord;
    return { label: m.label, value: [m.functional, m.kGrid ? `k ${m.kGrid.join('×')}` : null, m.cutoffEv ? `${m.cutoffEv} eV` : null].filter(Boolean).join(' · ') };
  }
  const s = row.record as SourceRow;
  return { label: s.citeKey, value: [s.doi, s.year].filter(Boolean).join(' · ') || s.kind };
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
  if (!isImportableKind(request.kind) && !isCatalogKind(request.kind)) throw new Error(`unknown kind ${String(request.kind)}`);
  const catalogKind = isCatalogKind(request.kind) ? request.kind : null;
  const catalogRows: CatalogRow[] = [];
  let missing: MissingCatalog | undefined;
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
  const born = new BornChargeTally((key) => header?.nameByKey.get(key) ?? key);
  const missingLabels = request.kind === 'calculations' ? new MissingMethodLabels(new Set(request.references.methods.map((m) => m.label))) : undefined;
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
          if (catalogKind) for (const ignored of header.ignored) addError({ row: 1, column: excerpt(ignored), reason: `"${excerpt(ignored)}" is not a column of ${catalogKind}: remove it or rename it to one of the template's columns.` });
          if (request.createMissing && request.kind === 'calculations') missing = new MissingCatalog(references, (key) => header!.nameByKey.get(key) ?? key, undefined, undefined, request.methodTable ? 'deferred' : undefined);
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
          const read = (key: string) => { const idx = h.indexByKey.get(key); return idx === undefined ? undefined : fields[idx]; };
          const columnName = (key: string) => h.nameByKey.get(key) ?? key;
          missingLabels?.add(row, read);
          const structureText = catalogKind === 'materials' ? (read('structure') ?? '').trim() : '';
          if (structureText !== '') {
            // Formula, atoms and space group come from the structure's symmetry search, which runs on the server.
            validCount++;
            ok = true;
            stored = { label: (read('name') ?? '').trim() || null, value: 'from the structure: checked on the server' };
          } else if (catalogKind) {
            const checked = validateCatalogRow(catalogKind, row, read, columnName, rowErrors);
            if (checked) {
              validCount++;
              ok = true;
              catalogRows.push(checked);
              stored = storedOfCatalog(catalogKind, checked);
            }
          }
          const valid = catalogKind ? null : validateRow(row, read, { kind: request.kind as 'measurements' | 'calculations', references, units: request.units, columnName, missing }, rowErrors);
          if (catalogKind) {
            if (!ok && structureText === '') {
              errorCount += Math.max(1, rowErrors.length);
              errors.push(...rowErrors.slice(0, Math.max(0, MAX_REPORTED_ERRORS - errors.length)));
              for (const e of rowErrors) if (e.column && !badColumns.includes(e.column)) badColumns.push(e.column);
            }
          } else if (valid) {
            validCount++;
            ok = true;
            tally.add(row, valid);
            born.add(row, valid);
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
  if (catalogKind) {
    // Identities twice in the file; matching against stored records happens on the server.
    const resolvedHeader = resolved;
    for (const e of planCatalogImport(catalogKind, catalogRows, [], (key) => resolvedHeader.nameByKey.get(key) ?? key).errors) {
      addError(e);
      validCount--;
      const p = preview.find((r) => r.row === e.row);
      if (p) {
        p.ok = false;
        p.stored = null;
        if (e.column && !p.badColumns.includes(e.column)) p.badColumns.push(e.column);
      }
    }
  }
  if (catalogKind) errors.sort((a, b) => a.row - b.row);
  const modeSets = tally.warnings(modeSetFacts(references));
  const neutrality = born.problems(neutralityFacts(references));
  for (const e of neutrality.errors) addError(e);
  const warnings = [...modeSets.warnings, ...neutrality.warnings].sort((a, b) => a.row - b.row).slice(0, MAX_REPORTED_WARNINGS);
  const warningCount = modeSets.warningCount + neutrality.warnings.length;
  return {
    headers,
    delimiter,
    delimiterName: delimiterName(delimiter),
    mapping,
    ignored: resolved.ignored,
    rowCount,
    validCount,
    errorCount,
    errors,
    preview,
    warnings,
    warningCount,
    missingMethods: missingLabels?.labels ?? [],
    missingMethodCount: missingLabels?.count ?? 0,
  };
}
