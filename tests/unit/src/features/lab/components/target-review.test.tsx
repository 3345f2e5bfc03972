// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { LightCurvePlotProps } from '@/components/light-curve-plot';
import { TargetPage } from '@/features/lab/components/target-page';
import { createQueryClient } from '@/lib/query-client';

// uPlot needs a canvas, which jsdom does not draw; the charts are looked at in the browser. The light
// curves and folds keep their props here so a test can read what they were given.
const plots = vi.hoisted(() => [] as LightCurvePlotProps[]);
vi.mock('@/components/light-curve-plot', () => ({
  LightCurvePlot: (props: LightCurvePlotProps) => {
    plots.push(props);
    return <div role="img" aria-label={props.label} />;
  },
}));

// The periodogram draws with uPlot directly: this stand-in keeps the data and options it was given.
const charts = vi.hoisted(() => [] as { options: Record<string, unknown>; data: ArrayLike<number>[] }[]);
vi.mock('uplot', () => ({
  default: class {
    width: number;
    constructor(options: { width: number }, data: ArrayLike<number>[]) {
      this.width = options.width;
      charts.push({ options: options as Record<string, unknown>, data });
    }
    setSize() {}
    destroy() {}
  },
}));

// The real interval is 1.5 s; a test steps the fake worker itself, so the review may ask as often as it likes.
vi.mock('@/features/lab/lib/period-search', async (importOriginal) => {
  const actual = await importOriginal<typeof import('@/features/lab/lib/period-search')>();
  return {
    ...actual,
    periodSearchPollInterval: (status: Parameters<typeof actual.periodSearchPollInterval>[0]) =>
      actual.isSearchUnderway(status) ? 5 : false,
  };
});

