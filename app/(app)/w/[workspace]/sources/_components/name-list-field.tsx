'use client';
import { useId, useState } from 'react';
import { inputClass } from '@/components/ui/field';
import { parseNameList, type PersonName } from '@/lib/citations/names';
import { formatAuthors } from '@/lib/citations/authors';

/** How a stored name is written back into the text box so that it parses to the same name. */
function asTyped(n: PersonName): string {
  if (n.literal) return n.review ? n.literal : `{${n.literal}}`;
  return [[n.particle, n.family].filter(Boolean).join(' '), n.suffix, n.given].filter(Boolean).join(', ');
}

const cell = `${inputClass} py-1 text-[13px]`;

/**
 * A list of people typed as text (one per line, or separated by ";" or "and"),
 * split into given and family names as you type, shown for correction before
 * saving. The corrected list is what the form sends.
 */
export function NameListField({ label, name, initial, errors, hint }: { label: string; name: string; initial: PersonName[]; errors?: string[]; hint?: string }) {
  const id = useId();
  const [text, setText] = useState(() => initial.map(asTyped).join('\n'));
  const [names, setNames] = useState<PersonName[]>(initial);
  const edit = (i: number, patch: Partial<PersonName>) =>
    setNames((list) =>
      list.map((n, j) => {
        if (j !== i) return n;
        const next: PersonName = { ...n, ...patch };
        // Splitting a name kept as written into family and given names is its review.
        if (next.family) {
          delete next.literal;
          delete next.review;
        }
        return next;
      }),
    );
  const toReview = names.filter((n) => n.review).length;
  return (
    <div className="space-y-2">
      <label htmlFor={`${id}-text`} className="block text-[13px] font-medium text-ink">
        {label}
      </label>
      <textarea
        id={`${id}-text`}
        rows={Math.min(6, Math.max(2, names.length + 1))}
        className={`${inputClass} text-sm`}
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          setNames(parseNameList(e.target.value));
        }}
        aria-describedby={`${id}-hint`}
        aria-invalid={errors?.length ? true : undefined}
      />
      <p id={`${id}-hint`} className="text-xs text-ink-faint">
        {hint ?? 'One per line, or separated by “;” or “and”: “Azuhata T.”, “Azuhata, T.”, “T. Azuhata”, “van der Waals, J. D.”. An organisation in braces: {Halden Phonon Group}.'}
      </p>
      <input type="hidden" name={name} value={JSON.stringify(names)} />
      {names.length > 0 && (
        <div className="rounded-md border border-rule bg-paper p-2" aria-live="polite">
          <p className="mb-1 text-xs text-ink-muted">
            Read as: <span className="text-ink">{formatAuthors(names)}</span>
            {toReview ? <span className="text-warn"> — {toReview} name{toReview === 1 ? '' : 's'} kept as written: split {toReview === 1 ? 'it' : 'them'} below or keep as an organisation.</span> : null}
          </p>
          <table className="w-full text-xs" data-testid={`${name}-parsed`}>
            <caption className="sr-only">{label}: parsed names, editable</caption>
            <thead>
              <tr className="text-left text-ink-muted">
                <th className="w-8 px-1 font-normal">#</th>
                <th className="px-1 font-normal">Given names</th>
                <th className="w-24 px-1 font-normal">Particle</th>
                <th className="px-1 font-normal">Family name</th>
                <th className="w-20 px-1 font-normal">Suffix</th>
              </tr>
            </thead>
            <tbody>
              {names.map((n, i) => (
                <tr key={i} data-review={n.review ? 'true' : undefined}>
                  <td className="px-1 text-ink-muted">{i + 1}</td>
                  {n.literal ? (
                    <td colSpan={4} className="px-1 py-0.5">
                      <div className="flex flex-wrap items-center gap-2">
                        <span className={n.review ? 'text-warn' : ''}>
                          {n.literal} {n.review ? '(kept as written, to review)' : '(organisation)'}
                        </span>
                        {n.review ? (
                          <>
                            <button type="button" className="underline" onClick={() => edit(i, { review: false })}>
                              Keep as an organisation
                            </button>
                            <button type="button" className="underline" onClick={() => edit(i, { family: n.literal })}>
                              Split it
                            </button>
                          </>
                        ) : null}
                      </div>
                    </td>
                  ) : (
                    (['given', 'particle', 'family', 'suffix'] as const).map((part) => (
                      <td key={part} className="px-1 py-0.5">
                        <input
                          className={cell}
                          aria-label={`${label} ${i + 1}: ${part === 'family' ? 'family name' : part === 'given' ? 'given names' : part}`}
                          value={n[part] ?? ''}
                          onChange={(e) => edit(i, { [part]: e.target.value || undefined })}
                        />
                      </td>
                    ))
                  )}
                </tr>
              ))}
            </tbody>
          </table>
          <p className="mt-1 text-[11px] text-ink-faint">Corrections here are saved; typing in the box above splits the names again.</p>
        </div>
      )}
      {errors?.length ? (
        <p className="text-xs text-bad" role="alert">
          {errors.join(' ')}
        </p>
      ) : null}
    </div>
  );
}
