// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { DeskRoute, DeskVolunteersRoute } from '@/app/routes/desk';
import { createQueryClient } from '@/lib/query-client';
import { stubBrowserLayout } from '../../../support/fake-deck-api';
import { type FakeDeskApi, fakeDeskApi } from '../../../support/fake-desk-api';

// The volunteer audit draws no chart, but the Desk's route module brings the review, which does.
vi.mock('@/components/light-curve-plot', () => ({
  LightCurvePlot: ({ label }: { label: string }) => <div role="img" aria-label={label} />,
}));

// What Testing Library sets itself when the test runner has global hooks (ours are imported).
(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

let fake: FakeDeskApi;
let restoreLayout: () => void;

beforeEach(() => {
  restoreLayout = stubBrowserLayout();
  fake = fakeDeskApi();
});

afterEach(() => {
  cleanup();
  fake.restore();
  restoreLayout();
});

async function renderVolunteers(path = '/desk/volunteers') {
  const router = createMemoryRouter(
    [
      {
        path: '/desk',
        Component: DeskRoute,
        children: [{ path: '/desk/volunteers', Component: DeskVolunteersRoute }],
      },
    ],
    { initialEntries: [path] },
  );
  render(
    <QueryClientProvider client={createQueryClient()}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  await screen.findByRole('table', { name: /^Volunteers, sorted by/ });
  return router;
}

const table = () => screen.getByRole('table', { name: /^Volunteers, sorted by/ });
/** The volunteers' names in the order the table shows them. */
const shownNames = () =>
  within(table())
    .getAllByText(/^(Ada Lovelace|Bea Swift|Cy Careful)$/)
    .map((element) => element.textContent?.trim());
const header = (name: string) =>
  within(table())
    .getAllByRole('columnheader')
    .find((cell) => cell.textContent?.startsWith(name))!;
const lastQuery = () => fake.volunteerQueries[fake.volunteerQueries.length - 1]!;

describe('Desk volunteer table: sorting and filters', () => {
  it('starts sorted by name, A to Z, with aria-sort on that column only', async () => {
    await renderVolunteers();
    expect(shownNames()).toEqual(['Ada Lovelace', 'Bea Swift', 'Cy Careful']);
    expect(header('Volunteer').getAttribute('aria-sort')).toBe('ascending');
    expect(header('Verdicts').getAttribute('aria-sort')).toBe('none');
    expect(lastQuery().get('sort')).toBe('name');
    expect(lastQuery().get('order')).toBe('asc');
  });

  it('a column header sorts by it, highest first, and pressing it again reverses the order', async () => {
    const router = await renderVolunteers();
    fireEvent.click(within(header('Verdicts')).getByRole('button'));
    await waitFor(() => expect(header('Verdicts').getAttribute('aria-sort')).toBe('descending'));
    expect(lastQuery().get('sort')).toBe('verdicts');
    expect(lastQuery().get('order')).toBe('desc');
    expect(header('Volunteer').getAttribute('aria-sort')).toBe('none');
    await waitFor(() => expect(shownNames()).toEqual(['Ada Lovelace', 'Bea Swift', 'Cy Careful']));

    fireEvent.click(within(header('Verdicts')).getByRole('button'));
    await waitFor(() => expect(header('Verdicts').getAttribute('aria-sort')).toBe('ascending'));
    expect(lastQuery().get('order')).toBe('asc');
    await waitFor(() => expect(shownNames()).toEqual(['Cy Careful', 'Bea Swift', 'Ada Lovelace']));
    // The order lives in the address, so a reload or a shared link shows the same table.
    expect(router.state.location.search).toBe('?sort=verdicts&order=asc');
  });

  it('median time sorts fastest first when first chosen', async () => {
    await renderVolunteers();
    fireEvent.click(within(header('Median time')).getByRole('button'));
    await waitFor(() => expect(header('Median time').getAttribute('aria-sort')).toBe('ascending'));
    expect(lastQuery().get('sort')).toBe('medianMs');
    expect(lastQuery().get('order')).toBe('asc');
  });

  it('shows each flag with its reason, and a cleared flag with who cleared it and why', async () => {
    await renderVolunteers();
    expect(screen.getByText('Median time 0.6 s per verdict, below 1.5 s')).toBeTruthy();
    expect(screen.getByText('Cleared by Test Moderator: The campaign is mostly quiet stars')).toBeTruthy();
    // Only a flag still standing can be cleared.
    expect(screen.getByRole('button', { name: 'Clear the “Too fast” flag of Bea Swift' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: /Clear the “One answer only” flag/ })).toBeNull();
  });

  it('Flagged only asks the server for volunteers with a flag still standing', async () => {
    await renderVolunteers();
    fireEvent.click(screen.getByRole('checkbox', { name: 'Flagged only' }));
    await waitFor(() => expect(shownNames()).toEqual(['Bea Swift']));
    expect(lastQuery().get('flagged')).toBe('true');
  });

  it('the search goes to the server once typing settles, and narrows the table', async () => {
    await renderVolunteers();
    fireEvent.change(screen.getByRole('searchbox', { name: 'Search volunteers' }), {
      target: { value: 'lovelace' },
    });
    await waitFor(() => expect(shownNames()).toEqual(['Ada Lovelace']));
    expect(lastQuery().get('search')).toBe('lovelace');
    expect(fake.volunteerQueries.filter((query) => query.get('search')).length).toBe(1);
  });
});

describe('Desk volunteer table: suspending', () => {
  it('Suspend asks for a reason first, then for confirmation, and only then suspends', async () => {
    await renderVolunteers();
    fireEvent.click(screen.getByRole('button', { name: 'Suspend Bea Swift' }));
    const panel = screen.getByRole('region', { name: 'Suspend Bea Swift' });

    fireEvent.click(within(panel).getByRole('button', { name: 'Suspend…' }));
    expect(within(panel).getByText('Give a reason; it goes in the audit log.')).toBeTruthy();

    fireEvent.change(within(panel).getByRole('textbox', { name: 'Reason' }), {
      target: { value: 'Judges faster than the light curve can be read' },
    });
    fireEvent.click(within(panel).getByRole('button', { name: 'Suspend…' }));
    expect(within(panel).getByText('Suspend Bea Swift?')).toBeTruthy();
    expect(fake.suspensions).toEqual([]);

    await act(async () => {
      fireEvent.click(within(panel).getByRole('button', { name: 'Yes, suspend Bea Swift' }));
    });
    await waitFor(() =>
      expect(fake.suspensions).toEqual([{ id: 2, reason: 'Judges faster than the light curve can be read' }]),
    );
    await screen.findByText(
      /Bea Swift is suspended\. Their verdicts no longer count; 7 snippets marked for rescoring\./,
    );
    // The table refreshes: Bea can now be restored.
    await screen.findByRole('button', { name: 'Restore Bea Swift' });
    expect(screen.queryByRole('region', { name: 'Suspend Bea Swift' })).toBeNull();
  });

  it('Back from the confirmation, or Cancel, suspends nobody', async () => {
    await renderVolunteers();
    fireEvent.click(screen.getByRole('button', { name: 'Suspend Ada Lovelace' }));
    const panel = screen.getByRole('region', { name: 'Suspend Ada Lovelace' });
    fireEvent.change(within(panel).getByRole('textbox', { name: 'Reason' }), {
      target: { value: 'Testing' },
    });
    fireEvent.click(within(panel).getByRole('button', { name: 'Suspend…' }));
    fireEvent.click(within(panel).getByRole('button', { name: 'Back' }));
    expect(within(panel).getByRole('textbox', { name: 'Reason' })).toBeTruthy();
    fireEvent.click(within(panel).getByRole('button', { name: 'Cancel' }));
    expect(screen.queryByRole('region', { name: 'Suspend Ada Lovelace' })).toBeNull();
    expect(fake.suspensions).toEqual([]);
  });
});