// What Testing Library sets itself when the test runner has global hooks (ours are imported).
(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

const TARGET_ID = 220;
const CAMPAIGN_ID = 1;

/** A 27-day light curve with a 5000 ppm box every 2 days from t0 = 1001, at 10-minute cadence. */
function lightCurve() {
  const timeDays: number[] = [];
  const flux: number[] = [];
  for (let t = 1000; t < 1027; t += 10 / 1440) {
    const cycles = (t - 1001) / 2;
    const hours = Math.abs(cycles - Math.round(cycles)) * 48;
    timeDays.push(t);
    flux.push(hours < 1 ? 0.995 : 1);
  }
  return {
    id: 9,
    timeStart: 1000,
    timeEnd: 1027,
    pointCount: timeDays.length,
    cadenceDays: 10 / 1440,
    noisePpm: 500,
    noise1hPpm: 200,
    isQuietReference: false,
    timeSystem: { timesys: 'TDB', timeref: 'SOLARSYSTEM', timeunit: 'd', bjdRefDays: 2457000 },
    series: { timeDays, flux },
  };
}

const dips = [
  {
    id: 71,
    snippetId: 501,
    timeCenter: 1003.0012,
    timeSigma: 0.01,
    depthPpm: 5100,
    durationHours: 2,
    snr: 30.2,
    consensusScore: 0.97,
  },
  {
    id: 72,
    snippetId: 507,
    timeCenter: 1013.0004,
    timeSigma: 0.012,
    depthPpm: 4900,
    durationHours: 2,
    snr: 28.4,
    consensusScore: 0.99,
  },
];

function detail(candidateId: number | null, withDips = true) {
  return {
    target: {
      id: TARGET_ID,
      campaignId: CAMPAIGN_ID,
      designation: 'TST-220',
      raDeg: 10,
      decDeg: 20,
      magnitude: 12,
      stellarRadiusRsun: 0.8,
      stellarMassMsun: 0.78,
      teffK: 4900,
      assumedFields: [],
      lightCurveCount: 1,
      snippetCount: 0,
    },
    lightCurves: [lightCurve()],
    snippets: [],
    dips: withDips ? dips : [],
    candidateId,
  };
}

const foldDiagnostics = (depthPpm: number, oddEven: number, secondary: number) => ({
  depthPpm,
  depthErrPpm: 50,
  oddEvenDifferenceSigma: oddEven,
  depthSecondaryPpm: secondary,
  depthSecondaryErrPpm: 40,
  harmonicDeltaLogLikelihood: -100,
  transitsWithData: 12,
});

const result = {
  pointCount: 3888,
  baselineDays: 27,
  bjdRefDays: 2457000,
  grid: { periods: 400, durationsHours: [1, 2, 3] },
  best: {
    periodDays: 2,
    t0Days: 1001,
    durationHours: 2,
    depthPpm: 5000,
    depthErrPpm: 48,
    snr: 61.3,
    logLikelihood: 1800,
  },
  diagnostics: {
    atBest: foldDiagnostics(5012, 0.4, 12),
    atHalf: foldDiagnostics(2490, 45.1, -8),
    atDouble: foldDiagnostics(5030, 0.3, 4980),
  },
  periodogram: { periodsDays: [0.5, 1, 1.5, 2, 2.5, 3, 4], power: [10, 900, 40, 1800, 30, 20, 1500] },
};

function search(status: 'queued' | 'running' | 'done' | 'failed', extra: Record<string, unknown> = {}) {
  return {
    id: 3,
    targetId: TARGET_ID,
    status,
    job: 'period-search:period-search-3',
    settings: { minPeriodDays: 0.5, maxPeriodDays: null, oversample: 1 },
    result: null,
    error: null,
    createdAt: '2026-12-02T02:00:00.000Z',
    updatedAt: '2026-12-02T02:00:00.000Z',
    progress: null,
    ...extra,
  };
}

const diagnostic = (
  code: string,
  label: string,
  value: number,
  verdict: 'pass' | 'warn',
  detail: string,
) => ({
  code,
  label,
  value,
  verdict,
  detail,
});

const dipVetting = {
  source: 'dip',
  transit: { periodDays: null, depthPpm: 5100, durationHours: 2, snr: 30.2 },
  star: { radiusRsun: 0.8, massMsun: 0.78, teffK: 4900 },
  derived: {
    radius: {
      radiusRatio: 0.0714,
      radiusRatioErr: 0,
      radiusEarth: 6.23,
      radiusEarthErr: 0,
      radiusJupiter: 0.556,
      radiusJupiterErr: 0,
    },
    stellarDensityGcm3: 2.14,
    singleTransitPeriodRange: { periodMinDays: 0.9, periodMaxDays: 3.1, impactMin: 0, impactMax: 0.9 },
    orbit: null,
  },
  diagnostics: [diagnostic('snr', 'Signal-to-noise ratio', 30.2, 'pass', 'SNR 30.2 against 7.1')],
};

const searchVetting = {
  ...dipVetting,
  source: 'period-search',
  transit: { periodDays: 2, depthPpm: 5000, depthErrPpm: 48, durationHours: 2, snr: 61.3 },
  derived: {
    ...dipVetting.derived,
    radius: { ...dipVetting.derived.radius, radiusEarth: 6.1, radiusEarthErr: 0.031 },
    singleTransitPeriodRange: null,
    orbit: {
      semiMajorAxisAu: 0.0286,
      semiMajorAxisErrAu: 0,
      aOverRstar: 7.7,
      equilibriumTemperatureK: 1250,
      transitProbability: 0.13,
      transitProbabilityErr: 0.0004,
      statement:
        'The chance that such an orbit transits from our view is 13.00 %: for each such planet seen transiting, about 7 more exist around stars like this that do not transit from our view.',
    },
  },
  diagnostics: [
    diagnostic('snr', 'Signal-to-noise ratio', 61.3, 'pass', 'SNR 61.3 against the threshold 7.1'),
    diagnostic('odd_even', 'Odd and even depths', 0.4, 'pass', 'Odd and even transits differ by 0.4σ'),
    diagnostic('secondary', 'Secondary eclipse at phase 0.5', 3.4, 'warn', 'A dip of 120 ppm at phase 0.5'),
    // A diagnostic this page has never heard of: it must show like the others.
    diagnostic('shape', 'Transit shape', 0.82, 'warn', 'V-shaped rather than flat-bottomed'),
  ],
};

interface Answer {
  status: number;
  body: unknown;
}

const json = ({ status, body }: Answer) =>
  new Response(status === 204 ? null : JSON.stringify(body), {
    status,
    headers: { 'Content-Type': 'application/json' },
  });

/** Before its first search, a target's latest period search is null. */
const noSearch = { status: 200, body: { periodSearch: null } };

interface FakeOptions {
  /** What the latest period search is, step by step: `advance()` moves to the next. */
  searches?: Answer[];
  promoteAnswer?: Answer;
  withDips?: boolean;
  vettingBeforeSearch?: Answer;
}

function fakeApi(options: FakeOptions = {}) {
  const state = {
    searches: options.searches ?? [noSearch],
    step: 0,
    started: false,
    candidateId: null as number | null,
    posts: [] as { path: string; body: unknown }[],
    gets: [] as string[],
  };
  const currentSearch = () => state.searches[Math.min(state.step, state.searches.length - 1)]!;
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = new URL(String(input), 'http://localhost');
    const method = init?.method ?? 'GET';
    const path = url.pathname;
    if (method === 'GET') state.gets.push(path);
    if (path === '/api/auth/csrf') return json({ status: 200, body: { token: 'csrf-token' } });
    if (method === 'POST') state.posts.push({ path, body: JSON.parse(String(init?.body ?? 'null')) });
    if (path === `/api/targets/${TARGET_ID}` && method === 'GET') {
      return json({ status: 200, body: detail(state.candidateId, options.withDips ?? true) });
    }
    if (path === `/api/targets/${TARGET_ID}/period-search`) {
      if (method === 'POST') {
        state.started = true;
        return json({ status: 202, body: { periodSearch: { ...search('queued'), progress: undefined } } });
      }
      return json(currentSearch());
    }
    if (path === `/api/targets/${TARGET_ID}/vetting`) {
      const latest = currentSearch().body as { periodSearch?: { status: string } };
      if (latest.periodSearch?.status === 'done')
        return json({ status: 200, body: { vetting: searchVetting } });
      return json(options.vettingBeforeSearch ?? { status: 200, body: { vetting: dipVetting } });
    }
    if (path === `/api/campaigns/${CAMPAIGN_ID}/candidates` && method === 'POST') {
      const answer = options.promoteAnswer ?? { status: 500, body: null };
      if (answer.status === 201 || answer.status === 409) state.candidateId = 5;
      return json(answer);
    }
    return json({ status: 404, body: { error: { code: 'not_found', message: path } } });
  });
  vi.stubGlobal('fetch', fetchMock);
  return {
    state,
    advance: () => {
      state.step += 1;
    },
  };
}

