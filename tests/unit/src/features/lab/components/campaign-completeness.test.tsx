// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { Completeness } from '@/features/lab/api/get-campaign-completeness';
import { CampaignCompleteness } from '@/features/lab/components/campaign-completeness';
import { createQueryClient } from '@/lib/query-client';
// Made by tests/reference/make_completeness_reference.py with astropy 5.2.1
// astropy.stats.binom_conf_interval (interval='wilson').
import reference from '../../../../../fixtures/reference/wilson.json';

// uPlot needs a real canvas, which jsdom does not draw; the chart is looked at in the browser. This
// stand-in keeps what the chart gives it (options, data), so a test can read the points and run the
// chart's draw hook on a recording context to see where the interval bars go.
const charts = vi.hoisted(
  () => [] as { options: Record<string, unknown>; data: unknown[][]; destroyed: boolean }[],
);
vi.mock('uplot', () => ({
  default: class {
    width: number;
    private readonly record: (typeof charts)[number];
    constructor(options: { width: number }, data: unknown[][]) {
      this.width = options.width;
      this.record = { options: options as Record<string, unknown>, data, destroyed: false };
      charts.push(this.record);
    }
    setSize() {}
    destroy() {
      this.record.destroyed = true;
    }
  },
}));

// What Testing Library sets itself when the test runner has global hooks (ours are imported).
(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

const bin = (lower: number, upper: number | null, recovered: number, missed: number, pending: number) => ({
  lower,
  upper,
  recovered,
  missed,
  pending,
  rate: recovered + missed === 0 ? null : recovered / (recovered + missed),
  wilsonLow: null as number | null,
  wilsonHigh: null as number | null,
});

/** astropy.stats.binom_conf_interval(k, n, confidence_level=0.95, interval='wilson'), from the fixture. */
function astropyWilson95(successes: number, trials: number) {
  const found = reference.intervals['95'].cases.find((c) => c.successes === successes && c.trials === trials);
  if (!found) throw new Error(`no reference interval for ${successes}/${trials}`);
  return { wilsonLow: found.low, wilsonHigh: found.high };
}

function filled(): Completeness {
  const bySnr = [bin(5, 7.1, 0, 0, 0), bin(7.1, 10, 1, 2, 1), bin(10, 15, 0, 0, 2), bin(20, 30, 5, 1, 0)];
  Object.assign(bySnr[1]!, astropyWilson95(1, 3));
  Object.assign(bySnr[3]!, astropyWilson95(5, 6));
  const byDepth = [bin(200, 500, 1, 2, 1), bin(2000, 5000, 5, 1, 0), bin(50_000, null, 0, 0, 2)];
  Object.assign(byDepth[0]!, astropyWilson95(1, 3));
  Object.assign(byDepth[1]!, astropyWilson95(5, 6));
  return {
    planted: { total: 12, recovered: 6, missed: 3, pending: 3, rate: 6 / 9, ...astropyWilson95(6, 9) },
    quiet: { total: 5, falseDips: 1, flat: 3, pending: 1, rate: 0.25, ...astropyWilson95(1, 4) },
    bySnr,
    byDepth,
    byDuration: [bin(2, 3, 5, 1, 0)],
    interval: { method: 'wilson', z: 1.959964 },
  };
}

function pending(planted: number, quiet: number): Completeness {
  const base = filled();
  const none = { recovered: 0, missed: 0, rate: null, wilsonLow: null, wilsonHigh: null };
  return {
    ...base,
    planted: { ...none, total: planted, pending: planted },
    quiet: {
      total: quiet,
      falseDips: 0,
      flat: 0,
      pending: quiet,
      rate: null,
      wilsonLow: null,
      wilsonHigh: null,
    },
    bySnr: base.bySnr.map((b) => ({ ...b, ...none, pending: 1 })),
    byDepth: [],
    byDuration: [],
  };
}

function serve(answer: { status: number; body: unknown }) {
  const fetchMock = vi.fn(async (input: RequestInfo | URL) => {
    const url = new URL(String(input), 'http://localhost');
    if (url.pathname === '/api/campaigns/7/completeness') {
      return new Response(JSON.stringify(answer.body), {
        status: answer.status,
        headers: { 'Content-Type': 'application/json' },
      });
    }
    return new Response(JSON.stringify({ error: { code: 'not_found', message: url.pathname } }), {
      status: 404,
    });
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

beforeEach(() => {
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

function renderCompleteness() {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <CampaignCompleteness campaignId={7} />
    </QueryClientProvider>,
  );
}

/** The table's rows as their cells' text. */
function tableRows(): string[][] {
  const table = screen.getByRole('table');
  return within(table)
    .getAllByRole('row')
    .slice(1)
    .map((row) =>
      within(row)
        .getAllByRole('cell')
        .map((cell) => cell.textContent ?? ''),
    );
}

describe('CampaignCompleteness', () => {
  it('when controls exist but none has an outcome, says so with their counts and draws no chart', async () => {
    serve({ status: 200, body: { completeness: pending(3, 1) } });
    renderCompleteness();
    expect(await screen.findByText('No control has an outcome yet')).toBeTruthy();
    expect(screen.getByText(/3 planted and 1 quiet control, all still open or split/)).toBeTruthy();
    expect(screen.getByText('What will appear here')).toBeTruthy();
    expect(screen.queryByRole('table')).toBeNull();
    expect(charts).toHaveLength(0);
  });

  it('when the campaign has no controls at all, says where they come from', async () => {
    serve({ status: 200, body: { completeness: pending(0, 0) } });
    renderCompleteness();
    expect(await screen.findByText('No controls yet')).toBeTruthy();
    expect(screen.getByText(/mixed in when light curves are cut into snippets/)).toBeTruthy();
  });

  it('shows the overall recovery, the false-dip rate and what is pending, with their intervals', async () => {
    serve({ status: 200, body: { completeness: filled() } });
    renderCompleteness();
    const recovered = (await screen.findByText('Planted dips recovered')).parentElement!;
    expect(recovered.textContent).toContain('67 %');
    expect(recovered.textContent).toContain('6 of 9 · 95 % interval 35–88 %');
    const quiet = screen.getByText('False dips on quiet controls').parentElement!;
    expect(quiet.textContent).toContain('25 %');
    expect(quiet.textContent).toContain('1 of 4 · 95 % interval 5–70 %');
    const waiting = screen.getByText('Pending', { selector: 'dt' }).parentElement!;
    expect(waiting.textContent).toContain('4');
    expect(waiting.textContent).toContain('3 planted · 1 quiet');
  });

  it('lists each SNR bin with recovered, missed, pending, rate and interval; a bin without outcomes shows dashes', async () => {
    serve({ status: 200, body: { completeness: filled() } });
    renderCompleteness();
    await screen.findByRole('table', { name: /by expected snr/i });
    expect(tableRows()).toEqual([
      ['5–7.1', '0', '0', '0', '—', '—'],
      ['7.1–10', '1', '2', '1', '33 %', '6–79 %'],
      ['10–15', '0', '0', '2', '—', '—'],
      ['20–30', '5', '1', '0', '83 %', '44–97 %'],
    ]);
  });

  it('charts the rate per SNR bin and draws each Wilson interval as a bar between its ends', async () => {
    serve({ status: 200, body: { completeness: filled() } });
    renderCompleteness();
    await screen.findByRole('table');
    expect(charts).toHaveLength(1);
    const chart = charts[0]!;
    expect(chart.data[0]).toEqual([0, 1, 2, 3]);
    expect(chart.data[1]).toEqual([null, 1 / 3, null, 5 / 6]);
    const figure = screen.getByRole('img');
    expect(figure.getAttribute('aria-label')).toContain('7.1–10: 33 % of 3, interval 6–79 %');
    expect(figure.getAttribute('aria-label')).toContain('False dips on quiet controls: 25 %');

    // Run the draw hook on a context that records the lines it strokes.
    const segments: [number, number, number, number][] = [];
    let at: [number, number] = [0, 0];
    const ctx = new Proxy(
      {
        moveTo: (x: number, y: number) => {
          at = [x, y];
        },
        lineTo: (x: number, y: number) => {
          segments.push([at[0], at[1], x, y]);
          at = [x, y];
        },
      } as Record<string, unknown>,
      { get: (target, key) => (key in target ? target[key as string] : () => {}), set: () => true },
    );
    const hooks = chart.options.hooks as { drawAxes: ((u: unknown) => void)[] };
    hooks.drawAxes[0]!({
      ctx,
      bbox: { left: 0, top: 20, width: 400, height: 200 },
      valToPos: (value: number, scale: string) => (scale === 'x' ? 100 * value + 50 : 220 - 200 * value),
    });
    const vertical = segments.filter(([x1, , x2]) => x1 === x2);
    // Bins 1 and 3 have intervals (x = 150, 350); bins 0 and 2 have none.
    expect(vertical.map(([x]) => x)).toEqual([150, 350]);
    const [, top1, , bottom1] = vertical[0]!;
    const interval = astropyWilson95(1, 3);
    expect(top1).toBeCloseTo(220 - 200 * interval.wilsonHigh, 9);
    expect(bottom1).toBeCloseTo(220 - 200 * interval.wilsonLow, 9);
    // The quiet controls' false-dip rate is a horizontal line across the chart at 25 %.
    expect(segments).toContainEqual([0, 170, 400, 170]);
  });

  it('switches chart and table to depth bins, the open last bin written as “≥”', async () => {
    serve({ status: 200, body: { completeness: filled() } });
    renderCompleteness();
    await screen.findByRole('table');
    act(() => {
      fireEvent.click(screen.getByLabelText('Depth'));
    });
    expect(screen.getByRole('table', { name: /by depth/i })).toBeTruthy();
    expect(tableRows().map((row) => row[0])).toEqual(['200–500 ppm', '2,000–5,000 ppm', '≥ 50,000 ppm']);
    expect(charts[0]!.destroyed).toBe(true);
    expect(charts.at(-1)!.data[1]).toEqual([1 / 3, 5 / 6, null]);
  });

  it('when the campaign is unknown, shows the error with a way to try again', async () => {
    serve({ status: 404, body: { error: { code: 'not_found', message: 'Campaign was not found' } } });
    renderCompleteness();
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('Could not load the completeness figures');
    expect(alert.textContent).toContain('Campaign was not found');
    expect(within(alert).getByRole('button', { name: 'Try again' })).toBeTruthy();
  });
});
