import { describeGaps } from '@/lib/citations/completeness';

/** A small marker beside a cite key whose source is incomplete; says what is missing on hover and to screen readers. */
export function IncompleteMark({ gaps }: { gaps: readonly string[] | null | undefined }) {
  const text = describeGaps(gaps ?? []);
  if (!text) return null;
  return (
    <span className="ml-1 inline-block rounded-sm border border-warn/40 bg-warn-soft px-1 align-middle text-[10px] font-medium leading-4 text-warn" title={text} data-testid="incomplete-source">
      <span aria-hidden="true">incomplete</span>
      <span className="sr-only">{text}</span>
    </span>
  );
}
