// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { FollowUpPage } from '@/features/lab/components/follow-up-page';
import { createQueryClient } from '@/lib/query-client';

// What Testing Library sets itself when the test runner has global hooks (ours are imported).
(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

const caution =
  'A candidate is not a confirmed planet: it is a target whose dips volunteers found and a scientist thought worth following up.';

/** Shaped like the demo server's candidate 1 (/tmp/samples/candidate-post.json). */
function candidate(overrides: Record<string, unknown> = {}) {
  return {
    id: 1,
    campaignId: 1,
    targetId: 209,
    designation: 'LTS-358478',
    promotedBy: 3,
    state: 'promoted',
    disposition: 'planet candidate',
    notes: 'three dips, looks periodic',
    periodDays: 2.2319075929743697,
    periodSigmaDays: 0.000011938128852288922,
    t0Bjd: 2458001.0104166665,
    t0SigmaDays: 0.00014275925760041277,
    depthPpm: 5411.999750816209,
    durationHours: 1.5,
    snr: 97.89505139128208,
    priority: 4.495158310887425,
    dipIds: [59, 60, 61],
    createdAt: '2026-12-02T01:59:49.274Z',
    updatedAt: '2026-12-02T01:59:49.274Z',
    credits: { named: ['Brisa Dunmore', 'Corin Dunmore'], others: 3 },
    ...overrides,
  };
}

interface Sent {
  method: string;
  path: string;
  body: unknown;
}

function fakeApi(initial: ReturnType<typeof candidate>[]) {
  let candidates = initial;
  const sent: Sent[] = [];
  let patchAnswer: { status: number; body: unknown } | null = null;
  const json = (status: number, body: unknown) =>
    new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = new URL(String(input), 'http://localhost');
    const method = init?.method ?? 'GET';
    const body = init?.body ? JSON.parse(String(init.body)) : undefined;
    sent.push({ method, path: url.pathname, body });
    if (url.pathname === '/api/auth/csrf') return json(200, { token: 'csrf-token' });
    if (method === 'GET' && url.pathname === '/api/campaigns/1/candidates') {
      return json(200, { caution, candidates });
    }
    const match = /^\/api\/candidates\/(\d+)$/.exec(url.pathname);
    if (method === 'PATCH' && match) {
      if (patchAnswer) return json(patchAnswer.status, patchAnswer.body);
      const id = Number(match[1]);
      candidates = candidates.map((c) =>
        c.id === id ? { ...c, ...body, updatedAt: '2026-12-02T03:00:00.000Z' } : c,
      );
      return json(200, { candidate: { ...candidates.find((c) => c.id === id), caution } });
    }
    return json(404, { error: { code: 'not_found', message: `No ${url.pathname}` } });
  });
  vi.stubGlobal('fetch', fetchMock);
  return {
    sent,
    patches: () => sent.filter((request) => request.method === 'PATCH'),
    answerPatchWith(status: number, answer: unknown) {
      patchAnswer = { status, body: answer };
    },
  };
}

