import { z } from 'zod';

/*
 * Reading the server's OpenAPI 3.1 document into what the API reference page shows: operations grouped
 * by tag, parameters and bodies flattened into rows a table can show, and a curl line for each.
 * Only the parts of OpenAPI the server writes are read; anything else is ignored rather than refused.
 */

type Json = Record<string, unknown>;

export const openApiDocumentSchema = z
  .object({
    openapi: z.string(),
    info: z.object({ title: z.string(), version: z.string(), description: z.string().optional() }).loose(),
    servers: z.array(z.object({ url: z.string() }).loose()).optional(),
    paths: z.record(z.string(), z.record(z.string(), z.unknown())),
    components: z
      .object({ schemas: z.record(z.string(), z.unknown()).optional() })
      .loose()
      .optional(),
  })
  .loose();

export type OpenApiDocument = z.infer<typeof openApiDocumentSchema>;

export const httpMethods = ['get', 'post', 'put', 'patch', 'delete'] as const;
export type HttpMethod = (typeof httpMethods)[number];

export interface SchemaRow {
  /** Dotted for nested fields; `[]` marks the items of a list. */
  name: string;
  depth: number;
  type: string;
  required: boolean;
  /** Ranges, lengths, allowed values and defaults, as short phrases. */
  rules: string[];
  description: string | null;
}

export interface ParameterRow extends SchemaRow {
  in: string;
}

export interface OperationBody {
  contentType: string;
  rows: SchemaRow[];
}

export interface Operation {
  /** Stable and unique on the page, for links to one operation. */
  anchor: string;
  method: HttpMethod;
  path: string;
  summary: string;
  whoMayCall: string | null;
  description: string | null;
  parameters: ParameterRow[];
  body: OperationBody | null;
  responses: { status: string; description: string }[];
  /** The schema the body is built from, kept for the curl example. */
  bodySchema: Json | null;
}

export interface OperationGroup {
  tag: string;
  operations: Operation[];
}

export interface ApiReference {
  title: string;
  version: string;
  description: string | null;
  serverUrl: string | null;
  groups: OperationGroup[];
}

const asObject = (value: unknown): Json | null =>
  value !== null && typeof value === 'object' && !Array.isArray(value) ? (value as Json) : null;

const asString = (value: unknown): string | null => (typeof value === 'string' ? value : null);

function resolve(schema: unknown, components: Json): Json | null {
  const object = asObject(schema);
  if (!object) return null;
  const ref = asString(object.$ref);
  if (ref?.startsWith('#/components/schemas/')) {
    return asObject(components[ref.slice('#/components/schemas/'.length)]);
  }
  return object;
}

/** The variants of a union, without the `null` one (that is said as "| null" instead). */
function variants(schema: Json): { options: Json[]; nullable: boolean } {
  const list = (Array.isArray(schema.anyOf) ? schema.anyOf : Array.isArray(schema.oneOf) ? schema.oneOf : [])
    .map(asObject)
    .filter((item): item is Json => item !== null);
  const options = list.filter((item) => item.type !== 'null');
  return { options, nullable: options.length < list.length };
}

export function typeText(schema: Json, components: Json = {}): string {
  const resolved = resolve(schema, components) ?? schema;
  if (Array.isArray(resolved.anyOf) || Array.isArray(resolved.oneOf)) {
    const { options, nullable } = variants(resolved);
    const names = [...new Set(options.map((option) => typeText(option, components)))];
    return [...names, ...(nullable ? ['null'] : [])].join(' | ') || 'any';
  }
  if (resolved.const !== undefined) return JSON.stringify(resolved.const);
  const type = resolved.type;
  const base = (name: unknown): string => {
    if (name === 'string' && resolved.format === 'binary') return 'file';
    if (name === 'array') {
      const items = asObject(resolved.items);
      return items ? `${typeText(items, components)}[]` : 'array';
    }
    return typeof name === 'string' ? name : 'any';
  };
  if (Array.isArray(type)) return type.map(base).join(' | ');
  if (type === undefined && resolved.properties) return 'object';
  return base(type);
}

function formatValue(value: unknown): string {
  return typeof value === 'string' ? `"${value}"` : JSON.stringify(value);
}

