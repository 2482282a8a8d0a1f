'use client';
import Link from 'next/link';
import { useEffect, useMemo, useRef, useState } from 'react';
import { columnsOf, type TableKind } from '@/lib/import/columns';
import { isCatalogKind } from '@/lib/import/catalog-columns';
import type { ColumnMapping } from '@/lib/import/header';
import type { PreviewRow, ReferenceLists } from '@/lib/import/preview';
import type { RowError } from '@/lib/import/errors';
import type { DefaultUnits } from '@/lib/import/units';
import { MAX_WIZARD_QUERY_CHARS, wizardQuery } from '@/lib/import/wizard-options';
import { checkMethodTable, compactLine, MAX_METHOD_LINES, prefillLine, type MethodTableLine } from '@/lib/import/method-table';
import { count } from '@/lib/format';
import { ENTROPY_UNITS, FREQUENCY_UNITS } from '@/lib/science/units';
import { Button, buttonClass } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { Panel } from '@/components/ui/panel';
import { inputClass } from '@/components/ui/field';
import { ColumnMappingForm } from './column-mapping';
import { FileDrop } from './file-drop';
import { ProgressBar } from './progress-bar';
import { RowErrorTable } from './row-error-table';
import { DosImport } from './dos-import';
import { MethodTableEditor, NewMethods } from './method-table';
import { usePreviewWorker } from './use-preview-worker';
import { UploadRefused, uploadImport, type UploadState } from './upload-import';

type Outcome = {
  importId: string;
  rowCount: number;
  insertedCount: number;
  duplicateCount: number;
  duplicates: Array<{ row: number; reason: string }>;
  warnings?: ModeSetWarning[];
  warningCount?: number;
  createdMaterials?: number;
  createdMethods?: number;
};
type CatalogOutcome = {
  importId: string | null;
  kind: 'materials' | 'methods' | 'sources';
  rowCount: number;
  createdCount: number;
  updatedCount: number;
  unchangedCount: number;
  unchanged: Array<{ row: number; handle: string }>;
};
type ModeSetWarning = { row: number; message: string };
type CommitState = UploadState<Outcome | CatalogOutcome>;

type WizardKind = TableKind | 'dos';
const KIND_LABEL: Record<WizardKind, string> = {
  measurements: 'Measurements (experiment)',
  calculations: 'Calculations (computed)',
  dos: 'Phonon DOS (computes entropies)',
  materials: 'Materials',
  methods: 'Methods',
  sources: 'Sources (CSV or BibTeX)',
};
const WIZARD_KINDS = ['measurements', 'calculations', 'dos', 'materials', 'methods', 'sources'] as const;
/** A reference file (BibTeX, RIS, CSL-JSON) of sources is checked on the server only. */
const REFERENCE_FILE = /\.(bib|bibtex|ris|json)$/i;