function renderPage() {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <MemoryRouter>
        <FollowUpPage campaignId={1} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

beforeEach(() => {
  vi.unstubAllGlobals();
});

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

/** The candidate cards, in the order shown (the list's own items, not the lists inside them). */
const cards = () =>
  [...screen.getByRole('list', { name: 'Candidates by priority' }).children] as HTMLElement[];

describe('Follow-up list', () => {
  it('shows the caution, and the candidates highest priority first with their ephemeris and credits', async () => {
    fakeApi([
      candidate({ id: 2, designation: 'LTS-064731', priority: 1.2, credits: { named: [], others: 1 } }),
      candidate(),
    ]);
    renderPage();
    await screen.findByRole('list', { name: 'Candidates by priority' });
    expect(screen.getByText('Candidates are not confirmed planets')).toBeTruthy();
    expect(screen.getByText(caution)).toBeTruthy();

    const [first, second] = cards();
    expect(
      within(first!)
        .getByRole('link', { name: /^Priority rank 1: ?LTS-358478$/ })
        .getAttribute('href'),
    ).toBe('/lab/candidates/1');
    expect(within(second!).getByRole('link', { name: /^Priority rank 2: ?LTS-064731$/ })).toBeTruthy();
    expect(within(first!).getByText('2.231908 ± 0.000012 d')).toBeTruthy();
    expect(within(first!).getByText('2458001.01042 BJD_TDB ± 0.2 min')).toBeTruthy();
    expect(within(first!).getByText('Found by Brisa Dunmore, Corin Dunmore and 3 others')).toBeTruthy();
    expect(within(second!).getByText('Found by 1 volunteer')).toBeTruthy();
  });

  it('offers both lists in CSV, JSON and VOTable as plain download links', async () => {
    fakeApi([candidate()]);
    renderPage();
    await screen.findByRole('list', { name: 'Candidates by priority' });
    const csv = screen.getByRole('link', { name: 'Follow-up list as CSV' });
    expect(csv.getAttribute('href')).toBe('/api/campaigns/1/follow-up?format=csv');
    expect(csv.hasAttribute('download')).toBe(true);
    expect(screen.getByRole('link', { name: 'Follow-up list as VOTable' }).getAttribute('href')).toBe(
      '/api/campaigns/1/follow-up?format=votable',
    );
    expect(screen.getByRole('link', { name: 'Consensus list as JSON' }).getAttribute('href')).toBe(
      '/api/campaigns/1/consensus?format=json',
    );
  });

  it('a state change is sent alone with PATCH, and the list shows it once saved', async () => {
    const api = fakeApi([candidate()]);
    renderPage();
    const form = await screen.findByRole('form', { name: 'Change LTS-358478' });
    const save = within(form).getByRole('button', { name: 'Save changes to LTS-358478' });
    expect((save as HTMLButtonElement).disabled).toBe(true);

    fireEvent.change(within(form).getByRole('combobox', { name: 'State' }), {
      target: { value: 'scheduled' },
    });
    fireEvent.click(save);

    await waitFor(() => expect(api.patches()).toHaveLength(1));
    expect(api.patches()[0]).toEqual({
      method: 'PATCH',
      path: '/api/candidates/1',
      body: { state: 'scheduled' },
    });
    await within(form).findByText('Saved.');
    await waitFor(() => expect(screen.getAllByText('Scheduled').length).toBeGreaterThan(0));
  });

  it('sends a disposition and cleared notes together, notes as null', async () => {
    const api = fakeApi([candidate()]);
    renderPage();
    const form = await screen.findByRole('form', { name: 'Change LTS-358478' });
    fireEvent.change(within(form).getByRole('combobox', { name: 'Disposition' }), {
      target: { value: 'eclipsing binary' },
    });
    fireEvent.change(within(form).getByRole('textbox', { name: 'Notes' }), { target: { value: '  ' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Save changes to LTS-358478' }));
    await waitFor(() => expect(api.patches()).toHaveLength(1));
    expect(api.patches()[0]!.body).toEqual({ disposition: 'eclipsing binary', notes: null });
  });

  it('shows the server’s field error next to the field it names', async () => {
    const api = fakeApi([candidate()]);
    api.answerPatchWith(400, {
      error: {
        code: 'validation_failed',
        message: 'Check the fields',
        fields: { state: 'One of promoted, scheduled, observed, resolved' },
      },
    });
    renderPage();
    const form = await screen.findByRole('form', { name: 'Change LTS-358478' });
    const state = within(form).getByRole('combobox', { name: 'State' });
    fireEvent.change(state, { target: { value: 'observed' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Save changes to LTS-358478' }));
    await within(form).findByText('One of promoted, scheduled, observed, resolved');
    expect(state.getAttribute('aria-invalid')).toBe('true');
    expect(within(form).queryByText('Saved.')).toBeNull();
  });

  it('says so when the list is empty, and points to the candidate review', async () => {
    fakeApi([]);
    renderPage();
    await screen.findByText('No candidates yet');
    expect(screen.getByRole('link', { name: 'Review settled dips' }).getAttribute('href')).toBe(
      '/lab/campaigns/1/review',
    );
    // The exports are still there: the consensus list does not need candidates.
    expect(screen.getByRole('link', { name: 'Consensus list as CSV' })).toBeTruthy();
  });
});
