import { z } from 'zod';
import { apiPaths } from '@/config/paths';

/** An error the API answered with, or one we met on the way there, in the API's own shape. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: Record<string, string>;

  constructor(status: number, code: string, message: string, fields: Record<string, string> = {}) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.fields = fields;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

const errorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
});

const csrfSchema = z.object({ token: z.string().min(1) });

type Method = 'GET' | 'POST' | 'PATCH' | 'DELETE';

export interface RequestOptions {
  method?: Method;
  body?: unknown;
  query?: Record<string, string | number | undefined>;
  signal?: AbortSignal;
  /**
   * The server regenerates the session on sign-in, sign-up and sign-out, which voids the CSRF token
   * bound to the old one.
   */
  rotatesSession?: boolean;
}

let csrfToken: Promise<string> | null = null;

function fetchCsrfToken(): Promise<string> {
  csrfToken ??= send(apiPaths.csrf(), { method: 'GET' })
    .then((body) => csrfSchema.parse(body).token)
    .catch((error: unknown) => {
      csrfToken = null;
      throw error;
    });
  return csrfToken;
}

export function forgetCsrfToken(): void {
  csrfToken = null;
}

function buildUrl(path: string, query: RequestOptions['query']): string {
  if (!query) return path;
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined && value !== '') search.set(key, String(value));
  }
  const text = search.toString();
  return text ? `${path}?${text}` : path;
}

async function send(
  url: string,
  init: { method: Method; body?: unknown; signal?: AbortSignal; csrf?: string },
) {
  const headers: Record<string, string> = { Accept: 'application/json' };
  // A FormData body needs the browser to write its own multipart boundary into Content-Type.
  const isForm = init.body instanceof FormData;
  if (init.body !== undefined && !isForm) headers['Content-Type'] = 'application/json';
  if (init.csrf) headers['X-CSRF-Token'] = init.csrf;

  let response: Response;
  try {
    response = await fetch(url, {
      method: init.method,
      headers,
      body:
        init.body === undefined ? undefined : isForm ? (init.body as FormData) : JSON.stringify(init.body),
      credentials: 'same-origin',
      signal: init.signal ?? null,
    });
  } catch (error) {
    if (error instanceof DOMException && error.name === 'AbortError') throw error;
    throw new ApiError(0, 'network_error', 'Could not reach Dipdeck. Check your connection and try again.');
  }

  if (response.status === 204) return null;
  const text = await response.text();
  let body: unknown = null;
  if (text) {
    try {
      body = JSON.parse(text);
    } catch {
      body = null;
    }
  }

  if (!response.ok) {
    const parsed = errorBodySchema.safeParse(body);
    if (parsed.success) {
      const { code, message, fields } = parsed.data.error;
      throw new ApiError(response.status, code, message, fields ?? {});
    }
    // A proxy in front of the server can refuse a big upload before Dipdeck sees it, without our JSON.
    if (response.status === 413) {
      throw new ApiError(413, 'too_large', 'The upload is larger than the server accepts.');
    }
    throw new ApiError(
      response.status,
      'unexpected_response',
      `Dipdeck's server had a problem (HTTP ${response.status}). Please try again in a moment.`,
    );
  }
  return body;
}

/** The one way the app talks to the API: JSON in and out, the session cookie, and the CSRF header. */
export async function apiRequest(path: string, options: RequestOptions = {}): Promise<unknown> {
  const method = options.method ?? 'GET';
  const url = buildUrl(path, options.query);
  if (method === 'GET') return send(url, { method, signal: options.signal });

  const attempt = async () =>
    send(url, { method, body: options.body, signal: options.signal, csrf: await fetchCsrfToken() });

  try {
    return await attempt();
  } catch (error) {
    // A token goes stale when the session expires or rotates elsewhere; one fresh token is worth a retry.
    if (isApiError(error) && error.status === 403 && error.code === 'csrf_invalid') {
      forgetCsrfToken();
      return await attempt();
    }
    throw error;
  } finally {
    if (options.rotatesSession) forgetCsrfToken();
  }
}

export const api = {
  get: <T>(path: string, schema: z.ZodType<T>, options: Omit<RequestOptions, 'method' | 'body'> = {}) =>
    apiRequest(path, { ...options, method: 'GET' }).then((body) => schema.parse(body)),
  post: <T>(
    path: string,
    schema: z.ZodType<T>,
    body?: unknown,
    options: Omit<RequestOptions, 'method'> = {},
  ) => apiRequest(path, { ...options, method: 'POST', body }).then((data) => schema.parse(data)),
  patch: <T>(
    path: string,
    schema: z.ZodType<T>,
    body?: unknown,
    options: Omit<RequestOptions, 'method'> = {},
  ) => apiRequest(path, { ...options, method: 'PATCH', body }).then((data) => schema.parse(data)),
  /** A multipart POST (file uploads); the CSRF header goes with it like any other POST. */
  upload: <T>(
    path: string,
    schema: z.ZodType<T>,
    form: FormData,
    options: Omit<RequestOptions, 'method'> = {},
  ) => apiRequest(path, { ...options, method: 'POST', body: form }).then((data) => schema.parse(data)),
  delete: (path: string, options: Omit<RequestOptions, 'method'> = {}) =>
    apiRequest(path, { ...options, method: 'DELETE' }).then(() => undefined),
};
