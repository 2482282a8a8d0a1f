'use client';
import { useActionState, useEffect, useState } from 'react';
import { useRouter } from 'next/navigation';
import { createBenchmarkAction, updateBenchmarkAction } from '../actions';
import { SelectField, TextField, inputClass } from '@/components/ui/field';
import { SubmitButton } from '@/components/ui/submit-button';
import { FormMessage } from '@/components/ui/form-message';
import { DEFAULT_CONVERGENCE_SHARE, DEFAULT_MAE_ABSOLUTE, DEFAULT_OUTLIER_THRESHOLDS, DEFAULT_REFERENCE_TOLERANCE, OUTLIER_RULE_KINDS, SCOPE_TECHNIQUES, type BenchmarkDefinition } from '@/lib/benchmark/schemas';
import { techniqueName } from '@/lib/benchmark/describe';
import { isDielectric, isThermal, QUANTITY_PLURAL, QUANTITY_UNIT } from '@/lib/benchmark/quantities';

const RULE_NAMES: Record<(typeof OUTLIER_RULE_KINDS)[number], string> = {
  'modified-z': 'Modified z-score |M| > threshold (Iglewicz–Hoaglin, default 3.5)',
  tukey: 'Tukey fences, k × IQR (default 1.5)',
  relative: '|error| / measured > threshold (e.g. 0.1 = 10 %)',
  sigma: '|error| > threshold × combined uncertainty σ',
};