export function ImportWizard({ workspaceId, slug }: { workspaceId: string; slug: string }) {
  const [kind, setKind] = useState<WizardKind>('measurements');
  const tableKind: TableKind = kind === 'dos' ? 'measurements' : kind;
  const catalog = isCatalogKind(kind);
  const [updateChanged, setUpdateChanged] = useState(false);
  const [createMissing, setCreateMissing] = useState(false);
  const [prefer, setPrefer] = useState<'' | 'typed' | 'structure'>('');
  const [file, setFile] = useState<File | null>(null);
  const [mapping, setMapping] = useState<ColumnMapping | undefined>(undefined);
  const [units, setUnits] = useState<DefaultUnits>({});
  const [references, setReferences] = useState<ReferenceLists | null>(null);
  const [referenceError, setReferenceError] = useState<string | null>(null);
  const [commit, setCommit] = useState<CommitState>({ status: 'idle' });
  /** The method table's lines as edited, by label (a line not edited yet shows the file's prefill). */
  const [tableEdits, setTableEdits] = useState<Record<string, MethodTableLine>>({});

  useEffect(() => {
    let live = true;
    fetch(`/api/workspaces/${workspaceId}/imports/references`)
      .then(async (res) => {
        if (!res.ok) throw new Error((await res.json()).detail ?? `HTTP ${res.status}`);
        return (await res.json()) as ReferenceLists;
      })
      .then((r) => live && setReferences(r))
      .catch((e: Error) => live && setReferenceError(e.message));
    return () => {
      live = false;
    };
  }, [workspaceId]);

  const referenceFile = kind === 'sources' && file !== null && REFERENCE_FILE.test(file.name);
  const missingFlag = kind === 'calculations' && createMissing;
  const request = useMemo(
    () => (kind !== 'dos' && !referenceFile && file && references ? { file, kind: tableKind, mapping, units, references, createMissing: missingFlag, methodTable: missingFlag } : null),
    [file, kind, tableKind, mapping, units, references, referenceFile, missingFlag],
  );
  const preview = usePreviewWorker(request);
  const done = preview.status === 'done' ? preview.result : null;
  // while a changed mapping is re-checked, or refused (two columns on one header), the last result stays on
  // screen so the select being changed keeps its place and its focus
  const [lastDone, setLastDone] = useState<{ file: File; result: NonNullable<typeof done> } | null>(null);
  if (done && lastDone?.result !== done && file) setLastDone({ file, result: done });
  const result = done ?? ((preview.status === 'working' || preview.status === 'refused') && mapping && lastDone?.file === file ? lastDone.result : null);
  const columns = columnsOf(tableKind);
  const noUnitColumn = result !== null && !catalog && !result.mapping.unit;
  // The method table: one line per method label of the file the workspace lacks, when createMissing is chosen.
  const missingMethods = useMemo(() => (kind === 'calculations' && result ? result.missingMethods : []), [kind, result]);
  const tableLines = useMemo(() => (missingFlag ? missingMethods.map((m) => tableEdits[m.label] ?? prefillLine(m)) : []), [missingFlag, missingMethods, tableEdits]);
  const tableCheck = useMemo(() => {
    const stored = new Set(references?.methods.map((m) => m.label) ?? []);
    return checkMethodTable(tableLines, { stored: (label) => stored.has(label) });
  }, [tableLines, references]);
  const tooManyMethods = missingFlag && (result?.missingMethodCount ?? 0) > MAX_METHOD_LINES;
  const query =
    file && (result || referenceFile)
      ? wizardQuery({
          kind: tableKind,
          fileName: file.name,
          mapping: result && !referenceFile ? result.mapping : undefined,
          units: noUnitColumn ? units : undefined,
          onChange: catalog && updateChanged ? 'update' : undefined,
          prefer: kind === 'materials' && prefer ? prefer : undefined,
          createMissing: missingFlag || undefined,
          methodTable: tableLines.length ? tableLines.map(compactLine) : undefined,
        })
      : null;
  const queryTooLong = query !== null && query.length > MAX_WIZARD_QUERY_CHARS;
  const tableReady = tableCheck.errors.length === 0 && !tooManyMethods && !queryTooLong;
  const canCommit = done !== null && done.errorCount === 0 && tableReady && commit.status !== 'sending' && commit.status !== 'done';

  const reset = (next: Partial<{ kind: WizardKind; file: File | null }>) => {
    if (next.kind) {
      setKind(next.kind);
      setUpdateChanged(false);
    }
    if (next.file !== undefined) setFile(next.file);
    setMapping(undefined);
    setTableEdits({});
    setCommit({ status: 'idle' });
  };

  async function send() {
    if (!file || !query) return;
    setCommit({ status: 'sending' });
    setCommit(await uploadImport<Outcome>(workspaceId, query, file));
  }

  return (
    <div className="space-y-5">
      <Panel title="1 · What are you importing?">
        <div className="flex flex-wrap items-end gap-4">
          <fieldset className="flex flex-wrap gap-4 text-sm">
            <legend className="sr-only">Kind of import</legend>
            {WIZARD_KINDS.map((k) => (
              <label key={k} className="flex items-center gap-1.5">
                <input type="radio" name="kind" value={k} checked={kind === k} onChange={() => reset({ kind: k })} disabled={commit.status === 'sending'} />
                {KIND_LABEL[k]}
              </label>
            ))}
          </fieldset>
          <a className={buttonClass('secondary')} href={`/api/workspaces/${workspaceId}/imports/templates/${kind}.csv`} download>
            Download the {kind === 'dos' ? 'DOS' : kind} template
          </a>
        </div>
        {catalog && (
          <div className="mt-3 space-y-1 text-sm">
            <p className="max-w-3xl text-ink-muted">
              Rows identical to stored {kind} are listed as unchanged and nothing is written for them. A row whose stored record has other values is refused, unless you
              choose to update those records.
              {kind === 'sources' && ' A BibTeX, RIS or CSL-JSON file (.bib, .ris, .json) is read as references.'}
            </p>
            <label className="flex items-center gap-1.5">
              <input type="checkbox" checked={updateChanged} onChange={(e) => setUpdateChanged(e.target.checked)} disabled={commit.status === 'sending'} />
              Update changed records (curator or owner; each update is audited and undone with the import)
            </label>
            {kind === 'materials' && (
              <label className="flex flex-wrap items-center gap-1.5">
                Where a row’s structure (POSCAR or CIF in a <code>structure</code> column) disagrees with its typed formula, atoms or space group:
                <select className={inputClass} value={prefer} onChange={(e) => setPrefer(e.target.value as typeof prefer)} disabled={commit.status === 'sending'}>
                  <option value="">refuse the row and show both</option>
                  <option value="typed">keep the typed values</option>
                  <option value="structure">take the structure’s values</option>
                </select>
              </label>
            )}
          </div>
        )}
        {kind === 'calculations' && (
          <label className="mt-3 flex items-center gap-1.5 text-sm">
            <input type="checkbox" checked={createMissing} onChange={(e) => setCreateMissing(e.target.checked)} disabled={commit.status === 'sending'} />
            Create missing materials and methods (materials from the rows’ material_… columns; methods from a table of recipes, filled from the method_… columns)
          </label>
        )}
      </Panel>

      {kind === 'dos' ? (
        <>
          {referenceError && <Notice tone="bad">Could not load the workspace’s materials, sources and methods: {referenceError}</Notice>}
          <DosImport workspaceId={workspaceId} slug={slug} references={references} />
        </>
      ) : (
        <>
          <Panel title="2 · Choose the file">
            <div className="space-y-3">
              {referenceError && <Notice tone="bad">Could not load the workspace’s materials, sources and methods: {referenceError}</Notice>}
              <FileDrop onFile={(f) => reset({ file: f })} disabled={commit.status === 'sending'} />
              {file && (
                <p className="text-sm text-ink-muted">
                  <span className="font-medium text-ink">{file.name}</span> · <span className="num">{count(file.size)} bytes</span>
                </p>
              )}
              {preview.status === 'working' && <ProgressBar label={preview.phase === 'reading' ? 'Reading the file (UTF-8)' : 'Parsing and checking rows'} fraction={preview.fraction} />}
              {preview.status === 'failed' && <Notice tone="bad">{preview.message}</Notice>}
              {preview.status === 'refused' && (
                <div className="space-y-2">
                  <Notice tone="bad">{preview.message}</Notice>
                  <RowErrorTable errors={preview.errors} errorCount={preview.errors.length} />
                </div>
              )}
            </div>
          </Panel>

          {referenceFile && (
            <Panel title="3 · Check and commit">
              <div className="space-y-3">
                <p className="text-sm text-ink-muted">A reference file is checked entry by entry on the server; any problem refuses it as a whole, with the entry and line.</p>
                <Button type="button" onClick={send} disabled={commit.status === 'sending' || commit.status === 'done'}>
                  {commit.status === 'sending' ? 'Importing…' : 'Import the references'}
                </Button>
                <CommitResult state={commit} slug={slug} />
              </div>
            </Panel>
          )}

          {result && !referenceFile && (
            <Panel title="3 · Columns and units">
              <div className="space-y-4">
                <p className="text-sm text-ink-muted">
                  {result.delimiterName}-separated, {result.headers.length} columns. Matched automatically — correct any column below.
                  {result.ignored.length > 0 && <> Ignored file columns: {result.ignored.map((h) => `“${h}”`).join(', ')}.</>}
                </p>
                <ColumnMappingForm columns={columns} headers={result.headers} mapping={mapping ?? result.mapping} onChange={setMapping} disabled={commit.status === 'sending'} />
                {noUnitColumn && (
                  <div className="flex flex-wrap gap-4">
                    <p className="w-full text-sm text-ink-muted">The file has no unit column: choose the unit of its values.</p>
                    <label className="space-y-0.5 text-xs font-medium">
                      Frequency unit
                      <select className={inputClass} value={units.frequency ?? ''} onChange={(e) => setUnits({ ...units, frequency: (e.target.value || undefined) as DefaultUnits['frequency'] })}>
                        <option value="">— choose —</option>
                        {FREQUENCY_UNITS.map((u) => (
                          <option key={u}>{u}</option>
                        ))}
                      </select>
                    </label>
                    <label className="space-y-0.5 text-xs font-medium">
                      Entropy unit
                      <select className={inputClass} value={units.entropy ?? ''} onChange={(e) => setUnits({ ...units, entropy: (e.target.value || undefined) as DefaultUnits['entropy'] })}>
                        <option value="">— choose —</option>
                        {ENTROPY_UNITS.map((u) => (
                          <option key={u}>{u}</option>
                        ))}
                      </select>
                    </label>
                    <label className="space-y-0.5 text-xs font-medium">
                      Heat-capacity unit
                      <select
                        className={inputClass}
                        value={units['heat-capacity'] ?? ''}
                        onChange={(e) => setUnits({ ...units, 'heat-capacity': (e.target.value || undefined) as DefaultUnits['heat-capacity'] })}
                      >
                        <option value="">— choose —</option>
                        {ENTROPY_UNITS.map((u) => (
                          <option key={u}>{u}</option>
                        ))}
                      </select>
                    </label>
                  </div>
                )}
              </div>
            </Panel>
          )}

          {result && !referenceFile && (
            <Panel title="4 · Preview and commit">
              <div className="space-y-4">
                <p className="text-sm">
                  <span className="num font-medium">{count(result.rowCount)}</span> rows ·{' '}
                  <span className="num text-good">{count(result.validCount)} valid</span> ·{' '}
                  <span className={`num ${result.errorCount ? 'text-bad' : 'text-ink-muted'}`}>{count(result.errorCount)} {result.errorCount === 1 ? 'error' : 'errors'}</span>
                </p>
                <NewMethods
                  count={result.missingMethodCount}
                  labels={missingMethods.map((m) => m.label)}
                  createMissing={missingFlag}
                  onCreateMissing={() => setCreateMissing(true)}
                  tooMany={tooManyMethods}
                  queryTooLong={queryTooLong}
                  disabled={commit.status === 'sending' || commit.status === 'done'}
                >
                  <MethodTableEditor
                    lines={tableLines}
                    onChange={(lines) => setTableEdits((edits) => ({ ...edits, ...Object.fromEntries(lines.map((l) => [l.label, l])) }))}
                    errors={tableCheck.errors}
                    missing={missingMethods}
                    disabled={commit.status === 'sending' || commit.status === 'done'}
                  />
                </NewMethods>
                {result.errorCount > 0 && <RowErrorTable errors={result.errors} errorCount={result.errorCount} />}
                <ModeSetWarnings warnings={result.warnings ?? []} count={result.warningCount ?? 0} />
                <PreviewTable headers={result.headers} rows={result.preview} errors={result.errors} />
                <div className="flex items-center gap-3">
                  <Button type="button" onClick={send} disabled={!canCommit} aria-disabled={!canCommit}>
                    {commit.status === 'sending' ? 'Importing…' : `Import ${count(result.rowCount)} rows`}
                  </Button>
                  {result.errorCount > 0 && <span className="text-xs text-ink-muted">Fix the errors in the file (or the mapping) first.</span>}
                  {result.errorCount === 0 && tableCheck.errors.length > 0 && <span className="text-xs text-ink-muted">Fix the method table first.</span>}
                </div>
                <CommitResult state={commit} slug={slug} />
              </div>
            </Panel>
          )}
        </>
      )}
    </div>
  );
}