export function rulesOf(schema: Json, components: Json = {}): string[] {
  const resolved = resolve(schema, components) ?? schema;
  // Rules of a nullable number sit on its non-null variant.
  const { options } = variants(resolved);
  const source: Json = options.length === 1 ? { ...options[0], ...resolved } : { ...resolved };
  const rules: string[] = [];
  // zod writes whole numbers as bounded by the largest safe integer, and "positive" as > 0: say them
  // the way a reader would (no upper bound; at least 1).
  const integer = source.type === 'integer';
  let min = (source.minimum ?? source.exclusiveMinimum) as unknown;
  let max = (source.maximum ?? source.exclusiveMaximum) as unknown;
  if (typeof max === 'number' && max >= Number.MAX_SAFE_INTEGER) max = undefined;
  if (typeof min === 'number' && min <= Number.MIN_SAFE_INTEGER) min = undefined;
  if (
    integer &&
    typeof source.exclusiveMinimum === 'number' &&
    source.minimum === undefined &&
    min !== undefined
  ) {
    source.minimum = (source.exclusiveMinimum as number) + 1;
    delete source.exclusiveMinimum;
    min = source.minimum;
  }
  const minText =
    source.exclusiveMinimum !== undefined && source.minimum === undefined ? `> ${min}` : `≥ ${min}`;
  const maxText =
    source.exclusiveMaximum !== undefined && source.maximum === undefined ? `< ${max}` : `≤ ${max}`;
  if (
    typeof min === 'number' &&
    typeof max === 'number' &&
    !minText.startsWith('>') &&
    !maxText.startsWith('<')
  ) {
    rules.push(`${min} to ${max}`);
  } else {
    if (typeof min === 'number') rules.push(minText);
    if (typeof max === 'number') rules.push(maxText);
  }
  if (typeof source.minLength === 'number' && typeof source.maxLength === 'number') {
    rules.push(`${source.minLength}–${source.maxLength} characters`);
  } else if (typeof source.maxLength === 'number') {
    rules.push(`at most ${source.maxLength} characters`);
  } else if (typeof source.minLength === 'number' && source.minLength > 0) {
    rules.push(`at least ${source.minLength} characters`);
  }
  if (typeof source.minItems === 'number') rules.push(`at least ${source.minItems} items`);
  if (typeof source.maxItems === 'number') rules.push(`at most ${source.maxItems} items`);
  if (Array.isArray(source.enum)) rules.push(`one of ${source.enum.map(formatValue).join(', ')}`);
  if (typeof source.format === 'string' && source.format !== 'binary') rules.push(source.format);
  if (typeof source.pattern === 'string') rules.push(`matches ${source.pattern}`);
  if (source.default !== undefined) rules.push(`default ${formatValue(source.default)}`);
  return rules;
}

/** Flattens an object schema into rows, nested objects and lists of objects indented under their field. */
export function schemaRows(schema: unknown, components: Json = {}, prefix = '', depth = 0): SchemaRow[] {
  const resolved = resolve(schema, components);
  if (!resolved || depth > 4) return [];
  const target = variants(resolved).options.length === 1 ? variants(resolved).options[0]! : resolved;
  const properties = asObject((resolve(target, components) ?? target).properties);
  if (!properties) return [];
  const required = new Set(
    Array.isArray((resolve(target, components) ?? target).required)
      ? ((resolve(target, components) ?? target).required as string[])
      : [],
  );
  const rows: SchemaRow[] = [];
  for (const [key, value] of Object.entries(properties)) {
    const property = resolve(value, components) ?? {};
    const name = prefix ? `${prefix}.${key}` : key;
    rows.push({
      name,
      depth,
      type: typeText(property, components),
      required: required.has(key),
      rules: rulesOf(property, components),
      description: asString(property.description),
    });
    const items = property.type === 'array' ? resolve(property.items, components) : null;
    if (items?.properties) rows.push(...schemaRows(items, components, `${name}[]`, depth + 1));
    else if (property.properties) rows.push(...schemaRows(property, components, name, depth + 1));
  }
  return rows;
}

function anchorOf(method: string, path: string): string {
  return `${method}-${path
    .replace(/^\/api\//, '')
    .replace(/[{}]/g, '')
    .replace(/[^A-Za-z0-9]+/g, '-')}`.replace(/-+$/, '');
}

/** "Who may call it: Scientists and admins." split off the description, which the server writes first. */
function splitDescription(text: string | null): { whoMayCall: string | null; description: string | null } {
  if (!text) return { whoMayCall: null, description: null };
  const match = /^Who may call it:\s*([^\n]*?)(?:\n+|$)([\s\S]*)$/.exec(text.trim());
  if (!match) return { whoMayCall: null, description: text.trim() };
  return { whoMayCall: match[1]?.trim() || null, description: match[2]?.trim() || null };
}

