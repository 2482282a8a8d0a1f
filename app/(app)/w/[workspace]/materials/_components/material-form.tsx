'use client';
import { useMemo, useState } from 'react';
import { crystalSystem, parseFormula } from '@/lib/science';
import { CP_CORRECTION_NOTE } from '@/lib/catalog/material-schema';
import { TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { FormMessage } from '@/components/ui/form-message';
import { useRecordForm } from '@/components/ui/use-record-form';
import { createMaterialAction, updateMaterialAction } from '../actions';

export interface MaterialFormValues {
  id?: string;
  name: string;
  displayName: string;
  formula: string;
  spaceGroup: string;
  atomsInCell: string;
  externalId: string;
  tags: string;
  thermalExpansionPerK: string;
  bulkModulusGpa: string;
  molarVolumeCm3: string;
}

/** What the formula and space group give, shown while typing (the server re-derives it on save). */
function preview(formula: string, spaceGroup: string): { text: string; bad: boolean } | null {
  const parts: string[] = [];
  if (formula.trim()) {
    try {
      const p = parseFormula(formula);
      parts.push(`reduced formula ${p.reduced}`, `${p.atomsPerFormulaUnit} atoms per formula unit`);
    } catch (e) {
      return { text: (e as Error).message.replace(/^formula: /, 'Formula '), bad: true };
    }
  }
  const sg = Number(spaceGroup);
  if (spaceGroup.trim() && Number.isInteger(sg) && sg >= 1 && sg <= 230) parts.push(`${crystalSystem(sg)} crystal system`);
  return parts.length ? { text: parts.join(' · '), bad: false } : null;
}

export function MaterialForm({ workspaceId, slug, initial }: { workspaceId: string; slug: string; initial: MaterialFormValues }) {
  const editing = Boolean(initial.id);
  const { state, pending, errors, onSubmit } = useRecordForm(editing ? updateMaterialAction : createMaterialAction, `/w/${slug}/materials`);
  const [formula, setFormula] = useState(initial.formula);
  const [spaceGroup, setSpaceGroup] = useState(initial.spaceGroup);
  const derived = useMemo(() => preview(formula, spaceGroup), [formula, spaceGroup]);


  return (
    <form
      className="grid max-w-2xl gap-4 sm:grid-cols-2"
      noValidate
      onSubmit={onSubmit}
    >
      <input type="hidden" name="workspaceId" value={workspaceId} />
      {initial.id && <input type="hidden" name="id" value={initial.id} />}
      <TextField label="Name (unique handle)" name="name" defaultValue={initial.name} errors={errors.name} hint='Used by imports and the API, e.g. "GaN-wz".' required />
      <TextField label="Display name" name="displayName" defaultValue={initial.displayName} errors={errors.displayName} hint="Optional, e.g. GaN (wurtzite)." />
      <div className="sm:col-span-2">
        <TextField
          label="Formula"
          name="formula"
          value={formula}
          onChange={(e) => setFormula(e.target.value)}
          errors={errors.formula}
          hint="Element symbols with counts; parentheses, hydrates (·) and fractional occupancies are understood."
          required
        />
        {derived && !(derived.bad && errors.formula) && (
          <p className={`mt-1 text-xs ${derived.bad ? 'text-warn' : 'text-ink-muted'}`} aria-live="polite">
            {derived.text}
          </p>
        )}
      </div>
      <TextField label="Space group (1–230)" name="spaceGroup" inputMode="numeric" value={spaceGroup} onChange={(e) => setSpaceGroup(e.target.value)} errors={errors.spaceGroup} />
      <TextField label="Atoms in the primitive cell" name="atomsInCell" inputMode="numeric" defaultValue={initial.atomsInCell} errors={errors.atomsInCell} hint="3N modes at Γ." />
      <TextField label="External structure id" name="externalId" defaultValue={initial.externalId} errors={errors.externalId} hint="Free text, e.g. a database id." />
      <TextField label="Material classes (tags)" name="tags" defaultValue={initial.tags} errors={errors.tags} hint="Comma-separated, e.g. semiconductor, nitride." />
      <fieldset className="grid gap-4 sm:col-span-2 sm:grid-cols-3">
        <legend className="text-sm font-semibold">Thermal properties (optional)</legend>
        <p className="text-xs text-ink-muted sm:col-span-3">{CP_CORRECTION_NOTE} Give them near 298 K.</p>
        <TextField
          label="Thermal expansion α_V (K⁻¹)"
          name="thermalExpansionPerK"
          inputMode="decimal"
          defaultValue={initial.thermalExpansionPerK}
          errors={errors.thermalExpansionPerK}
          hint="Volumetric: 3 × the linear coefficient of a cubic crystal, e.g. 3.12e-5."
        />
        <TextField label="Bulk modulus B_T (GPa)" name="bulkModulusGpa" inputMode="decimal" defaultValue={initial.bulkModulusGpa} errors={errors.bulkModulusGpa} hint="Isothermal, e.g. 160." />
        <TextField
          label="Molar volume V_m (cm³/mol)"
          name="molarVolumeCm3"
          inputMode="decimal"
          defaultValue={initial.molarVolumeCm3}
          errors={errors.molarVolumeCm3}
          hint="Per mole of formula units: molar mass ÷ density, e.g. 11.25."
        />
      </fieldset>
      <div className="flex items-center gap-3 sm:col-span-2">
        <Button type="submit" disabled={pending} aria-disabled={pending}>
          {pending ? 'Saving…' : editing ? 'Save material' : 'Create material'}
        </Button>
        {!state.ok && <FormMessage state={state} />}
      </div>
    </form>
  );
}
