import { workspaceSourcesRoute } from '@/lib/citations/export-routes';

/** GET …/sources/export?format=bibtex|ris|csl-json[&ids=a,b] */
export const GET = workspaceSourcesRoute();
