import type { InputHTMLAttributes, SelectHTMLAttributes } from 'react';

export const inputClass =
  'block w-full rounded-md border border-rule-strong bg-panel px-2.5 py-1.5 text-sm text-ink placeholder:text-ink-faint focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/20 aria-[invalid=true]:border-bad';

type Common = { label: string; name: string; errors?: string[]; hint?: string };

function FieldShell({ id, label, errors, hint, children }: { id: string; label: string; errors?: string[]; hint?: string; children: React.ReactNode }) {
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-[13px] font-medium text-ink">
        {label}
      </label>
      {children}
      {hint && !errors?.length && (
        <p id={`${id}-hint`} className="text-xs text-ink-faint">
          {hint}
        </p>
      )}
      {errors?.length ? (
        <p id={`${id}-error`} className="text-xs text-bad" role="alert">
          {errors.join(' ')}
        </p>
      ) : null}
    </div>
  );
}

export function TextField({ label, name, errors, hint, id, ...props }: Common & InputHTMLAttributes<HTMLInputElement>) {
  const fieldId = id ?? `f-${name}`;
  return (
    <FieldShell id={fieldId} label={label} errors={errors} hint={hint}>
      <input
        id={fieldId}
        name={name}
        className={inputClass}
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={errors?.length ? `${fieldId}-error` : hint ? `${fieldId}-hint` : undefined}
        {...props}
      />
    </FieldShell>
  );
}

export function SelectField({ label, name, errors, hint, id, children, ...props }: Common & SelectHTMLAttributes<HTMLSelectElement>) {
  const fieldId = id ?? `f-${name}`;
  return (
    <FieldShell id={fieldId} label={label} errors={errors} hint={hint}>
      <select id={fieldId} name={name} className={inputClass} aria-invalid={errors?.length ? true : undefined} {...props}>
        {children}
      </select>
    </FieldShell>
  );
}
