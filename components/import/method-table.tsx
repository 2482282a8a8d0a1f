'use client';
import type { ReactNode } from 'react';
import { APPROACH_LABELS, FUNCTIONAL_SUGGESTIONS } from '@/lib/catalog/method-schema';
import type { RowError } from '@/lib/import/errors';
import { copyRecipe, fillDown, MAX_METHOD_LINES, METHOD_TABLE_FIELD_NAMES, METHOD_TABLE_FIELDS, type MethodTableField, type MethodTableLine, type MissingMethodLabel } from '@/lib/import/method-table';
import { APPROACHES } from '@/lib/record-kinds';

const cellClass =
  'w-full min-w-0 rounded border border-rule-strong bg-panel px-1.5 py-1 text-xs text-ink placeholder:text-ink-faint focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/20 aria-[invalid=true]:border-bad aria-[invalid=true]:bg-bad-soft disabled:opacity-60';

const WIDTH: Record<MethodTableField, string> = {
  functional: 'w-24',
  dispersion: 'w-20',
  pseudopotential: 'w-28',
  cutoff_eV: 'w-16',
  k_grid: 'w-20',
  q_grid: 'w-20',
  smearing: 'w-24',
  approach: 'w-44',
  lo_to_correction: 'w-16',
};

const PLACEHOLDER: Partial<Record<MethodTableField, string>> = { functional: 'required', cutoff_eV: '600', k_grid: '8x8x8', q_grid: '4x4x4' };

/**
 * The method table of a calculation import: one line per method label the file names but the
 * workspace lacks, the label fixed, the recipe editable. `errors` are the lines' errors
 * (checkMethodTable); `missing` tells which rows of the file disagree with a line's prefill.
 */
