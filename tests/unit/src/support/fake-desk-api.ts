import { vi } from 'vitest';

export const fakeModerator = {
  id: 9,
  email: 'moderator@example.com',
  displayName: 'Test Moderator',
  role: 'moderator',
  suspended: false,
  newsletterOptIn: false,
  creditByName: false,
  emailConfirmed: true,
  createdAt: '2026-12-01T00:00:00.000Z',
} as const;

/** One split snippet as GET /api/desk/splits lists it; its target is TST-<id>. */
export function fakeSplit(snippetId: number) {
  return {
    snippetId,
    campaign: { id: 1, name: 'Test field' },
    target: { id: snippetId * 10, designation: `TST-${snippetId}` },
    kind: 'real',
    splitReason: 'max_verdicts',
    splitAt: '2026-12-02T10:00:00.000Z',
    consensusScore: 0.52,
    dipShare: 0.5,
    verdictCount: 4,
    onCandidate: false,
  };
}

/** A review as GET /api/desk/splits/:id sends it: 48 points over 12 hours and four verdicts. */
export function fakeReview(snippetId: number, state = 'split') {
  const hours = Array.from({ length: 48 }, (_, i) => i / 4);
  const verdict = (personId: number, answer: string, markHours: number | null, weight: number) => ({
    personId,
    displayName: `Volunteer ${personId}`,
    answer,
    markHours,
    createdAt: '2026-12-02T09:00:00.000Z',
    sensitivity: 0.8,
    specificity: 0.9,
    weight,
  });
  return {
    snippet: {
      id: snippetId,
      campaign: { id: 1, name: 'Test field' },
      target: { id: snippetId * 10, designation: `TST-${snippetId}` },
      kind: 'real',
      state,
      outcome: null,
      splitReason: 'max_verdicts',
      timeStart: 100,
      timeEnd: 100.5,
      durationHours: 12,
      consensusScore: 0.52,
      dipShare: 0.5,
      effectiveVotes: 3.6,
      verdictCount: 4,
    },
    series: { hours, ppm: hours.map((_, i) => ((i * 37) % 11) - 5) },
    verdicts: [
      verdict(1, 'dip', 5.5, 1.6),
      verdict(2, 'dip', 6, 1.2),
      verdict(3, 'flat', null, -1.4),
      verdict(4, 'unsure', null, 0),
    ],
    scoreHistory: [
      { at: '2026-12-02T09:00:00.000Z', verdictCount: 1, score: 0.7 },
      { at: '2026-12-02T09:05:00.000Z', verdictCount: 2, score: 0.8 },
      { at: '2026-12-02T09:10:00.000Z', verdictCount: 3, score: 0.55 },
      { at: '2026-12-02T09:15:00.000Z', verdictCount: 4, score: 0.52 },
    ],
    neighbours: [
      {
        snippetId: snippetId + 1000,
        offsetHours: -12,
        durationHours: 12,
        state: 'settled',
        outcome: 'flat',
        consensusScore: 0.04,
      },
    ],
    rulings: [],
  };
}

export interface FakeVolunteer {
  id: number;
  displayName: string;
  email: string;
  suspended: boolean;
  suspendedReason: string | null;
  verdicts: number;
  controls: { seen: number; correct: number; accuracy: number | null };
  agreement: { compared: number; agreed: number; share: number | null };
  medianMs: number | null;
  topAnswer: { answer: string; share: number } | null;
  lastActiveAt: string | null;
  maxPerMinute: number;
  flags: { code: string; reason: string; cleared: null | { by: string | null; note: string; at: string } }[];
}

function fakeVolunteer(
  id: number,
  displayName: string,
  verdicts: number,
  flags: FakeVolunteer['flags'] = [],
): FakeVolunteer {
  return {
    id,
    displayName,
    email: `${displayName.toLowerCase().replace(/\W+/g, '.')}@example.com`,
    suspended: false,
    suspendedReason: null,
    verdicts,
    controls: { seen: 10, correct: 8, accuracy: 0.8 },
    agreement: { compared: 20, agreed: 15, share: 0.75 },
    medianMs: 2_400 + id * 100,
    topAnswer: { answer: 'flat', share: 0.6 },
    lastActiveAt: '2026-12-02T08:00:00.000Z',
    maxPerMinute: 12,
    flags,
  };
}

/** Three volunteers: Ada (many verdicts), Bea (flagged too fast), Cy (few verdicts, a cleared flag). */
export function fakeVolunteers(): FakeVolunteer[] {
  return [
    fakeVolunteer(1, 'Ada Lovelace', 120),
    fakeVolunteer(2, 'Bea Swift', 45, [
      { code: 'too_fast', reason: 'Median time 0.6 s per verdict, below 1.5 s', cleared: null },
    ]),
    fakeVolunteer(3, 'Cy Careful', 8, [
      {
        code: 'one_answer',
        reason: '95 % of verdicts are flat',
        cleared: {
          by: 'Test Moderator',
          note: 'The campaign is mostly quiet stars',
          at: '2026-12-01T12:00:00.000Z',
        },
      },
    ]),
  ];
}

