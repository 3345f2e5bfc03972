import { z } from 'zod';
import type { AnyRouteDef } from './define-route';

// The API reference, generated from the route table: paths, access rules and the same zod schemas that
// validate each request (zod 4 emits JSON Schema 2020-12, the dialect OpenAPI 3.1 uses).

type JsonSchema = Record<string, unknown>;

function schemaOf(schema: z.ZodType): JsonSchema {
  const { $schema: _dialect, ...rest } = z.toJSONSchema(schema, {
    io: 'input',
    unrepresentable: 'any',
  }) as JsonSchema;
  return rest;
}

function parametersOf(schema: z.ZodType | undefined, where: 'path' | 'query'): JsonSchema[] {
  if (!schema) return [];
  const json = schemaOf(schema);
  const properties = (json.properties ?? {}) as Record<string, JsonSchema>;
  const required = new Set((json.required as string[] | undefined) ?? []);
  return Object.entries(properties).map(([name, property]) => ({
    name,
    in: where,
    required: where === 'path' || required.has(name),
    schema: property,
  }));
}

const ACCESS_TEXT: Record<string, string> = {
  public: 'Anyone, signed in or not.',
  'signed-in': 'Any signed-in person.',
  volunteer: 'Volunteers and every role above.',
  moderator: 'Moderators, scientists and admins.',
  scientist: 'Scientists and admins (API tokens work).',
  admin: 'Admins only.',
};

const errorSchema = {
  type: 'object',
  required: ['error'],
  properties: {
    error: {
      type: 'object',
      required: ['code', 'message'],
      properties: {
        code: { type: 'string' },
        message: { type: 'string' },
        fields: { type: 'object', additionalProperties: { type: 'string' } },
      },
    },
  },
};

export function buildOpenApi(
  routes: AnyRouteDef[],
  options: { version: string; serverUrl: string },
): JsonSchema {
  const paths: Record<string, Record<string, JsonSchema>> = {};
  for (const route of routes) {
    const path = `/api${route.path.replace(/:([A-Za-z_]+)/g, '{$1}')}`;
    const tag = route.path.split('/')[1] === 'admin' ? 'admin' : (route.path.split('/')[1] ?? 'api');
    const operation: JsonSchema = {
      summary: route.summary,
      description: `Who may call it: ${ACCESS_TEXT[route.access] ?? route.access}`,
      tags: [tag],
      parameters: [...parametersOf(route.params, 'path'), ...parametersOf(route.query, 'query')],
      responses: {
        [String(route.status ?? 200)]: { description: 'Success' },
        '400': {
          description: 'Invalid input; `fields` names each problem',
          content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } },
        },
        ...(route.access === 'public'
          ? {}
          : { '401': { description: 'Not signed in' }, '403': { description: 'Not allowed for this role' } }),
      },
    };
    if (route.access === 'public') operation.security = [];
    if (route.multipart) {
      operation.requestBody = {
        required: true,
        content: {
          'multipart/form-data': {
            schema: {
              type: 'object',
              required: [route.multipart.fileField],
              properties: {
                [route.multipart.fileField]: route.multipart.multiple
                  ? { type: 'array', items: { type: 'string', format: 'binary' } }
                  : { type: 'string', format: 'binary' },
                ...((route.multipart.fields
                  ? schemaOf(route.multipart.fields).properties
                  : {}) as JsonSchema),
              },
            },
          },
        },
      };
    } else if (route.body) {
      operation.requestBody = {
        required: true,
        content: { 'application/json': { schema: schemaOf(route.body) } },
      };
    }
    paths[path] ??= {};
    paths[path][route.method] = operation;
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Dipdeck API',
      version: options.version,
      description:
        'JSON over HTTP. Browsers sign in with a session cookie and send X-CSRF-Token (from GET /api/auth/csrf) on state-changing requests; scripts send `Authorization: Bearer <token>` with a token made in the Lab.',
    },
    servers: [{ url: options.serverUrl }],
    security: [{ session: [] }, { bearer: [] }],
    components: {
      securitySchemes: {
        session: { type: 'apiKey', in: 'cookie', name: 'dipdeck.sid' },
        bearer: { type: 'http', scheme: 'bearer' },
      },
      schemas: { Error: errorSchema },
    },
    paths,
  };
}
