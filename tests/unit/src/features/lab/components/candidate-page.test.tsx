// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { CandidatePage } from '@/features/lab/components/candidate-page';
import { createQueryClient } from '@/lib/query-client';

// What Testing Library sets itself when the test runner has global hooks (ours are imported).
(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

const notConfirmed =
  'A candidate is not a confirmed planet: it is a target whose dips volunteers found and a scientist thought worth following up.';
const sunCaution =
  'Windows with the target closer than 30° to the Sun are never proposed: pointing a telescope that near the Sun risks the instrument and the eyes of anyone at it.';

const site = (observable: boolean, reason: string, name = 'Test site', observatoryId = 1) => ({
  observatoryId,
  name,
  observable,
  reason,
  minTargetAltitudeDeg: 40,
  maxSunAltitudeDeg: -20,
  sunSeparationDeg: 70,
});

/** Epochs 1513 and 1520 of candidate 1 on the demo server (/tmp/samples/windows.json). */
function windows(sites = true) {
  return [
    {
      epoch: 1513,
      midBjdTdb: 2461377.8866048367,
      sigmaDays: 0.018062953106112636,
      startBjdTdb: 2461377.837291884,
      endBjdTdb: 2461377.9359177896,
      startUtc: '2026-12-03T08:07:25.573Z',
      midUtc: '2026-12-03T09:18:26.118Z',
      endUtc: '2026-12-03T10:29:26.663Z',
      sunSeparationDeg: 69.35029266439878,
      observatories: sites ? [site(false, 'target below 30° during the window (lowest -9.1°)')] : [],
    },
    {
      epoch: 1520,
      midBjdTdb: 2461393.51,
      sigmaDays: 0.01814651741008806,
      startBjdTdb: 2461393.461,
      endBjdTdb: 2461393.559,
      startUtc: '2026-12-18T23:04:20.029Z',
      midUtc: '2026-12-19T00:15:27.756Z',
      endUtc: '2026-12-19T01:26:35.483Z',
      sunSeparationDeg: 74.2,
      observatories: sites ? [site(true, 'Sun below -12° and target above 30° throughout the window')] : [],
    },
  ];
}

type Answer = { status: number; body: unknown };

/** Candidate 1 on the demo server, as GET /api/candidates/1 answers. */
const demoCandidate = {
  id: 1,
  campaignId: 1,
  targetId: 209,
  designation: 'LTS-358478',
  promotedBy: 3,
  state: 'scheduled',
  disposition: 'planet candidate',
  notes: null,
  periodDays: 2.2319075929743697,
  periodSigmaDays: 0.000011938128852288922,
  t0Bjd: 2458001.0104166665,
  t0SigmaDays: 0.00014275925760041277,
  depthPpm: 5412,
  durationHours: 1.5,
  snr: 97.9,
  priority: 4.5,
  dipIds: [59, 60, 61],
  createdAt: '2026-12-02T01:59:49.274Z',
  updatedAt: '2026-12-02T01:59:49.274Z',
  credits: { named: ['Brisa Dunmore'], others: 2 },
  caution: notConfirmed,
};

function fakeApi(windowsAnswer: Answer, candidateAnswer: Answer = ok({ candidate: demoCandidate })) {
  const requested: string[] = [];
  const json = ({ status, body }: Answer) =>
    new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL) => {
      const url = new URL(String(input), 'http://localhost');
      requested.push(`${url.pathname}${url.search}`);
      if (url.pathname === '/api/candidates/1/windows') return json(windowsAnswer);
      if (url.pathname === '/api/candidates/1') return json(candidateAnswer);
      return json({ status: 404, body: { error: { code: 'not_found', message: 'No such thing' } } });
    }),
  );
  return { requested };
}

function ok(body: unknown): Answer {
  return { status: 200, body };
}
const windowsBody = (overrides: Record<string, unknown> = {}) => ({
  candidate: {
    id: 1,
    campaignId: 1,
    targetId: 209,
    designation: 'LTS-358478',
    periodDays: 2.2319075929743697,
  },
  windows: windows(),
  leftOutNearSun: 2,
  cautions: [notConfirmed, sunCaution],
  ...overrides,
});

