import { workspaceSourcesRoute } from '@/app/api/workspaces/[workspaceId]/_lib/source-export-routes';

/** GET …/sources/export?format=bibtex|ris|csl-json[&ids=a,b] */
export const GET = workspaceSourcesRoute();
