import Link from 'next/link';
import { countPairsOnIncompleteSources } from '@/lib/citations/completeness';
import { EXPORT_FORMAT_NAMES, EXPORT_FORMATS } from '@/lib/citations/formats';
import { doiUrl } from '@/lib/catalog/doi';
import { buttonClass } from '@/components/ui/button';
import { IncompleteMark } from './incomplete-mark';
import { IncompletePairsNote } from './incomplete-pairs-note';

export interface CitedSource {
  citeKey: string;
  citation: string;
  doi: string | null;
  gaps: readonly string[];
}

/** The citation list of a revision: every source its pairs rest on, incomplete ones marked, and the downloads. */
export function RevisionSources({
  pairs,
  sources,
  sourcesHref,
  exportHref,
}: {
  pairs: ReadonlyArray<{ sourceIds: readonly string[] }>;
  sources: ReadonlyMap<string, CitedSource>;
  /** The workspace's sources page, for links to each source. */
  sourcesHref: string;
  /** The export route, without ?format (a query such as "revision=3" may be in it). */
  exportHref: (format: string) => string;
}) {
  const list = [...sources.entries()].sort(([, a], [, b]) => a.citeKey.localeCompare(b.citeKey));
  return (
    <div className="space-y-2" data-testid="revision-sources">
      <IncompletePairsNote count={countPairsOnIncompleteSources(pairs, sources)} total={pairs.length} />
      {list.length ? (
        <ul className="max-h-64 space-y-0.5 overflow-y-auto text-xs">
          {list.map(([id, s]) => (
            <li key={id}>
              <Link href={`${sourcesHref}/${id}`} className="font-mono">
                {s.citeKey}
              </Link>
              <IncompleteMark gaps={s.gaps} /> — {s.citation}
              {s.doi ? (
                <>
                  {' · '}
                  <a href={doiUrl(s.doi)} rel="noreferrer noopener" target="_blank">
                    doi:{s.doi}
                  </a>
                </>
              ) : null}
            </li>
          ))}
        </ul>
      ) : null}
      <div className="flex flex-wrap gap-2">
        {EXPORT_FORMAT_NAMES.map((f) => (
          <a key={f} className={buttonClass('secondary')} href={exportHref(f)} download>
            Sources ({EXPORT_FORMATS[f].label})
          </a>
        ))}
      </div>
    </div>
  );
}
