// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ObservatoriesPage } from '@/features/lab/components/observatories-page';
import { createQueryClient } from '@/lib/query-client';

// What Testing Library sets itself when the test runner has global hooks (ours are imported).
(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

interface Site {
  id: number;
  name: string;
  latitudeDeg: number;
  longitudeDeg: number;
  elevationM: number;
  minTargetAltitudeDeg: number;
  sunAltitudeLimitDeg: number;
  createdAt: string;
}

const testSite: Site = {
  id: 1,
  name: 'Test site',
  latitudeDeg: 28.76,
  longitudeDeg: -17.88,
  elevationM: 2396,
  minTargetAltitudeDeg: 30,
  sunAltitudeLimitDeg: -12,
  createdAt: '2026-12-01T10:00:00.000Z',
};

interface Sent {
  method: string;
  path: string;
  body: unknown;
}

/** The observatory routes of server/http/routes/candidates.ts, in memory, with the name rule. */
function fakeApi(initial: Site[]) {
  let sites = [...initial];
  let nextId = 10;
  const sent: Sent[] = [];
  const json = (status: number, body: unknown) =>
    new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
  const taken = () =>
    json(409, {
      error: {
        code: 'observatory_exists',
        message: 'An observatory of that name exists',
        fields: { name: 'Already taken' },
      },
    });
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = new URL(String(input), 'http://localhost');
      const method = init?.method ?? 'GET';
      const body = init?.body ? JSON.parse(String(init.body)) : undefined;
      if (url.pathname === '/api/auth/csrf') return json(200, { token: 'csrf-token' });
      sent.push({ method, path: url.pathname, body });
      if (url.pathname === '/api/observatories') {
        if (method === 'GET') return json(200, { observatories: sites });
        if (sites.some((s) => s.name === body.name)) return taken();
        const site = { id: nextId++, createdAt: '2026-12-02T03:00:00.000Z', ...body };
        sites = [...sites, site];
        return json(201, { observatory: site });
      }
      const match = /^\/api\/observatories\/(\d+)$/.exec(url.pathname);
      const id = Number(match?.[1]);
      const found = sites.find((s) => s.id === id);
      if (!found) return json(404, { error: { code: 'not_found', message: 'Observatory not found' } });
      if (method === 'PATCH') {
        if (body.name && sites.some((s) => s.name === body.name && s.id !== id)) return taken();
        const changed = { ...found, ...body };
        sites = sites.map((s) => (s.id === id ? changed : s));
        return json(200, { observatory: changed });
      }
      if (method === 'DELETE') {
        sites = sites.filter((s) => s.id !== id);
        return json(200, { removed: id });
      }
      return json(405, { error: { code: 'method', message: 'No' } });
    }),
  );
  return {
    writes: () => sent.filter((request) => request.method !== 'GET'),
  };
}

