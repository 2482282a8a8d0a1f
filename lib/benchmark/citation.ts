/** The "how to cite this revision" text shown on the benchmark page. */
export interface CitableRevision {
  workspaceName: string;
  benchmarkName: string;
  revisionNumber: number;
  fingerprint: string;
  createdAt: Date;
  url: string;
}

export function howToCite(r: CitableRevision): string {
  const date = r.createdAt.toISOString().slice(0, 10);
  return `${r.workspaceName}. "${r.benchmarkName}", benchmark revision ${r.revisionNumber} (${date}), Lattice Ledger, fingerprint sha256:${r.fingerprint.slice(0, 16)}. ${r.url}. Cite the sources of the data (BibTeX download) as well.`;
}