export function MethodTableEditor({
  lines,
  onChange,
  errors,
  missing,
  disabled,
}: {
  lines: MethodTableLine[];
  onChange: (lines: MethodTableLine[]) => void;
  errors: RowError[];
  missing: MissingMethodLabel[];
  disabled?: boolean;
}) {
  const reasons = new Map<string, string>();
  for (const e of errors) {
    const key = `${e.methodLine}|${e.column}`;
    reasons.set(key, [reasons.get(key), e.reason].filter(Boolean).join(' '));
  }
  const reasonOf = (line: number, field: 'label' | MethodTableField) => reasons.get(`${line}|${METHOD_TABLE_FIELD_NAMES[field]}`);
  const set = (index: number, field: MethodTableField, value: string) => onChange(lines.map((l, i) => (i === index ? { ...l, [field]: value } : l)));
  const disagreements = missing.flatMap((m) => m.others.map((o) => ({ ...o, label: m.label, first: m.row, line: lines.findIndex((l) => l.label === m.label) + 1 })));

  return (
    <div className="space-y-2">
      <div role="region" aria-label="New methods" tabIndex={0} className="overflow-x-auto rounded-md border border-rule">
        <table className="text-xs" data-testid="method-table">
          <caption className="sr-only">One line per new method: its label and the recipe it is created with</caption>
          <thead className="bg-panel text-left text-ink-muted">
            <tr>
              <th className="px-1.5 py-1.5 font-medium">Line</th>
              <th className="px-1.5 py-1.5 font-medium">Label</th>
              {METHOD_TABLE_FIELDS.map((f) => (
                <th key={f} className="px-1.5 py-1.5 font-medium whitespace-nowrap">
                  {METHOD_TABLE_FIELD_NAMES[f]}
                  {f === 'functional' && <span aria-hidden="true"> *</span>}
                  {lines.length > 1 && (
                    <button
                      type="button"
                      className="ml-1 rounded px-1 text-accent-strong hover:bg-accent-soft disabled:opacity-50"
                      aria-label={`Fill ${METHOD_TABLE_FIELD_NAMES[f]} down from line 1`}
                      title={`Fill ${METHOD_TABLE_FIELD_NAMES[f]} down from line 1`}
                      onClick={() => onChange(fillDown(lines, f))}
                      disabled={disabled}
                    >
                      ↧
                    </button>
                  )}
                </th>
              ))}
              <th className="px-1.5 py-1.5 font-medium">
                <span className="sr-only">Copy</span>
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-rule">
            {lines.map((line, i) => {
              const n = i + 1;
              const labelReason = reasonOf(n, 'label');
              return (
                <tr key={line.label} data-label={line.label}>
                  <td className="num px-1.5 py-1 text-ink-muted">{n}</td>
                  <td className={`px-1.5 py-1 font-mono whitespace-nowrap ${labelReason ? 'text-bad' : ''}`} title={labelReason}>
                    {line.label}
                  </td>
                  {METHOD_TABLE_FIELDS.map((f) => {
                    const reason = reasonOf(n, f);
                    const common = {
                      'aria-label': `${METHOD_TABLE_FIELD_NAMES[f]} of ${line.label}`,
                      'aria-invalid': reason ? true : undefined,
                      title: reason,
                      className: cellClass,
                      disabled,
                      value: line[f] ?? '',
                    };
                    return (
                      <td key={f} className={`px-1 py-1 ${WIDTH[f]}`}>
                        {f === 'approach' ? (
                          <select {...common} onChange={(e) => set(i, f, e.target.value)}>
                            <option value="">—</option>
                            {APPROACHES.map((a) => (
                              <option key={a} value={a}>
                                {APPROACH_LABELS[a]}
                              </option>
                            ))}
                            <Unlisted value={line[f]} choices={APPROACHES} />
                          </select>
                        ) : f === 'lo_to_correction' ? (
                          <select {...common} onChange={(e) => set(i, f, e.target.value)}>
                            <option value="">—</option>
                            <option value="yes">yes</option>
                            <option value="no">no</option>
                            <Unlisted value={line[f]} choices={['yes', 'no']} />
                          </select>
                        ) : (
                          <input
                            {...common}
                            type="text"
                            list={f === 'functional' ? 'method-table-functionals' : undefined}
                            placeholder={PLACEHOLDER[f]}
                            required={f === 'functional'}
                            onChange={(e) => set(i, f, e.target.value)}
                          />
                        )}
                      </td>
                    );
                  })}
                  <td className="px-1 py-1 whitespace-nowrap">
                    {i > 0 && (
                      <button
                        type="button"
                        className="rounded border border-rule-strong px-1.5 py-0.5 text-ink-muted hover:bg-paper hover:text-ink disabled:opacity-50"
                        aria-label={`Copy the recipe of line ${i} into line ${n} (${line.label})`}
                        onClick={() => onChange(copyRecipe(lines, i - 1, i))}
                        disabled={disabled}
                      >
                        Copy above
                      </button>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
        <datalist id="method-table-functionals">
          {FUNCTIONAL_SUGGESTIONS.map((f) => (
            <option key={f} value={f} />
          ))}
        </datalist>
      </div>
      {errors.length > 0 && (
        <ul className="list-disc space-y-0.5 pl-5 text-xs text-bad" data-testid="method-table-errors" aria-label="Errors in the method table">
          {errors.map((e, i) => (
            <li key={i}>
              Line {e.methodLine} · {e.column}: {e.reason}
            </li>
          ))}
        </ul>
      )}
      {disagreements.length > 0 && (
        <ul className="list-disc space-y-0.5 pl-5 text-xs text-ink-muted" aria-label="Rows that disagree with the table">
          {disagreements.map((d) => (
            <li key={`${d.label}|${d.field}`}>
              Line {d.line} ({d.label}): row {d.row} gives {METHOD_TABLE_FIELD_NAMES[d.field]} “{d.value}”, unlike row {d.first}; the table’s value is used for every row of the method.
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

/** A prefilled value the select does not offer (kept, so that the check can name it). */
function Unlisted({ value, choices }: { value: string | undefined; choices: readonly string[] }) {
  if (!value || choices.includes(value)) return null;
  return <option value={value}>{value} (not a choice)</option>;
}

/**
 * Step 4's part about the file's new method labels: without createMissing a pointer to it,
 * with it the table (`children`), or why the table cannot be sent.
 */
export function NewMethods({
  count,
  labels,
  createMissing,
  onCreateMissing,
  tooMany,
  queryTooLong,
  disabled,
  children,
}: {
  count: number;
  labels: string[];
  createMissing: boolean;
  onCreateMissing: () => void;
  tooMany: boolean;
  queryTooLong: boolean;
  disabled?: boolean;
  children: ReactNode;
}) {
  if (count === 0) return null;
  const named = `${labels.slice(0, 4).map((l) => `“${l}”`).join(', ')}${count > 4 ? `, … (${count.toLocaleString('en')} in all)` : ''}`;
  if (!createMissing) {
    return (
      <div className="flex flex-wrap items-center gap-3 rounded-md border border-rule bg-panel px-3 py-2 text-sm" data-testid="new-methods-hint">
        <p className="max-w-3xl">
          The file names {count === 1 ? 'a method' : `${count.toLocaleString('en')} methods`} this workspace lacks: {named}. To create them in this import, with a recipe per label given here, choose to create missing materials and methods.
        </p>
        <button type="button" className="rounded-md border border-rule-strong px-2.5 py-1 text-sm font-medium hover:bg-paper disabled:opacity-50" onClick={onCreateMissing} disabled={disabled}>
          Create them in this import
        </button>
      </div>
    );
  }
  return (
    <section aria-labelledby="new-methods-title" className="space-y-2" data-testid="new-methods">
      <h3 id="new-methods-title" className="text-sm font-medium">
        New methods ({count.toLocaleString('en')})
      </h3>
      <p className="max-w-3xl text-xs text-ink-muted">
        Each line creates one method with this recipe, in the same write as the rows; a bad line refuses the whole import. The file’s method_… cells fill the lines at first and are not read otherwise. A family differs in one parameter: copy the line above, then change that field.
      </p>
      {tooMany ? (
        <p className="text-sm text-bad" role="alert">
          The file names {count.toLocaleString('en')} new methods; the table takes at most {MAX_METHOD_LINES} in one import. Import the methods first (a methods file), or split the file.
        </p>
      ) : (
        children
      )}
      {queryTooLong && (
        <p className="text-sm text-bad" role="alert">
          The method table is too long to send with the file: shorten its cells, or import the methods first (a methods file).
        </p>
      )}
    </section>
  );
}