function renderPage() {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <MemoryRouter>
        <ObservatoriesPage />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

beforeEach(() => vi.unstubAllGlobals());
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const fill = (form: HTMLElement, label: string, value: string) =>
  fireEvent.change(within(form).getByRole('textbox', { name: label }), { target: { value } });

describe('Observatories', () => {
  it('lists each site with its place, east positive written as E or W, and its limits', async () => {
    fakeApi([testSite]);
    renderPage();
    const table = await screen.findByRole('table', { name: 'Observatories' });
    expect(within(table).getByText('Test site')).toBeTruthy();
    expect(within(table).getByText('28.76° N, 17.88° W')).toBeTruthy();
    expect(within(table).getByText('2396 m')).toBeTruthy();
    expect(within(table).getByText('-12°')).toBeTruthy();
  });

  it('adds an observatory with the defaults filled in, and lists it', async () => {
    const api = fakeApi([testSite]);
    renderPage();
    const form = await screen.findByRole('form', { name: 'Add an observatory' });
    fill(form, 'Name', 'Roof dome');
    fill(form, 'Latitude (°)', '58.98');
    fill(form, 'Longitude (°)', '−2.96');
    fireEvent.click(within(form).getByRole('button', { name: 'Add observatory' }));

    await waitFor(() => expect(api.writes()).toHaveLength(1));
    expect(api.writes()[0]).toEqual({
      method: 'POST',
      path: '/api/observatories',
      body: {
        name: 'Roof dome',
        latitudeDeg: 58.98,
        longitudeDeg: -2.96,
        elevationM: 0,
        minTargetAltitudeDeg: 30,
        sunAltitudeLimitDeg: -12,
      },
    });
    await screen.findByText(/Roof dome is added/);
    expect(within(screen.getByRole('table', { name: 'Observatories' })).getByText('Roof dome')).toBeTruthy();
    // A fresh, empty form for the next one.
    const fresh = screen.getByRole('form', { name: 'Add an observatory' });
    expect((within(fresh).getByRole('textbox', { name: 'Name' }) as HTMLInputElement).value).toBe('');
  });

  it('checks the ranges before sending anything', async () => {
    const api = fakeApi([testSite]);
    renderPage();
    const form = await screen.findByRole('form', { name: 'Add an observatory' });
    fill(form, 'Name', 'Too far north');
    fill(form, 'Latitude (°)', '95');
    fill(form, 'Longitude (°)', 'east');
    fill(form, 'Sun altitude limit (°)', '5');
    fireEvent.click(within(form).getByRole('button', { name: 'Add observatory' }));
    expect(within(form).getByText('From -90 to 90')).toBeTruthy();
    expect(within(form).getByText('Give a number from -180 to 180')).toBeTruthy();
    expect(within(form).getByText('From -90 to 0')).toBeTruthy();
    expect(api.writes()).toHaveLength(0);
  });

  it('shows the server’s 409 on the name when it is taken', async () => {
    fakeApi([testSite]);
    renderPage();
    const form = await screen.findByRole('form', { name: 'Add an observatory' });
    fill(form, 'Name', 'Test site');
    fill(form, 'Latitude (°)', '10');
    fill(form, 'Longitude (°)', '10');
    fireEvent.click(within(form).getByRole('button', { name: 'Add observatory' }));
    await within(form).findByText('Already taken');
    expect(within(form).getByRole('textbox', { name: 'Name' }).getAttribute('aria-invalid')).toBe('true');
  });

  it('changes an observatory, sending only the field that changed', async () => {
    const api = fakeApi([testSite]);
    renderPage();
    await screen.findByRole('table', { name: 'Observatories' });
    fireEvent.click(screen.getByRole('button', { name: 'Change Test site' }));
    const form = screen.getByRole('form', { name: 'Change Test site' });
    expect((within(form).getByRole('textbox', { name: 'Latitude (°)' }) as HTMLInputElement).value).toBe(
      '28.76',
    );
    fill(form, 'Sun altitude limit (°)', '-18');
    fireEvent.click(within(form).getByRole('button', { name: 'Save changes' }));

    await waitFor(() => expect(api.writes()).toHaveLength(1));
    expect(api.writes()[0]).toEqual({
      method: 'PATCH',
      path: '/api/observatories/1',
      body: { sunAltitudeLimitDeg: -18 },
    });
    await screen.findByText('Test site is saved.');
    await waitFor(() =>
      expect(within(screen.getByRole('table', { name: 'Observatories' })).getByText('-18°')).toBeTruthy(),
    );
    expect(screen.getByRole('form', { name: 'Add an observatory' })).toBeTruthy();
  });

  it('removes an observatory only after it is confirmed', async () => {
    const api = fakeApi([testSite, { ...testSite, id: 2, name: 'Second site' }]);
    renderPage();
    await screen.findByRole('table', { name: 'Observatories' });
    fireEvent.click(screen.getByRole('button', { name: 'Remove Second site' }));
    expect(api.writes()).toHaveLength(0);
    fireEvent.click(screen.getByRole('button', { name: 'Keep' }));
    expect(api.writes()).toHaveLength(0);

    fireEvent.click(screen.getByRole('button', { name: 'Remove Second site' }));
    fireEvent.click(screen.getByRole('button', { name: 'Remove Second site now' }));
    await waitFor(() =>
      expect(api.writes()).toEqual([{ method: 'DELETE', path: '/api/observatories/2', body: undefined }]),
    );
    await screen.findByText(/Second site is removed/);
    await waitFor(() => expect(screen.queryByText('Second site')).toBeNull());
    expect(screen.getByText('Test site')).toBeTruthy();
  });

  it('says so when there are no observatories', async () => {
    fakeApi([]);
    renderPage();
    await screen.findByText(/No observatories yet/);
  });
});
