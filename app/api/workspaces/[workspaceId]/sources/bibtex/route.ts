import { workspaceSourcesRoute } from '@/app/api/workspaces/[workspaceId]/_lib/source-export-routes';

/** GET …/sources/bibtex[?ids=a,b]: the BibTeX form of …/sources/export, kept for existing links. */
export const GET = workspaceSourcesRoute('bibtex');
