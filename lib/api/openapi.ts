import { z } from 'zod';
import {
  calculationSchema,
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
            409: 'This file was already imported (firstImportId links to it)',
            413: 'Body over IMPORT_MAX_BYTES',
            422: 'Nothing imported: every row error is listed',
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
const valueFilterParameters = ['material', 'source', 'import'].map((name) => ({ name, in: 'query', required: false, schema: { type: 'string' }, description: `Only rows of this ${name} id.` }));

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
  };
  return {
    openapi: '3.1.0',
    info: {
      title: 'Lattice Ledger API',
      version: '1.0.0',
      description:
        'Bulk ingest of measurements and calculations, and reads of a workspace’s records, for workflow pipelines. ' +
        'Authenticate with an API token created in Settings → API tokens (Authorization: Bearer llt_…); the token decides the workspace. ' +
        'Errors are RFC 9457 problem documents.',
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
            'Calculations with `createMissing=true` create the materials and methods they name from their material_… and method_… columns.',
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
      ...readPaths('materials', 'Materials', 'material', 'MaterialSummary'),
      ...readPaths('sources', 'Sources', 'source', 'SourceSummary'),
      ...readPaths('methods', 'Methods', 'method', 'MethodSummary'),
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
