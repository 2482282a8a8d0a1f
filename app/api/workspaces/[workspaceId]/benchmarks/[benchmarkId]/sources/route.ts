import { benchmarkSourcesRoute } from '@/app/api/workspaces/[workspaceId]/_lib/source-export-routes';

/** GET …/benchmarks/:id/sources?format=bibtex|ris|csl-json[&revision=N] */
export const GET = benchmarkSourcesRoute();
