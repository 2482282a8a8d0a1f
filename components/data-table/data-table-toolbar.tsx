'use client';
import { useId } from 'react';
import { useListUrl } from './use-list-url';
import { useUrlText } from './use-url-text';

export interface ToolbarFilter {
  /** URL parameter, e.g. "tag". */
  param: string;
  label: string;
  options: Array<{ value: string; label: string }>;
}

export interface ToolbarTextFilter {
  param: string;
  label: string;
  placeholder?: string;
}

const field =
  'rounded-sm border-0 border-b border-dashed border-rule-strong bg-transparent px-1 py-0.5 text-sm text-ink placeholder:text-ink-faint focus:border-solid focus:border-accent focus:outline-none';

function TextCondition({ filter, wide }: { filter: ToolbarTextFilter; wide?: boolean }) {
  const [value, setValue] = useUrlText(filter.param);
  const id = useId();
  return (
    <span className="inline-flex items-baseline gap-1.5">
      <label htmlFor={id} className="text-ink-muted">
        {filter.label}
      </label>
      <input id={id} type="search" className={`${field} ${wide ? 'w-64' : 'w-36'}`} placeholder={filter.placeholder ?? 'anything'} value={value} onChange={(e) => setValue(e.target.value)} />
    </span>
  );
}

/**
 * The conditions of a list, read as a sentence ("whose name contains …, class any,
 * include retracted"), every one kept in the URL; "Reset" clears them all.
 */
export function DataTableToolbar({
  search,
  filters = [],
  texts = [],
  retractedToggle = true,
}: {
  /** What the free-text condition searches, e.g. "name, formula or external id". */
  search: string;
  filters?: ToolbarFilter[];
  texts?: ToolbarTextFilter[];
  retractedToggle?: boolean;
}) {
  const { searchParams, update } = useListUrl();
  const params = ['q', ...filters.map((f) => f.param), ...texts.map((t) => t.param), 'retracted'];
  const active = params.filter((p) => searchParams.get(p));
  return (
    <div role="search" aria-label="Conditions of the list" className="flex flex-wrap items-baseline gap-x-5 gap-y-2 rounded-md border-l-4 border-accent/60 bg-accent-soft/40 px-3 py-2 text-sm">
      <TextCondition filter={{ param: 'q', label: `${search} contains`, placeholder: 'any text' }} wide />
      {filters.map((f) => (
        <label key={f.param} className="inline-flex items-baseline gap-1.5 text-ink-muted">
          {f.label}
          <select className={`${field} pr-5`} value={searchParams.get(f.param) ?? ''} onChange={(e) => update({ [f.param]: e.target.value })}>
            <option value="">any</option>
            {f.options.map((o) => (
              <option key={o.value} value={o.value}>
                {o.label}
              </option>
            ))}
          </select>
        </label>
      ))}
      {texts.map((t) => (
        <TextCondition key={t.param} filter={t} />
      ))}
      {retractedToggle && (
        <label className="inline-flex items-center gap-1.5 text-ink-muted">
          <input type="checkbox" className="accent-accent" checked={searchParams.get('retracted') === '1'} onChange={(e) => update({ retracted: e.target.checked ? '1' : null })} />
          include retracted records
        </label>
      )}
      {active.length > 0 && (
        <button type="button" className="ml-auto text-xs font-medium text-accent underline decoration-dotted underline-offset-2 hover:text-accent-strong" onClick={() => update(Object.fromEntries(params.map((p) => [p, null])))}>
          Reset {active.length === 1 ? 'the condition' : `${active.length} conditions`}
        </button>
      )}
    </div>
  );
}
