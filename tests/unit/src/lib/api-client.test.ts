import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { ApiError, api, forgetCsrfToken } from '@/lib/api-client';

interface Call {
  url: string;
  method: string;
  csrf: string | null;
}

let calls: Call[];
let tokens: number;
let answers: Array<(call: Call) => Response>;

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}

beforeEach(() => {
  forgetCsrfToken();
  calls = [];
  tokens = 0;
  answers = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init: RequestInit) => {
      const headers = new Headers(init.headers);
      const call = { url, method: init.method ?? 'GET', csrf: headers.get('X-CSRF-Token') };
      calls.push(call);
      if (url === '/api/auth/csrf') {
        tokens += 1;
        return json(200, { token: `token-${tokens}` });
      }
      const answer = answers.shift();
      return answer ? answer(call) : json(200, { ok: true });
    }),
  );
});

afterEach(() => {
  vi.unstubAllGlobals();
});

const ok = z.object({ ok: z.boolean() });

describe('api client', () => {
  it('sends no CSRF token on a GET', async () => {
    await api.get('/api/thing', ok);
    expect(calls).toEqual([{ url: '/api/thing', method: 'GET', csrf: null }]);
  });

  it('fetches the CSRF token once and sends it on every non-GET', async () => {
    await api.post('/api/a', ok, {});
    await api.patch('/api/b', ok, {});
    expect(calls.map((call) => [call.url, call.csrf])).toEqual([
      ['/api/auth/csrf', null],
      ['/api/a', 'token-1'],
      ['/api/b', 'token-1'],
    ]);
  });

  it('after a request that rotates the session, fetches a fresh token for the next one', async () => {
    await api.post('/api/auth/sign-in', ok, {}, { rotatesSession: true });
    await api.post('/api/a', ok, {});
    expect(calls.filter((call) => call.url === '/api/a')[0]?.csrf).toBe('token-2');
  });

  it('when the server says csrf_invalid, refetches the token and retries once', async () => {
    answers.push(() => json(403, { error: { code: 'csrf_invalid', message: 'Bad token' } }));
    await expect(api.post('/api/a', ok, {})).resolves.toEqual({ ok: true });
    expect(calls.filter((call) => call.url === '/api/a').map((call) => call.csrf)).toEqual([
      'token-1',
      'token-2',
    ]);
  });

  it('when the retry is refused too, gives up with the server’s error', async () => {
    const refuse = () => json(403, { error: { code: 'csrf_invalid', message: 'Bad token' } });
    answers.push(refuse, refuse);
    await expect(api.post('/api/a', ok, {})).rejects.toMatchObject({ status: 403, code: 'csrf_invalid' });
    expect(calls.filter((call) => call.url === '/api/a')).toHaveLength(2);
  });

  it('turns an error answer into an ApiError with its code, message and fields', async () => {
    answers.push(() =>
      json(400, {
        error: { code: 'validation_failed', message: 'Check the form', fields: { password: 'Too short' } },
      }),
    );
    const error = await api.post('/api/auth/sign-up', ok, {}).catch((caught: unknown) => caught);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      status: 400,
      code: 'validation_failed',
      fields: { password: 'Too short' },
    });
  });

  it('when the answer is not JSON, says the server had a problem and names the status', async () => {
    answers.push(() => new Response('<html>oops</html>', { status: 502 }));
    await expect(api.get('/api/thing', ok)).rejects.toMatchObject({
      code: 'unexpected_response',
      status: 502,
    });
  });

  it('when the network fails, says Dipdeck could not be reached', async () => {
    vi.stubGlobal('fetch', vi.fn().mockRejectedValue(new TypeError('Failed to fetch')));
    await expect(api.get('/api/thing', ok)).rejects.toMatchObject({ code: 'network_error', status: 0 });
  });
});
