import { z } from 'zod';
import { materialInputSchema } from '@/lib/catalog/material-schema';
import { methodInputSchema } from '@/lib/catalog/method-schema';
import { sourceInputSchema } from '@/lib/catalog/source-schema';
import {
  benchmarkSchema,
  benchmarkStatusSchema,
  benchmarkSummarySchema,
  calculationSchema,
  flagPageSchema,
  methodStatisticsResponseSchema,
  pairPageSchema,
  revisionListItemSchema,
  revisionSchema,
  verdictSchema,
  importRequestSchema,
  importResultSchema,
  catalogImportResultSchema,
  importSummarySchema,
  materialSchema,
  materialSummarySchema,
  measurementSchema,
  methodSchema,
  methodSummarySchema,
  pageOf,
  problemSchema,
  sourceSchema,
  sourceSummarySchema,
} from './schemas';

type JsonSchema = Record<string, unknown>;

/** zod 4's own JSON Schema output (draft 2020-12, which OpenAPI 3.1 uses as is). */
function jsonSchema(schema: z.ZodType, io: 'input' | 'output'): JsonSchema {
  const out = z.toJSONSchema(schema, { target: 'draft-2020-12', io, unrepresentable: 'any' }) as JsonSchema;
  delete out.$schema;
  return out;
}

/** A PATCH body: the input's fields, none required, null allowed to clear an optional one. */
function patchOf(input: JsonSchema, title: string): JsonSchema {
  const { required: _required, ...rest } = input;
  return { ...rest, title, description: 'Only the fields to change; the merged record must still satisfy the create schema.' };
}

const ref = (name: string) => ({ $ref: `#/components/schemas/${name}` });
const problemContent = { 'application/problem+json': { schema: ref('Problem') } };
const problems = (...statuses: number[]) =>
  Object.fromEntries(
    statuses.map((s) => [
      String(s),
      {
        description:
          {
            400: 'Bad request',
            401: 'Missing, unknown, revoked or expired token',
            403: "The token's role does not allow this",
            404: 'Not found in the token’s workspace',
            409: 'This file was already imported (firstImportId links to it), or a request with this Idempotency-Key is still running',
            413: 'Body over IMPORT_MAX_BYTES',
            422: 'Nothing imported: every row error is listed; or the Idempotency-Key was used for a different request',
          }[s] ?? 'Error',
        content: problemContent,
      },
    ]),
  );

const pageParameters = [
  { name: 'page', in: 'query', schema: { type: 'integer', minimum: 1, default: 1 } },
  { name: 'size', in: 'query', schema: { type: 'integer', minimum: 1, maximum: 1000, default: 100 } },
];
const idParameter = [{ name: 'id', in: 'path', required: true, schema: { type: 'string' } }];
const methodIdParameter = { name: 'methodId', in: 'path', required: true, schema: { type: 'string' } };
const revisionQueryParameter = {
  name: 'revision',
  in: 'query',
  required: false,
  description: 'A revision number; absent or `latest`: the latest.',
  schema: { oneOf: [{ type: 'integer', minimum: 1 }, { const: 'latest' }] },
};

/** On every POST (lib/services/idempotency.ts). */
export const idempotencyKeyParameter = {
  name: 'Idempotency-Key',
  in: 'header',
  required: false,
  description:
    'Any 1–255 visible ASCII characters (a UUID, or a hash of the file). The first request with a key stores its answer; a retry with the same key, ' +
    'method, path, query and body within IDEMPOTENCY_WINDOW_HOURS (default 24) gets that answer again, with `Idempotency-Replayed: true`, and runs nothing. ' +
    'The same key with another request: 422. While the first still runs: 409. Keys belong to the token and its workspace. Answers 5xx and 429 are not stored.',
  schema: { type: 'string', minLength: 1, maxLength: 255 },
};

const json = (name: string, description: string) => ({ description, content: { 'application/json': { schema: ref(name) } } });

