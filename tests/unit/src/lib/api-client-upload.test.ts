import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { api, forgetCsrfToken } from '@/lib/api-client';

interface Sent {
  url: string;
  headers: Headers;
  body: unknown;
}

let sent: Sent[];

beforeEach(() => {
  forgetCsrfToken();
  sent = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init: RequestInit) => {
      sent.push({ url, headers: new Headers(init.headers), body: init.body });
      if (url === '/api/auth/csrf')
        return new Response(JSON.stringify({ token: 'token-1' }), { status: 200 });
      if (url === '/api/too-big') return new Response('<html>413</html>', { status: 413 });
      return new Response(JSON.stringify({ ok: true }), { status: 200 });
    }),
  );
});

afterEach(() => {
  vi.unstubAllGlobals();
});

const ok = z.object({ ok: z.boolean() });

describe('api.upload', () => {
  it('sends the FormData as it is, with the CSRF header and no Content-Type of its own', async () => {
    const form = new FormData();
    form.append('file', new Blob(['designation\nDPD-1\n'], { type: 'text/csv' }), 'targets.csv');
    await api.upload('/api/campaigns/1/targets', ok, form);
    const upload = sent.find((call) => call.url === '/api/campaigns/1/targets');
    expect(upload?.body).toBe(form);
    expect(upload?.headers.get('X-CSRF-Token')).toBe('token-1');
    // The browser writes multipart/form-data with its boundary only when nobody else sets the header.
    expect(upload?.headers.get('Content-Type')).toBeNull();
  });

  it('when a proxy refuses a big upload without JSON, says it was too large', async () => {
    await expect(api.upload('/api/too-big', ok, new FormData())).rejects.toMatchObject({
      status: 413,
      code: 'too_large',
    });
  });
});
