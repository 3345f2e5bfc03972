// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { DeskRoute, DeskSplitRoute, DeskSplitsRoute } from '@/app/routes/desk';
import { createQueryClient } from '@/lib/query-client';
import { stubBrowserLayout } from '../../../support/fake-deck-api';
import { type FakeDeskApi, fakeDeskApi } from '../../../support/fake-desk-api';

// uPlot needs a canvas, which jsdom does not draw; the chart is looked at in the browser tests. The
// review only needs the chart to be there with its name.
vi.mock('@/components/light-curve-plot', () => ({
  LightCurvePlot: ({ label }: { label: string }) => <div role="img" aria-label={label} />,
}));

// What Testing Library sets itself when the test runner has global hooks (ours are imported).
(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

let fake: FakeDeskApi;
let restoreLayout: () => void;

function setUp(queue?: number[]) {
  fake = fakeDeskApi(queue ? { queue } : {});
}

beforeEach(() => {
  restoreLayout = stubBrowserLayout();
});

afterEach(() => {
  cleanup();
  fake?.restore();
  restoreLayout();
});

function renderDesk(path: string) {
  const router = createMemoryRouter(
    [
      {
        path: '/desk',
        Component: DeskRoute,
        children: [
          { index: true, Component: DeskSplitsRoute },
          { path: '/desk/splits/:snippetId', Component: DeskSplitRoute },
        ],
      },
    ],
    { initialEntries: [path] },
  );
  render(
    <QueryClientProvider client={createQueryClient()}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return router;
}

const shownSnippet = () =>
  Number(
    document.querySelector('[data-review-snippet-id]')?.getAttribute('data-review-snippet-id') ?? Number.NaN,
  );

/** Waits until the review of `id` is on screen with its place in the queue read. */
async function reviewOf(id: number) {
  await waitFor(() => expect(shownSnippet()).toBe(id));
  await screen.findByRole('heading', { level: 1, name: `TST-${id}` });
  await waitFor(() => expect(screen.queryByText('Reading the queue…')).toBeNull());
}

const key = (name: string, target: Element = document.body, options: Partial<KeyboardEventInit> = {}) => {
  let allowed = true;
  act(() => {
    allowed = fireEvent.keyDown(target, { key: name, ...options });
  });
  return allowed;
};

const announcement = () => document.querySelector('[data-desk-announcement]')?.textContent ?? '';
const note = () => screen.getByRole('textbox', { name: /Note/ }) as HTMLTextAreaElement;

describe('Desk review keyboard shortcuts', () => {
  it('D rules dip on the split shown, announces it and goes on to the next split in the queue', async () => {
    setUp();
    const router = renderDesk('/desk/splits/101');
    await reviewOf(101);
    expect(screen.getByText('1 of 3 · oldest first')).toBeTruthy();

    key('d');
    await reviewOf(102);
    expect(fake.rulings).toEqual([{ snippetId: 101, ruling: 'dip' }]);
    expect(announcement()).toBe('Ruled dip on TST-101 (snippet #101).');
    expect(router.state.location.pathname).toBe('/desk/splits/102');
    // The ruled snippet has left the queue.
    expect(screen.getByText('1 of 2 · oldest first')).toBeTruthy();
  });

  it('F rules flat and S rules systematic, each on the split shown at the time', async () => {
    setUp();
    renderDesk('/desk/splits/101');
    await reviewOf(101);
    key('f');
    await reviewOf(102);
    key('s');
    await reviewOf(103);
    expect(fake.rulings).toEqual([
      { snippetId: 101, ruling: 'flat' },
      { snippetId: 102, ruling: 'systematic' },
    ]);
    expect(announcement()).toBe('Ruled systematic on TST-102 (snippet #102).');
  });

  it('typing "d" in the note does not rule; Esc leaves the note and D then rules with it', async () => {
    setUp();
    renderDesk('/desk/splits/101');
    await reviewOf(101);
    note().focus();
    expect(key('d', note())).toBe(true);
    fireEvent.change(note(), { target: { value: 'doubtful ramp at the start' } });
    key('f', note());
    key('s', note());
    key('j', note());
    expect(fake.rulings).toEqual([]);
    expect(shownSnippet()).toBe(101);

    key('Escape', note());
    expect(document.activeElement).not.toBe(note());
    key('d');
    await reviewOf(102);
    expect(fake.rulings).toEqual([{ snippetId: 101, ruling: 'dip', note: 'doubtful ramp at the start' }]);
    // The next split starts with an empty note.
    expect(note().value).toBe('');
  });

  it('N focuses the note, and the N is not typed into it', async () => {
    setUp();
    renderDesk('/desk/splits/101');
    await reviewOf(101);
    const allowed = key('n');
    expect(document.activeElement).toBe(note());
    expect(allowed).toBe(false);
    expect(note().value).toBe('');
    expect(fake.rulings).toEqual([]);
  });

  it('J and → go to the next split, K and ← back, in the queue order, without ruling', async () => {
    setUp([103, 101, 102]);
    const router = renderDesk('/desk/splits/103?order=needed');
    await reviewOf(103);
    key('j');
    await reviewOf(101);
    key('ArrowRight');
    await reviewOf(102);
    key('k');
    await reviewOf(101);
    key('ArrowLeft');
    await reviewOf(103);
    expect(fake.rulings).toEqual([]);
    // The queue's order comes along from split to split.
    expect(router.state.location.search).toBe('?order=needed');
  });

  it('J on the last split says so and stays; K on the first does the same', async () => {
    setUp();
    renderDesk('/desk/splits/103');
    await reviewOf(103);
    key('j');
    expect(announcement()).toBe('This is the last split in the queue.');
    expect(shownSnippet()).toBe(103);
    key('k');
    await reviewOf(102);
    key('k');
    await reviewOf(101);
    key('k');
    expect(announcement()).toBe('This is the first split in the queue.');
  });

  it('leaves keys with Ctrl, Alt or Meta to the browser', async () => {
    setUp();
    renderDesk('/desk/splits/101');
    await reviewOf(101);
    expect(key('d', document.body, { ctrlKey: true })).toBe(true);
    key('f', document.body, { metaKey: true });
    key('s', document.body, { altKey: true });
    key('ArrowRight', document.body, { metaKey: true });
    expect(fake.rulings).toEqual([]);
    expect(shownSnippet()).toBe(101);
  });

  it('the Dip, Flat and Systematic buttons rule like their keys', async () => {
    setUp();
    renderDesk('/desk/splits/101');
    await reviewOf(101);
    fireEvent.click(screen.getByRole('button', { name: 'Systematic' }));
    await reviewOf(102);
    expect(fake.rulings).toEqual([{ snippetId: 101, ruling: 'systematic' }]);
  });
});

describe('Desk review at the end of the queue and for unknown snippets', () => {
  it('ruling the last split goes back to the queue, which says nothing is left', async () => {
    setUp([101]);
    const router = renderDesk('/desk/splits/101');
    await reviewOf(101);
    key('d');
    await screen.findByRole('heading', { name: 'No split snippets to rule on' });
    expect(router.state.location.pathname).toBe('/desk');
    expect(announcement()).toBe('Ruled dip on TST-101 (snippet #101). That was the last split in the queue.');
  });

  it('an unknown snippet is answered with a page that says there is none, and a way back', async () => {
    setUp();
    renderDesk('/desk/splits/999');
    await screen.findByRole('heading', { name: 'There is no snippet #999' });
    expect(screen.getByRole('link', { name: 'Back to the split queue' }).getAttribute('href')).toBe('/desk');
    expect(key('d')).toBe(true);
    expect(fake.rulings).toEqual([]);
  });

  it('shows the verdicts by name with their weight, the marks and the neighbouring snippet', async () => {
    setUp();
    renderDesk('/desk/splits/101');
    await reviewOf(101);
    expect(screen.getByRole('table', { name: /Verdicts on this snippet/ })).toBeTruthy();
    expect(screen.getByText('Volunteer 3')).toBeTruthy();
    expect(screen.getByText('+1.60')).toBeTruthy();
    expect(screen.getByText('−1.40')).toBeTruthy();
    expect(
      screen.getByRole('img', { name: /Marks on the time axis\. 2 marks from 4 verdicts/ }),
    ).toBeTruthy();
    expect(
      screen.getByRole('link', { name: /Snippet 1101, −12 h from this one: settled \(flat\)/ }),
    ).toBeTruthy();
  });
});