/** The first rows as read, with what each valid row will store; a bad cell is tinted and says why on hover. */
function PreviewTable({ headers, rows, errors }: { headers: string[]; rows: PreviewRow[]; errors: RowError[] }) {
  const reasons = new Map<string, string>();
  for (const e of errors) if (e.column) reasons.set(`${e.row}|${e.column}`, [reasons.get(`${e.row}|${e.column}`), e.reason].filter(Boolean).join(' '));
  return (
    <div role="region" aria-label="First rows of the file" tabIndex={0} className="max-h-96 overflow-auto rounded-md border border-rule">
      <table className="w-full text-xs" data-testid="import-preview">
        <caption className="sr-only">First rows of the file, with the label and value each valid row will store</caption>
        <thead className="sticky top-0 bg-panel text-left text-ink-muted">
          <tr>
            <th className="px-2 py-1.5 font-medium">Row</th>
            <th className="border-r border-rule bg-accent-soft/60 px-2 py-1.5 font-medium whitespace-nowrap text-accent-strong">Stored label</th>
            <th className="border-r border-rule bg-accent-soft/60 px-2 py-1.5 text-right font-medium whitespace-nowrap text-accent-strong">Stored value</th>
            {headers.map((h, i) => (
              <th key={i} className="px-2 py-1.5 font-medium whitespace-nowrap">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {rows.map((r) => (
            <tr key={r.row} className={r.ok ? '' : 'bg-bad-soft/40'} data-ok={r.ok}>
              <td className="num px-2 py-1">{r.row}</td>
              <td className="border-r border-rule px-2 py-1 whitespace-nowrap" data-testid="stored-label">
                {r.stored ? (r.stored.label ?? '—') : <span className="text-ink-faint">not stored</span>}
              </td>
              <td className="num border-r border-rule px-2 py-1 text-right whitespace-nowrap" data-testid="stored-value">
                {r.stored ? r.stored.value : '—'}
              </td>
              {r.cells.map((c, i) => {
                const bad = r.badColumns.includes(headers[i]);
                return (
                  <td
                    key={i}
                    className={`px-2 py-1 whitespace-nowrap ${bad ? 'bg-bad-soft font-medium text-bad ring-1 ring-inset ring-bad/50' : ''}`}
                    title={bad ? reasons.get(`${r.row}|${headers[i]}`) : undefined}
                    data-bad={bad || undefined}
                  >
                    {c === '' && bad ? <span className="italic">empty</span> : c}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** Warnings about the sets of an import (mode sets, Born-charge neutrality): imported all the same. */
function ModeSetWarnings({ warnings, count }: { warnings: ModeSetWarning[]; count: number }) {
  if (warnings.length === 0) return null;
  return (
    <div role="note" aria-label="Import warnings" data-testid="mode-set-warnings" className="rounded-md border border-rule bg-panel px-3 py-2 text-xs">
      <p className="mb-1 font-medium">
        {count.toLocaleString('en')} set{count === 1 ? '' : 's'} to check (imported all the same)
      </p>
      <ul className="list-disc space-y-1 pl-4">
        {warnings.map((w) => (
          <li key={`${w.row}-${w.message}`}>
            Row {w.row}: {w.message}
          </li>
        ))}
      </ul>
      {count > warnings.length && <p className="mt-1 text-ink-muted">…and {(count - warnings.length).toLocaleString('en')} more.</p>}
    </div>
  );
}

function CommitResult({ state, slug }: { state: CommitState; slug: string }) {
  const box = useRef<HTMLDivElement>(null);
  // the Import button is disabled once the rows are in: focus goes to what happened instead
  useEffect(() => {
    if (state.status === 'done' || state.status === 'refused') box.current?.focus();
  }, [state.status]);
  return (
    <div ref={box} tabIndex={-1} className="focus:outline-none" data-testid="commit-result">
      <CommitOutcome state={state} slug={slug} />
    </div>
  );
}

function CommitOutcome({ state, slug }: { state: CommitState; slug: string }) {
  if (state.status === 'done' && 'createdCount' in state.outcome) {
    const o = state.outcome;
    return (
      <Notice tone="good">
        {o.importId === null ? (
          <>Nothing to write: all {count(o.rowCount)} rows are identical to stored {o.kind} (unchanged).</>
        ) : (
          <>
            Imported {count(o.rowCount)} rows: {count(o.createdCount)} {o.kind} created, {count(o.updatedCount)} updated, {count(o.unchangedCount)} unchanged.{' '}
            <Link href={`/w/${slug}/imports/${o.importId}`}>Open the import</Link> · <Link href={`/w/${slug}/${o.kind}`}>Open the {o.kind}</Link>
          </>
        )}
      </Notice>
    );
  }
  if (state.status === 'done' && 'insertedCount' in state.outcome) {
    const o = state.outcome;
    return (
      <>
        <Notice tone="good">
          Imported {count(o.insertedCount)} of {count(o.rowCount)} rows
          {o.duplicateCount > 0 && <> ({count(o.duplicateCount)} identical to existing rows, skipped)</>}.
          {(o.createdMaterials ?? 0) > 0 && <> Created {count(o.createdMaterials!)} {o.createdMaterials === 1 ? 'material' : 'materials'}.</>}
          {(o.createdMethods ?? 0) > 0 && <> Created {count(o.createdMethods!)} {o.createdMethods === 1 ? 'method' : 'methods'}.</>}{' '}
          <Link href={`/w/${slug}/imports/${o.importId}`}>Open the import</Link>
          {(o.createdMethods ?? 0) > 0 && (
            <>
              {' '}
              · <Link href={`/w/${slug}/methods`}>Open the methods</Link>
            </>
          )}
        </Notice>
        <ModeSetWarnings warnings={o.warnings ?? []} count={o.warningCount ?? 0} />
      </>
    );
  }
  if (state.status === 'refused') return <UploadRefused state={state} slug={slug} />;
  return null;
}
