'use client';
import { SelectField, TextField, inputClass } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormMessage } from '@/components/ui/form-message';
import { useRecordForm } from '@/components/ui/use-record-form';
import { createMethodAction, updateMethodAction } from '../actions';

export interface MethodFormValues {
  id?: string;
  label: string;
  functional: string;
  dispersion: string;
  pseudopotential: string;
  cutoffEv: string;
  kGrid: string;
  qGrid: string;
  smearing: string;
  approach: string;
  nonAnalyticCorrection: string;
  notes: string;
}

export function MethodForm({
  workspaceId,
  slug,
  initial,
  functionals,
  approaches,
}: {
  workspaceId: string;
  slug: string;
  initial: MethodFormValues;
  functionals: readonly string[];
  approaches: Array<{ value: string; label: string }>;
}) {
  const editing = Boolean(initial.id);
  const { state, pending, errors, onSubmit } = useRecordForm(editing ? updateMethodAction : createMethodAction, `/w/${slug}/methods`);


  return (
    <form
      className="grid max-w-3xl gap-4 sm:grid-cols-2"
      noValidate
      onSubmit={onSubmit}
    >
      <input type="hidden" name="workspaceId" value={workspaceId} />
      {initial.id && <input type="hidden" name="id" value={initial.id} />}
      <TextField label="Label (unique)" name="label" defaultValue={initial.label} errors={errors.label} hint='Used by imports, e.g. "PBEsol-PAW-520".' required />
      <TextField label="Functional" name="functional" list="functional-suggestions" defaultValue={initial.functional} errors={errors.functional} required />
      <datalist id="functional-suggestions">
        {functionals.map((f) => (
          <option key={f} value={f} />
        ))}
      </datalist>
      <TextField label="Dispersion correction" name="dispersion" defaultValue={initial.dispersion} errors={errors.dispersion} hint="e.g. D3(BJ); leave empty for none." />
      <TextField label="Pseudopotential family" name="pseudopotential" defaultValue={initial.pseudopotential} errors={errors.pseudopotential} />
      <TextField label="Plane-wave cutoff (eV)" name="cutoffEv" inputMode="decimal" defaultValue={initial.cutoffEv} errors={errors.cutoffEv} />
      <TextField label="Smearing" name="smearing" defaultValue={initial.smearing} errors={errors.smearing} />
      <TextField label="k-point grid" name="kGrid" defaultValue={initial.kGrid} errors={errors.kGrid} hint='e.g. "8x8x8"' />
      <TextField label="q-point grid" name="qGrid" defaultValue={initial.qGrid} errors={errors.qGrid} hint='e.g. "4x4x4"' />
      <SelectField label="Approach" name="approach" defaultValue={initial.approach} errors={errors.approach}>
        <option value="">Not given</option>
        {approaches.map((a) => (
          <option key={a.value} value={a.value}>
            {a.label}
          </option>
        ))}
      </SelectField>
      <SelectField label="LO–TO (non-analytic) correction" name="nonAnalyticCorrection" defaultValue={initial.nonAnalyticCorrection} errors={errors.nonAnalyticCorrection}>
        <option value="">Not given</option>
        <option value="yes">Yes</option>
        <option value="no">No</option>
      </SelectField>
      <div className="space-y-1 sm:col-span-2">
        <label htmlFor="f-notes" className="block text-[13px] font-medium">
          Notes
        </label>
        <textarea id="f-notes" name="notes" rows={3} defaultValue={initial.notes} className={inputClass} aria-invalid={errors.notes ? true : undefined} />
        {errors.notes && (
          <p className="text-xs text-bad" role="alert">
            {errors.notes.join(' ')}
          </p>
        )}
      </div>
      <div className="flex items-center gap-3 sm:col-span-2">
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : editing ? 'Save method' : 'Create method'}
        </Button>
        {!state.ok && <FormMessage state={state} />}
      </div>
    </form>
  );
}
