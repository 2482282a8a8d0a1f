import Link from 'next/link';
import { notFound } from 'next/navigation';
import { z } from 'zod';
import { requirePageMember } from '@/lib/session';
import { getBenchmark } from '@/db/queries/benchmarks';
import { benchmarkConvergence } from '@/lib/services/benchmarks/convergence';
import { ALL_MATERIALS, CONVERGENCE_PARAMETERS, PARAMETER_NAMES } from '@/lib/benchmark/convergence-view';
import { EmptyState, Panel } from '@/components/ui/panel';
import { Notice } from '@/components/ui/notice';
import { ConvergencePlot } from '@/components/charts/convergence-plot';
import { header, percentOf, stat } from '@/lib/format';

const searchSchema = z.object({ parameter: z.enum(CONVERGENCE_PARAMETERS).catch('kppra').default('kppra') });

function parameterText(value: number | null, unit: string): string {
  if (value === null) return '—';
  const text = Number.isInteger(value) ? value.toLocaleString('en') : String(Number(value.toPrecision(4)));
  return unit ? `${text} ${unit}` : text;
}

export default async function ConvergencePage({ params, searchParams }: { params: Promise<{ workspace: string; id: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { workspace, id } = await params;
  const { parameter } = searchSchema.parse(await searchParams);
  const ctx = await requirePageMember(workspace, 'benchmarks:read');
  const bm = await getBenchmark(ctx.workspace.id, id);
  if (!bm) notFound();
  const { rev, view } = await benchmarkConvergence(ctx.workspace.id, bm.id, parameter);
  const base = `/w/${ctx.workspace.slug}/benchmarks/${bm.id}`;
  const named = PARAMETER_NAMES[parameter];
  const xTitle = header(named.name, named.unit);

  const head = (
    <header className="space-y-2">
      <p className="text-xs uppercase tracking-wide text-ink-faint">
        <Link href={`/w/${ctx.workspace.slug}/benchmarks`}>Benchmarks</Link> / <Link href={base}>{bm.name}</Link>
      </p>
      <h1>Convergence view</h1>
      {rev ? <p className="text-xs text-ink-muted">Revision {rev.number} · fingerprint sha256:{rev.fingerprint.slice(0, 16)}</p> : null}
      <nav aria-label="Recipe parameter" className="flex flex-wrap gap-2 text-sm">
        <span className="text-ink-muted">Parameter that varies:</span>
        {CONVERGENCE_PARAMETERS.map((p) => (
          <Link key={p} href={`${base}/convergence?parameter=${p}`} aria-current={p === parameter ? 'page' : undefined} className={p === parameter ? 'font-semibold underline' : 'text-accent'}>
            {PARAMETER_NAMES[p].name}
          </Link>
        ))}
      </nav>
    </header>
  );

  if (!rev || !view) {
    return (
      <div className="space-y-6">
        {head}
        <EmptyState title={rev ? 'This benchmark compares with experiment' : 'No revision yet'}>
          {rev
            ? 'The convergence view needs a benchmark against a reference method: edit the scope and choose one under “Compared with”.'
            : 'Nothing has been computed for this benchmark yet.'}
        </EmptyState>
      </div>
    );
  }

  const unit = view.unit;
  const tol = `${view.tolerance}${unit ? ` ${unit}` : ''}`;
  const materials = new Set(view.points.map((p) => p.materialId)).size;
  return (
    <div className="space-y-6">
      {head}
      <p className="text-sm text-ink-muted">
        Each candidate method is one member of the family; its {named.name} is read from the method’s stored recipe
        {parameter === 'kppra' ? ' (k-grid product × atoms in the cell, so it differs by material)' : ''}. A material converges at the least
        converged value from which every more converged member stays within {tol} of the reference (largest |Δ| over its modes).
      </p>
      {view.methodsLacking.length ? (
        <Notice tone="warn">
          <span data-testid="methods-lacking">
            Left out, no {named.name} stored: {view.methodsLacking.join(', ')}. Add the field to these methods, or pick another parameter.
          </span>
        </Notice>
      ) : null}
      {view.materialsLacking.length ? (
        <Notice tone="warn">
          Left out, no atoms in the cell recorded (k-points per reciprocal atom needs them): {view.materialsLacking.join(', ')}.
        </Notice>
      ) : null}
      {view.points.length === 0 ? (
        <EmptyState title="Nothing to plot">No candidate method has this parameter and a pair with the reference.</EmptyState>
      ) : (
        <>
          <Panel title={`Recommended ${named.name} per material class (${percentOf(view.share)} within ${tol})`}>
            <table className="w-full text-sm" data-testid="convergence-classes">
              <caption className="sr-only">Smallest parameter value at which the share of each class is within tolerance</caption>
              <thead>
                <tr className="text-left">
                  <th scope="col">Class (tag)</th>
                  <th scope="col" className="text-right">Materials</th>
                  <th scope="col" className="text-right">Converge in the family</th>
                  <th scope="col" className="text-right">Needed</th>
                  <th scope="col" className="text-right">{header(`Recommended ${named.name}`, named.unit)}</th>
                </tr>
              </thead>
              <tbody>
                {view.classes.map((c) => (
                  <tr key={c.group} className="border-t border-line" data-class={c.group}>
                    <th scope="row" className="text-left font-normal">{c.group === ALL_MATERIALS ? <em>{ALL_MATERIALS}</em> : c.group}</th>
                    <td className="text-right tabular-nums">{c.n}</td>
                    <td className="text-right tabular-nums">{c.converged}</td>
                    <td className="text-right tabular-nums">{c.needed}</td>
                    <td className="text-right tabular-nums" data-testid="recommended">
                      {c.value === null ? `none: only ${c.converged} of ${c.n} converge` : parameterText(c.value, '')}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
            <p className="mt-2 text-xs text-ink-muted">
              The value is the ⌈{view.share}·N⌉-th material convergence point of the class. It holds for the family as imported: a class with few
              materials rests on few points, and a material in several classes counts in each.
            </p>
          </Panel>

          {view.neverConverged.length ? (
            <Panel title={`Never converge within the family (${view.neverConverged.length})`}>
              <ul className="text-sm" data-testid="never-converged">
                {view.neverConverged.map((m) => (
                  <li key={m.materialId}>
                    <Link href={`/w/${ctx.workspace.slug}/materials/${m.materialId}`}>{m.material}</Link>: the most converged member is still {stat('error', m.bestMaxAbsolute)}
                    {unit ? ` ${unit}` : ''} from the reference at best.
                  </li>
                ))}
              </ul>
            </Panel>
          ) : null}

          <div className="grid gap-4 xl:grid-cols-2">
            <Panel title="Largest |Δ| per material">
              <ConvergencePlot
                points={view.points.map((p) => ({ material: p.material, method: p.method, parameter: p.parameter, value: p.maxAbsolute }))}
                summary={view.distribution.map((d) => ({ method: d.method, parameter: d.parameter, median: d.medianMax, p95: d.p95Max }))}
                tolerance={view.tolerance}
                xTitle={xTitle}
                yTitle={header('max |Δ|', unit)}
                ariaLabel={`Largest deviation from the reference against ${named.name}`}
                summaryText={`${materials} materials, ${view.distribution.length} family members; dashed line: tolerance ${tol}.`}
                downloadName={`convergence-max-${parameter}`}
              />
            </Panel>
            <Panel title="Mean |Δ| (MAE) per material">
              <ConvergencePlot
                points={view.points.map((p) => ({ material: p.material, method: p.method, parameter: p.parameter, value: p.meanAbsolute }))}
                summary={view.distribution.map((d) => ({ method: d.method, parameter: d.parameter, median: d.medianMean }))}
                tolerance={view.tolerance}
                xTitle={xTitle}
                yTitle={header('MAE', unit)}
                ariaLabel={`Mean absolute deviation from the reference against ${named.name}`}
                summaryText={`Median MAE over ${materials} materials per family member; dashed line: tolerance ${tol}.`}
                downloadName={`convergence-mae-${parameter}`}
              />
            </Panel>
          </div>

          <Panel title="Per family member">
            <table className="w-full text-sm" data-testid="convergence-distribution">
              <caption className="sr-only">Distribution of deviations over materials per family member</caption>
              <thead>
                <tr className="text-left">
                  <th scope="col">Method</th>
                  <th scope="col" className="text-right">{header(`Median ${named.name}`, named.unit)}</th>
                  <th scope="col" className="text-right">Materials</th>
                  <th scope="col" className="text-right">{header('Median max |Δ|', unit)}</th>
                  <th scope="col" className="text-right">{header('95th pct. max |Δ|', unit)}</th>
                  <th scope="col" className="text-right">{header('Median MAE', unit)}</th>
                </tr>
              </thead>
              <tbody>
                {view.distribution.map((d) => (
                  <tr key={d.method} className="border-t border-line">
                    <th scope="row" className="text-left font-normal">{d.method}</th>
                    <td className="text-right tabular-nums">{parameterText(d.parameter, '')}</td>
                    <td className="text-right tabular-nums">{d.n}</td>
                    <td className="text-right tabular-nums">{stat('error', d.medianMax)}</td>
                    <td className="text-right tabular-nums">{stat('error', d.p95Max)}</td>
                    <td className="text-right tabular-nums">{stat('error', d.medianMean)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </Panel>
        </>
      )}
    </div>
  );
}
