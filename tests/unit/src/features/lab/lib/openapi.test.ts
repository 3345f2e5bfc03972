import { describe, expect, it } from 'vitest';
import {
  curlExample,
  exampleBaseUrl,
  openApiDocumentSchema,
  readOpenApi,
  rulesOf,
} from '@/features/lab/lib/openapi';

// Shaped like the document server/http/openapi.ts writes (OpenAPI 3.1, JSON Schema 2020-12 bodies).
const document = openApiDocumentSchema.parse({
  openapi: '3.1.0',
  info: { title: 'Dipdeck API', version: '0.1.0' },
  servers: [{ url: 'http://localhost:3000' }],
  components: { schemas: { Error: { type: 'object' } } },
  paths: {
    '/api/campaigns/{id}': {
      patch: {
        summary: 'Change settings and/or status',
        description: 'Who may call it: Scientists and admins (API tokens work).',
        tags: ['campaigns'],
        parameters: [{ name: 'id', in: 'path', required: true, schema: { type: 'integer', minimum: 1 } }],
        requestBody: {
          content: {
            'application/json': {
              schema: {
                type: 'object',
                required: ['name'],
                properties: {
                  name: { type: 'string', minLength: 1, maxLength: 120 },
                  detrendWindowDays: {
                    anyOf: [{ type: 'number', minimum: 0.1, maximum: 30 }, { type: 'null' }],
                  },
                  status: { type: 'string', enum: ['draft', 'live'] },
                  truth: { type: 'object', properties: { t0Days: { type: 'number' } } },
                },
              },
            },
          },
        },
        responses: { '200': { description: 'Success' }, '409': { description: 'Conflict' } },
      },
    },
    '/api/campaigns/{id}/light-curves': {
      post: {
        summary: 'Upload light curves',
        tags: ['campaigns'],
        requestBody: {
          content: {
            'multipart/form-data': {
              schema: {
                type: 'object',
                required: ['files'],
                properties: {
                  files: { type: 'array', items: { type: 'string', format: 'binary' } },
                  target: { type: 'string' },
                },
              },
            },
          },
        },
        responses: { '202': { description: 'Success' } },
      },
    },
    '/api/health': { get: { summary: 'Health', tags: ['health'], responses: {} } },
  },
});

describe('readOpenApi', () => {
  const reference = readOpenApi(document);
  const patch = reference.groups[0]!.operations[0]!;

  it('groups operations by their first tag, in the document’s order', () => {
    expect(reference.groups.map((group) => [group.tag, group.operations.length])).toEqual([
      ['campaigns', 2],
      ['health', 1],
    ]);
  });

  it('splits who may call it from the description, and reads parameters and answers', () => {
    expect(patch.whoMayCall).toBe('Scientists and admins (API tokens work).');
    expect(patch.description).toBeNull();
    expect(patch.parameters).toEqual([
      {
        name: 'id',
        in: 'path',
        depth: 0,
        type: 'integer',
        required: true,
        rules: ['≥ 1'],
        description: null,
      },
    ]);
    expect(patch.responses.map((response) => response.status)).toEqual(['200', '409']);
  });

  it('flattens the body into rows: nullable unions, ranges, allowed values and nested fields', () => {
    expect(patch.body?.rows.map((row) => [row.name, row.depth, row.type, row.required, row.rules])).toEqual([
      ['name', 0, 'string', true, ['1–120 characters']],
      ['detrendWindowDays', 0, 'number | null', false, ['0.1 to 30']],
      ['status', 0, 'string', false, ['one of "draft", "live"']],
      ['truth', 0, 'object', false, []],
      ['truth.t0Days', 1, 'number', false, []],
    ]);
  });
});

describe('rulesOf', () => {
  it('says a positive whole number as at least 1, without the largest safe integer as its bound', () => {
    expect(rulesOf({ type: 'integer', exclusiveMinimum: 0, maximum: Number.MAX_SAFE_INTEGER })).toEqual([
      '≥ 1',
    ]);
    expect(rulesOf({ type: 'number', exclusiveMinimum: 0 })).toEqual(['> 0']);
  });
});

describe('curlExample', () => {
  const reference = readOpenApi(document);
  const [patch, upload] = reference.groups[0]!.operations;

  it('sends the Bearer token and the required JSON fields', () => {
    expect(curlExample(patch!, 'https://dipdeck.example')).toBe(
      [
        'curl -X PATCH "https://dipdeck.example/api/campaigns/1"',
        '-H "Authorization: Bearer $DIPDECK_TOKEN"',
        '-H "Content-Type: application/json"',
        `-d '{"name":"Example"}'`,
      ].join(' \\\n  '),
    );
  });

  it('sends files of a multipart upload with -F', () => {
    expect(curlExample(upload!, 'https://dipdeck.example')).toContain('-F "files=@light-curve.fits"');
  });
});

describe('exampleBaseUrl', () => {
  it('uses the document’s server when absolute, and this site otherwise', () => {
    expect(exampleBaseUrl('https://api.example/', 'http://localhost:5173')).toBe('https://api.example');
    expect(exampleBaseUrl('/', 'http://localhost:5173')).toBe('http://localhost:5173');
    expect(exampleBaseUrl(null, 'http://localhost:5173/')).toBe('http://localhost:5173');
  });
});