export function BenchmarkForm({
  workspaceId,
  benchmarkId,
  initial,
  options,
}: {
  workspaceId: string;
  benchmarkId?: string;
  initial: BenchmarkDefinition;
  options: { methods: Array<{ id: string; label: string }>; materials: Array<{ id: string; name: string }>; tags: string[] };
}) {
  const router = useRouter();
  const [state, action] = useActionState(benchmarkId ? updateBenchmarkAction : createBenchmarkAction, { ok: false });
  const [quantity, setQuantity] = useState(initial.scope.quantity);
  const [series, setSeries] = useState(initial.scope.entropyTemperatureK === null);
  const [ruleKind, setRuleKind] = useState(initial.rules.outlierRule.kind);
  const [referenceId, setReferenceId] = useState(initial.scope.referenceMethodId ?? '');
  const e = state.fieldErrors ?? {};

  useEffect(() => {
    const href = (state.data as { href?: string } | undefined)?.href;
    if (state.ok && href) router.push(href);
  }, [state, router]);

  const { scope, rules, alertThresholds: alerts } = initial;
  return (
    <form action={action} className="max-w-3xl space-y-6">
      <input type="hidden" name="workspaceId" value={workspaceId} />
      {benchmarkId ? <input type="hidden" name="benchmarkId" value={benchmarkId} /> : null}
      <fieldset className="space-y-3">
        <legend className="text-sm font-semibold">Name and purpose</legend>
        <TextField label="Name" name="name" defaultValue={initial.name} errors={e.name} required maxLength={120} />
        <TextField label="Purpose" name="purpose" defaultValue={initial.purpose ?? ''} errors={e.purpose} hint="What decision this benchmark informs." />
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="text-sm font-semibold">Scope</legend>
        <SelectField label="Quantity" name="quantity" value={quantity} onChange={(ev) => setQuantity(ev.target.value as typeof quantity)} errors={e.quantity ?? e['scope.quantity']}>
          <option value="frequency">Γ-point mode frequency</option>
          <option value="entropy">Vibrational entropy at T</option>
          <option value="heat-capacity">Heat capacity at T (measured Cp against computed Cv)</option>
          <option value="eps-inf">Dielectric constant ε∞ (electronic)</option>
          <option value="eps-static">Dielectric constant ε₀ (static)</option>
          <option value="born-charge">Born effective charge per site (mean of the diagonal)</option>
          <option value="lo-to-splitting">LO–TO splitting of polar modes (from TO and LO frequencies)</option>
        </SelectField>
        <SelectField
          label="Compared with"
          name="referenceMethodId"
          value={referenceId}
          onChange={(ev) => setReferenceId(ev.target.value)}
          errors={e.referenceMethodId ?? e['scope.referenceMethodId']}
          hint={
            referenceId
              ? 'A convergence study: the candidates are compared with this method’s calculations (for example the same functional on a much denser grid), mode by mode. Measurements, decisions and pins play no part.'
              : undefined
          }
        >
          <option value="">Experiment (measured values)</option>
          {options.methods.map((m) => (
            <option key={m.id} value={m.id}>
              Reference method: {m.label}
            </option>
          ))}
        </SelectField>
        {referenceId ? (
          <div className="grid grid-cols-2 gap-3">
            <TextField
              label={`Tolerance on the largest |Δ| of a material (${QUANTITY_UNIT[quantity] || 'dimensionless'})`}
              name="referenceTolerance"
              type="number"
              step="any"
              defaultValue={rules.referenceTolerance ?? ''}
              placeholder={String(DEFAULT_REFERENCE_TOLERANCE[quantity])}
              errors={e.referenceTolerance ?? e['rules.referenceTolerance']}
              hint="Blank: the default for the quantity."
            />
            <TextField
              label="Share of a class within tolerance to recommend a recipe (%)"
              name="convergenceSharePercent"
              type="number"
              step="any"
              defaultValue={(rules.convergenceShare ?? DEFAULT_CONVERGENCE_SHARE) * 100}
              errors={e.convergenceSharePercent ?? e['rules.convergenceShare']}
            />
          </div>
        ) : null}
        {isDielectric(quantity) && !referenceId ? (
          <p className="text-xs text-ink-muted">One value per material on each side, whatever its temperature; for a non-cubic crystal the orientational average (ε_xx + ε_yy + ε_zz)/3 is compared, whether it was stored as such or computed from the three principal values of the tensor column.</p>
        ) : null}
        {quantity === 'born-charge' ? (
          <p className="text-xs text-ink-muted">One charge per site on each side, compared by the mean of the tensor&apos;s diagonal; a site written as an element only (&quot;Ga&quot;) stands for every atom of that element. Where both sides hold the full tensor, the page also gives ‖ΔZ‖ (Frobenius).</p>
        ) : null}
        {quantity === 'lo-to-splitting' ? (
          <p className="text-xs text-ink-muted">Reads the frequency rows: a TO and an LO of one species from one source make a measured splitting, and the method&apos;s TO and LO lines of that species the computed one. Give TO and LO in the branch column or the irrep label.</p>
        ) : null}
        {quantity === 'heat-capacity' && !referenceId ? (
          <SelectField
            label="Cp against Cv"
            name="heatCapacityCorrection"
            defaultValue={rules.heatCapacityCorrection ?? 'none'}
            errors={e.heatCapacityCorrection ?? e['rules.heatCapacityCorrection']}
            hint="Calorimetry measures Cp; a harmonic calculation gives Cv, which lies below it by α² B V_m T. The correction uses each material's thermal expansion α, bulk modulus B and molar volume V_m (its material page); materials without all three are then left out."
          >
            <option value="none">Compare as stored (no correction; the page says so)</option>
            <option value="cp-minus-cv">Add Cp − Cv = α² B V_m T to each computed Cv</option>
          </SelectField>
        ) : null}
        {isThermal(quantity) ? (
          <div className="grid grid-cols-2 gap-3">
            <div className="col-span-2">
            <SelectField
              label="Compare"
              name="thermalTemperatures"
              value={series ? 'each' : 'one'}
              onChange={(ev) => setSeries(ev.target.value === 'each')}
              errors={e.thermalTemperatures}
              hint={series ? 'Each measured value pairs with the computed value of the same material nearest in temperature, within the tolerance: a measured S(T) or Cp(T) series is compared point by point. Import the DOS at the measured temperatures.' : undefined}
            >
              <option value="one">At one temperature</option>
              <option value="each">At every measured temperature (a series)</option>
            </SelectField>
            </div>
            {series ? null : <TextField label="Temperature (K)" name="entropyTemperatureK" type="number" step="any" defaultValue={scope.entropyTemperatureK ?? 298.15} errors={e.entropyTemperatureK} />}
            <TextField label="Tolerance (K)" name="entropyToleranceK" type="number" step="any" defaultValue={scope.entropyToleranceK} errors={e.entropyToleranceK} />
          </div>
        ) : (
          <div className="grid grid-cols-2 gap-3">
            <TextField label="Measured at or above (K)" name="temperatureMinK" type="number" step="any" defaultValue={scope.temperatureMinK ?? ''} errors={e.temperatureMinK} hint="Empty: no lower limit." />
            <TextField
              label="Measured at or below (K)"
              name="temperatureMaxK"
              type="number"
              step="any"
              defaultValue={scope.temperatureMaxK ?? ''}
              errors={e.temperatureMaxK ?? e['scope.temperatureMaxK']}
              hint="Empty: no upper limit. A window leaves out measurements without a temperature."
            />
          </div>
        )}
        <div>
          <p className="text-[13px] font-medium">Techniques (none ticked: all)</p>
          <div className="mt-1 flex flex-wrap gap-3 text-sm">
            {SCOPE_TECHNIQUES.map((t) => (
              <label key={t} className="inline-flex items-center gap-1.5">
                <input type="checkbox" name="techniques" value={t} defaultChecked={scope.techniques.includes(t)} />
                {techniqueName(t)}
              </label>
            ))}
          </div>
        </div>
        <TextField
          label="Material tags (comma-separated; a material needs one of them)"
          name="materialTags"
          defaultValue={scope.materialTags.join(', ')}
          errors={e.materialTags}
          hint={options.tags.length ? `Tags in this workspace: ${options.tags.join(', ')}` : 'No tags yet.'}
        />
        <label className="block space-y-1 text-[13px] font-medium">
          <span>Or an explicit material list (replaces the tags)</span>
          <select name="materialIds" multiple defaultValue={scope.materialIds} className={`${inputClass} h-28`}>
            {options.materials.map((m) => (
              <option key={m.id} value={m.id}>
                {m.name}
              </option>
            ))}
          </select>
          {e['scope.materialIds'] ? <span className="text-xs text-bad">{e['scope.materialIds'].join(' ')}</span> : null}
        </label>
        <div>
          <p className="text-[13px] font-medium">{referenceId ? 'Candidate methods (none ticked: all but the reference)' : 'Methods to compare (none ticked: all)'}</p>
          <div className="mt-1 flex flex-wrap gap-3 text-sm">
            {options.methods.map((m) => (
              <label key={m.id} className="inline-flex items-center gap-1.5">
                <input type="checkbox" name="methodIds" value={m.id} defaultChecked={scope.methodIds.includes(m.id)} />
                {m.label}
              </label>
            ))}
            {options.methods.length === 0 ? <span className="text-ink-muted">No methods yet.</span> : null}
          </div>
          {e['scope.methodIds'] ? <p className="text-xs text-bad">{e['scope.methodIds'].join(' ')}</p> : null}
        </div>
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="text-sm font-semibold">Rules</legend>
        <div className="grid grid-cols-2 gap-3">
          <TextField
            label="Pairing window (± % of the measured value)"
            name="maxRelativeDeviationPercent"
            type="number"
            step="any"
            defaultValue={rules.maxRelativeDeviation * 100}
            errors={e.maxRelativeDeviationPercent ?? e['rules.maxRelativeDeviation']}
          />
          <TextField label="Ambiguity window (cm⁻¹)" name="ambiguityCm1" type="number" step="any" defaultValue={rules.ambiguityCm1} errors={e.ambiguityCm1} />
          <TextField
            label="Pairing window when both sides are labelled (± %)"
            name="labelledMaxRelativeDeviationPercent"
            type="number"
            step="any"
            defaultValue={rules.labelledMaxRelativeDeviation * 100}
            errors={e.labelledMaxRelativeDeviationPercent ?? e['rules.labelledMaxRelativeDeviation']}
            hint="A labelled pair is a firm assignment: a wider window keeps a badly computed line in the statistics."
          />
        </div>
        <SelectField
          label="Outlier rule"
          name="outlierKind"
          value={ruleKind}
          onChange={(ev) => setRuleKind(ev.target.value as typeof ruleKind)}
          errors={e.outlierKind}
        >
          {OUTLIER_RULE_KINDS.map((k) => (
            <option key={k} value={k}>
              {RULE_NAMES[k]}
            </option>
          ))}
        </SelectField>
        <TextField
          key={ruleKind}
          label="Outlier threshold"
          name="outlierThreshold"
          type="number"
          step="any"
          defaultValue={ruleKind === rules.outlierRule.kind ? rules.outlierRule.threshold : DEFAULT_OUTLIER_THRESHOLDS[ruleKind]}
          errors={e.outlierThreshold ?? e['rules.outlierRule.threshold']}
        />
        <div className="grid grid-cols-2 gap-3">
          <SelectField label="Outlier scale (modified z, Tukey)" name="outlierScale" defaultValue={rules.outlierRule.scale ?? ''} errors={e.outlierScale}>
            <option value="">By quantity (relative for frequencies and dielectric constants)</option>
            <option value="relative">Relative error (error / measured)</option>
            <option value="absolute">Absolute error</option>
          </SelectField>
          <TextField
            label="Flag outliers from N ="
            name="outlierMinN"
            type="number"
            step="1"
            defaultValue={rules.outlierRule.minN}
            errors={e.outlierMinN ?? e['rules.outlierRule.minN']}
            hint="Modified z and Tukey estimate a spread from the sample; on a handful of pairs they flag noise."
          />
        </div>
        <div className="grid grid-cols-2 gap-3">
          <TextField label="Rank a method from N =" name="rankMinN" type="number" step="1" defaultValue={rules.ranking.minN} errors={e.rankMinN ?? e['rules.ranking.minN']} />
          <TextField
            label="…and a coverage of at least (%)"
            name="rankMinCoveragePercent"
            type="number"
            step="any"
            defaultValue={rules.ranking.minCoverage * 100}
            errors={e.rankMinCoveragePercent ?? e['rules.ranking.minCoverage']}
            hint="Coverage = paired / measured values in scope. Below either rule a method is listed, not ranked."
          />
        </div>
        {isThermal(quantity) ? (
          <SelectField label={`Compare ${QUANTITY_PLURAL[quantity]}`} name="entropyBasis" defaultValue={rules.entropyBasis} errors={e.entropyBasis}>
            <option value="formula-unit">Per mole of formula units (the reduced formula: per GaN, not Ga2N2)</option>
            <option value="atom">Per mole of atoms (every material weighs alike)</option>
          </SelectField>
        ) : null}
        <SelectField label="Several measurements of one mode" name="repeatedMeasurements" defaultValue={rules.repeatedMeasurements} errors={e.repeatedMeasurements}>
          <option value="separate">Each measurement is its own pair</option>
          <option value="weighted-mean">One pair with their uncertainty-weighted mean</option>
        </SelectField>
        <TextField label="Frequency band edges (cm⁻¹, comma-separated)" name="bandEdgesCm1" defaultValue={rules.bandEdgesCm1.join(', ')} errors={e.bandEdgesCm1 ?? e['rules.bandEdgesCm1']} />
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="text-sm font-semibold">Alert thresholds (defaults for watchers)</legend>
        <div className="grid grid-cols-3 gap-3">
          <TextField
            label={`MAE change (${QUANTITY_UNIT[quantity]})`}
            name="alertMaeAbsolute"
            type="number"
            step="any"
            defaultValue={alerts.maeAbsolute ?? alerts.maeCm1 ?? ''}
            placeholder={String(DEFAULT_MAE_ABSOLUTE[quantity])}
            errors={e.alertMaeAbsolute ?? e.alertMaeCm1}
            hint="Blank: the default for the quantity."
          />
          <TextField label="MAE change (%)" name="alertMaeRelativePercent" type="number" step="any" defaultValue={alerts.maeRelative * 100} errors={e.alertMaeRelativePercent} />
          <TextField label="N change (%)" name="alertNRelativePercent" type="number" step="any" defaultValue={alerts.nRelative * 100} errors={e.alertNRelativePercent} />
        </div>
      </fieldset>

      <SubmitButton pendingLabel="Saving…">{benchmarkId ? 'Save and recompute' : 'Create benchmark'}</SubmitButton>
      <FormMessage state={state} />
    </form>
  );
}
