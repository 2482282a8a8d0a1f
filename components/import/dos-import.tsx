'use client';
import Link from 'next/link';
import { useMemo, useState } from 'react';
import { decodeUtf8Strict } from '@/lib/import/decode';
import { dosQuery, parseDosTemperatures } from '@/lib/import/dos-format';
import { previewDos, type DosPreviewResult, type DosReferenceLists } from '@/lib/import/dos-preview';
import { isImportRefusal, type RowError } from '@/lib/import/errors';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { Panel } from '@/components/ui/panel';
import { FileDrop } from './file-drop';
import { RowErrorTable } from './row-error-table';
import { UploadRefused, uploadImport, type UploadState } from './upload-import';
import { count, plain } from '@/lib/format';

type Outcome = { importId: string; insertedCount: number; duplicateCount: number; computedCount: number; dosCount: number };
type CommitState = UploadState<Outcome>;

type Loaded = { file: File; text: string } | { file: File; refusal: { message: string; errors: RowError[] } };

/**
 * The wizard's phonon-DOS path: the file is checked and the entropies computed in the
 * browser with the same reader and harmonicFromDos as the server (DOS files are small,
 * so this runs on the main thread), then the original bytes are sent for commit.
 */
export function DosImport({ workspaceId, slug, references }: { workspaceId: string; slug: string; references: DosReferenceLists | null }) {
  const [temperatureText, setTemperatureText] = useState('298.15');
  const [loaded, setLoaded] = useState<Loaded | null>(null);
  const [commit, setCommit] = useState<CommitState>({ status: 'idle' });
  const temperatures = parseDosTemperatures(temperatureText);

  const preview = useMemo((): { result: DosPreviewResult } | { refusal: { message: string; errors: RowError[] } } | null => {
    const chosen = parseDosTemperatures(temperatureText);
    if (!loaded || !references || !chosen.ok) return null;
    if ('refusal' in loaded) return { refusal: loaded.refusal };
    try {
      return { result: previewDos(loaded.text, references, chosen.temperatures) };
    } catch (e) {
      if (isImportRefusal(e)) return { refusal: { message: e.message, errors: e.errors } };
      return { refusal: { message: (e as Error).message, errors: [] } };
    }
  }, [loaded, references, temperatureText]);

  async function choose(file: File) {
    setCommit({ status: 'idle' });
    try {
      setLoaded({ file, text: decodeUtf8Strict(new Uint8Array(await file.arrayBuffer())) });
    } catch (e) {
      const errors = isImportRefusal(e) ? e.errors : [];
      setLoaded({ file, refusal: { message: (e as Error).message, errors } });
    }
  }

  async function send() {
    if (!loaded || !temperatures.ok) return;
    setCommit({ status: 'sending' });
    setCommit(await uploadImport<Outcome>(workspaceId, dosQuery({ fileName: loaded.file.name, temperatures: temperatures.temperatures }), loaded.file));
  }

  const result = preview && 'result' in preview ? preview.result : null;
  const canCommit = result !== null && result.errorCount === 0 && temperatures.ok && commit.status !== 'sending' && commit.status !== 'done';

  return (
    <div className="space-y-5">
      <Panel title="2 · Temperatures and file">
        <div className="space-y-3">
          <label className="block max-w-md space-y-0.5 text-xs font-medium">
            Temperatures (K) at which to compute entropy and heat capacity
            <input
              className={inputClass}
              value={temperatureText}
              onChange={(e) => {
                setTemperatureText(e.target.value);
                setCommit({ status: 'idle' });
              }}
              aria-invalid={!temperatures.ok}
              aria-describedby="dos-temperatures-hint"
              disabled={commit.status === 'sending'}
            />
          </label>
          <p id="dos-temperatures-hint" className={`text-xs ${temperatures.ok ? 'text-ink-muted' : 'text-bad'}`}>
            {temperatures.ok ? 'Separate several with commas, e.g. 100, 298.15, 500.' : temperatures.reason}
          </p>
          <FileDrop onFile={choose} disabled={commit.status === 'sending'} />
          {loaded && (
            <p className="text-sm text-ink-muted">
              <span className="font-medium text-ink">{loaded.file.name}</span> · <span className="num">{count(loaded.file.size)} bytes</span>
            </p>
          )}
          {preview && 'refusal' in preview && (
            <div className="space-y-2">
              <Notice tone="bad">{preview.refusal.message}</Notice>
              {preview.refusal.errors.length > 0 && <RowErrorTable errors={preview.refusal.errors} errorCount={preview.refusal.errors.length} />}
            </div>
          )}
        </div>
      </Panel>

      {result && (
        <Panel title="3 · What will be computed">
          <div className="space-y-4">
            <p className="text-sm">
              <span className="num font-medium">{count(result.rowCount)}</span> rows · <span className="num">{result.blocks.length}</span> densities of states ·{' '}
              <span className={`num ${result.errorCount ? 'text-bad' : 'text-ink-muted'}`}>{count(result.errorCount)} {result.errorCount === 1 ? 'error' : 'errors'}</span>
              {result.ignored.length > 0 && <span className="text-ink-muted"> · ignored columns: {result.ignored.map((h) => `“${h}”`).join(', ')}</span>}
            </p>
            {result.errorCount > 0 && <RowErrorTable errors={result.errors} errorCount={result.errorCount} />}
            <DosBlocksTable result={result} />
            <p className="text-xs text-ink-muted">
              Harmonic values per formula unit (J mol⁻¹ K⁻¹): the DOS is renormalised to 3 × atoms in the cell and divided by Z, the formula units per cell. Calorimetric
              entropies also hold electronic and anharmonic contributions that a harmonic DOS does not.
            </p>
            <div className="flex items-center gap-3">
              <Button type="button" onClick={send} disabled={!canCommit} aria-disabled={!canCommit}>
                {commit.status === 'sending' ? 'Importing…' : 'Compute and import'}
              </Button>
              {result.errorCount > 0 && <span className="text-xs text-ink-muted">Fix the errors in the file first.</span>}
            </div>
            <DosCommitResult state={commit} slug={slug} />
          </div>
        </Panel>
      )}
    </div>
  );
}

