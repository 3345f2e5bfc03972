// @vitest-environment jsdom
import { QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { DeckPage } from '@/features/deck/components/deck-page';
import type { Person } from '@/lib/person';
import { createQueryClient } from '@/lib/query-client';
import { type FakeDeckApi, fakeDeckApi, stubBrowserLayout } from '../../../support/fake-deck-api';

// uPlot needs a canvas, which jsdom does not draw; the chart is exercised in the browser tests. This
// stand-in keeps what the Deck relies on: a tap on the chart reports an x value.
vi.mock('@/components/light-curve-plot', () => ({
  LightCurvePlot: ({ onTap, label }: { onTap?: (x: number) => void; label: string }) => (
    <button type="button" data-no-swipe aria-label={label} onClick={() => onTap?.(3)}>
      chart
    </button>
  ),
}));

// What Testing Library sets itself when the test runner has global hooks (ours are imported).
(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

const CARD_WIDTH_PX = 300;

const volunteer: Person = {
  id: 1,
  email: 'volunteer@example.com',
  displayName: 'Test Volunteer',
  role: 'volunteer',
  suspended: false,
  newsletterOptIn: false,
  creditByName: false,
  emailConfirmed: true,
  createdAt: '2026-12-01T00:00:00.000Z',
};

let fake: FakeDeckApi;
let restoreLayout: () => void;

beforeEach(() => {
  window.localStorage.clear();
  window.localStorage.setItem('dipdeck.guide-seen.v1', 'yes');
  restoreLayout = stubBrowserLayout(CARD_WIDTH_PX);
  fake = fakeDeckApi();
});

afterEach(() => {
  cleanup();
  fake.restore();
  restoreLayout();
  vi.useRealTimers();
});

async function renderDeck() {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <MemoryRouter>
        <DeckPage person={volunteer} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
  await waitFor(() => expect(shownSnippet()).toBe(1));
}

const shownSnippet = () =>
  Number(document.querySelector('[data-snippet-id]')?.getAttribute('data-snippet-id') ?? Number.NaN);

const key = (name: string, options: Partial<KeyboardEventInit> = {}) =>
  act(() => {
    fireEvent.keyDown(document.body, { key: name, ...options });
  });

const card = () => document.querySelector('[data-snippet-id]')!.parentElement as HTMLElement;

// A pointer event at a given time: the gesture's velocity comes from the events' timestamps.
function pointer(type: string, x: number, y: number, timeMs: number) {
  const event = new MouseEvent(type, { bubbles: true, cancelable: true, clientX: x, clientY: y, button: 0 });
  Object.defineProperty(event, 'timeStamp', { value: timeMs });
  Object.defineProperty(event, 'pointerId', { value: 1 });
  act(() => {
    card().dispatchEvent(event);
  });
}

/** A drag from the card's centre through the given offsets, one step every `stepMs`, then released. */
function drag(
  offsets: [dx: number, dy: number][],
  stepMs = 40,
  release: 'pointerup' | 'pointercancel' = 'pointerup',
) {
  const [startX, startY] = [150, 200];
  let time = 1_000;
  pointer('pointerdown', startX, startY, time);
  for (const [dx, dy] of offsets) {
    time += stepMs;
    pointer('pointermove', startX + dx, startY + dy, time);
  }
  const [lastDx, lastDy] = offsets[offsets.length - 1]!;
  // Held still before letting go, so only the distance decides.
  pointer(release, startX + lastDx, startY + lastDy, time + 200);
}

const sentAnswers = () => fake.verdicts.map((verdict) => `${verdict.snippetId}:${verdict.answer}`);

describe('Deck keyboard shortcuts', () => {
  it('→ dip, ← flat, ↑ unsure, each on the card shown, and the next card follows', async () => {
    await renderDeck();
    await key('ArrowRight');
    expect(shownSnippet()).toBe(2);
    await key('ArrowLeft');
    await key('ArrowUp');
    expect(shownSnippet()).toBe(4);
    await waitFor(() => expect(sentAnswers()).toEqual(['1:dip', '2:flat', '3:unsure']));
  });

  it('leaves browser shortcuts and shifted arrows alone', async () => {
    await renderDeck();
    await key('ArrowRight', { ctrlKey: true });
    await key('ArrowLeft', { metaKey: true });
    await key('ArrowRight', { shiftKey: true });
    await key('z', { ctrlKey: true });
    expect(shownSnippet()).toBe(1);
    expect(fake.verdicts).toEqual([]);
  });

  it('M marks at the time cursor (the card’s middle) and sends the mark with a dip', async () => {
    await renderDeck();
    await key('m');
    expect(screen.getByText('mark 6 h')).toBeTruthy();
    await key('m');
    expect(screen.getByText('no mark')).toBeTruthy();
    await key('m');
    await key('ArrowRight');
    await waitFor(() => expect(fake.verdicts).toHaveLength(1));
    // Sent in the light curve's own time: the snippet starts at day 100.
    expect(fake.verdicts[0]!.markTime).toBeCloseTo(100 + 6 / 24, 9);
  });

  it('a new card starts unmarked: a key pressed straight after never carries the last card’s mark', async () => {
    await renderDeck();
    await key('m');
    await key('ArrowRight');
    await key('ArrowRight');
    await waitFor(() => expect(fake.verdicts).toHaveLength(2));
    expect(fake.verdicts[0]!.markTime).toBeDefined();
    expect(fake.verdicts[1]!.markTime).toBeUndefined();
    expect(screen.getByText('no mark')).toBeTruthy();
  });

  it('a tap on the chart sets the mark, and Clear mark takes it away', async () => {
    await renderDeck();
    fireEvent.click(screen.getByRole('button', { name: /Light-curve snippet/ }));
    expect(screen.getByText('mark 3 h')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Clear mark' }));
    expect(screen.getByText('no mark')).toBeTruthy();
  });
});

describe('Deck undo', () => {
  it('Z takes back the last verdict and brings its card back', async () => {
    await renderDeck();
    await key('ArrowLeft');
    await waitFor(() => expect(fake.verdicts).toHaveLength(1));
    await key('z');
    await waitFor(() => expect(fake.undone).toEqual([fake.verdicts[0]!.clientId]));
    expect(shownSnippet()).toBe(1);
    // Said on screen and in the live region.
    expect(screen.getAllByText(/taken back/i).length).toBeGreaterThan(0);
  });

  it('the Undo button does the same', async () => {
    await renderDeck();
    await key('ArrowRight');
    await waitFor(() => expect(fake.verdicts).toHaveLength(1));
    fireEvent.click(screen.getByRole('button', { name: /^Undo/ }));
    await waitFor(() => expect(fake.undone).toHaveLength(1));
  });

  it('does nothing after 15 seconds: the verdict stands', async () => {
    await renderDeck();
    await key('ArrowRight');
    await waitFor(() => expect(fake.verdicts).toHaveLength(1));
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(Date.now() + 15_001);
    await key('z');
    expect(fake.undone).toEqual([]);
    expect(shownSnippet()).toBe(2);
  });
});

describe('Deck gestures', () => {
  const third = CARD_WIDTH_PX / 3;

  it('a drag past a third of the card’s width gives a verdict by its direction', async () => {
    await renderDeck();
    drag([
      [40, 0],
      [80, 0],
      [third + 10, 0],
    ]);
    drag([
      [-40, 0],
      [-third - 10, 0],
    ]);
    drag([
      [0, -40],
      [0, -third - 10],
    ]);
    expect(shownSnippet()).toBe(4);
    await waitFor(() => expect(sentAnswers()).toEqual(['1:dip', '2:flat', '3:unsure']));
  });

  it('springs back from a drag that stops short, comes back, goes down or is cancelled', async () => {
    await renderDeck();
    drag([
      [30, 0],
      [third - 10, 0],
    ]);
    drag([
      [60, 0],
      [third + 30, 0],
      [40, 0],
      [5, 0],
    ]);
    drag([
      [0, 60],
      [0, third + 40],
    ]);
    drag(
      [
        [60, 0],
        [third + 30, 0],
      ],
      40,
      'pointercancel',
    );
    expect(shownSnippet()).toBe(1);
    expect(fake.verdicts).toEqual([]);
  });

  it('a quick flick counts although short, but not a twitch under 32 px', async () => {
    await renderDeck();
    let time = 5_000;
    const flick = (dx: number) => {
      pointer('pointerdown', 150, 200, time);
      pointer('pointermove', 150 + dx / 2, 200, time + 20);
      pointer('pointermove', 150 + dx, 200, time + 40);
      pointer('pointerup', 150 + dx, 200, time + 45);
      time += 1_000;
    };
    flick(-25);
    expect(shownSnippet()).toBe(1);
    flick(-60);
    expect(shownSnippet()).toBe(2);
    await waitFor(() => expect(sentAnswers()).toEqual(['1:flat']));
  });

  it('a drag that starts on a button belongs to the button, not the card', async () => {
    await renderDeck();
    const clear = screen.getByRole('button', { name: 'Clear mark' });
    const down = new MouseEvent('pointerdown', { bubbles: true, clientX: 150, clientY: 200, button: 0 });
    act(() => {
      clear.dispatchEvent(down);
    });
    pointer('pointermove', 150 + third + 40, 200, 2_000);
    pointer('pointerup', 150 + third + 40, 200, 2_300);
    expect(shownSnippet()).toBe(1);
  });
});