function benchmarkPaths() {
  const tags = ['Benchmarks'];
  return {
    '/benchmarks': {
      get: { tags, summary: 'A page of benchmarks with the headline of their latest revision', parameters: pageParameters, responses: { '200': json('BenchmarkSummaryPage', 'One page'), ...problems(400, 401, 403) } },
    },
    '/benchmarks/{id}': {
      get: { tags, summary: 'One benchmark: its definition and a summary of the latest revision', parameters: idParameter, responses: { '200': json('Benchmark', 'The benchmark'), ...problems(401, 403, 404) } },
    },
    '/benchmarks/{id}/status': {
      get: {
        tags,
        summary: 'The recomputation state, and whether the latest revision includes an import',
        description:
          'An import queues the recomputation of the workspace’s benchmarks before it answers 201. Poll this route with ?import=<importId> until `import.settled` is true: ' +
          '`latestRevision` (= `import.revision`) is then the revision that includes the import, and `import.rowsInRevision` says how many of its rows are in the benchmark’s scope ' +
          '(0 when none is: the revision then did not change). `state: failed` carries the error of the last recomputation. The state is kept by the one app process.',
        parameters: [...idParameter, { name: 'import', in: 'query', required: false, schema: { type: 'string' }, description: 'An import id of this workspace (the `importId` of POST /imports).' }],
        responses: { '200': json('BenchmarkStatus', 'The state'), ...problems(400, 401, 403, 404) },
      },
    },
    '/benchmarks/{id}/revisions': {
      get: { tags, summary: 'A page of the benchmark’s revisions, newest first, with their causes', parameters: [...idParameter, ...pageParameters], responses: { '200': json('RevisionPage', 'One page'), ...problems(400, 401, 403, 404) } },
    },
    '/benchmarks/{id}/revisions/{number}': {
      get: {
        tags,
        summary: 'One revision: per-method statistics, coverage and the common-ground ranking',
        parameters: [...idParameter, { name: 'number', in: 'path', required: true, schema: { type: 'integer', minimum: 1 } }],
        responses: { '200': json('Revision', 'The revision'), ...problems(400, 401, 403, 404) },
      },
    },
    '/benchmarks/{id}/methods/{methodId}/statistics': {
      get: {
        tags,
        summary: 'One method’s statistics (N, MAE, RMSE, bias, …, coverage, common-ground errors) as the benchmark page shows them',
        parameters: [...idParameter, methodIdParameter, revisionQueryParameter],
        responses: { '200': json('MethodStatisticsResponse', 'The method’s row'), ...problems(400, 401, 403, 404) },
      },
    },
    '/benchmarks/{id}/methods/{methodId}/verdict': {
      get: {
        tags,
        summary: 'Pass or fail: the method’s MAE on the common pairs ≤ maxMae and its coverage ≥ minCoverage',
        description:
          'The numbers are the stored revision’s, on the ranking’s common ground (the measured values every ranked method pairs). A method the ranking rule leaves ' +
          'unranked has no common-ground MAE and fails with the rule’s reason. `recomputation.pending` and a warning say when a newer revision is being computed; a warning says when N is small.',
        parameters: [
          ...idParameter,
          methodIdParameter,
          { name: 'maxMae', in: 'query', required: true, schema: { type: 'number', minimum: 0 }, description: 'Largest MAE that passes, in the benchmark’s unit (cm⁻¹ or J mol⁻¹ K⁻¹).' },
          { name: 'minCoverage', in: 'query', required: false, schema: { type: 'number', minimum: 0, maximum: 1, default: 0 }, description: 'Smallest coverage (paired / measured values in scope) that passes.' },
          revisionQueryParameter,
        ],
        responses: { '200': json('Verdict', 'The verdict'), ...problems(400, 401, 403, 404) },
      },
    },
    '/benchmarks/{id}/pairs': {
      get: {
        tags,
        summary: 'A page of a revision’s pairs (measured, calculated, error)',
        parameters: [
          ...idParameter,
          revisionQueryParameter,
          { name: 'method', in: 'query', required: false, schema: { type: 'string' }, description: 'Only pairs of this method id.' },
          { name: 'material', in: 'query', required: false, schema: { type: 'string' }, description: 'Only pairs of this material id.' },
          ...pageParameters,
        ],
        responses: { '200': json('PairPage', 'One page'), ...problems(400, 401, 403, 404) },
      },
    },
    '/benchmarks/{id}/flags': {
      get: {
        tags,
        summary: 'A page of the outlier and quality flags a revision raised',
        parameters: [
          ...idParameter,
          revisionQueryParameter,
          { name: 'method', in: 'query', required: false, schema: { type: 'string' } },
          { name: 'kind', in: 'query', required: false, schema: { type: 'string', enum: ['outlier', 'quality'] } },
          ...pageParameters,
        ],
        responses: { '200': json('FlagPage', 'One page'), ...problems(400, 401, 403, 404) },
      },
    },
  };
}
const valueFilterParameters = ['material', 'source', 'import'].map((name) => ({ name, in: 'query', required: false, schema: { type: 'string' }, description: `Only rows of this ${name} id.` }));

