import type { MethodResult } from '@/lib/benchmark/types';
import { fixed, header, stat } from '@/lib/format';

/**
 * What one scale factor per method would do: λ with its standard error, and the RMSE
 * as computed beside the RMSE after scaling, fitted without the material it is tested
 * on (cross-validated), so the gain is the one a new crystal would see.
 */
export function ScalingPanel({ methods, unit }: { methods: MethodResult[]; unit: string }) {
  const rows = methods.filter((m) => m.statistics);
  if (rows.length === 0) return <p className="text-sm text-ink-muted">No method has enough pairs for a scale factor.</p>;
  const widest = Math.max(...rows.map((m) => Math.max(m.statistics!.rootMeanSquareError, m.statistics!.rmseAfterScalingOutOfSample ?? m.statistics!.rmseAfterScaling ?? 0)));
  const width = (v: number | undefined) => (v === undefined || widest <= 0 ? 0 : Math.max(1, (100 * v) / widest));
  return (
    <div className="space-y-3">
      <p className="text-sm text-ink-muted" data-testid="scaling-note">
        Scaling multiplies every computed frequency of a method by one factor λ, fitted by least squares to the measured ones; the cross-validated RMSE fits λ without each material and tests it on that material, so it shows what scaling would gain on a crystal not yet measured.
      </p>
      <ul className="grid gap-3 [grid-template-columns:repeat(auto-fill,minmax(17rem,1fr))]" data-testid="scaling">
        {rows.map((m) => {
          const s = m.statistics!;
          const crossValidated = s.rmseAfterScalingOutOfSample;
          return (
            <li key={m.methodId} className="rounded-md border border-rule bg-paper/50 p-3" data-method={m.label}>
              <p className="text-sm font-medium">{m.label}</p>
              <p className="mt-1 text-lg leading-tight" data-stat="scale-factor">
                <span className="text-ink-muted">λ = </span>
                {s.scaleFactor === undefined ? (
                  <span className="text-sm text-ink-muted" data-stat="scale-factor-undefined">
                    none: {s.scaleFactorUndefined ?? 'not fitted in this revision'}
                  </span>
                ) : (
                  <span className="num font-semibold">{stat('scaleFactor', s.scaleFactor)}</span>
                )}
                {s.scaleFactorStandardError !== undefined ? (
                  <span className="num text-sm text-ink-muted" data-stat="scale-factor-error">
                    {' '}
                    ± {stat('scaleFactor', s.scaleFactorStandardError)}
                  </span>
                ) : null}
              </p>
              <p className="text-xs text-ink-muted">
                N = {m.n}
                {s.clusterCount ? ` pairs, ${s.clusterCount} materials` : ' pairs'}
                {s.scaleFactorStandardError !== undefined ? '; ± one standard error, by material' : '; no standard error in this revision'}
              </p>
              <div className="mt-2 space-y-1.5 text-xs">
                <Bar label={header('RMSE as computed', unit)} value={s.rootMeanSquareError} width={width(s.rootMeanSquareError)} tone="bg-ink-faint" stat="rmse" />
                <Bar
                  label={header('RMSE scaled, cross-validated', unit)}
                  value={crossValidated}
                  width={width(crossValidated)}
                  tone="bg-accent"
                  stat="rmse-cross-validated"
                  missing="needs two materials"
                />
                <p className="flex justify-between gap-2 text-ink-muted">
                  <span>{header('RMSE scaled, in sample', unit)}</span>
                  <span className="num" data-stat="rmse-in-sample">
                    {s.rmseAfterScaling === undefined ? <span className="text-ink-faint">—</span> : stat('error', s.rmseAfterScaling)}
                  </span>
                </p>
              </div>
            </li>
          );
        })}
      </ul>
      <p className="text-xs text-ink-faint">
        λ minimises Σ (λ ω − ν)² (ω computed, ν measured); its standard error allows for errors the modes of one material share. A λ near 1 with little RMSE gain means the method&apos;s error is not a uniform stretch. Largest bar: {fixed(widest, 2)} {unit}.
      </p>
    </div>
  );
}

function Bar({ label, value, width, tone, stat: key, missing = '—' }: { label: string; value: number | undefined; width: number; tone: string; stat: string; missing?: string }) {
  return (
    <div>
      <p className="flex justify-between gap-2">
        <span>{label}</span>
        <span className="num font-medium" data-stat={key}>
          {value === undefined ? <span className="font-normal text-ink-faint">{missing}</span> : stat('error', value)}
        </span>
      </p>
      <div aria-hidden className="mt-0.5 h-1.5 rounded-full bg-rule/60">
        <div className={`h-1.5 rounded-full ${tone}`} style={{ width: `${width}%` }} />
      </div>
    </div>
  );
}