const sortValue: Record<string, (v: FakeVolunteer) => number | string> = {
  name: (v) => v.displayName,
  verdicts: (v) => v.verdicts,
  controlAccuracy: (v) => v.controls.accuracy ?? -1,
  agreement: (v) => v.agreement.share ?? -1,
  medianMs: (v) => v.medianMs ?? Number.POSITIVE_INFINITY,
  topShare: (v) => v.topAnswer?.share ?? -1,
  lastActive: (v) => v.lastActiveAt ?? '',
};

export interface FakeDeskApi {
  /** The queue, in its order; a ruling takes its snippet out. */
  queue: number[];
  /** POST /api/snippets/:id/ruling, in the order they arrived. */
  rulings: { snippetId: number; ruling: string; note?: string }[];
  /** The query of every GET /api/desk/volunteers. */
  volunteerQueries: URLSearchParams[];
  suspensions: { id: number; reason: string }[];
  volunteers: FakeVolunteer[];
  restore(): void;
}

/**
 * Stands in for the server behind `fetch`, as the Desk's routes answer: a signed-in moderator, a queue
 * of split snippets (101, 102, 103 unless told), their reviews, rulings, and the volunteer audit.
 */
export function fakeDeskApi(options: { queue?: number[] } = {}): FakeDeskApi {
  const state: FakeDeskApi = {
    queue: [...(options.queue ?? [101, 102, 103])],
    rulings: [],
    volunteerQueries: [],
    suspensions: [],
    volunteers: fakeVolunteers(),
    restore: () => {},
  };
  const known = new Set(state.queue);
  const ruled = new Set<number>();
  const json = (status: number, body: unknown) =>
    new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
  const notFound = (what: string) => json(404, { error: { code: 'not_found', message: `No ${what}.` } });

  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = new URL(String(input), 'http://localhost');
    const method = (init?.method ?? 'GET').toUpperCase();
    const path = url.pathname;
    const body = () => JSON.parse(String(init?.body ?? '{}'));

    if (path === '/api/auth/csrf') return json(200, { token: 'test-token' });
    if (path === '/api/auth/me') return json(200, { person: fakeModerator });

    if (path === '/api/desk/splits' && method === 'GET') {
      const limit = Number(url.searchParams.get('limit') ?? 50);
      const offset = Number(url.searchParams.get('offset') ?? 0);
      const splits = state.queue.slice(offset, offset + limit).map(fakeSplit);
      return json(200, { splits, total: state.queue.length });
    }
    const review = path.match(/^\/api\/desk\/splits\/(\d+)$/);
    if (review && method === 'GET') {
      const id = Number(review[1]);
      if (!known.has(id)) return notFound('snippet with this id');
      return json(200, { review: fakeReview(id, ruled.has(id) ? 'ruled' : 'split') });
    }
    const ruling = path.match(/^\/api\/snippets\/(\d+)\/ruling$/);
    if (ruling && method === 'POST') {
      const id = Number(ruling[1]);
      const given = body();
      state.rulings.push({ snippetId: id, ...given });
      state.queue = state.queue.filter((queued) => queued !== id);
      ruled.add(id);
      return json(201, {
        snippet: { id, state: 'ruled', outcome: given.ruling === 'dip' ? 'dip' : 'flat' },
        ruling: {
          id: state.rulings.length,
          ruling: given.ruling,
          note: given.note ?? null,
          createdAt: new Date().toISOString(),
        },
      });
    }

    if (path === '/api/desk/volunteers' && method === 'GET') {
      const query = url.searchParams;
      state.volunteerQueries.push(new URLSearchParams(query));
      const search = (query.get('search') ?? '').toLowerCase();
      const sort = query.get('sort') ?? 'name';
      const direction = query.get('order') === 'desc' ? -1 : 1;
      const value = sortValue[sort] ?? sortValue.name!;
      const rows = state.volunteers
        .filter((v) => !search || `${v.displayName} ${v.email}`.toLowerCase().includes(search))
        .filter((v) => query.get('flagged') !== 'true' || v.flags.some((flag) => !flag.cleared))
        .sort((a, b) => (value(a) < value(b) ? -direction : value(a) > value(b) ? direction : 0));
      return json(200, { volunteers: rows, total: rows.length });
    }
    const suspend = path.match(/^\/api\/desk\/volunteers\/(\d+)\/(suspend|restore)$/);
    if (suspend && method === 'POST') {
      const volunteer = state.volunteers.find((v) => v.id === Number(suspend[1]));
      if (!volunteer) return notFound('volunteer with this id');
      const given = body();
      if (suspend[2] === 'suspend') {
        state.suspensions.push({ id: volunteer.id, reason: given.reason });
        volunteer.suspended = true;
        volunteer.suspendedReason = given.reason;
      } else {
        volunteer.suspended = false;
        volunteer.suspendedReason = null;
      }
      return json(200, { volunteer, rescoring: 7 });
    }

    return json(404, { error: { code: 'not_found', message: `No fake for ${method} ${path}` } });
  });
  vi.stubGlobal('fetch', fetchMock);
  state.restore = () => vi.unstubAllGlobals();
  return state;
}