export function readOpenApi(document: OpenApiDocument): ApiReference {
  const components = asObject(document.components?.schemas) ?? {};
  const groups = new Map<string, Operation[]>();
  for (const [path, item] of Object.entries(document.paths)) {
    const shared = Array.isArray(item.parameters) ? item.parameters : [];
    for (const method of httpMethods) {
      const operation = asObject(item[method]);
      if (!operation) continue;
      const tags = Array.isArray(operation.tags)
        ? operation.tags.filter((tag) => typeof tag === 'string')
        : [];
      const tag = (tags[0] as string | undefined) ?? 'other';
      const parameters: ParameterRow[] = [
        ...shared,
        ...(Array.isArray(operation.parameters) ? operation.parameters : []),
      ]
        .map(asObject)
        .filter((parameter): parameter is Json => parameter !== null)
        .map((parameter) => {
          const schema = asObject(parameter.schema) ?? {};
          return {
            name: asString(parameter.name) ?? '?',
            in: asString(parameter.in) ?? 'query',
            depth: 0,
            type: typeText(schema, components),
            required: parameter.required === true,
            rules: rulesOf(schema, components),
            description: asString(parameter.description) ?? asString(schema.description),
          };
        });
      const content = asObject(asObject(operation.requestBody)?.content);
      const [contentType, media] = content ? (Object.entries(content)[0] ?? []) : [];
      const bodySchema = resolve(asObject(media)?.schema, components);
      const responses = Object.entries(asObject(operation.responses) ?? {}).map(([status, response]) => ({
        status,
        description: asString(asObject(response)?.description) ?? '',
      }));
      const { whoMayCall, description } = splitDescription(asString(operation.description));
      const list = groups.get(tag) ?? [];
      list.push({
        anchor: anchorOf(method, path),
        method,
        path,
        summary: asString(operation.summary) ?? `${method.toUpperCase()} ${path}`,
        whoMayCall,
        description,
        parameters,
        body: contentType && bodySchema ? { contentType, rows: schemaRows(bodySchema, components) } : null,
        responses,
        bodySchema: bodySchema ?? null,
      });
      groups.set(tag, list);
    }
  }
  return {
    title: document.info.title,
    version: document.info.version,
    description: document.info.description ?? null,
    serverUrl: document.servers?.[0]?.url ?? null,
    groups: [...groups.entries()].map(([tag, operations]) => ({ tag, operations })),
  };
}

function exampleValue(schema: Json, name: string): unknown {
  if (schema.default !== undefined) return schema.default;
  if (Array.isArray(schema.enum) && schema.enum.length > 0) return schema.enum[0];
  const { options } = variants(schema);
  const source = options[0] ?? schema;
  const type = Array.isArray(source.type) ? source.type.find((item) => item !== 'null') : source.type;
  if (type === 'integer' || type === 'number') {
    return typeof source.minimum === 'number' ? source.minimum : 1;
  }
  if (type === 'boolean') return false;
  if (type === 'array') return [];
  if (type === 'object') return {};
  return name === 'name' ? 'Example' : 'text';
}

/** The address to show in examples: the document's server when it is absolute, else this site. */
export function exampleBaseUrl(serverUrl: string | null, origin: string): string {
  if (serverUrl && /^https?:\/\//.test(serverUrl)) return serverUrl.replace(/\/+$/, '');
  return origin.replace(/\/+$/, '');
}

/**
 * A curl line that works with a token made on the API tokens page: path parameters filled with 1,
 * required body fields with their default or smallest value, and files as @file.
 */
export function curlExample(operation: Operation, baseUrl: string): string {
  const path = operation.path.replace(/\{[^}]+\}/g, '1');
  const query = operation.parameters
    .filter((parameter) => parameter.in === 'query' && parameter.required)
    .map((parameter) => `${encodeURIComponent(parameter.name)}=1`)
    .join('&');
  const url = `${baseUrl}${path}${query ? `?${query}` : ''}`;
  const lines = [`curl${operation.method === 'get' ? '' : ` -X ${operation.method.toUpperCase()}`} "${url}"`];
  lines.push('-H "Authorization: Bearer $DIPDECK_TOKEN"');
  const schema = operation.bodySchema;
  const properties = asObject(schema?.properties) ?? {};
  const required = new Set(Array.isArray(schema?.required) ? (schema.required as string[]) : []);
  if (operation.body?.contentType === 'multipart/form-data') {
    for (const [key, value] of Object.entries(properties)) {
      const property = asObject(value) ?? {};
      const type = typeText(property);
      if (type === 'file' || type === 'file[]')
        lines.push(`-F "${key}=@${key === 'file' ? 'targets.csv' : 'light-curve.fits'}"`);
      else if (required.has(key)) lines.push(`-F "${key}=${String(exampleValue(property, key))}"`);
    }
  } else if (operation.body) {
    const picked = Object.entries(properties).filter(([key]) => required.has(key));
    const entries = picked.length > 0 ? picked : Object.entries(properties).slice(0, 1);
    const example = Object.fromEntries(
      entries.map(([key, value]) => [key, exampleValue(asObject(value) ?? {}, key)]),
    );
    lines.push('-H "Content-Type: application/json"');
    lines.push(`-d '${JSON.stringify(example)}'`);
  }
  return lines.join(' \\\n  ');
}
