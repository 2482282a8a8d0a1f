import { benchmarkSourcesRoute } from '@/lib/citations/export-routes';

/** BibTeX of every source behind the pairs of a revision (…/sources?format=bibtex, kept for existing links). */
export const GET = benchmarkSourcesRoute('bibtex');
