import Link from 'next/link';
import { getRevision, pairLookups } from '@/db/queries/revisions';
import { describeProblem, type DeckViewEntry } from '@/db/queries/decks';
import { listSubjectThreads, openPairThreadCounts } from '@/db/queries/comments';
import { getMaterial } from '@/db/queries/materials';
import { getMaterialValues } from '@/db/queries/material-values';
import { plotPoints } from '@/lib/benchmark/pairs-export';
import { techniqueName } from '@/lib/benchmark/describe';
import type { PairRecord } from '@/lib/benchmark/types';
import { Notice } from '@/components/ui/notice';
import { IncompleteMark } from '@/components/citations/incomplete-mark';
import { Leaderboard } from '@/app/(app)/w/[workspace]/benchmarks/_components/leaderboard';
import { MaterialValuesSection } from '@/app/(app)/w/[workspace]/materials/_components/material-values';
import { fixed, plain, pValue, signed, trueMinus, utcMinute } from '@/lib/format';
import { SlidePlot, type SlidePlotKind } from './slide-plot';
import { PLOT_KINDS, VIEW_KIND_LABELS } from '@/lib/decks/view-kinds';
import { flaggedPairs, ROWS_PER_SLIDE, type SlideMode } from './slide-parts';

export type { SlideMode } from './slide-parts';

interface Citation {
  key: string;
  text: string;
  doi: string | null;
  gaps: string[];
}

const CITATIONS_SHOWN = 24;

function Citations({ items, columns }: { items: Citation[]; columns: 1 | 2 | 3 }) {
  if (items.length === 0) return null;
  const shown = items.slice(0, CITATIONS_SHOWN);
  return (
    <div className="text-xs text-ink-muted" data-testid="slide-citations">
      <p className="font-medium text-ink">Sources ({items.length})</p>
      <ul className={columns === 1 ? '' : columns === 2 ? 'columns-2 gap-6' : 'columns-3 gap-6'}>
        {shown.map((c) => (
          <li key={c.key} className="break-inside-avoid">
            <span className="font-mono">{c.key}</span>
            <IncompleteMark gaps={c.gaps} /> — {c.text}
            {c.doi ? ` · doi:${c.doi}` : ''}
          </li>
        ))}
      </ul>
      {items.length > shown.length ? <p>… and {items.length - shown.length} more (the deck&apos;s benchmark lists every source).</p> : null}
    </div>
  );
}

function citationsOf(pairs: readonly PairRecord[], sources: Map<string, { citeKey: string; citation: string; doi: string | null; gaps: string[] }>): Citation[] {
  const ids = [...new Set(pairs.flatMap((p) => p.sourceIds))];
  return ids
    .map((id) => sources.get(id))
    .filter((s): s is NonNullable<typeof s> => !!s)
    .map((s) => ({ key: s.citeKey, text: s.citation, doi: s.doi, gaps: s.gaps }))
    .sort((a, b) => a.key.localeCompare(b.key));
}

function ThreadCount({ count, mode }: { count: number; mode: SlideMode }) {
  if (mode === 'print' && count === 0) return null;
  return (
    <p className="text-sm" data-testid="slide-open-threads" data-count={count}>
      {count === 0 ? 'No open thread on the points of this slide.' : `${count} open thread${count === 1 ? '' : 's'} on the points of this slide.`}
    </p>
  );
}

/**
 * One deck view rendered from its pinned revision (or what is missing, when its target is gone).
 * A long outlier table is split over `parts` slides; `part` is this one (0-based).
 */
