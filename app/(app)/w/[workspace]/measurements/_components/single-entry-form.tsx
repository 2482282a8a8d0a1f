'use client';
import Link from 'next/link';
import { startTransition, useActionState, useEffect, useRef, useState, type FormEvent } from 'react';
import type { ActionState } from '@/lib/action-state';
import type { ImportableKind } from '@/lib/import/columns';
import { ACTIVITY_VALUES, BRANCH_VALUES, SAMPLE_FORM_VALUES, TECHNIQUE_VALUES } from '@/lib/import/vocabulary';
import { IMPORTER_UNDO_HOURS } from '@/lib/import/undo-rule';
import { unitSymbol } from '@/lib/format';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { createSingleEntryAction } from '../actions';
import { unitsOf } from '@/lib/import/units';
import type { ImportQuantity as EntryQuantity } from '@/lib/import/columns';

export interface EntryChoices {
  materials: Array<{ id: string; name: string }>;
  sources: Array<{ id: string; citeKey: string }>;
  methods: Array<{ id: string; label: string }>;
}

/** Fields cleared after a save; material, source, method and conditions stay for the next line of the same spectrum. */
const PER_LINE_FIELDS = ['value', 'uncertainty', 'irrep', 'branch', 'degeneracy', 'mode_index', 'notes'];

function Options({ values, blank = '—' }: { values: readonly string[]; blank?: string }) {
  return (
    <>
      <option value="">{blank}</option>
      {values.map((v) => (
        <option key={v} value={v}>
          {v}
        </option>
      ))}
    </>
  );
}

/**
 * One measured peak or entropy, or one computed mode or entropy, typed in. The
 * server validates it exactly like an import row and stores it as a one-row import.
 */