beforeEach(() => {
  plots.length = 0;
  charts.length = 0;
  vi.stubGlobal(
    'ResizeObserver',
    class {
      observe() {}
      disconnect() {}
    },
  );
});

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function renderPage() {
  const router = createMemoryRouter(
    [{ path: '/lab/targets/:targetId', element: <TargetPage targetId={TARGET_ID} /> }],
    { initialEntries: [`/lab/targets/${TARGET_ID}`] },
  );
  render(
    <QueryClientProvider client={createQueryClient()}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
}

const section = (name: RegExp | string) => {
  const heading = screen.getByRole('heading', { level: 2, name });
  return heading.closest('section') as HTMLElement;
};

describe('Target review: dips', () => {
  it('marks each dip on the light curve as an ink line at its centre, apart from planted marks, and lists it', async () => {
    fakeApi();
    renderPage();
    await screen.findByRole('heading', { level: 1, name: 'TST-220' });
    const curve = plots.findLast((props) => props.label.startsWith('Light curve of TST-220:'))!;
    expect(curve.markers).toEqual([
      { x: 1003.0012, tone: 'ink' },
      { x: 1013.0004, tone: 'ink' },
    ]);
    expect(curve.label).toContain('dips at 1003.001, 1013.000 days');
    const rows = within(within(section('Dips')).getByRole('table'))
      .getAllByRole('row')
      .slice(1);
    expect(rows.map((row) => row.textContent)).toEqual([
      expect.stringContaining('1003.0012 d ± 14 min'),
      expect.stringContaining('1013.0004 d ± 17 min'),
    ]);
    expect(rows[0]!.textContent).toContain('5100 ppm');
    expect(rows[0]!.textContent).toContain('#501');
  });
});

describe('Target review: period search', () => {
  it('runs a search through queued and running to done, then shows the periodogram, the three folds and the refreshed vetting', async () => {
    const running = search('running', { progress: { percent: 40, stage: 'searching 400 periods' } });
    const fake = fakeApi({
      searches: [
        noSearch,
        { status: 200, body: { periodSearch: search('queued') } },
        { status: 200, body: { periodSearch: running } },
        { status: 200, body: { periodSearch: search('done', { result }) } },
      ],
    });
    renderPage();
    const panel = () => section('Period search');
    await within(await screen.findByRole('region', { name: 'Period search' })).findByText(
      'No period search has been run for this target yet.',
    );
    // Before any search, vetting reads the strongest dip as a single transit.
    await within(section('Vetting')).findByText('Period allowed by a single transit');

    fake.advance();
    fireEvent.click(within(panel()).getByRole('button', { name: 'Run period search' }));
    await waitFor(() =>
      expect(fake.state.posts).toEqual([{ path: `/api/targets/${TARGET_ID}/period-search`, body: {} }]),
    );
    const bar = await within(panel()).findByRole('progressbar', { name: 'Period search progress' });
    expect(bar.getAttribute('aria-valuenow')).toBe('0');
    expect(within(panel()).getByText('waiting for a worker')).toBeTruthy();
    expect(
      (within(panel()).getByRole('button', { name: 'Run the period search again' }) as HTMLButtonElement)
        .disabled,
    ).toBe(true);

    act(() => fake.advance());
    await within(panel()).findByText('searching 400 periods');
    expect(within(panel()).getByRole('progressbar').getAttribute('aria-valuenow')).toBe('40');
    expect(within(panel()).getByText('Running')).toBeTruthy();

    act(() => fake.advance());
    await within(panel()).findByRole('heading', { name: 'Periodogram' });
    expect(within(panel()).queryByRole('progressbar')).toBeNull();
    expect(within(panel()).getByText('Period P').nextElementSibling?.textContent).toBe('2.00000 d');
    expect(within(panel()).getByText('5000 ± 48 ppm')).toBeTruthy();
    expect(within(panel()).getByText('BJD_TDB 2458001.00000')).toBeTruthy();

    // The periodogram: all its points, with P, P/2 and 2P marked in its accessible name.
    const chart = charts.at(-1)!;
    expect(Array.from(chart.data[0]!)).toEqual(result.periodogram.periodsDays);
    expect(
      within(panel()).getByRole('img', { name: /BLS periodogram of TST-220.*P = 2\.00000 d/ }),
    ).toBeTruthy();
    const peaks = within(within(panel()).getByRole('table')).getAllByRole('row').slice(1);
    expect(peaks.map((row) => within(row).getAllByRole('cell').at(-1)?.textContent)).toEqual([
      'P',
      '2P',
      'P/2',
    ]);

    // Three folds, each from the light curve and with its own diagnostics.
    for (const [name, depth, oddEven] of [
      ['P', '5012 ± 50 ppm', '0.4σ'],
      ['P/2', '2490 ± 50 ppm', '45.1σ'],
      ['2P', '5030 ± 50 ppm', '0.3σ'],
    ] as const) {
      const fold = within(panel()).getByRole('heading', {
        name: new RegExp(`^Folded at ${name.replace('/', '\\/')} `),
      });
      const card = within(fold.closest('article') as HTMLElement);
      expect(card.getByText(depth)).toBeTruthy();
      expect(card.getByText(oddEven)).toBeTruthy();
    }
    const atP = plots.findLast((props) => props.label.includes('folded at P = '))!;
    // The fold is centred on mid-transit: the binned means there are as deep as the box (−5000 ppm).
    const centre = atP.line!.x.findIndex((x) => Math.abs(x) < 0.3);
    expect(atP.line!.y[centre]).toBeCloseTo(-5000, 0);
    expect(atP.xLabel).toBe('hours from mid-transit');
    expect(Math.max(...atP.x.map(Math.abs))).toBeLessThanOrEqual(10);

    // The whole orbit at 2P reaches ±P (48 h), where an eclipsing binary's other eclipse would be.
    fireEvent.click(within(panel()).getByRole('button', { name: 'Whole orbit' }));
    const at2P = plots.findLast((props) => props.label.includes('folded at 2P = '))!;
    expect(Math.max(...at2P.x.map(Math.abs))).toBeGreaterThan(47.5);
    expect(within(panel()).getByRole('button', { name: 'Whole orbit' }).getAttribute('aria-pressed')).toBe(
      'true',
    );

    // Vetting now reads the search, with the orbit and the transit probability's statement.
    const vetting = within(section('Vetting'));
    await vetting.findByText(/for each such planet seen transiting, about 7 more exist/);
    expect(vetting.getByText('13.00 %')).toBeTruthy();
    expect(vetting.getByText(/the latest period search/)).toBeTruthy();
  });

  it('shows why a search failed and lets it be run again with a period range', async () => {
    const fake = fakeApi({
      searches: [
        {
          status: 200,
          body: {
            periodSearch: search('failed', {
              error: 'the target has fewer than 100 points of light curve to search',
            }),
          },
        },
        { status: 200, body: { periodSearch: search('queued') } },
      ],
    });
    renderPage();
    const failed = await screen.findByRole('alert');
    expect(failed.textContent).toContain('The period search failed');
    expect(failed.textContent).toContain('fewer than 100 points');
    const panel = within(section('Period search'));
    fireEvent.change(panel.getByLabelText('Shortest period (days)'), { target: { value: '1' } });
    fireEvent.change(panel.getByLabelText('Longest period (days)'), { target: { value: '0.8' } });
    fireEvent.click(panel.getByRole('button', { name: 'Run the period search again' }));
    expect(await panel.findByText('Must be longer than the shortest period')).toBeTruthy();
    expect(fake.state.posts).toEqual([]);

    fireEvent.change(panel.getByLabelText('Longest period (days)'), { target: { value: '5' } });
    fake.advance();
    fireEvent.click(panel.getByRole('button', { name: 'Run the period search again' }));
    await waitFor(() =>
      expect(fake.state.posts).toEqual([
        { path: `/api/targets/${TARGET_ID}/period-search`, body: { minPeriodDays: 1, maxPeriodDays: 5 } },
      ]),
    );
    await panel.findByRole('progressbar');
  });
});

describe('Target review: vetting', () => {
  it('lists every diagnostic with a pass or warn badge in words and its number, including ones it does not know', async () => {
    fakeApi({ searches: [{ status: 200, body: { periodSearch: search('done', { result }) } }] });
    renderPage();
    const vetting = within(await screen.findByRole('region', { name: 'Vetting' }));
    await vetting.findByText('Transit shape');
    const items = Array.from(document.querySelectorAll('[data-diagnostic]'));
    expect(items.map((item) => item.getAttribute('data-diagnostic'))).toEqual([
      'snr',
      'odd_even',
      'secondary',
      'shape',
    ]);
    const shape = within(items[3] as HTMLElement);
    expect(shape.getByText('Warn')).toBeTruthy();
    expect(shape.getByText('0.82')).toBeTruthy();
    expect(shape.getByText('V-shaped rather than flat-bottomed')).toBeTruthy();
    expect(within(items[0] as HTMLElement).getByText('Pass')).toBeTruthy();
    expect(vetting.getByText('2 of 4 warn: look at them before promoting.')).toBeTruthy();
    expect(vetting.getByText('6.100 ± 0.031 R⊕')).toBeTruthy();
    expect(vetting.getByText(/A candidate is not a confirmed planet/)).toBeTruthy();
  });

  it('does not ask for vetting while the target has no dip and no search, and says so', async () => {
    const fake = fakeApi({ withDips: false });
    renderPage();
    const vetting = within(await screen.findByRole('region', { name: 'Vetting' }));
    expect(await vetting.findByText('Nothing to vet yet.')).toBeTruthy();
    expect(vetting.getByText(/no settled dip and no finished period search yet/)).toBeTruthy();
    expect(vetting.queryByRole('alert')).toBeNull();
    expect(fake.state.gets).not.toContain(`/api/targets/${TARGET_ID}/vetting`);
  });

  it('says why there is nothing to vet when the API answers 409, without an error', async () => {
    fakeApi({
      vettingBeforeSearch: {
        status: 409,
        body: {
          error: {
            code: 'no_stellar_parameters',
            message: 'The catalogue gives this star no radius, mass or temperature; add them to vet it',
          },
        },
      },
    });
    renderPage();
    const vetting = within(await screen.findByRole('region', { name: 'Vetting' }));
    expect(await vetting.findByText('Nothing to vet yet.')).toBeTruthy();
    expect(vetting.getByText(/no radius, mass or temperature/)).toBeTruthy();
    expect(vetting.queryByRole('alert')).toBeNull();
  });
});

describe('Target review: promotion', () => {
  const candidate = {
    candidate: {
      id: 5,
      campaignId: CAMPAIGN_ID,
      targetId: TARGET_ID,
      designation: 'TST-220',
      state: 'promoted',
      priority: 3.25,
      dipIds: [72],
      credits: { named: ['Brisa Dunmore'], others: 2 },
      caution: 'Not yet a confirmed planet: a target the volunteers found, worth following up.',
    },
  };

  async function promotionForm() {
    const region = await screen.findByRole('region', { name: 'Promote to the follow-up list' });
    return within(region);
  }

  it('posts the chosen dips, notes and precision, then links to the candidate and the follow-up list', async () => {
    const fake = fakeApi({ promoteAnswer: { status: 201, body: candidate } });
    renderPage();
    const form = await promotionForm();
    const boxes = form.getAllByRole('checkbox') as HTMLInputElement[];
    expect(boxes.map((box) => box.checked)).toEqual([true, true]);
    fireEvent.click(form.getByLabelText('Dip #71 at 1003.0012 d'));
    fireEvent.change(form.getByLabelText('Notes (optional)'), { target: { value: '  two clean dips  ' } });
    fireEvent.change(form.getByLabelText('Telescope precision (ppm, optional)'), {
      target: { value: '800' },
    });
    fireEvent.click(form.getByRole('button', { name: 'Promote to the follow-up list' }));

    const done = await screen.findByRole('region', { name: 'On the follow-up list' });
    expect(fake.state.posts).toEqual([
      {
        path: `/api/campaigns/${CAMPAIGN_ID}/candidates`,
        body: { targetId: TARGET_ID, dipIds: [72], notes: 'two clean dips', telescopePrecisionPpm: 800 },
      },
    ]);
    const links = within(done).getAllByRole('link');
    expect(links.map((link) => link.getAttribute('href'))).toEqual([
      '/lab/candidates/5',
      `/lab/campaigns/${CAMPAIGN_ID}/follow-up`,
    ]);
    expect(within(done).getByText(/TST-220 is candidate #5/)).toBeTruthy();
    expect(
      within(done).getByText(
        'Not yet a confirmed planet: a target the volunteers found, worth following up.',
      ),
    ).toBeTruthy();
    expect(within(done).queryByRole('button', { name: 'Promote to the follow-up list' })).toBeNull();
    // The target was asked for again (its candidateId now set): the header links to the candidate too.
    await waitFor(() => expect(screen.getAllByRole('link', { name: 'Candidate #5' })).toHaveLength(2));
  });

  it('does not post without a dip chosen, and shows a too-large precision at its field', async () => {
    const fake = fakeApi({ promoteAnswer: { status: 201, body: candidate } });
    renderPage();
    const form = await promotionForm();
    fireEvent.click(form.getByLabelText('Dip #71 at 1003.0012 d'));
    fireEvent.click(form.getByLabelText('Dip #72 at 1013.0004 d'));
    fireEvent.change(form.getByLabelText('Telescope precision (ppm, optional)'), {
      target: { value: '2000000' },
    });
    fireEvent.click(form.getByRole('button', { name: 'Promote to the follow-up list' }));
    expect(await form.findByText('Choose at least one dip')).toBeTruthy();
    expect(form.getByText('A number of ppm above 0, up to 1 000 000')).toBeTruthy();
    expect(fake.state.posts).toEqual([]);
  });

  it('shows the server’s field errors of a 400 at their fields', async () => {
    fakeApi({
      promoteAnswer: {
        status: 400,
        body: {
          error: {
            code: 'validation_failed',
            message: 'Some dips are not this target’s',
            fields: { dipIds: 'Every dip must be a settled dip of this target' },
          },
        },
      },
    });
    renderPage();
    const form = await promotionForm();
    fireEvent.click(form.getByRole('button', { name: 'Promote to the follow-up list' }));
    const message = await form.findByText('Every dip must be a settled dip of this target');
    expect(message.closest('fieldset')).toBeTruthy();
    // Still the form: nothing was promoted.
    expect(form.getByRole('button', { name: 'Promote to the follow-up list' })).toBeTruthy();
  });

  it('shows a 400 without fields as a message over the button', async () => {
    fakeApi({
      promoteAnswer: {
        status: 400,
        body: {
          error: { code: 'validation_failed', message: 'No such target in this campaign', fields: {} },
        },
      },
    });
    renderPage();
    const form = await promotionForm();
    fireEvent.click(form.getByRole('button', { name: 'Promote to the follow-up list' }));
    const alert = await form.findByRole('alert');
    expect(alert.textContent).toContain('No such target in this campaign');
  });

  it('on 409 says the target is already on the follow-up list and links to it', async () => {
    fakeApi({
      promoteAnswer: {
        status: 409,
        body: {
          error: { code: 'already_a_candidate', message: 'This target is already on the follow-up list' },
        },
      },
    });
    renderPage();
    const form = await promotionForm();
    fireEvent.click(form.getByRole('button', { name: 'Promote to the follow-up list' }));
    const region = within(await screen.findByRole('region', { name: 'On the follow-up list' }));
    expect(region.getByText('Already on the follow-up list')).toBeTruthy();
    expect(
      region.getByText(/This target is already on the follow-up list\. Someone promoted it meanwhile/),
    ).toBeTruthy();
    expect(region.getByRole('link', { name: 'Candidate #5' }).getAttribute('href')).toBe('/lab/candidates/5');
  });
});
