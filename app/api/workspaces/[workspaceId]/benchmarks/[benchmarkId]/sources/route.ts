import { benchmarkSourcesRoute } from '@/lib/citations/export-routes';

/** GET …/benchmarks/:id/sources?format=bibtex|ris|csl-json[&revision=N] */
export const GET = benchmarkSourcesRoute();