/** POST /{plural} and PATCH /{plural}/{id} of a catalogue record, added to readPaths' entries. */
function writeOperations(plural: string, tag: string, item: string) {
  const Item = `${item[0].toUpperCase()}${item.slice(1)}`;
  return {
    post: {
      tags: [tag],
      summary: `Create one ${item}`,
      description: `The fields of the web form, validated by the same schema. Bulk: POST /imports?kind=${plural}. A taken ${
        { material: 'name', method: 'label', source: 'cite key or DOI' }[item]
      } is 409 with the field named; invalid fields are 422 with \`fields\` [{ path, message }].`,
      parameters: [idempotencyKeyParameter],
      requestBody: { required: true, content: { 'application/json': { schema: ref(`${Item}Input`) } } },
      responses: {
        '201': { description: `Created (Location: /api/v1/${plural}/{id})`, content: { 'application/json': { schema: ref(Item) } } },
        ...problems(400, 401, 403, 409, 422),
      },
    },
    patch: {
      tags: [tag],
      summary: `Change some fields of one ${item}`,
      description: 'Send only the fields to change (null clears an optional one); they are laid over the stored record and the whole is validated again. A retracted record is 409.',
      parameters: idParameter,
      requestBody: { required: true, content: { 'application/json': { schema: ref(`${Item}Patch`) } } },
      responses: { '200': { description: `The ${item} as saved`, content: { 'application/json': { schema: ref(Item) } } }, ...problems(400, 401, 403, 404, 409, 422) },
    },
  };
}

function withWrites(paths: Record<string, Record<string, unknown>>, plural: string, tag: string, item: string) {
  const ops = writeOperations(plural, tag, item);
  paths[`/${plural}`].post = ops.post;
  paths[`/${plural}/{id}`].patch = ops.patch;
  return paths;
}

function readPaths(plural: string, tag: string, item: string, summary: string, extraListParameters: object[] = []) {
  return {
    [`/${plural}`]: {
      get: {
        tags: [tag],
        summary: `A page of ${plural}`,
        parameters: [...pageParameters, ...extraListParameters],
        responses: { '200': { description: 'One page', content: { 'application/json': { schema: ref(`${summary}Page`) } } }, ...problems(400, 401, 403) },
      },
    },
    [`/${plural}/{id}`]: {
      get: {
        tags: [tag],
        summary: `One ${item} by id`,
        parameters: idParameter,
        responses: { '200': { description: `The ${item}`, content: { 'application/json': { schema: ref(`${item[0].toUpperCase()}${item.slice(1)}`) } } }, ...problems(401, 403, 404) },
      },
    },
  };
}

