import { vi } from 'vitest';

export interface FakeRequest {
  method: string;
  path: string;
  query: URLSearchParams;
  body: unknown;
}

/** A handler answers a request it knows with a response, or undefined to leave it to the next one. */
export type FakeHandler = (request: FakeRequest) => Response | undefined | Promise<Response | undefined>;

export interface FakeApi {
  /** Every request but the CSRF token's, in the order they arrived. */
  requests: FakeRequest[];
  /** The requests to one method and path. */
  calls(method: string, path: string): FakeRequest[];
  restore(): void;
}

export function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}

export function apiError(status: number, code: string, message: string, fields?: Record<string, string>) {
  return json(status, { error: { code, message, ...(fields ? { fields } : {}) } });
}

export function fakePerson(overrides: Record<string, unknown> = {}) {
  return {
    id: 7,
    email: 'ada@example.com',
    displayName: 'Ada',
    role: 'volunteer',
    suspended: false,
    newsletterOptIn: false,
    creditByName: true,
    emailConfirmed: true,
    createdAt: '2026-11-01T00:00:00.000Z',
    ...overrides,
  };
}

/**
 * Stands in for the server behind `fetch`: the CSRF token always, then the handlers in order; anything no
 * handler knows answers 404, so a test sees a request it did not expect.
 */
export function fakeApi(...handlers: FakeHandler[]): FakeApi {
  const state: FakeApi = {
    requests: [],
    calls: (method, path) => state.requests.filter((r) => r.method === method && r.path === path),
    restore: () => vi.unstubAllGlobals(),
  };
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = new URL(String(input), 'http://localhost');
      if (url.pathname === '/api/auth/csrf') return json(200, { token: 'test-token' });
      const request: FakeRequest = {
        method: (init?.method ?? 'GET').toUpperCase(),
        path: url.pathname,
        query: url.searchParams,
        body: init?.body ? JSON.parse(String(init.body)) : undefined,
      };
      state.requests.push(request);
      for (const handler of handlers) {
        const response = await handler(request);
        if (response) return response;
      }
      return apiError(404, 'not_found', `No fake for ${request.method} ${request.path}`);
    }),
  );
  return state;
}