export async function DeckSlide({ workspace, entry, mode, part = 0, parts = 1 }: { workspace: { id: string; slug: string }; entry: DeckViewEntry; mode: SlideMode; part?: number; parts?: number }) {
  const kindLabel = VIEW_KIND_LABELS[entry.viewKind] ?? entry.viewKind;
  const heading =
    (entry.title ?? (entry.benchmark ? `${kindLabel} · ${entry.benchmark.name}` : entry.material ? `${kindLabel} · ${entry.material.name}` : kindLabel)) +
    (parts > 1 ? ` (${part + 1} of ${parts})` : '');
  const big = mode === 'present';
  const isPlot = (PLOT_KINDS as readonly string[]).includes(entry.viewKind) || entry.viewKind === 'comparison';
  const note = entry.note ? <p className={`${big ? 'text-xl' : 'text-sm'} whitespace-pre-wrap border-l-4 border-accent pl-3`} data-testid="slide-note">{entry.note}</p> : null;
  // A plot is limited by the height of a screen or a landscape page: its note, threads and sources go beside it, not under it
  // (the faceted histogram is too wide for that on paper).
  const beside = isPlot && (big || entry.viewKind !== 'histogram');
  const shell = (subtitle: React.ReactNode, body: React.ReactNode, footer: React.ReactNode) => (
    <article className="flex h-full flex-col gap-3" data-testid="slide" data-kind={entry.viewKind}>
      <header>
        <h2 className={big ? 'text-3xl font-semibold tracking-tight' : 'text-xl font-semibold'}>{heading}</h2>
        <div className={`${big ? 'text-base' : 'text-xs'} text-ink-muted`}>{subtitle}</div>
      </header>
      <div className={beside ? `grid min-h-0 flex-1 gap-6 ${big ? 'grid-cols-[minmax(0,1fr)_18rem]' : 'grid-cols-[minmax(0,1fr)_15rem]'}` : 'contents'}>
        <div className={`min-h-0 flex-1 ${big && !isPlot ? 'overflow-auto' : ''} ${big ? (isPlot ? 'text-base' : 'text-sm xl:text-base') : 'text-[13px]'}`} tabIndex={big && !isPlot ? 0 : undefined} data-testid="slide-body">
          {body}
        </div>
        <div className={beside ? 'min-h-0 space-y-3 overflow-auto' : 'contents'}>
          {part === 0 ? note : null}
          <footer className="space-y-2">{footer}</footer>
        </div>
      </div>
    </article>
  );

  if (entry.problem) {
    return shell(
      <span>{kindLabel}</span>,
      <Notice tone="warn">
        <span data-testid="slide-missing">{describeProblem(entry.problem)}</span>
      </Notice>,
      null,
    );
  }

  if (entry.viewKind === 'material' && entry.material) {
    const [m, values, threads] = await Promise.all([
      getMaterial(workspace.id, entry.material.id),
      getMaterialValues(workspace.id, entry.material.id),
      listSubjectThreads(workspace.id, 'material', entry.material.id),
    ]);
    const selected = values.methods.find((x) => x.methodId === entry.filters.methodId) ?? values.methods[0];
    const cited = new Map([...values.peaks, ...(selected?.modes ?? []), ...values.entropies].map((v) => [v.citeKey, v.sourceGaps]));
    const keys = [...cited.keys()].sort();
    return shell(
      <span>
        {m?.formula} · current values (a material page is not pinned to a revision)
      </span>,
      <MaterialValuesSection slug={workspace.slug} materialId={entry.material.id} materialName={entry.material.name} values={values} selectedMethodId={selected?.methodId} />,
      <>
        <ThreadCount count={threads.filter((t) => !t.resolvedAt).length} mode={mode} />
        <Citations items={keys.map((k) => ({ key: k, text: 'see Sources', doi: null, gaps: cited.get(k) ?? [] }))} columns={mode === 'print' ? 2 : 3} />
      </>,
    );
  }

  const bm = entry.benchmark!;
  const rev = await getRevision(workspace.id, bm.id, entry.revision!.number);
  if (!rev) {
    return shell(<span>{bm.name}</span>, <Notice tone="warn">{describeProblem({ kind: 'revision-missing', benchmarkName: bm.name })}</Notice>, null);
  }
  const snap = rev.statistics;
  const [lookups, openCounts] = await Promise.all([pairLookups(workspace.id, snap), openPairThreadCounts(workspace.id, bm.id)]);
  const hidden = new Set(entry.filters.hiddenMethods ?? []);
  const methodLabel = new Map(snap.methods.map((x) => [x.methodId, x.label]));
  const materialName = (id: string) => lookups.materials.get(id)?.name ?? id.slice(0, 8);
  const newer = entry.latestNumber !== null && entry.latestNumber > rev.number;
  const subtitle = (
    <span>
      {bm.name} · revision {rev.number} of {utcMinute(rev.createdAt)}
      {newer ? <strong className="text-warn"> · a newer revision ({entry.latestNumber}) exists</strong> : null}
    </span>
  );

  let shownPairs: PairRecord[] = snap.pairs.filter((p) => !hidden.has(p.methodId));
  let body: React.ReactNode;
  if (snap.empty) {
    body = <Notice tone="info">{snap.empty}</Notice>;
    shownPairs = [];
  } else if (entry.viewKind === 'leaderboard') {
    const methods = snap.methods.filter((x) => !hidden.has(x.methodId));
    body = <Leaderboard methods={methods} unit={snap.unit} pairByKey={new Map(snap.pairs.map((p) => [p.key, p]))} materialName={materialName} details="none" />;
  } else if (entry.viewKind === 'outliers') {
    const all = flaggedPairs(snap.pairs, entry.filters.hiddenMethods);
    const perSlide = ROWS_PER_SLIDE[mode];
    const first = part * perSlide;
    const flagged = all.slice(first, first + perSlide);
    // Below 1280 px the presenter drops the cite-key column: the slide's sources are listed under the table anyway.
    const narrowHidden = big ? 'hidden xl:table-cell' : '';
    shownPairs = flagged;
    body =
      all.length === 0 ? (
        <p className="text-ink-muted">No pair is flagged or excluded in this revision.</p>
      ) : (
        <>
          <table className="min-w-full border-collapse" data-testid="slide-outliers">
            <thead className="border-b border-rule text-left text-ink-muted">
              <tr>
                <th className="px-2 py-1 font-medium">Pair</th>
                <th className="px-2 py-1 font-medium">Method</th>
                <th className="px-2 py-1 text-right font-medium whitespace-nowrap">Measured → calculated ({snap.unit})</th>
                <th className="px-2 py-1 text-right font-medium whitespace-nowrap">Error ({snap.unit})</th>
                <th className="px-2 py-1 font-medium">Why</th>
                <th className={`px-2 py-1 font-medium whitespace-nowrap ${narrowHidden}`}>Measured in</th>
              </tr>
            </thead>
            <tbody>
              {flagged.map((p) => (
                <tr key={p.key} className="border-b border-rule/70 align-top">
                  <td className="px-2 py-1 whitespace-nowrap">
                    {[materialName(p.materialId), p.label].filter(Boolean).join(' ')} <span className="text-ink-faint">{techniqueName(p.technique)}</span>
                    {openCounts.get(p.key) ? <span className="ml-1 rounded bg-warn-soft px-1 text-[0.8em] text-warn">{openCounts.get(p.key)} open</span> : null}
                  </td>
                  <td className="px-2 py-1 whitespace-nowrap">{methodLabel.get(p.methodId)}</td>
                  <td className="num whitespace-nowrap px-2 py-1 text-right">
                    {plain(p.measured)} → {fixed(p.calculated, 2)}
                  </td>
                  <td className="num px-2 py-1 text-right">{signed(p.error)}</td>
                  <td className="px-2 py-1">{p.excluded !== null ? <span className="text-bad">Excluded: {trueMinus(p.excluded)}</span> : <span className="whitespace-nowrap text-warn">{trueMinus(p.outlier ?? '')}</span>}</td>
                  {/* the measurement's cite key (its source comes first); every citation of the slide is listed under the table */}
                  <td className={`px-2 py-1 font-mono text-[0.8em] whitespace-nowrap ${narrowHidden}`}>{lookups.sources.get(p.sourceIds[0])?.citeKey ?? '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {parts > 1 ? (
            <p className="text-xs text-ink-muted">
              Rows {first + 1}–{first + flagged.length} of {all.length}
              {part + 1 < parts ? '; continued on the next slide.' : '.'}
            </p>
          ) : null}
        </>
      );
  } else {
    const points = plotPoints(snap, lookups);
    const methods = snap.methods.map((x) => ({ methodId: x.methodId, label: x.label, limits: x.statistics?.blandAltman ?? null }));
    const kind = entry.viewKind as SlidePlotKind;
    if (kind === 'bland-altman') {
      const chosen = methods.find((x) => x.methodId === entry.filters.methodId) ?? methods.find((x) => x.limits) ?? methods[0];
      shownPairs = shownPairs.filter((p) => p.methodId === chosen?.methodId);
    } else if (kind === 'comparison') {
      const a = entry.filters.methodA ?? methods[0]?.methodId;
      const b = entry.filters.methodB ?? methods[1]?.methodId;
      shownPairs = snap.pairs.filter((p) => p.methodId === a || p.methodId === b);
    }
    const record = kind === 'comparison' ? snap.comparisons.find((c) => [c.a, c.b].includes(entry.filters.methodA ?? '') && [c.a, c.b].includes(entry.filters.methodB ?? '')) : undefined;
    body = (
      <div className={`flex gap-6 ${big ? 'h-full items-stretch' : 'flex-wrap items-start'}`}>
        <div className={big ? 'h-full min-w-0 flex-1' : ''} data-plot-slot>
          <SlidePlot kind={kind} points={points} methods={methods} unit={snap.unit} filters={entry.filters} fileName={`${bm.name.replace(/[^A-Za-z0-9]+/g, '-')}-r${rev.number}-${kind}`} forPrint={mode === 'print'} />
        </div>
        {record ? (
          <dl className="grid shrink-0 grid-cols-2 content-start gap-x-4 gap-y-1" data-testid="slide-comparison">
            <dt className="text-ink-muted">Common pairs</dt>
            <dd className="num">{record.n}</dd>
            <dt className="text-ink-muted">Wilcoxon signed-rank p</dt>
            <dd className="num">{pValue(record.wilcoxon.pValue)}</dd>
            <dt className="text-ink-muted">
              {methodLabel.get(record.a)} closer / {methodLabel.get(record.b)} closer / ties
            </dt>
            <dd className="num">
              {record.wins} / {record.losses} / {record.ties}
            </dd>
          </dl>
        ) : null}
      </div>
    );
  }

  const openOnSlide = shownPairs.reduce((s, p) => s + (openCounts.get(p.key) ?? 0), 0);
  return shell(
    subtitle,
    body,
    <>
      <ThreadCount count={openOnSlide} mode={mode} />
      {mode === 'present' ? (
        <p className="text-xs text-ink-faint" data-testid="slide-hint">
          {isPlot ? 'Hover a point for its values and source. ' : null}
          <Link href={`/w/${workspace.slug}/benchmarks/${bm.id}/revisions/${rev.number}`}>Open revision {rev.number}</Link>
        </p>
      ) : null}
      <Citations items={citationsOf(shownPairs, lookups.sources)} columns={beside ? 1 : mode === 'print' ? 2 : 3} />
    </>,
  );
}