function DosBlocksTable({ result }: { result: DosPreviewResult }) {
  return (
    <div role="region" aria-label="Densities of states in the file" tabIndex={0} className="max-h-96 overflow-auto rounded-md border border-rule">
      <table className="w-full text-xs" data-testid="dos-preview">
        <caption className="sr-only">Densities of states in the file and the values computed from them</caption>
        <thead className="sticky top-0 bg-panel text-left text-ink-muted">
          <tr>
            <th className="px-2 py-1.5 font-medium">Material</th>
            <th className="px-2 py-1.5 font-medium">Method</th>
            <th className="px-2 py-1.5 font-medium">Source</th>
            <th className="px-2 py-1.5 font-medium">Grid</th>
            <th className="px-2 py-1.5 font-medium">Z</th>
            <th className="px-2 py-1.5 font-medium">T (K)</th>
            <th className="px-2 py-1.5 text-right font-medium">S (J mol⁻¹ K⁻¹)</th>
            <th className="px-2 py-1.5 text-right font-medium">C_v (J mol⁻¹ K⁻¹)</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {result.blocks.map((b) => {
            const rows = b.values ?? [null];
            return rows.map((v, i) => (
              <tr key={`${b.firstRow}-${i}`}>
                {i === 0 && (
                  <>
                    <td className="px-2 py-1 align-top" rowSpan={rows.length}>
                      {b.material}
                    </td>
                    <td className="px-2 py-1 align-top" rowSpan={rows.length}>
                      {b.method}
                    </td>
                    <td className="px-2 py-1 align-top font-mono" rowSpan={rows.length}>
                      {b.source}
                    </td>
                    <td className="num px-2 py-1 align-top whitespace-nowrap" rowSpan={rows.length}>
                      {b.points} points, {b.minFrequency}–{b.maxFrequency} {b.unit}
                    </td>
                    <td className="num px-2 py-1 align-top" rowSpan={rows.length}>
                      {b.formulaUnitsPerCell === null ? '—' : plain(Number(b.formulaUnitsPerCell.toFixed(4)))}
                    </td>
                  </>
                )}
                {v ? (
                  <>
                    <td className="num px-2 py-1">{v.temperatureK}</td>
                    <td className="num px-2 py-1 text-right">{v.entropy}</td>
                    <td className="num px-2 py-1 text-right">{v.heatCapacity}</td>
                  </>
                ) : (
                  <td className="px-2 py-1 text-ink-muted" colSpan={3}>
                    computed once the file has no errors
                  </td>
                )}
              </tr>
            ));
          })}
        </tbody>
      </table>
    </div>
  );
}

function DosCommitResult({ state, slug }: { state: CommitState; slug: string }) {
  if (state.status === 'done') {
    const o = state.outcome;
    return (
      <Notice tone="good">
        Stored {count(o.insertedCount)} computed values from {o.dosCount} densities of states
        {o.duplicateCount > 0 && <> ({count(o.duplicateCount)} identical to existing rows, skipped)</>}.{' '}
        <Link href={`/w/${slug}/imports/${o.importId}`}>Open the import</Link>
      </Notice>
    );
  }
  if (state.status === 'refused') return <UploadRefused state={state} slug={slug} />;
  return null;
}
