import { vi } from 'vitest';

/** One card as GET /api/deck/next sends it: 48 points over 12 hours. */
export function fakeCard(snippetId: number) {
  const hours = Array.from({ length: 48 }, (_, i) => i / 4);
  return {
    snippetId,
    campaign: { id: 1, name: 'Test field' },
    timeStart: 100,
    durationHours: 12,
    cadenceMinutes: 15,
    pointCount: hours.length,
    hours,
    ppm: hours.map((_, i) => ((i * 37) % 11) - 5),
  };
}

export interface FakeDeckApi {
  /** POST /api/verdicts bodies, in the order they arrived. */
  verdicts: { clientId: string; snippetId: number; answer: string; markTime?: number }[];
  /** Client ids sent to DELETE /api/verdicts/:clientId. */
  undone: string[];
  restore(): void;
}

/**
 * Stands in for the server behind `fetch`: a stream of cards numbered from 1, verdicts and undo
 * recorded for the test to read. Answers as the real routes do (201 with a reveal, 204 for undo).
 */
export function fakeDeckApi(): FakeDeckApi {
  let nextId = 1;
  const state: FakeDeckApi = { verdicts: [], undone: [], restore: () => {} };
  const json = (status: number, body: unknown) =>
    new Response(body === undefined ? null : JSON.stringify(body), {
      status,
      headers: { 'Content-Type': 'application/json' },
    });
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = new URL(String(input), 'http://localhost');
    const method = (init?.method ?? 'GET').toUpperCase();
    if (url.pathname === '/api/auth/csrf') return json(200, { token: 'test-token' });
    if (url.pathname === '/api/deck/next') {
      const count = Number(url.searchParams.get('count') ?? 3);
      const cards = Array.from({ length: count }, () => fakeCard(nextId++));
      return json(200, { cards });
    }
    if (url.pathname === '/api/verdicts' && method === 'POST') {
      const body = JSON.parse(String(init?.body));
      state.verdicts.push(body);
      return json(201, {
        verdict: {
          clientId: body.clientId,
          snippetId: body.snippetId,
          answer: body.answer,
          markTime: body.markTime ?? null,
          createdAt: new Date().toISOString(),
        },
        reveal: { designation: `TST-${body.snippetId}`, feedback: null },
      });
    }
    const undo = url.pathname.match(/^\/api\/verdicts\/(.+)$/);
    if (undo && method === 'DELETE') {
      state.undone.push(decodeURIComponent(undo[1]!));
      return new Response(null, { status: 204 });
    }
    return json(404, { error: { code: 'not_found', message: `No fake for ${method} ${url.pathname}` } });
  });
  vi.stubGlobal('fetch', fetchMock);
  state.restore = () => vi.unstubAllGlobals();
  return state;
}

/** jsdom has no layout, media queries or pointer capture; the Deck needs a little of each. Answers the undo. */
export function stubBrowserLayout(cardWidthPx = 300): () => void {
  vi.stubGlobal(
    'matchMedia',
    (query: string) =>
      ({
        matches: false,
        media: query,
        addEventListener: () => {},
        removeEventListener: () => {},
      }) as unknown as MediaQueryList,
  );
  const layout = vi.spyOn(HTMLElement.prototype, 'getBoundingClientRect').mockReturnValue({
    x: 0,
    y: 0,
    left: 0,
    top: 0,
    width: cardWidthPx,
    height: 400,
    right: cardWidthPx,
    bottom: 400,
    toJSON: () => ({}),
  });
  HTMLElement.prototype.setPointerCapture ??= () => {};
  HTMLElement.prototype.releasePointerCapture ??= () => {};
  return () => {
    layout.mockRestore();
    vi.unstubAllGlobals();
  };
}