/** The OpenAPI 3.1 document of /api/v1, built from the same zod schemas that parse requests. */
export function buildOpenApiDocument(serverUrl: string): JsonSchema {
  const components: Record<string, JsonSchema> = {
    ImportRequest: jsonSchema(importRequestSchema, 'input'),
    ImportResult: jsonSchema(importResultSchema, 'output'),
    CatalogImportResult: jsonSchema(catalogImportResultSchema, 'output'),
    ImportSummary: jsonSchema(importSummarySchema, 'output'),
    ImportSummaryPage: jsonSchema(pageOf(importSummarySchema, 'ImportSummaryPage'), 'output'),
    Problem: jsonSchema(problemSchema, 'output'),
    Material: jsonSchema(materialSchema, 'output'),
    MaterialSummaryPage: jsonSchema(pageOf(materialSummarySchema, 'MaterialSummaryPage'), 'output'),
    Source: jsonSchema(sourceSchema, 'output'),
    SourceSummaryPage: jsonSchema(pageOf(sourceSummarySchema, 'SourceSummaryPage'), 'output'),
    Method: jsonSchema(methodSchema, 'output'),
    MethodSummaryPage: jsonSchema(pageOf(methodSummarySchema, 'MethodSummaryPage'), 'output'),
    Measurement: jsonSchema(measurementSchema, 'output'),
    MeasurementPage: jsonSchema(pageOf(measurementSchema, 'MeasurementPage'), 'output'),
    Calculation: jsonSchema(calculationSchema, 'output'),
    CalculationPage: jsonSchema(pageOf(calculationSchema, 'CalculationPage'), 'output'),
    MaterialInput: jsonSchema(materialInputSchema.meta({ title: 'MaterialInput' }), 'input'),
    MaterialPatch: patchOf(jsonSchema(materialInputSchema, 'input'), 'MaterialPatch'),
    MethodInput: jsonSchema(methodInputSchema.meta({ title: 'MethodInput' }), 'input'),
    MethodPatch: patchOf(jsonSchema(methodInputSchema, 'input'), 'MethodPatch'),
    SourceInput: jsonSchema(sourceInputSchema.meta({ title: 'SourceInput' }), 'input'),
    SourcePatch: patchOf(jsonSchema(sourceInputSchema, 'input'), 'SourcePatch'),
    BenchmarkSummaryPage: jsonSchema(pageOf(benchmarkSummarySchema, 'BenchmarkSummaryPage'), 'output'),
    Benchmark: jsonSchema(benchmarkSchema, 'output'),
    BenchmarkStatus: jsonSchema(benchmarkStatusSchema, 'output'),
    RevisionPage: jsonSchema(pageOf(revisionListItemSchema, 'RevisionPage'), 'output'),
    Revision: jsonSchema(revisionSchema, 'output'),
    MethodStatisticsResponse: jsonSchema(methodStatisticsResponseSchema, 'output'),
    Verdict: jsonSchema(verdictSchema, 'output'),
    PairPage: jsonSchema(pairPageSchema, 'output'),
    FlagPage: jsonSchema(flagPageSchema, 'output'),
  };
  return {
    openapi: '3.1.0',
    info: {
      title: 'Lattice Ledger API',
      version: '1.0.0',
      description:
        'Bulk ingest of measurements and calculations, and reads of a workspace’s records, for workflow pipelines. ' +
        'Authenticate with an API token created in Settings → API tokens (Authorization: Bearer llt_…); the token decides the workspace. ' +
        'Errors are RFC 9457 problem documents. Every POST takes an Idempotency-Key header, so a retried request never runs twice. ' +
        'Benchmark reads (statistics, pairs, flags, the recomputation status and a pass/fail verdict) let a workflow check its own results.',
    },
    servers: [{ url: `${serverUrl}/api/v1` }],
    security: [{ bearerAuth: [] }],
    components: { securitySchemes: { bearerAuth: { type: 'http', scheme: 'bearer', bearerFormat: 'llt_<prefix>_<secret>' } }, schemas: components },
    paths: {
      '/imports': {
        post: {
          tags: ['Imports'],
          summary: 'Import measurements, calculations, or catalogue records (materials, methods, sources) in bulk (all rows or none)',
          description:
            'JSON rows or a CSV file (the template’s columns; UTF-8; comma, semicolon or tab). The same body twice is refused (409). ' +
            'Rows identical to existing ones are skipped and listed in `duplicates`. ' +
            'Catalogue kinds (materials, methods, sources; sources also as a BibTeX, RIS or CSL-JSON body) match stored records by identity ' +
            '(material: external identifier, else reduced formula + space group + name; method: label; source: cite key): identical rows are listed as `unchanged`, ' +
            'changed rows are refused unless `onChange=update`; an import whose rows are all unchanged writes nothing and answers 200 with `importId: null` (CatalogImportResult). ' +
            'Calculations with `createMissing=true` create the materials and methods they name from their material_… and method_… columns. ' +
            'Single records are created with POST /materials, /methods and /sources. Send an Idempotency-Key so a retried push never imports twice.',
          parameters: [
            {
              name: 'kind',
              in: 'query',
              required: false,
              description: 'Required with text/csv. `dos`: a phonon density of states (columns material, method, source, unit, frequency, density) from which entropies and heat capacities are computed and stored as calculations.',
              schema: { type: 'string', enum: ['measurements', 'calculations', 'dos', 'materials', 'methods', 'sources'] },
            },
            {
              name: 'onChange',
              in: 'query',
              required: false,
              description: 'Catalogue kinds: `refuse` (default) a row whose stored record has other values, or `update` it with an audit entry (curator or owner). In a JSON body: `onChange`.',
              schema: { type: 'string', enum: ['refuse', 'update'] },
            },
            {
              name: 'createMissing',
              in: 'query',
              required: false,
              description: 'kind=calculations: `true` creates missing materials and methods in the same transaction (needs materials:create and methods:create; 403 without). In a JSON body: `createMissing`.',
              schema: { type: 'string', enum: ['true', 'false'] },
            },
            {
              name: 'temperatures',
              in: 'query',
              required: false,
              description: 'With kind=dos: temperatures in K at which to evaluate, separated by commas (default 298.15; at most 50, each > 0 and ≤ 5000).',
              schema: { type: 'string', example: '298.15,300' },
            },
            { name: 'fileName', in: 'query', required: false, schema: { type: 'string' } },
            idempotencyKeyParameter,
          ],
          requestBody: {
            required: true,
            content: {
              'application/json': { schema: ref('ImportRequest') },
              'text/csv': { schema: { type: 'string', contentMediaType: 'text/csv' } },
              'application/x-bibtex': { schema: { type: 'string', description: 'kind=sources: BibTeX (RIS and CSL-JSON are recognised too).' } },
            },
          },
          responses: {
            '201': { description: 'Imported', content: { 'application/json': { schema: { oneOf: [ref('ImportResult'), ref('CatalogImportResult')] } } } },
            '200': { description: 'Catalogue kinds: every row unchanged, nothing written', content: { 'application/json': { schema: ref('CatalogImportResult') } } },
            ...problems(400, 401, 403, 409, 413, 422),
          },
        },
        get: {
          tags: ['Imports'],
          summary: 'A page of imports, newest first',
          parameters: pageParameters,
          responses: { '200': { description: 'One page', content: { 'application/json': { schema: ref('ImportSummaryPage') } } }, ...problems(400, 401, 403) },
        },
      },
      '/imports/{id}': {
        get: {
          tags: ['Imports'],
          summary: 'One import by id',
          parameters: idParameter,
          responses: { '200': { description: 'The import', content: { 'application/json': { schema: ref('ImportSummary') } } }, ...problems(401, 403, 404) },
        },
      },
      ...benchmarkPaths(),
      ...withWrites(readPaths('materials', 'Materials', 'material', 'MaterialSummary'), 'materials', 'Materials', 'material'),
      ...withWrites(readPaths('sources', 'Sources', 'source', 'SourceSummary'), 'sources', 'Sources', 'source'),
      ...withWrites(readPaths('methods', 'Methods', 'method', 'MethodSummary'), 'methods', 'Methods', 'method'),
      ...readPaths('measurements', 'Measurements', 'measurement', 'Measurement', valueFilterParameters),
      ...readPaths('calculations', 'Calculations', 'calculation', 'Calculation', [
        ...valueFilterParameters,
        { name: 'method', in: 'query', required: false, schema: { type: 'string' }, description: 'Only rows of this method id.' },
      ]),
      '/openapi.json': {
        get: { tags: ['Meta'], summary: 'This document (public)', security: [], responses: { '200': { description: 'OpenAPI 3.1 document' } } },
      },
    },
  };
}
