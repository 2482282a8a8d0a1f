import { Suspense } from 'react';
import Link from 'next/link';
import type { BenchmarkRecord } from '@/db/queries/benchmarks';
import { scopeLabels } from '@/db/queries/benchmarks';
import { materialNames, pairLookups, type RevisionView } from '@/db/queries/revisions';
import { listDecisions, listPins } from '@/db/queries/decisions';
import { describeScope, techniqueName } from '@/lib/benchmark/describe';
import { howToCite } from '@/lib/benchmark/citation';
import { RevisionSources } from '@/components/citations/revision-sources';
import { env } from '@/lib/env';
import { roleCan, type WorkspaceRole } from '@/lib/permissions';
import { EmptyState, Panel } from '@/components/ui/panel';
import { Notice } from '@/components/ui/notice';
import { buttonClass } from '@/components/ui/button';
import { Leaderboard } from './leaderboard';
import { ScalingPanel } from './scaling-panel';
import { ReferencePanel } from './reference-panel';
import { TensorPanel } from './tensor-panel';
import { MaterialTable } from './material-table';
import { cautionOf } from '@/lib/benchmark/compute';
import { isDielectric, isThermal } from '@/lib/benchmark/quantities';
import { BreakdownTable } from './breakdown-table';
import { BenchmarkPlots } from './benchmark-plots';
import { MethodComparison } from './method-comparison';
import { RevisionHistoryLoading, RevisionHistoryPanel } from './revision-history-panel';
import { PairDecisionForm, RecomputeButton, RevertForm } from './decision-forms';
import { RecomputeWatcher } from './recompute-watcher';
import { QueryProvider } from './query-provider';
import { counted, header as withUnitHeader, plain, signed, trueMinus, utcMinute as when } from '@/lib/format';
import { qualityLines } from '@/lib/benchmark/quality-lines';
import { comparisonFromSearch } from '../schemas';
import { AddToDeck } from '@/app/(app)/w/[workspace]/decks/_components/add-to-deck';
import { DiscussButton } from '@/app/(app)/w/[workspace]/_discussion/discuss-button';
import { listBenchmarkThreads, threadsBySubject } from '@/db/queries/comments';
import { ScrollRegion } from '@/components/ui/scroll-region';

export const QUALITY_BAR_NOTE =
  'Statistics depend on the quality and representativeness of the data; they support, and do not replace, expert judgement and peer review.';

const OUTLIER_ROWS = 200;