export function SingleEntryForm({ workspaceId, slug, kind, choices, initialMaterial = '' }: { workspaceId: string; slug: string; kind: ImportableKind; choices: EntryChoices; initialMaterial?: string }) {
  const [state, dispatch, pending] = useActionState<ActionState, FormData>(createSingleEntryAction, { ok: false });
  const [quantity, setQuantity] = useState<EntryQuantity>('frequency');
  const [material, setMaterial] = useState(initialMaterial);
  const formRef = useRef<HTMLFormElement>(null);
  const errors = state.fieldErrors ?? {};
  const saved = state.ok ? (state.data as { importId: string; duplicate: boolean }) : null;
  const measured = kind === 'measurements';
  const materialId = choices.materials.find((m) => m.name === material)?.id;

  useEffect(() => {
    if (!saved || !formRef.current) return;
    const form = formRef.current;
    for (const name of PER_LINE_FIELDS) {
      const el = form.elements.namedItem(name);
      if (el instanceof HTMLInputElement || el instanceof HTMLSelectElement || el instanceof HTMLTextAreaElement) el.value = '';
    }
    (form.elements.namedItem('value') as HTMLInputElement | null)?.focus();
  }, [saved]);

  const onSubmit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    startTransition(() => dispatch(data));
  };

  const units = unitsOf(quantity);
  const withTensor = quantity === 'born-charge' || quantity === 'eps-inf' || quantity === 'eps-static';
  return (
    <form ref={formRef} noValidate onSubmit={onSubmit} className="space-y-5" aria-label={measured ? 'Add one measurement' : 'Add one calculation'}>
      <input type="hidden" name="workspaceId" value={workspaceId} />
      <input type="hidden" name="kind" value={kind} />
      <datalist id="entry-materials">
        {choices.materials.map((m) => (
          <option key={m.id} value={m.name} />
        ))}
      </datalist>
      <datalist id="entry-sources">
        {choices.sources.map((s) => (
          <option key={s.id} value={s.citeKey} />
        ))}
      </datalist>

      <fieldset className={`grid gap-4 ${measured ? 'sm:grid-cols-3' : 'sm:grid-cols-4'}`}>
        <legend className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-muted">What, and from where</legend>
        <TextField label="Material" name="material" list="entry-materials" autoComplete="off" required value={material} onChange={(e) => setMaterial(e.target.value)} errors={errors.material} hint="Its handle, e.g. GaN-wz." />
        {!measured && (
          <SelectField label="Method" name="method" required defaultValue={choices.methods[0]?.label ?? ''} errors={errors.method}>
            <Options values={choices.methods.map((m) => m.label)} blank="— choose —" />
          </SelectField>
        )}
        <SelectField label="Quantity" name="quantity" required value={quantity} onChange={(e) => setQuantity(e.target.value as EntryQuantity)} errors={errors.quantity}>
          <option value="frequency">{measured ? 'frequency (a peak)' : 'frequency (a mode)'}</option>
          <option value="entropy">entropy</option>
          <option value="heat-capacity">{measured ? 'heat capacity (Cp)' : 'heat capacity (harmonic Cv)'}</option>
          <option value="eps-inf">dielectric constant ε∞</option>
          <option value="eps-static">dielectric constant ε₀</option>
          <option value="born-charge">Born effective charge (one site)</option>
        </SelectField>
        <TextField label="Source (cite key)" name="source" list="entry-sources" autoComplete="off" required errors={errors.source} hint="e.g. azuhata1995; add a source first if it is new." />
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-muted">Value</legend>
        <TextField
          label="Value"
          name="value"
          inputMode="decimal"
          required={!withTensor}
          errors={errors.value}
          hint={withTensor ? 'May be left empty when the tensor is given: it is then the mean of the diagonal.' : measured ? 'As written in the source; kept exactly ("1.50" stays 1.50).' : 'Imaginary modes as negative numbers.'}
        />
        <SelectField key={quantity} label="Unit" name="unit" defaultValue={units[0]} errors={errors.unit}>
          {units.map((u) => (
            <option key={u} value={u}>
              {unitSymbol(u) || 'none (dimensionless)'}
            </option>
          ))}
        </SelectField>
        {measured ? <TextField label="Uncertainty (same unit)" name="uncertainty" inputMode="decimal" errors={errors.uncertainty} /> : <TextField label="Mode index" name="mode_index" inputMode="numeric" errors={errors.mode_index} hint="Its place in the computed list, 1 = lowest." />}
      </fieldset>

      {withTensor && (
        <fieldset className="grid gap-4 sm:grid-cols-3">
          <legend className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-muted">{quantity === 'born-charge' ? 'Site and tensor' : 'Principal values'}</legend>
          {quantity === 'born-charge' && <TextField label="Site" name="site" autoComplete="off" required errors={errors.site} hint='The atom: element symbol, optional number ("Ga", "O2").' />}
          <div className="sm:col-span-2">
            <TextField
              label={quantity === 'born-charge' ? 'Tensor (e)' : 'Principal values'}
              name="tensor"
              autoComplete="off"
              errors={errors.tensor}
              hint={quantity === 'born-charge' ? 'Optional: nine numbers row-major, e.g. 2.60 0 0; 0 2.60 0; 0 0 2.74. One entry holds one atom: the material page checks neutrality once every atom of the cell is in.' : 'Optional, for a non-cubic crystal: three numbers ≥ 1.'}
            />
          </div>
        </fieldset>
      )}

      {quantity === 'frequency' && (
        <fieldset className="grid gap-4 sm:grid-cols-4">
          <legend className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-muted">Mode</legend>
          <TextField label="Irrep label" name="irrep" autoComplete="off" errors={errors.irrep} hint="e.g. E2(high), T2g, A1(LO)." />
          <SelectField label="Branch" name="branch" defaultValue="" errors={errors.branch}>
            <Options values={BRANCH_VALUES} blank="— not split —" />
          </SelectField>
          <TextField label="Degeneracy" name="degeneracy" inputMode="numeric" errors={errors.degeneracy} />
          <SelectField label="Activity" name="activity" defaultValue="" errors={errors.activity}>
            <Options values={ACTIVITY_VALUES} />
          </SelectField>
        </fieldset>
      )}

      <fieldset className={`grid gap-4 ${measured ? 'sm:grid-cols-4' : 'sm:grid-cols-3'}`}>
        <legend className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-muted">Conditions</legend>
        <TextField label="Temperature (K)" name="temperature_K" inputMode="decimal" errors={errors.temperature_K} hint={quantity === 'entropy' ? 'Required for an entropy.' : quantity === 'heat-capacity' ? 'Required for a heat capacity.' : undefined} />
        {measured && (
          <>
            <SelectField key={quantity === 'frequency' ? 'peak' : 'thermal'} label="Technique" name="technique" defaultValue={quantity === 'frequency' ? 'raman' : 'calorimetry'} errors={errors.technique}>
              <Options values={TECHNIQUE_VALUES} />
            </SelectField>
            {quantity === 'frequency' && <TextField label="Laser (nm)" name="laser_nm" inputMode="decimal" errors={errors.laser_nm} />}
            <SelectField label="Sample form" name="sample_form" defaultValue="" errors={errors.sample_form}>
              <Options values={SAMPLE_FORM_VALUES} />
            </SelectField>
          </>
        )}
        <div className={measured ? 'sm:col-span-4' : 'sm:col-span-3'}>
          <TextField label="Notes" name="notes" errors={errors.notes} />
        </div>
      </fieldset>

      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={pending} aria-disabled={pending}>
          {pending ? 'Saving…' : measured ? 'Save measurement' : 'Save calculation'}
        </Button>
        <span className="text-xs text-ink-muted">Checked like an import row; saved as a one-row import you can undo for {IMPORTER_UNDO_HOURS} hours.</span>
      </div>
      {!state.ok && state.message && <Notice tone="bad">{state.message}</Notice>}
      {saved && (
        <Notice tone={saved.duplicate ? 'warn' : 'good'}>
          <span data-testid="entry-saved">{state.message}</span> <Link href={`/w/${slug}/imports/${saved.importId}`}>Open its import</Link>
          {materialId && (
            <>
              {' · '}
              <Link href={`/w/${slug}/materials/${materialId}`}>Open {material}</Link>
            </>
          )}
        </Notice>
      )}
    </form>
  );
}