function renderPage() {
  const client = createQueryClient();
  // Server trouble is retried with a back-off in the app; a test should not wait for it.
  client.setDefaultOptions({ queries: { ...client.getDefaultOptions().queries, retry: false } });
  render(
    <QueryClientProvider client={client}>
      <MemoryRouter>
        <CandidatePage candidateId={1} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

beforeEach(() => vi.unstubAllGlobals());
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('Candidate page: transit windows', () => {
  it('lists each window in BJD_TDB and UTC with its σ, and each observatory’s yes or no with the reason', async () => {
    const api = fakeApi(ok(windowsBody()));
    renderPage();
    const first = await screen.findByRole('listitem', { name: 'Epoch 1513' });
    expect(api.requested).toContain('/api/candidates/1/windows?count=10');
    expect(within(first).getByText('Thu, 3 Dec 2026, 09:18 UTC', { exact: false })).toBeTruthy();
    expect(within(first).getByText('2461377.88660 ± 26.0 min')).toBeTruthy();
    expect(within(first).getByText('2461377.83729 – 2461377.93592')).toBeTruthy();
    expect(within(first).getByText('Thu, 3 Dec 2026, 08:07 – 10:29 UTC')).toBeTruthy();
    expect(within(first).getByText('69°')).toBeTruthy();
    expect(within(first).getByText('Not observable')).toBeTruthy();
    expect(within(first).getByText('target below 30° during the window (lowest -9.1°)')).toBeTruthy();

    const later = screen.getByRole('listitem', { name: 'Epoch 1520' });
    expect(within(later).getByText('Observable')).toBeTruthy();
    // The σ grows with the epoch, and the page says how much.
    expect(within(later).getByText('2461393.51000 ± 26.1 min')).toBeTruthy();
    expect(screen.getByText(/± 26\.0 min for the first window, ± 26\.1 min for the last/)).toBeTruthy();
  });

  it('shows both cautions and how many windows were left out near the Sun', async () => {
    fakeApi(ok(windowsBody()));
    renderPage();
    await screen.findByRole('listitem', { name: 'Epoch 1513' });
    expect(screen.getByText(notConfirmed)).toBeTruthy();
    expect(screen.getByText(sunCaution)).toBeTruthy();
    expect(screen.getByText('2 windows left out near the Sun')).toBeTruthy();
  });

  it('asks for more windows when another count is chosen', async () => {
    const api = fakeApi(ok(windowsBody()));
    renderPage();
    await screen.findByRole('listitem', { name: 'Epoch 1513' });
    fireEvent.change(screen.getByRole('combobox', { name: 'Windows to show' }), { target: { value: '50' } });
    await waitFor(() => expect(api.requested).toContain('/api/candidates/1/windows?count=50'));
  });

  it('switches between the list and a month calendar in UTC, marking observable windows in words', async () => {
    fakeApi(ok(windowsBody()));
    renderPage();
    await screen.findByRole('listitem', { name: 'Epoch 1513' });
    const listButton = screen.getByRole('button', { name: 'List' });
    const calendarButton = screen.getByRole('button', { name: 'Calendar' });
    expect(listButton.getAttribute('aria-pressed')).toBe('true');

    fireEvent.click(calendarButton);
    expect(calendarButton.getAttribute('aria-pressed')).toBe('true');
    expect(screen.queryByRole('listitem', { name: 'Epoch 1513' })).toBeNull();
    const december = screen.getByRole('region', { name: 'December 2026' });
    const grid = within(december).getByRole('table', { name: 'Transit windows in December 2026, UTC' });
    // Epoch 1520 starts on the 18th but its mid-transit is on the 19th, where it belongs.
    const nineteenth = within(grid)
      .getAllByRole('cell')
      .find((cell) => cell.textContent?.startsWith('19'))!;
    expect(within(nineteenth).getByText('Observable')).toBeTruthy();
    expect(within(nineteenth).getByText(/Epoch 1520/)).toBeTruthy();
    const third = within(grid)
      .getAllByRole('cell')
      .find((cell) => cell.textContent?.startsWith('3'))!;
    expect(within(third).getByText('Not observable')).toBeTruthy();
    // The phones' day list carries the same windows.
    const days = within(december).getByRole('list', { name: 'Days with windows in December 2026' });
    expect(within(days).getByText('Saturday, 19 December 2026')).toBeTruthy();

    fireEvent.click(listButton);
    expect(screen.getByRole('listitem', { name: 'Epoch 1513' })).toBeTruthy();
  });

  it('points to the observatories page when there is no observatory to check against', async () => {
    fakeApi(ok(windowsBody({ windows: windows(false) })));
    renderPage();
    await screen.findByRole('listitem', { name: 'Epoch 1513' });
    expect(screen.getByText('No observatories yet')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Add an observatory' }).getAttribute('href')).toBe(
      '/lab/observatories',
    );
  });

  it('shows the candidate’s state, credits and links from its own answer', async () => {
    const api = fakeApi(ok(windowsBody()));
    renderPage();
    await screen.findByText('Found by Brisa Dunmore and 2 others');
    expect(api.requested).toContain('/api/candidates/1');
    expect(screen.getByRole('link', { name: /The follow-up list/ }).getAttribute('href')).toBe(
      '/lab/campaigns/1/follow-up',
    );
    expect(screen.getByRole('link', { name: 'The target’s review' }).getAttribute('href')).toBe(
      '/lab/targets/209',
    );
    expect((screen.getByRole('combobox', { name: 'State' }) as HTMLSelectElement).value).toBe('scheduled');
  });
});

describe('Candidate page: when there are no windows to give', () => {
  it('says plainly that a single-transit candidate has no period yet (409 no_ephemeris)', async () => {
    fakeApi({
      status: 409,
      body: {
        error: {
          code: 'no_ephemeris',
          message:
            'This candidate has no period yet (a single transit): run a period search, then promote again',
        },
      },
    });
    renderPage();
    await screen.findByText('No period yet, so no transit windows');
    expect(screen.getByText(/has a single transit and no period/)).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Try again' })).toBeNull();
    // The candidate itself is still there to read and change.
    expect(screen.getByText('Found by Brisa Dunmore and 2 others')).toBeTruthy();
    expect(screen.getByText(notConfirmed)).toBeTruthy();
    expect(screen.getByRole('combobox', { name: 'State' })).toBeTruthy();
  });

  it('says there is no such candidate on 404', async () => {
    const missing = { status: 404, body: { error: { code: 'not_found', message: 'Candidate not found' } } };
    fakeApi(missing, missing);
    renderPage();
    await screen.findByText('No such candidate');
  });

  it('offers to try again when the server fails on the windows, or on the candidate', async () => {
    const broken = {
      status: 500,
      body: { error: { code: 'internal', message: 'Something broke on our side' } },
    };
    fakeApi(broken);
    renderPage();
    await screen.findByText('Something broke on our side');
    expect(screen.getByText('Could not load the transit windows of candidate #1')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Try again' })).toBeTruthy();
    cleanup();

    fakeApi(ok(windowsBody()), broken);
    renderPage();
    await screen.findByText('Could not load the candidate');
    expect(screen.getByRole('button', { name: 'Try again' })).toBeTruthy();
  });
});