export async function BenchmarkView({
  bm,
  rev,
  workspace,
  role,
  computing,
  search = {},
}: {
  bm: BenchmarkRecord;
  rev: RevisionView | null;
  workspace: { id: string; slug: string; name: string };
  role: WorkspaceRole;
  computing: boolean;
  /** The page's search parameters (the method comparison's pair). */
  search?: Record<string, string | string[] | undefined>;
}) {
  const base = `/w/${workspace.slug}/benchmarks/${bm.id}`;
  const api = `/api/workspaces/${workspace.id}/benchmarks/${bm.id}`;
  const readOnly = rev !== null && !rev.isLatest;
  // Decisions and pins name measurements: a benchmark against a reference method has none.
  const canDecide = !readOnly && bm.scope.referenceMethodId === undefined && roleCan(role, 'decisions:create');
  const canRevert = !readOnly && roleCan(role, 'decisions:revert');
  const canEdit = roleCan(role, 'benchmarks:update');
  const labels = await scopeLabels(workspace.id, bm.scope);
  const scopeText = describeScope(bm.scope, { methods: labels.methods.map((m) => m.label), materials: labels.materials.map((m) => m.name), reference: labels.reference });

  const header = (
    <header className="space-y-2">
      <p className="text-xs uppercase tracking-wide text-ink-faint">
        <Link href={`/w/${workspace.slug}/benchmarks`}>Benchmarks</Link>
      </p>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h1>{bm.name}</h1>
          {bm.purpose ? <p className="text-sm text-ink-muted">{bm.purpose}</p> : null}
          <p className="text-sm text-ink-muted">Scope: {scopeText}.</p>
        </div>
        <div className="flex flex-wrap gap-2">
          {canEdit ? (
            <Link href={`${base}/edit`} className={buttonClass('secondary')}>
              Edit scope and rules
            </Link>
          ) : null}
          {canEdit && !readOnly ? <RecomputeButton workspaceId={workspace.id} benchmarkId={bm.id} /> : null}
        </div>
      </div>
      {rev ? (
        <p className="text-xs text-ink-muted" data-testid="revision-line">
          Revision {rev.number} · {when(rev.createdAt)} · fingerprint sha256:{rev.fingerprint.slice(0, 16)}
          {readOnly ? (
            <>
              {' '}
              · <strong>read-only past revision</strong> · <Link href={base}>open the latest</Link>
            </>
          ) : null}
        </p>
      ) : null}
    </header>
  );

  const watcher = !readOnly ? (
    <QueryProvider>
      <RecomputeWatcher key={`${rev?.number ?? 0}-${computing}`} workspaceId={workspace.id} benchmarkId={bm.id} shownRevision={rev?.number ?? null} computing={computing} canRetry={canEdit} />
    </QueryProvider>
  ) : null;

  if (!rev) {
    return (
      <div className="space-y-6">
        {header}
        {watcher}
        <EmptyState title="No revision yet">
          {computing ? 'The first revision is being computed.' : 'Nothing has been computed for this benchmark yet. Recompute it to store its first revision.'}
        </EmptyState>
      </div>
    );
  }

  const snap = rev.statistics;
  const [lookups, decisions, pins] = await Promise.all([
    pairLookups(workspace.id, snap),
    listDecisions(workspace.id, bm.id),
    listPins(workspace.id),
  ]);
  const threads = threadsBySubject(await listBenchmarkThreads(workspace.id, bm.id));
  const can = { comment: roleCan(role, 'comments:create'), resolve: roleCan(role, 'comments:resolve'), decide: canDecide };
  const extraNames = await materialNames(
    workspace.id,
    snap.quality.map((q) => q.materialId).filter((id) => !lookups.materials.has(id)),
  );
  const materialName = (id: string) => lookups.materials.get(id)?.name ?? extraNames.get(id) ?? id.slice(0, 8);

  const pairByKey = new Map(snap.pairs.map((p) => [p.key, p]));
  const excludedCount = snap.pairs.filter((p) => p.excluded !== null).length;
  const methodList = [...snap.methods].sort((a, b) => a.label.localeCompare(b.label)).map((m) => ({ methodId: m.methodId, label: m.label }));
  const methodLabel = new Map(snap.methods.map((m) => [m.methodId, m.label]));
  const flagged = snap.pairs.filter((p) => p.outlier !== null || p.excluded !== null);
  const scopeMethods = new Set(snap.methods.map((m) => m.methodId));
  const activePins = pins.filter((p) => scopeMethods.has(p.methodId));
  const url = `${env().BETTER_AUTH_URL.replace(/\/$/, '')}${base}/revisions/${rev.number}`;
  const cite = howToCite({ workspaceName: workspace.name, benchmarkName: bm.name, revisionNumber: rev.number, fingerprint: rev.fingerprint, createdAt: rev.createdAt, url });
  const fileStem = `${bm.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'benchmark'}-r${rev.number}`;
  const q = `revision=${rev.number}`;
  const comparison = comparisonFromSearch(search, methodList.map((m) => m.methodId));
  // older revisions stored no caution: the quantity's own
  const caution = snap.reference ? null : (snap.caution ?? cautionOf(snap.quantity, snap.rules));
  const qualityLineList = qualityLines(snap.quality, (id) => methodLabel.get(id) ?? id, materialName);

  return (
    <div className="space-y-6">
      {header}
      <div id="discussion">
        <DiscussButton workspaceId={workspace.id} subject={{ kind: 'revision', id: rev.id, benchmarkId: bm.id }} title={`revision ${rev.number}`} threads={threads.get(`revision|${rev.id}`) ?? []} can={can} />
      </div>
      {watcher}
      {caution ? (
        <Notice tone="warn">
          <span data-testid={`${isDielectric(snap.quantity) ? 'dielectric' : snap.quantity}-caution`}>{caution}</span>
          {isThermal(snap.quantity) ? (
            <>
              {' '}
              <span data-testid="entropy-basis">
                {snap.entropyBasis === 'atom'
                  ? 'Values are compared per mole of atoms (each formula-unit value divided by the atoms of the reduced formula), so every material weighs alike.'
                  : 'Values are compared per mole of formula units of the reduced formula (per GaN for a material written Ga2N2), as thermochemical tables give them.'}
              </span>
            </>
          ) : null}
          {snap.cpCorrection ? (
            <>
              {' '}
              <span data-testid="cp-correction">
                Corrected: {snap.cpCorrection.corrected} material{snap.cpCorrection.corrected === 1 ? '' : 's'}.
                {snap.cpCorrection.lacking.length
                  ? ` Left out for want of α, B or V_m: ${snap.cpCorrection.lacking.slice(0, 12).join(', ')}${snap.cpCorrection.lacking.length > 12 ? ` and ${snap.cpCorrection.lacking.length - 12} more` : ''}.`
                  : ''}
              </span>
            </>
          ) : null}
        </Notice>
      ) : null}

      {snap.empty ? (
        <EmptyState title="Nothing to compare in this scope">
          <p>{snap.empty}</p>
          <p className="mt-2">
            The scope asks for {scopeText}. Widen the techniques, the temperature window, the tags or the methods{canEdit ? '' : ' (a curator can)'}.
          </p>
        </EmptyState>
      ) : (
        // one query client for the plots and the comparison, so the pairs are fetched once
        <QueryProvider>
          {snap.reference ? (
            <Panel title={`Against the reference method ${snap.reference.label}`}>
              <ReferencePanel reference={snap.reference} unit={snap.unit} convergenceHref={`${base}/convergence`} />
            </Panel>
          ) : null}
          <Panel title="Leaderboard" actions={<AddToDeck workspaceId={workspace.id} kinds={['leaderboard']} benchmarkId={bm.id} revisionNumber={rev.number} />}>
            {snap.reference ? (
              <p className="mb-2 text-xs text-ink-muted" data-testid="reference-note">
                Every statistic below is the distance from the reference method {snap.reference.label}, not from experiment: where a column says measured, read reference.
              </p>
            ) : null}
            <Leaderboard methods={snap.methods} unit={snap.unit} pairByKey={pairByKey} materialName={materialName} ranking={snap.ranking} reference={snap.reference?.label} />
            <p className="mt-1 text-xs text-ink-muted" data-testid="scope-counts">
              {(snap.counts.measuredInScope ?? snap.counts.measurements).toLocaleString('en')} {snap.reference ? 'reference' : 'measured'} values in scope; {excludedCount.toLocaleString('en')} pair{excludedCount === 1 ? '' : 's'} excluded by decisions (kept in the
              lists, out of every statistic).
            </p>
          </Panel>

          {snap.tensors?.length ? (
            <Panel title="Full Born-charge tensors">
              <TensorPanel tensors={snap.tensors} pairsByMethod={new Map(snap.methods.map((m) => [m.methodId, m.n]))} />
            </Panel>
          ) : null}

          {snap.quantity === 'frequency' && !snap.reference ? (
            <Panel title="Scaling">
              <ScalingPanel methods={snap.methods} unit={snap.unit} />
            </Panel>
          ) : null}

          <Panel title="Plots">
            <BenchmarkPlots
                workspaceId={workspace.id}
                benchmarkId={bm.id}
                revision={rev.number}
                fileStem={fileStem}
                methods={snap.methods.map((m) => ({ methodId: m.methodId, label: m.label, limits: m.statistics?.blandAltman ?? null }))}
              />
          </Panel>

          {snap.materialRows ? (
            <Panel title="Per material">
              <p className="mb-2 text-xs text-ink-muted">The crystals that break a method: its materials, worst MAE first. Sort by any column.</p>
              <MaterialTable rows={snap.materialRows} methods={methodList} unit={snap.unit} slug={workspace.slug} />
            </Panel>
          ) : null}

          <div className="grid gap-4 xl:grid-cols-2">
            <Panel title="Per material class">
              <BreakdownTable rows={snap.classes} methods={methodList} groupTitle="Class (tag)" caption="Statistics per material class" unit={snap.unit} />
            </Panel>
            {snap.quantity === 'frequency' ? (
              <Panel title={`Per frequency band (${snap.unit})`}>
                <BreakdownTable rows={snap.bands} methods={methodList} groupTitle="Measured band" caption="Statistics per frequency band" unit={snap.unit} />
              </Panel>
            ) : null}
            {snap.species?.length ? (
              <Panel title="Per symmetry species">
                <BreakdownTable rows={snap.species} methods={methodList} groupTitle="Species" caption="Statistics per irreducible-representation species" unit={snap.unit} />
              </Panel>
            ) : null}
            {snap.branches?.length ? (
              <Panel title="Per branch (TO / LO)">
                <BreakdownTable rows={snap.branches} methods={methodList} groupTitle="Branch" caption="Statistics per TO / LO branch" unit={snap.unit} />
              </Panel>
            ) : null}
            {snap.techniques?.length ? (
              <Panel title="Per technique">
                <BreakdownTable rows={snap.techniques.map((r) => ({ ...r, group: techniqueName(r.group === 'not stated' ? null : r.group) }))} methods={methodList} groupTitle="Technique" caption="Statistics per measurement technique" unit={snap.unit} />
              </Panel>
            ) : null}
          </div>

          <Panel title="Method comparison">
            <MethodComparison
                workspaceId={workspace.id}
                benchmarkId={bm.id}
                revision={rev.number}
                methods={methodList}
                comparisons={snap.comparisons}
                unit={snap.unit}
                fileStem={fileStem}
                initial={comparison.pair}
                initialError={comparison.error}
              />
          </Panel>

          <Panel title={`Outliers and excluded pairs (${flagged.length})`} actions={<AddToDeck workspaceId={workspace.id} kinds={['outliers']} benchmarkId={bm.id} revisionNumber={rev.number} />}>
            <p className="mb-2 text-xs text-ink-muted">
              Rule: {snap.rules.outlierRule.kind} with threshold {snap.rules.outlierRule.threshold}
              {snap.outlierScale ? ` on the ${snap.outlierScale} error` : ''}
              {snap.rules.outlierRule.minN && (snap.rules.outlierRule.kind === 'modified-z' || snap.rules.outlierRule.kind === 'tukey')
                ? `, applied to methods with at least ${snap.rules.outlierRule.minN} included pairs`
                : ''}
              . Flagged pairs stay in the statistics until a curator excludes them.
            </p>
            {flagged.length === 0 ? (
              <p className="text-sm text-ink-muted">No pair is flagged or excluded.</p>
            ) : (
              <ScrollRegion label="Outliers and excluded pairs table">
                <table className="min-w-full border-collapse text-[13px]" data-testid="outliers">
                  <thead className="border-b border-rule">
                    <tr className="text-left text-ink-muted">
                      <th className="px-2 py-1.5 font-medium">Pair (measurement source)</th>
                      <th className="px-2 py-1.5 font-medium">Method</th>
                      <th className="px-2 py-1.5 font-medium">{withUnitHeader('Measured → calculated', snap.unit)}</th>
                      <th className="px-2 py-1.5 font-medium">{withUnitHeader('Error', snap.unit)}</th>
                      <th className="px-2 py-1.5 font-medium">Why</th>
                      <th className="px-2 py-1.5 font-medium">Discussion</th>
                      {canDecide ? <th className="px-2 py-1.5 font-medium">Decision</th> : null}
                    </tr>
                  </thead>
                  <tbody>
                    {flagged.slice(0, OUTLIER_ROWS).map((p) => {
                      const src = lookups.sources.get(p.sourceIds[0]);
                      return (
                        <tr key={p.key} id={`pair-${encodeURIComponent(p.key)}`} className="border-b border-rule/70 align-top">
                          <td className="min-w-48 px-2 py-1.5">
                            <Link href={`/w/${workspace.slug}/materials/${p.materialId}`}>{materialName(p.materialId)}</Link>
                            {p.label ? ` ${p.label}` : null} <span className="text-xs text-ink-faint">{techniqueName(p.technique)}</span>
                            <span className="mt-0.5 block text-xs text-ink-muted" data-testid="pair-source">
                              {src ? (
                                <>
                                  {src.citation}
                                  {src.doi ? (
                                    <>
                                      {' '}
                                      <a href={`https://doi.org/${src.doi}`} rel="noreferrer noopener" target="_blank">
                                        doi
                                      </a>
                                    </>
                                  ) : null}
                                </>
                              ) : (
                                'source not found'
                              )}
                            </span>
                          </td>
                          <td className="px-2 py-1.5">{methodLabel.get(p.methodId)}</td>
                          <td className="num px-2 py-1.5 whitespace-nowrap">
                            {plain(p.measured)} → {plain(p.calculated)}
                          </td>
                          <td className="num px-2 py-1.5 whitespace-nowrap">{signed(p.error)}</td>
                          <td className="min-w-44 px-2 py-1.5">
                            {p.excluded !== null ? <span className="text-bad">Excluded: {p.excluded}</span> : <span className="text-warn">{trueMinus(p.outlier ?? '')}</span>}
                          </td>
                          <td className="px-2 py-1.5 whitespace-nowrap">
                            <DiscussButton
                              workspaceId={workspace.id}
                              subject={{ kind: 'pair', id: p.key, benchmarkId: bm.id, pinnable: p.measurementIds.length === 1 && p.calculationIds.length > 0 }}
                              title={`${[materialName(p.materialId), p.label].filter(Boolean).join(' ')} · ${methodLabel.get(p.methodId) ?? ''}`}
                              threads={threads.get(`pair|${p.key}`) ?? []}
                              can={can}
                            />
                          </td>
                          {canDecide ? (
                            <td className="min-w-28 px-2 py-1.5">
                              {p.excluded === null && p.measurementIds.length === 1 ? (
                                <PairDecisionForm
                                  pair={{
                                    workspaceId: workspace.id,
                                    benchmarkId: bm.id,
                                    methodId: p.methodId,
                                    measurementId: p.measurementIds[0],
                                    calculationId: p.calculationIds[0] ?? null,
                                  }}
                                />
                              ) : (
                                <span className="text-xs text-ink-faint">see decisions below</span>
                              )}
                            </td>
                          ) : null}
                        </tr>
                      );
                    })}
                  </tbody>
                </table>
                {flagged.length > OUTLIER_ROWS ? <p className="mt-1 text-xs text-ink-muted">Showing the first {OUTLIER_ROWS}; the pairs CSV lists all.</p> : null}
              </ScrollRegion>
            )}
          </Panel>
        </QueryProvider>
      )}

      <div className="grid gap-4 xl:grid-cols-2">
        <Panel id="decisions" title={`Decisions and pins (${decisions.filter((d) => !d.revertedAt).length} in force, ${activePins.length} pins)`}>
          {decisions.length === 0 && activePins.length === 0 ? (
            <p className="text-sm text-ink-muted">No decision recorded yet.</p>
          ) : (
            <ul className="space-y-2 text-sm" data-testid="decisions">
              {decisions.map((d) => (
                <li key={d.id} className={d.revertedAt ? 'text-ink-faint line-through decoration-ink-faint/50' : ''}>
                  <span className="font-medium">{d.kind}</span> {d.methodLabel ? `(${d.methodLabel})` : '(every method)'} — “{d.reason}” · {d.createdBy ?? 'unknown'}, {when(d.createdAt)}
                  {d.revertedAt ? ` · reverted ${when(d.revertedAt)}: ${d.revertReason}` : null}
                  {!d.revertedAt && canRevert ? <RevertForm workspaceId={workspace.id} benchmarkId={bm.id} decisionId={d.id} /> : null}
                </li>
              ))}
              {activePins.map((p) => (
                <li key={p.id}>
                  <span className="font-medium">{p.calculationId ? 'pinned pairing' : 'no counterpart'}</span> ({p.methodLabel}) — “{p.reason}” · {p.createdBy ?? 'unknown'}, {when(p.createdAt)}
                  {canRevert ? <RevertForm workspaceId={workspace.id} benchmarkId={bm.id} pinId={p.id} /> : null}
                </li>
              ))}
            </ul>
          )}
        </Panel>
        <Panel title={`Quality flags (${qualityLineList.length} ${qualityLineList.length === 1 ? 'line' : 'lines'}, ${counted(snap.quality.length, 'flag')})`}>
          {snap.quality.length === 0 ? (
            <p className="text-sm text-ink-muted">No calculation set in scope fails a quality check.</p>
          ) : (
            <>
              <p className="mb-2 text-xs text-ink-muted">Most serious first. A note that follows from a method&apos;s grids alone is one line per method, with the number of materials it concerns.</p>
              <ScrollRegion label="Quality flags list" className="max-h-80 overflow-y-auto">
                <ul className="space-y-1.5 text-sm" data-testid="quality-lines">
                  {qualityLineList.slice(0, 300).map((l) => (
                    <li key={l.key} data-code={l.code} className="leading-snug">
                      <span className={`mr-1 rounded px-1.5 text-xs font-medium ${l.severity === 'error' ? 'bg-bad-soft text-bad' : 'bg-warn-soft text-warn'}`}>{l.codeName}</span>
                      <span className="font-medium">{l.methodLabel}</span> · <span>{l.scope}</span>: <span className="text-ink-muted">{l.message}</span>
                      {l.materials.length > 1 ? (
                        <details className="ml-1 text-xs text-ink-muted">
                          <summary className="cursor-pointer">Which materials</summary>
                          {l.materials.join(', ')}
                        </details>
                      ) : null}
                    </li>
                  ))}
                </ul>
              </ScrollRegion>
            </>
          )}
          {snap.qualityNotApplied?.length ? (
            <ul className="mt-2 space-y-1 text-xs text-ink-muted" data-testid="quality-not-applied">
              {snap.qualityNotApplied.slice(0, 50).map((n, i) => (
                <li key={i}>
                  {n.code} · {methodLabel.get(n.methodId)} · {materialName(n.materialId)}: {n.reason}
                </li>
              ))}
            </ul>
          ) : null}
        </Panel>
      </div>

      <div id="revision-history">
        <Suspense fallback={<RevisionHistoryLoading />}>
          <RevisionHistoryPanel workspaceId={workspace.id} benchmarkId={bm.id} base={base} current={rev.number} />
        </Suspense>
      </div>

      <Panel title="Cite and download">
        <div className="space-y-3 text-sm">
          <div>
            <p className="font-medium">How to cite this revision</p>
            <p className="rounded-md border border-rule bg-paper px-3 py-2 font-mono text-xs" data-testid="how-to-cite">
              {cite}
            </p>
          </div>
          <div className="flex flex-wrap gap-2">
            <a className={buttonClass('secondary')} href={`${api}/pairs?${q}&format=csv`} download>
              Pairs (CSV)
            </a>
            <a className={buttonClass('secondary')} href={`${api}/leaderboard?${q}&format=csv`} download>
              Leaderboard (CSV)
            </a>
            <a className={buttonClass('secondary')} href={`${api}/leaderboard?${q}&format=latex`} download>
              Leaderboard (LaTeX)
            </a>
            <span className="self-center text-xs text-ink-muted">Plots download as SVG or PNG from their own buttons.</span>
          </div>
          <RevisionSources pairs={snap.pairs} sources={lookups.sources} sourcesHref={`/w/${workspace.slug}/sources`} exportHref={(f) => `${api}/sources?${q}&format=${f}`} />
          <p className="text-xs text-ink-muted">
            {snap.counts.measurements.toLocaleString('en')} measurements, {snap.counts.calculations.toLocaleString('en')} calculations, {snap.counts.materials.toLocaleString('en')} materials and{' '}
            {snap.counts.methods} methods in scope; {snap.pairs.length.toLocaleString('en')} pairs.
          </p>
        </div>
      </Panel>

      <p className="border-t border-rule pt-3 text-xs text-ink-muted" data-testid="quality-bar-note">
        {QUALITY_BAR_NOTE}
      </p>
    </div>
  );
}
