import { benchmarkSourcesRoute } from '@/app/api/workspaces/[workspaceId]/_lib/source-export-routes';

/** BibTeX of every source behind the pairs of a revision (…/sources?format=bibtex, kept for existing links). */
export const GET = benchmarkSourcesRoute('bibtex');
