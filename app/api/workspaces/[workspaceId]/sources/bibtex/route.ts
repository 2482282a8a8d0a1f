import { workspaceSourcesRoute } from '@/lib/citations/export-routes';

/** GET …/sources/bibtex[?ids=a,b]: the BibTeX form of …/sources/export, kept for existing links. */
export const GET = workspaceSourcesRoute('bibtex');
